#include "analytics/electrical/insulation_power_factor.h"

#include <cmath>

namespace ferrum::analytics::electrical {

InsulationPfCheck check_insulation_pf(double power_factor_pct, double temp_c,
                                      std::optional<double> correction_factor,
                                      std::optional<double> capacitance_pf,
                                      std::optional<double> reference_capacitance_pf,
                                      double limit_pct) {
  InsulationPfCheck c;
  c.power_factor_pct = power_factor_pct;
  if (correction_factor && *correction_factor > 0) {
    c.pf20_pct = power_factor_pct * *correction_factor;
    c.corrected = true;
  } else if (std::fabs(temp_c - 20.0) <= 0.5) {
    c.pf20_pct = power_factor_pct;  // measured at the reference temperature
  }
  if (c.pf20_pct) c.within_limit = *c.pf20_pct <= limit_pct;
  if (capacitance_pf && reference_capacitance_pf && *reference_capacitance_pf > 0)
    c.capacitance_change_pct = (*capacitance_pf - *reference_capacitance_pf) / *reference_capacitance_pf * 100.0;
  return c;
}

}  // namespace ferrum::analytics::electrical
