// The budgeted plan (analytics/plan) as JSON for `ferrum plan --json`. An
// unlimited budget is null.
#pragma once

#include <Poco/JSON/Object.h>

#include "analytics/plan/plan.h"

namespace ferrum::assess {

Poco::JSON::Object::Ptr to_json(const analytics::FleetPlan& p);

}  // namespace ferrum::assess
