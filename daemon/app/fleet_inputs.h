// The whole-fleet assessment behind `rank` and `plan`: the last one from
// ROOT/cache/ when nothing changed since (daemon/assess/ranking_cache.h),
// else a fresh one (with --fresh always), stored for next time. Either way
// each unit's ranking fields only (analytics::ranking_fields).
#pragma once

#include <vector>

#include "analytics/assessment.h"
#include "daemon/app/command_line.h"
#include "daemon/app/site_context.h"

namespace ferrum::app {

std::vector<analytics::UnitAssessment> fleet_ranking_inputs(const Invocation& inv, SiteContext& site, analytics::Day as_of);

}  // namespace ferrum::app
