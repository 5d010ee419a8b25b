#include "analytics/assess_unit.h"

#include "analytics/action_plan.h"
#include "analytics/held_back.h"
#include "analytics/site_earth_check.h"
#include "analytics/standard_tables.h"
#include "analytics/electrical/electrical_assessment.h"

namespace ferrum::analytics {

UnitAssessment assess_unit(const UnitData& data, Day as_of, const AssessmentOptions& options) {
  UnitAssessment a;
  a.unit = data.info;
  a.as_of = as_of;
  a.work_status = data.work_status;
  assess_oil(data, as_of, options.oil, a);
  assess_thermal(data, as_of, options.thermal, a);
  assess_electrical(data, options.electrical, a);
  add_site_earth_check(data, as_of, options.site_earth, a);
  a.held_back = newer_held_back(data);
  // The index reads the oil and thermal parts; the life reads the index.
  score_health(options.health, a);
  estimate_remaining_life(options.life, a);
  ActionPlanOptions actions = options.actions;
  // One cooling threshold: the one the thermal part uses for its action.
  actions.decision.cooling_discrepancy_k = options.thermal.discrepancy_threshold_k;
  actions.decision.chronic_items = options.life.chronic_items;
  finalize_actions(actions, a);
  for (const TableInfo& t : standard_tables().info)
    a.tables.push_back({t.title(), t.status_text(), t.origin, t.status == kStatusUnverified});
  return a;
}

}  // namespace ferrum::analytics
