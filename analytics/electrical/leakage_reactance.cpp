#include "analytics/electrical/leakage_reactance.h"

#include <cmath>

namespace ferrum::analytics::electrical {

ReactanceCheck check_leakage_reactance(double measured_pct, double nameplate_pct, bool per_phase) {
  ReactanceCheck c;
  c.change_pct = (measured_pct - nameplate_pct) / nameplate_pct * 100.0;
  const double limit = per_phase ? kReactancePerPhaseLimitPct : kReactanceThreePhaseLimitPct;
  c.within_limit = std::fabs(c.change_pct) <= limit;
  return c;
}

}  // namespace ferrum::analytics::electrical
