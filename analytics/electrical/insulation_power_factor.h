// Insulation power factor (dissipation factor) of the winding insulation
// (CH, CL, CHL) corrected to 20 °C, against service limits, and the change
// of its capacitance.
//
// Method and sources:
// * PF_20 = PF_m·K(T_m): the temperature correction factor K comes from a
//   table (IEEE C57.152 gives one for oil-filled units; from memory, not yet
//   in ferrum). ferrum takes K as an argument: without it the result is the
//   measured value, marked as not corrected, and is checked only when the
//   test was made at 20 °C ± 0.5 °C.
// * Limits for oil-filled units at 20 °C: about 0.5 % new, 1.0 % in service
//   (values from memory of IEEE C57.152; verify).
// * Capacitance change against the nameplate/factory or previous value is
//   reported (a change suggests winding movement or a shorted layer); no
//   limit is applied (none known to the team from a published source).
// Units: power factor in %, capacitance in pF, temperature in °C.
// Valid for oil-filled power transformers tested at the usual 10 kV or less.
#pragma once

#include <optional>

namespace ferrum::analytics::electrical {

inline constexpr double kPfLimitNewPct = 0.5;        // from memory of IEEE C57.152; verify
inline constexpr double kPfLimitInServicePct = 1.0;  // from memory of IEEE C57.152; verify
inline constexpr const char* kInsulationPfSource =
    "IEEE C57.152 insulation power factor at 20 °C: 0.5 % new, 1.0 % in service (from memory; verify)";

struct InsulationPfCheck {
  double power_factor_pct = 0;         // measured
  std::optional<double> pf20_pct;      // corrected to 20 °C when possible
  bool corrected = false;              // a correction factor was applied
  std::optional<double> capacitance_change_pct;
  std::optional<bool> within_limit;    // null when no 20 °C value is known
};

// correction_factor: K with PF_20 = PF_m·K (absent: no table for this case).
// limit_pct: kPfLimitInServicePct or kPfLimitNewPct.
InsulationPfCheck check_insulation_pf(double power_factor_pct, double temp_c,
                                      std::optional<double> correction_factor,
                                      std::optional<double> capacitance_pf,
                                      std::optional<double> reference_capacitance_pf,
                                      double limit_pct = kPfLimitInServicePct);

}  // namespace ferrum::analytics::electrical
