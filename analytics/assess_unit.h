// The whole assessment of one unit on one day: oil and gases, thermal and
// field findings, health index, remaining life and the action list, in that
// order (each step reads what the previous ones filled). Pure: the caller
// passes every input and the day; nothing is read from a clock or a file.
// The methods and their sources are named in the headers of the steps:
// analytics/oil_assessment.h, analytics/thermal_assessment.h,
// analytics/health_index.h, analytics/remaining_life.h,
// analytics/action_plan.h,
// analytics/decision/decision.h.
#pragma once

#include "analytics/action_plan.h"
#include "analytics/site_earth_check.h"
#include "analytics/assessment.h"
#include "analytics/electrical/electrical_assessment.h"
#include "analytics/health_index.h"
#include "analytics/oil_assessment.h"
#include "analytics/remaining_life.h"
#include "analytics/thermal_assessment.h"
#include "analytics/unit_data.h"

namespace ferrum::analytics {

struct AssessmentOptions {
  OilOptions oil;
  ThermalOptions thermal;
  ElectricalOptions electrical;
  HealthIndexOptions health;
  RemainingLifeOptions life;
  ActionPlanOptions actions;  // with the decision's thresholds ([ranking] in ferrum.ini)
  SiteEarthOptions site_earth;  // an earth stolen at another unit of the site: check this one's
};

// Sets unit and as_of, then runs assess_oil, assess_thermal, assess_electrical, score_health,
// estimate_remaining_life and finalize_actions. Never throws on odd data: each
// step records what it could not do in `missing` / `assumptions`.
UnitAssessment assess_unit(const UnitData& data, Day as_of, const AssessmentOptions& options);

}  // namespace ferrum::analytics
