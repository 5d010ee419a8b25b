// Winding resistance (DC) corrected to a reference temperature, its spread
// between the phases of one winding and tap, and its change against a
// nameplate/factory or earlier value.
//
// Method and sources:
// * Temperature correction R_ref = R_m·(T_k + T_ref)/(T_k + T_m), with
//   T_k = 234.5 °C for copper and 225 °C for aluminium: IEEE C57.12.90
//   (resistance measurement clause; edition and clause number from memory,
//   verify). Default reference 75 °C (the usual reference temperature of
//   IEEE C57.12.00 for 65 °C-rise units; from memory, verify).
// * Spread between phases about 2 %: common practice (value from memory of
//   field test guides such as IEEE C57.152; verify).
// * Change against the nameplate/factory or previous value about 5 %:
//   common practice (value from memory; verify).
//
// Units: resistances in Ω, temperatures in °C, spread and change in %.
// Valid for winding temperatures above −T_k (physically: the ambient range
// of field tests) once the winding temperature has settled (no load, oil and
// winding at the same temperature).
#pragma once

#include <optional>
#include <span>

namespace ferrum::analytics::electrical {

enum class Conductor { copper, aluminium };

inline constexpr double kCopperTk = 234.5;     // IEEE C57.12.90 (from memory; verify)
inline constexpr double kAluminiumTk = 225.0;  // IEEE C57.12.90 (from memory; verify)
inline constexpr double kDefaultReferenceC = 75.0;
inline constexpr double kPhaseSpreadLimitPct = 2.0;  // common practice, from memory
inline constexpr double kChangeLimitPct = 5.0;       // common practice, from memory
inline constexpr const char* kWindingResistanceSource =
    "IEEE C57.12.90 temperature correction (T_k 234.5 Cu, 225 Al); spread 2 % and change 5 %: "
    "common practice (from memory; verify)";

double conductor_tk(Conductor conductor);

// REQUIRES: measured_c > −T_k.
double corrected_resistance(double measured_ohm, double measured_c, double reference_c,
                            Conductor conductor);

// (max − min)/mean·100 of the phase values; nullopt with fewer than two.
std::optional<double> phase_spread_pct(std::span<const double> phase_ohm);

// (value − reference)/reference·100. REQUIRES: reference_ohm > 0.
double change_pct(double value_ohm, double reference_ohm);

// Within the limits: spread (when known) ≤ spread limit and |change| (when
// known) ≤ change limit.
bool winding_within_limits(std::optional<double> spread_pct, std::optional<double> change,
                           double spread_limit_pct = kPhaseSpreadLimitPct,
                           double change_limit_pct = kChangeLimitPct);

}  // namespace ferrum::analytics::electrical
