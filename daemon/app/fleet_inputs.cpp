#include "daemon/app/fleet_inputs.h"

#include "daemon/app/progress_display.h"
#include "daemon/assess/assessment_service.h"
#include "daemon/assess/ranking_cache.h"

namespace ferrum::app {

void for_each_fleet_ranking_input(const Invocation& inv, SiteContext& site, analytics::Day as_of,
                                  const std::function<void(analytics::RankingInput&&)>& each,
                                  const std::function<void()>& restart) {
  // The key before the first read: an import meanwhile changes it (ranking_cache.h).
  const std::string cache_key = assess::ranking_cache_key(site.root, *site.store, as_of);
  if (!inv.has("fresh")) {
    bool given = false;
    if (assess::read_ranking_cache(site.root, cache_key, [&](analytics::RankingInput&& u) {
          given = true;
          each(std::move(u));
        }))
      return;
    if (given) restart();
  }
  // Assessed anew: each assessment is cut to its ranking input as it comes,
  // handed on and written to the cache, so peak memory does not grow with
  // the fleet, and the caller gets what the cache would have given.
  ProgressDisplay progress("assessing", "units", inv.has("quiet"));
  const auto ids = assess::register_unit_ids(*site.store);
  assess::RankingCacheWriter cache(site.root, cache_key, ids.size());
  assess::for_each_fleet_assessment(
      *site.store, ids, as_of, assess::options_from_config(site.config, &site.root),
      [&](analytics::UnitAssessment&& a) {
        auto input = analytics::ranking_input(a);
        cache.add(input);
        each(std::move(input));
      },
      [&](const char*, std::size_t done, std::size_t total) {
        progress.update(static_cast<double>(done), static_cast<double>(total));
      });
  progress.finish();
  cache.commit();
}

std::vector<analytics::RankingInput> fleet_ranking_inputs(const Invocation& inv, SiteContext& site, analytics::Day as_of) {
  std::vector<analytics::RankingInput> inputs;
  inputs.reserve(assess::register_unit_ids(*site.store).size());  // grown by doubling, it held up to twice the fleet
  for_each_fleet_ranking_input(
      inv, site, as_of, [&](analytics::RankingInput&& u) { inputs.push_back(std::move(u)); }, [&] { inputs.clear(); });
  return inputs;
}

}  // namespace ferrum::app
