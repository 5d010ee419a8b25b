// Leakage reactance (short-circuit impedance) measured in the field against
// the nameplate impedance: a change suggests winding movement or deformation.
// Sources: IEEE C57.152 leakage reactance test; limits ±2 % of the nameplate
// value for the three-phase equivalent and ±3 % per phase (values from
// memory, verify).
// Units: impedance in % (on the unit's rating), change in % of the
// nameplate value. Valid at the same tap as the nameplate value.
#pragma once

namespace ferrum::analytics::electrical {

inline constexpr double kReactanceThreePhaseLimitPct = 2.0;  // from memory; verify
inline constexpr double kReactancePerPhaseLimitPct = 3.0;    // from memory; verify
inline constexpr const char* kLeakageReactanceSource =
    "IEEE C57.152 leakage reactance: ±2 % three-phase, ±3 % per phase (from memory; verify)";

struct ReactanceCheck {
  double change_pct = 0;  // (measured − nameplate)/nameplate·100
  bool within_limit = true;
};

// per_phase: the reading is of one phase (limit ±3 %) rather than the
// three-phase equivalent (±2 %). REQUIRES: nameplate_pct > 0.
ReactanceCheck check_leakage_reactance(double measured_pct, double nameplate_pct, bool per_phase);

}  // namespace ferrum::analytics::electrical
