// The whole-fleet assessment behind `rank` and `plan`: the last one from
// ROOT/cache/ when nothing changed since (daemon/assess/ranking_cache.h),
// else a fresh one (with --fresh always), stored for next time. Either way
// each unit's ranking input only (analytics/ranking_input.h).
#pragma once

#include <functional>
#include <vector>

#include "analytics/ranking_input.h"
#include "daemon/app/command_line.h"
#include "daemon/app/site_context.h"

namespace ferrum::app {

std::vector<analytics::RankingInput> fleet_ranking_inputs(const Invocation& inv, SiteContext& site, analytics::Day as_of);

// The same a unit at a time, so that nothing of the fleet need be held:
// `each` gets the units in register order. A cache found damaged part-way
// is abandoned for a fresh assessment, after `restart` (forget the units
// given so far).
void for_each_fleet_ranking_input(const Invocation& inv, SiteContext& site, analytics::Day as_of,
                                  const std::function<void(analytics::RankingInput&&)>& each,
                                  const std::function<void()>& restart);

}  // namespace ferrum::app
