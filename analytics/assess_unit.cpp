#include "analytics/assess_unit.h"

#include "analytics/action_plan.h"
#include "analytics/standard_tables.h"

namespace ferrum::analytics {

UnitAssessment assess_unit(const UnitData& data, Day as_of, const AssessmentOptions& options) {
  UnitAssessment a;
  a.unit = data.info;
  a.as_of = as_of;
  assess_oil(data, as_of, options.oil, a);
  assess_thermal(data, as_of, options.thermal, a);
  // The index reads the oil and thermal parts; the life reads the index.
  score_health(options.health, a);
  estimate_remaining_life(options.life, a);
  finalize_actions(a);
  for (const TableInfo& t : standard_tables().info)
    a.tables.push_back({t.title(), t.status_text(), t.origin, t.status == kStatusUnverified});
  return a;
}

}  // namespace ferrum::analytics
