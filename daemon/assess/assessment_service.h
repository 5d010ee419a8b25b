// The edge between the store and the pure analytics: reads a unit's data,
// maps the site configuration onto the analytics options, and runs the
// assessment. No rendering here.
#pragma once

#include <string>
#include <vector>

#include "analytics/assess_unit.h"
#include "analytics/assessment.h"
#include "analytics/fleet_ranking.h"
#include "daemon/config/site_config.h"
#include "daemon/site/site_root.h"
#include "schema/store.h"

namespace ferrum::assess {

// Analytics options from ferrum.ini, with the IEEE C57.104-2019 tables read
// from ROOT/tables/ when the site keeps its own (corrected) copy there.
analytics::AssessmentOptions options_from_config(const config::SiteConfig& config, const site::SiteRoot* root);

analytics::UnitAssessment assess_unit(store::Store& store, const std::string& unit_id, analytics::Day as_of,
                                      const analytics::AssessmentOptions& options);

// Every unit in the register, in unit_id order.
std::vector<analytics::UnitAssessment> assess_fleet(store::Store& store, analytics::Day as_of,
                                                    const analytics::AssessmentOptions& options);

analytics::RankingOptions ranking_options_from_config(const config::SiteConfig& config);

}  // namespace ferrum::assess
