#include "daemon/assess/load_retention.h"

#include <spdlog/spdlog.h>

#include <climits>
#include <memory>

#include "analytics/load_history.h"
#include "daemon/assess/assessment_service.h"

namespace ferrum::assess {

analytics::Timestamp load_retention_cut(analytics::Day today, int years) {
  const auto c = analytics::civil_from_days(today);
  const int y = c.year - years;
  const bool leap = (y % 4 == 0 && y % 100 != 0) || y % 400 == 0;
  const analytics::Day day = c.month == 2 && c.day == 29 && !leap ? analytics::days_from_civil(y, 3, 1)
                                                                  : analytics::days_from_civil(y, c.month, c.day);
  return analytics::start_of(day);
}

std::size_t apply_load_retention(store::Store& store, const config::SiteConfig& config, const site::SiteRoot* root,
                                 analytics::Day today) {
  const int years = config.store.keep_load_points_years;
  if (years <= 0) return 0;
  const analytics::Timestamp cut = load_retention_cut(today, years);
  const auto options = options_from_config(config, root).thermal;
  std::size_t changed = 0;
  for (const auto& unit : store.units()) {
    // Only the points older than the limit are read (one day of them, run daily).
    const auto old = store.load_points(unit.unit_id, INT64_MIN, cut - 1);
    if (old.empty()) continue;
    const auto data = store.unit_data(unit.unit_id);  // the summarised days so far, if any
    analytics::LoadHistory history = data.load_history ? *data.load_history : analytics::LoadHistory{};
    analytics::summarise_load_before(analytics::resolve_thermal_model(data.info, options.method), options.gaps,
                                     options.limits, old, cut, history);
    store.begin();
    try {
      store.keep_load_history(unit.unit_id, history);
      store.commit();
    } catch (...) {
      store.rollback();
      throw;
    }
    spdlog::info("load retention: {} load points of {} before {} summarised by day", old.size(), unit.unit_id,
                 analytics::format_day(analytics::day_of(cut)));
    ++changed;
  }
  return changed;
}

}  // namespace ferrum::assess
