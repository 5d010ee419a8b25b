// Fleet documents: the ranking report (PDF), the ranking as CSV, and the
// weekly bundle index page. Like the unit report they lay out what the
// analytics produced (analytics::FleetRanking) and compute nothing.
#pragma once

#include <iosfwd>
#include <string>
#include <utility>
#include <vector>

#include "analytics/assessment.h"
#include "analytics/fleet_ranking.h"
#include "analytics/site_view.h"
#include "report/plan_report.h"
#include "report/render_error.h"
#include "report/planner_week.h"
#include "report/report_options.h"

namespace ferrum::report {

// Data older than this is listed as stale in the coverage table (display
// choice, one year, matching the usual annual oil and infrared rounds).
inline constexpr double kStaleDataYears = 1.0;

// Ranking table (risk order), distribution of units over bands, rated MVA
// due per year (ten years), open alerts (one line each) and data coverage
// from each unit's missing/freshness lists; the ten-year plan when `plan` is
// given and configured (report/plan_section.cpp); safety cautions at the end.
// Written atomically; throws RenderError.
void render_fleet_report(const analytics::FleetRanking& ranking, const std::vector<analytics::UnitAssessment>& units,
                         const std::vector<std::string>& open_alerts, const ReportOptions& options,
                         const std::string& path, const PlanSection* plan = nullptr,
                         const std::vector<analytics::SiteView>* sites = nullptr);

// The ranking as CSV (RFC 4180 quoting, "\n" line ends, header row first).
// Absent values are empty fields. The writer streams a row at a time (`rank
// --csv` at 20,000 units would otherwise hold a 60 MB string beside the
// ranking); the string form is for files written atomically and tests.
void write_fleet_ranking_csv(std::ostream& out, const analytics::FleetRanking& ranking);
void write_fleet_ranking_csv(std::ostream& out, const analytics::RankedRows& rows);  // the rows from elsewhere
std::string fleet_ranking_csv(const analytics::FleetRanking& ranking);

// The week's cover: the planner's week first (actions due in 7 and 30 days,
// changes since last week, alerts, files per party, overdue samples and
// inspections: planner_week.h), then the week's unit reports with unit, site,
// health index, band and file name, in ranking order. `unit_report_files`
// holds (unit_id, file name). Written atomically; throws RenderError.
void render_weekly_index(const std::string& week_label, const analytics::FleetRanking& ranking,
                         const std::vector<std::pair<std::string, std::string>>& unit_report_files,
                         const PlannerWeek& week, const ReportOptions& options, const std::string& path);

}  // namespace ferrum::report
