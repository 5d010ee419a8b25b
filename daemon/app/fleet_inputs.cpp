#include "daemon/app/fleet_inputs.h"

#include "daemon/app/progress_display.h"
#include "daemon/assess/assessment_service.h"
#include "daemon/assess/ranking_cache.h"

namespace ferrum::app {

std::vector<analytics::RankingInput> fleet_ranking_inputs(const Invocation& inv, SiteContext& site, analytics::Day as_of) {
  // The key before the first read: an import meanwhile changes it (ranking_cache.h).
  const std::string cache_key = assess::ranking_cache_key(site.root, *site.store, as_of);
  auto units = inv.has("fresh") ? std::nullopt : assess::read_ranking_cache(site.root, cache_key);
  if (units) return std::move(*units);
  // Assessed anew: each assessment is cut to its ranking input as it comes,
  // so peak memory does not grow with the fleet, and the caller gets what
  // the cache would have given.
  ProgressDisplay progress("assessing", "units", inv.has("quiet"));
  const auto ids = assess::register_unit_ids(*site.store);
  std::vector<analytics::RankingInput> inputs;
  inputs.reserve(ids.size());  // grown by doubling, the vector held up to twice the fleet
  assess::for_each_fleet_assessment(
      *site.store, ids, as_of, assess::options_from_config(site.config, &site.root),
      [&](analytics::UnitAssessment&& a) { inputs.push_back(analytics::ranking_input(a)); },
      [&](const char*, std::size_t done, std::size_t total) {
        progress.update(static_cast<double>(done), static_cast<double>(total));
      });
  progress.finish();
  assess::write_ranking_cache(site.root, cache_key, inputs);
  return inputs;
}

}  // namespace ferrum::app
