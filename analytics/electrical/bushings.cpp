#include "analytics/electrical/bushings.h"

#include <algorithm>
#include <cmath>

namespace ferrum::analytics::electrical {

BushingCheck check_bushing(std::optional<double> power_factor_pct,
                           std::optional<double> nameplate_power_factor_pct,
                           std::optional<double> capacitance_pf,
                           std::optional<double> nameplate_capacitance_pf) {
  BushingCheck c;
  if (capacitance_pf && nameplate_capacitance_pf && *nameplate_capacitance_pf > 0) {
    c.capacitance_change_pct =
        (*capacitance_pf - *nameplate_capacitance_pf) / *nameplate_capacitance_pf * 100.0;
    const double change = std::fabs(*c.capacitance_change_pct);
    if (change > kBushingCapOutOfServicePct) c.verdict = BushingVerdict::out_of_service;
    else if (change > kBushingCapInvestigatePct) c.verdict = BushingVerdict::investigate;
  }
  if (power_factor_pct && nameplate_power_factor_pct && *nameplate_power_factor_pct > 0 &&
      *power_factor_pct > kBushingPfFactor * *nameplate_power_factor_pct)
    c.verdict = std::max(c.verdict, BushingVerdict::investigate);
  c.within_limit = c.verdict == BushingVerdict::acceptable;
  return c;
}

const char* bushing_verdict_name(BushingVerdict verdict) {
  switch (verdict) {
    case BushingVerdict::acceptable: return "acceptable";
    case BushingVerdict::investigate: return "investigate";
    case BushingVerdict::out_of_service: return "out of service";
  }
  return "unknown";
}

}  // namespace ferrum::analytics::electrical
