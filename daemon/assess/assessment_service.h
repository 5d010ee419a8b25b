// The edge between the store and the pure analytics: reads a unit's data,
// maps the site configuration onto the analytics options, and runs the
// assessment. No rendering here.
#pragma once

#include <functional>
#include <string>
#include <vector>

#include "analytics/assess_unit.h"
#include "analytics/site_view.h"
#include "analytics/assessment.h"
#include "analytics/fleet_ranking.h"
#include "daemon/config/site_config.h"
#include "daemon/site/site_root.h"
#include "schema/store.h"

namespace ferrum::assess {

// Analytics options from ferrum.ini. With a root, the site's corrected copies
// of the standard tables (ROOT/tables/) are read and installed first
// (site_tables.h): the options' defaults come from the tables in force.
analytics::AssessmentOptions options_from_config(const config::SiteConfig& config, const site::SiteRoot* root);

analytics::UnitAssessment assess_unit(store::Store& store, const std::string& unit_id, analytics::Day as_of,
                                      const analytics::AssessmentOptions& options);

// Every unit in the register, in unit_id order.
std::vector<analytics::UnitAssessment> assess_fleet(store::Store& store, analytics::Day as_of,
                                                    const analytics::AssessmentOptions& options);

// Runs work(store, i) for every i in [0, n) on `workers` threads (0: one
// per core), each with its own connection to the database of `database`
// (Store::open_another: a connection serves one thread at a time; SQLite's
// WAL lets the readers run beside a writer), and emit(i) on the calling
// thread in the order of i while the workers go on. The workers run at most
// a bounded window ahead of emit, so what they leave for it does not grow
// with n. A worker's exception stops the others and is rethrown here, as is
// one from emit.
void run_in_order(const store::Store& database, std::size_t n, unsigned workers,
                  const std::function<void(store::Store&, std::size_t)>& work,
                  const std::function<void(std::size_t)>& emit);

// Assesses `ids` through run_in_order; `emit` gets the assessments in the
// order of `ids`, on the calling thread.
void assess_units_parallel(const store::Store& store, const std::vector<std::string>& ids, analytics::Day as_of,
                           const analytics::AssessmentOptions& options, unsigned workers,
                           const std::function<void(analytics::UnitAssessment&&)>& emit);

// Progress of a whole-fleet task: what it is doing ("assessing", "unit
// reports"), how many of how many are done. Called on the calling thread.
using FleetProgress = std::function<void(const char* stage, std::size_t done, std::size_t total)>;

// The register's unit ids, in unit_id order.
std::vector<std::string> register_unit_ids(store::Store& store);

// The units `ids` (the whole fleet: register_unit_ids), assessed in parallel
// and handed to `emit` one at a time (memory does not grow with the fleet),
// with progress as "assessing".
void for_each_fleet_assessment(store::Store& store, const std::vector<std::string>& ids, analytics::Day as_of,
                               const analytics::AssessmentOptions& options,
                               const std::function<void(analytics::UnitAssessment&&)>& emit,
                               const FleetProgress& progress = {});

// Every unit in the register, in unit_id order, kept in a vector.
std::vector<analytics::UnitAssessment> assess_fleet_parallel(store::Store& store,
                                                             analytics::Day as_of,
                                                             const analytics::AssessmentOptions& options,
                                                             const FleetProgress& progress = {});

analytics::RankingOptions ranking_options_from_config(const config::SiteConfig& config);

// The site view's options ([analysis] site_wet_paper_pct).
analytics::SiteViewOptions site_view_options_from_config(const config::SiteConfig& config);

// The site view of assessed units, written into them (site lines, load
// transfer targets): analytics::site_view then apply_site_view.
std::vector<analytics::SiteView> apply_site_view(std::vector<analytics::UnitAssessment>& units,
                                                 const config::SiteConfig& config);
std::vector<analytics::SiteView> apply_site_view(std::vector<analytics::RankingInput>& units,
                                                 const config::SiteConfig& config);

}  // namespace ferrum::assess
