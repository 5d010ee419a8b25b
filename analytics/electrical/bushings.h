// Condenser bushings: C1 capacitance change and power factor against the
// nameplate values.
//
// Method and sources (IEEE C57.152 bushing tests and bushing makers' field
// guidance; values from memory, verify):
// * capacitance change |ΔC1|/C1_nameplate: above 5 % investigate, above 10 %
//   take out of service (a rise of capacitance suggests shorted condenser
//   layers);
// * power factor above about twice the nameplate value: investigate.
// Units: capacitance in pF, power factor and change in %.
// Valid for condenser bushings with a test tap; C1 is the main insulation.
// A bushing over its limit is a defect of the bushing: repair or replace the
// bushing, not the unit.
#pragma once

#include <optional>

namespace ferrum::analytics::electrical {

inline constexpr double kBushingCapInvestigatePct = 5.0;    // from memory; verify
inline constexpr double kBushingCapOutOfServicePct = 10.0;  // from memory; verify
inline constexpr double kBushingPfFactor = 2.0;             // × nameplate; from memory; verify
inline constexpr const char* kBushingSource =
    "IEEE C57.152 bushing C1 tests: capacitance change 5 % investigate, 10 % out of service; "
    "power factor twice nameplate investigate (from memory; verify)";

enum class BushingVerdict { acceptable, investigate, out_of_service };

struct BushingCheck {
  std::optional<double> capacitance_change_pct;  // (C − C_np)/C_np·100
  BushingVerdict verdict = BushingVerdict::acceptable;
  bool within_limit = true;  // verdict == acceptable
};

// Each argument may be absent; what is present is checked.
BushingCheck check_bushing(std::optional<double> power_factor_pct,
                           std::optional<double> nameplate_power_factor_pct,
                           std::optional<double> capacitance_pf,
                           std::optional<double> nameplate_capacitance_pf);

const char* bushing_verdict_name(BushingVerdict verdict);

}  // namespace ferrum::analytics::electrical
