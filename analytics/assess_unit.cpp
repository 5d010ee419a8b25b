#include "analytics/assess_unit.h"

#include "analytics/action_plan.h"
#include "analytics/electrical/electrical_assessment.h"

namespace ferrum::analytics {

UnitAssessment assess_unit(const UnitData& data, Day as_of, const AssessmentOptions& options) {
  UnitAssessment a;
  a.unit = data.info;
  a.as_of = as_of;
  assess_oil(data, as_of, options.oil, a);
  assess_thermal(data, as_of, options.thermal, a);
  assess_electrical(data, options.electrical, a);
  // The index reads the oil and thermal parts; the life reads the index.
  score_health(options.health, a);
  estimate_remaining_life(options.life, a);
  finalize_actions(a);
  return a;
}

}  // namespace ferrum::analytics
