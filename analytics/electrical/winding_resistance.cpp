#include "analytics/electrical/winding_resistance.h"

#include <algorithm>
#include <cmath>
#include <numeric>

namespace ferrum::analytics::electrical {

double conductor_tk(Conductor conductor) {
  return conductor == Conductor::copper ? kCopperTk : kAluminiumTk;
}

double corrected_resistance(double measured_ohm, double measured_c, double reference_c,
                            Conductor conductor) {
  const double tk = conductor_tk(conductor);
  return measured_ohm * (tk + reference_c) / (tk + measured_c);
}

std::optional<double> phase_spread_pct(std::span<const double> phase_ohm) {
  if (phase_ohm.size() < 2) return std::nullopt;
  const auto [lo, hi] = std::minmax_element(phase_ohm.begin(), phase_ohm.end());
  const double mean = std::accumulate(phase_ohm.begin(), phase_ohm.end(), 0.0) /
                      static_cast<double>(phase_ohm.size());
  if (mean <= 0) return std::nullopt;
  return (*hi - *lo) / mean * 100.0;
}

double change_pct(double value_ohm, double reference_ohm) {
  return (value_ohm - reference_ohm) / reference_ohm * 100.0;
}

bool winding_within_limits(std::optional<double> spread_pct, std::optional<double> change,
                           double spread_limit_pct, double change_limit_pct) {
  if (spread_pct && *spread_pct > spread_limit_pct) return false;
  if (change && std::fabs(*change) > change_limit_pct) return false;
  return true;
}

}  // namespace ferrum::analytics::electrical
