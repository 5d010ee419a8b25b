// Turns assessments into files: unit reports, the fleet report (PDF + CSV),
// the weekly bundle and alert PDFs. Used by `ferrum report` and the daemon.
// All files are written atomically (the report library renders to a
// temporary name and renames).
#pragma once

#include <cstdint>
#include <filesystem>
#include <functional>
#include <optional>
#include <string>
#include <vector>

#include "analytics/assessment.h"
#include "analytics/assess_unit.h"
#include "analytics/fleet_ranking.h"
#include "daemon/assess/assessment_service.h"
#include "daemon/config/site_config.h"
#include "daemon/site/site_root.h"
#include "report/plan_report.h"
#include "schema/store.h"

namespace ferrum::reporting {

class ReportWriter {
 public:
  ReportWriter(const site::SiteRoot& root, const config::SiteConfig& config, store::Store& store);

  // Told how far fleet_report and weekly_bundle are (assessing, unit reports).
  void set_progress(assess::FleetProgress progress) { progress_ = std::move(progress); }

  // One unit's PDF in `out_dir` (ferrum-UNIT-YYYY-MM-DD.pdf). The "what
  // changed" part compares with the unit's data as it stood at its previous
  // report (or a week earlier when there was none).
  std::filesystem::path unit_report(const std::string& unit_id, analytics::Day as_of,
                                    const std::filesystem::path& out_dir);

  // The reports of several units, each the file unit_report writes for it,
  // with each unit of their sites assessed once for all of them and the
  // ranking cache read at most once. A unit's report needs its site's view,
  // which needs every unit of the site assessed: one by one, the reports of
  // every unit of an n-unit site cost n² assessments (the daemon after a
  // file naming them all; `ferrum report` naming them). Never throws: per
  // unit, in the order given, its path or why it failed. `assessed`, when
  // given, sees each wanted unit's assessment (without its site view) before
  // its report is rendered: the daemon checks its alerts on it instead of
  // assessing the unit a second time.
  struct UnitReportOutcome {
    std::string unit_id;
    std::filesystem::path path;  // empty when it failed
    std::string error;
  };
  std::vector<UnitReportOutcome> unit_reports_by_id(
      const std::vector<std::string>& unit_ids, analytics::Day as_of, const std::filesystem::path& out_dir,
      const std::function<void(const analytics::UnitAssessment&)>& assessed = {});

  struct FleetFiles {
    std::filesystem::path pdf, csv, sites_csv;  // sites_csv: ferrum-fleet-sites-DATE.csv (site view)
  };
  FleetFiles fleet_report(analytics::Day as_of, const std::filesystem::path& out_dir);

  // reports/YYYY-Www/: every unit report, the fleet report and index.pdf.
  // An existing week folder is left untouched; returns its path either way.
  std::filesystem::path weekly_bundle(analytics::Day as_of);

  // reports/alerts/alert-UNIT-KIND-TIME.pdf (one per alert: -2, -3 when the
  // name is taken) and a line in reports/alerts/alerts.csv naming it. The time
  // (UTC seconds) is printed in site time (config::site_timestamp); the store
  // keeps it in UTC.
  std::filesystem::path alert(const std::string& unit_id, const std::string& kind, const std::string& text,
                              const std::string& first_step, std::int64_t at_utc);

  // Assessment of a unit (also used for alerts).
  analytics::UnitAssessment assess(const std::string& unit_id, analytics::Day as_of);

  static std::string week_label(analytics::Day d);  // "2026-W49"

 private:
  analytics::FleetRanking rank(const std::vector<analytics::UnitAssessment>& units, analytics::Day as_of);
  // The ten-year plan of the fleet report, when ferrum.ini [plan] sets a
  // budget; marks each ranked unit with where the plan puts its action
  // (analytics::apply_plan), so that every list of the ranking shows it.
  report::PlanSection plan_section(analytics::FleetRanking& ranking, analytics::Day as_of);
  FleetFiles fleet_files(const std::vector<analytics::UnitAssessment>& units, const analytics::FleetRanking& ranking,
                         const report::PlanSection& plan, const std::vector<analytics::SiteView>& sites,
                         analytics::Day as_of, const std::filesystem::path& out_dir);
  // The fleet ranking with the budget plan applied, made from the ranking
  // inputs of the last whole-fleet assessment when they are still current
  // (daemon/assess/ranking_cache.h); read once per unit_reports_by_id call.
  struct CachedPlan {
    bool read = false;
    std::optional<analytics::FleetRanking> ranking;  // none: no current cache, or no plan
  };
  // Where the budget plan puts one unit's action, for its report alone: from
  // the cached plan when there is one, else not_known (or none when the
  // action is not one the plan funds or no plan is configured).
  analytics::PlanSchedule unit_plan_schedule(const analytics::UnitAssessment& unit, analytics::Day as_of,
                                             CachedPlan& plan);
  // The weekly bundle's unit reports, one per assessment (site view applied),
  // rendered on one thread per core; paths in the order of `units`.
  std::vector<std::filesystem::path> unit_reports(const std::vector<analytics::UnitAssessment>& units,
                                                  const std::vector<analytics::SiteView>& sites, analytics::Day as_of,
                                                  const std::filesystem::path& out_dir);

  site::SiteRoot root_;
  config::SiteConfig config_;
  store::Store& store_;
  analytics::AssessmentOptions options_;
  assess::FleetProgress progress_;
};

// UnitData as it stood at the end of `day` (later records dropped).
analytics::UnitData data_as_of(const analytics::UnitData& d, analytics::Day day);

}  // namespace ferrum::reporting
