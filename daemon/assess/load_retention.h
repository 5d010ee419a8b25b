// The retention rule of the load series, [store] keep_load_points_years:
// for every unit, raw load points older than the limit are replaced by daily
// thermal summaries and the thermal model's state where they were cut
// (analytics/load_history.h), one transaction per unit, so that the thermal
// assessment reads the same figures afterwards (thermal_assessment.cpp).
#pragma once

#include <cstddef>

#include "analytics/calendar.h"
#include "daemon/config/site_config.h"
#include "daemon/site/site_root.h"
#include "schema/store.h"

namespace ferrum::assess {

// The first second kept raw: the start of the day `years` before `today`
// (29 February going back to a year without it: 1 March).
analytics::Timestamp load_retention_cut(analytics::Day today, int years);

// Applies the rule as of `today` (does nothing when the key is not set);
// returns the number of units whose old points were summarised.
std::size_t apply_load_retention(store::Store& store, const config::SiteConfig& config, const site::SiteRoot* root,
                                 analytics::Day today);

}  // namespace ferrum::assess
