#include "report/fleet_report.h"
#include "report/safety_text.h"

#include <gtest/gtest.h>

#include <algorithm>

#include "report/alert_report.h"
#include "report/plan_report.h"
#include "report/site_section.h"
#include "tests/report/pdf_tools.h"
#include "tests/report/report_fixtures.h"

namespace ferrum::report {
namespace {
using namespace testing;

using FleetReportTest = RenderedPdfTest;

TEST_F(FleetReportTest, RankingChartsAlertsAndCoverage) {
  const auto ranking = fixtures::small_ranking();
  const std::vector<analytics::UnitAssessment> units = {fixtures::filled_unit(), fixtures::empty_unit()};
  const std::string path = temp_path("fleet.pdf");
  render_fleet_report(ranking, units, {"T-204: acetylene rising (raised 2026-11-30 06:10 UTC)"}, fixed_options(), path);
  ASSERT_TRUE(qpdf_check(path));
  const std::string text = squash(pdf_raw_text(path));
  for (const char* s : {"Ranking by risk", "Condition bands and replacement outlook", "Units with open alerts",
                        "Data coverage", "SAFETY", "T-204", "T-117", "T-031", "T-990", "Kelder Road 132 kV",
                        "acetylene rising", "Rated MVA due for replacement", "2030", "refurbish",
                        "too little data: no oil, load or inspection data", "more than",
                        "P1 by 2026-12-07: Make safe or take out of service: grounding",
                        "Remaining life ending within ten years", "failures per 1,000 unit-years"})
    EXPECT_NE(text.find(s), std::string::npos) << s;
  // Ranking order is kept: T-204 (rank 1) is listed before T-117 (rank 2) and T-031 (rank 3).
  EXPECT_LT(text.find("T-204"), text.find("T-117"));
  EXPECT_LT(text.find("T-117"), text.find("T-031"));
  // The tied units carry the "=" mark.
  EXPECT_NE(text.find("4="), std::string::npos);
  // Coverage lists the empty unit's missing data.
  EXPECT_NE(text.find("oil: none"), std::string::npos);
}

// The site view in the fleet report and its CSV: a site that fails N-1 is
// flagged, a rating of 7.5 MVA prints as 7.5 (N-1 and the sum of peaks:
// common planning practice, no published source; the numbers are checked in
// tests/analytics/site_view_test.cpp).
TEST_F(FleetReportTest, SitesSectionFlagsNMinusOneAndCsvListsUnits) {
  auto ranking = fixtures::small_ranking();
  ranking.units[0].rated_mva = 7.5;
  auto a = fixtures::filled_unit();
  a.unit.unit_id = "T-204";
  a.unit.site = "Kelder Road 132 kV";
  a.unit.rated_mva = 45;
  a.thermal.peak_load_pu = 0.8;
  a.thermal.emergency_load_pu = 1.3;
  auto b = a;
  b.unit.unit_id = "T-205";
  b.unit.rated_mva = 7.5;
  b.oil.paper_moisture_pct = 3.4;  // wet: takes no transferred load
  const std::vector<analytics::UnitAssessment> units = {a, b};
  const auto sites = analytics::site_view(units, {});
  ASSERT_TRUE(sites.at(0).flagged());
  const std::string path = temp_path("fleet-sites.pdf");
  render_fleet_report(ranking, units, {}, fixed_options(), path, nullptr, &sites);
  ASSERT_TRUE(qpdf_check(path));
  const std::string text = squash(pdf_raw_text(path));
  for (const char* s : {"Sites and N-1", "FAILS", "Units that take no transferred load", "T-205 takes no transferred load",
                        "wet paper (3.4 % water", "N-1 fails: with T-204", "7.5"})
    EXPECT_NE(text.find(s), std::string::npos) << s;
  const std::string csv = fleet_sites_csv(sites);
  EXPECT_EQ(csv.rfind("site,installed_mva,site_peak_load_mva,n1_unit_out,n1_capacity_mva,n1_margin_mva,n1,unit_id,", 0), 0u);
  EXPECT_NE(csv.find("Kelder Road 132 kV,52.5,"), std::string::npos);
  EXPECT_NE(csv.find(",fail,T-205,7.5,"), std::string::npos);
  EXPECT_NE(csv.find("wet paper (3.4 % water, above 2.5 %)"), std::string::npos);
}

// The plan section's heading follows the horizon; a plan that follows a smaller budget's
// allocation says so; a configured plan without costs says why. Layout only: the plan's numbers
// are checked in tests/analytics/plan_test.cpp.
TEST_F(FleetReportTest, PlanSectionHeadingFollowsTheHorizon) {
  analytics::PlanUnit a;
  a.unit_id = "T-204";
  a.site = "Kelder Road 132 kV";
  a.health_index = 35;
  a.remaining_life_years = 3;
  a.action = "replace";
  a.action_year = 2026;
  a.consequence = 0.8;
  a.rated_mva = 40;
  a.replacement_cost = 1200000;
  analytics::CostOptions costs;
  costs.currency = "GBP";
  analytics::PlanOptions o;
  o.horizon_years = 5;
  o.budget_per_year = 800000;
  o.carry_over = true;
  PlanSection section;
  section.configured = true;
  section.plan = analytics::plan_fleet({a}, analytics::days_from_civil(2026, 11, 30), costs, o);
  section.plan->allocation_budget = 600000;  // as if a smaller allocation had been chosen
  const std::string path = temp_path("fleet-plan.pdf");
  render_fleet_report(fixtures::small_ranking(), {}, {}, fixed_options(), path, &section);
  ASSERT_TRUE(qpdf_check(path));
  std::string text = squash(pdf_raw_text(path));
  for (const char* s : {"Five-year plan", "800,000 GBP a year", "T-204 replace 1,200,000, 40 MVA", "without any plan",
                        "unlimited budget", "as a budget of 600,000 GBP a year would fund them", "Method and assumptions",
                        "CIGRE TB 761"})
    EXPECT_NE(text.find(s), std::string::npos) << s;
  EXPECT_EQ(text.find("Ten-year plan"), std::string::npos);

  PlanSection missing;
  missing.configured = true;
  missing.horizon_years = 12;
  missing.unavailable = "costs.cost_per_mva_class2 is not set";
  render_fleet_report(fixtures::small_ranking(), {}, {}, fixed_options(), path, &missing);
  text = squash(pdf_raw_text(path));
  EXPECT_NE(text.find("Twelve-year plan"), std::string::npos);
  EXPECT_NE(text.find("No plan: costs.cost_per_mva_class2 is not set"), std::string::npos);
}

TEST_F(FleetReportTest, EmptyFleetStillRenders) {
  const std::string path = temp_path("fleet-empty.pdf");
  render_fleet_report({}, {}, {}, fixed_options(), path);
  ASSERT_TRUE(qpdf_check(path));
  const std::string text = squash(pdf_raw_text(path));
  EXPECT_NE(text.find("No units in the ranking."), std::string::npos);
  EXPECT_NE(text.find("No open alerts."), std::string::npos);
}

TEST_F(FleetReportTest, WeeklyIndexListsReportsInRankingOrder) {
  const std::string path = temp_path("weekly.pdf");
  render_weekly_index("2026-W49", fixtures::small_ranking(),
                      {{"T-031", "T-031_2026-11-30.pdf"}, {"T-204", "T-204_2026-11-30.pdf"}, {"T-777", "T-777_2026-11-30.pdf"}},
                      PlannerWeek{}, fixed_options(), path);
  ASSERT_TRUE(qpdf_check(path));
  const std::string text = squash(pdf_raw_text(path));
  EXPECT_NE(text.find("2026-W49"), std::string::npos);
  EXPECT_LT(text.find("T-204_2026-11-30.pdf"), text.find("T-031_2026-11-30.pdf"));
  EXPECT_LT(text.find("T-031_2026-11-30.pdf"), text.find("T-777_2026-11-30.pdf"));  // unknown unit last
  EXPECT_NE(text.find("T-031 Harbour West 81 good T-031_2026-11-30.pdf"), std::string::npos) << text;
  EXPECT_NE(text.find("T-777 — — — T-777_2026-11-30.pdf"), std::string::npos) << text;
  EXPECT_NE(text.find("SAFETY"), std::string::npos);
}

TEST_F(FleetReportTest, WeeklyCoverPutsThePlannersWeekFirst) {
  // Layout and wording only: the values are given, nothing is computed here.
  PlannerWeek w;
  w.week_label = "2026-W49";
  w.as_of = ferrum::analytics::days_from_civil(2026, 11, 30);
  w.units = 3;
  w.due_7 = {{w.as_of - 2, 1, "T-204", "Kelder Road 132 kV", "Resample the oil", 0,
              "acetylene rose between the last two samples; confirm before any outage"}};
  analytics::WorkListRow row;
  row.unit_id = "T-117";
  row.site = "Northgate";
  row.text = "Repair the breather";
  row.reason = "silica gel saturated at the last inspection";
  row.due = w.as_of + 40;
  w.work_list = {row};
  w.due_30 = {{w.as_of + 20, 2, "T-117", "Northgate", "Infrared survey", 0, ""}};
  w.needing_action = {{"T-117", "Northgate", "replace", 2030, "", {}}};
  w.have_previous_week = true;
  w.changes = {{"T-117", "Northgate", "band fair -> poor"}};
  w.alerts = {{"2026-11-28T10:00:00Z", "T-204", "acetylene", "acetylene appeared: 3 ppm"}};
  w.parties = {{"oil-lab", 4, 1, {"lab-week48.csv"}}};
  w.overdue = {{"T-031", "Harbour West", "inspection", std::nullopt}};
  const std::string path = temp_path("weekly-cover.pdf");
  render_weekly_index("2026-W49", fixtures::small_ranking(), {{"T-204", "T-204_2026-11-30.pdf"}}, w, fixed_options(), path);
  ASSERT_TRUE(qpdf_check(path));
  const std::string text = squash(pdf_raw_text(path));
  for (const char* s : {"2026-11-28 overdue T-204 Kelder Road 132 kV", "1 Resample the oil", "Infrared survey",
                        "band fair -> poor", "acetylene appeared: 3 ppm", "oil-lab 4", "1 lab-week48.csv",
                        "T-031 Harbour West inspection never", "T-117 Northgate replace", "SAFETY",
                        // The action lists carry a short reason (plumbing: no published source applies).
                        "Resample the oil acetylene rose between the last two samples",
                        "Repair the breather silica gel saturated at the last inspection"})
    EXPECT_NE(text.find(s), std::string::npos) << s << "\n" << text;
  EXPECT_EQ(text.find("confirm before any outage"), std::string::npos);  // short: the first clause
  // Plain words, not a configuration key (plumbing of the wording: no published source applies).
  EXPECT_EQ(text.find("[analysis]"), std::string::npos);
  EXPECT_NE(text.find("inspections after the site's inspection interval (365 days)"), std::string::npos);
  // The week comes before the list of reports.
  EXPECT_LT(text.find("Resample the oil"), text.find("T-204_2026-11-30.pdf"));
  // The first page, often printed alone, carries the one-line caution above the week's actions
  // (the full block stays at the end). Plumbing of the layout: no published source applies.
  EXPECT_LT(text.find("SAFETY: decision support only"), text.find("Resample the oil"));
  const std::string plain = planner_week_text(w);
  EXPECT_NE(plain.find("2026-11-28 OVERDUE  T-204 (Kelder Road 132 kV), priority 1: Resample the oil"), std::string::npos)
      << plain;
  EXPECT_NE(plain.find("oil-lab: 4 received, 1 rejected (lab-week48.csv)"), std::string::npos) << plain;
}

TEST_F(FleetReportTest, AlertIsOnePageWithSafetyBlock) {
  AlertInfo alert{"T-204", "Kelder Road 132 kV", "acetylene rising", "2026-11-30 06:10 UTC",
                  "C₂H₂ rose from 6.7 to 9.5 µL/L between the last two samples (IEEE C57.104-2019 status 2 → 3).",
                  "Resample oil for DGA within 48 hours; do not re-energise after any trip until an engineer has evaluated the unit."};
  const std::string path = temp_path("alert.pdf");
  render_alert(alert, fixed_options(), path);
  ASSERT_TRUE(qpdf_check(path));
  EXPECT_EQ(pdf_pages(path), 1);
  const std::string text = squash(pdf_raw_text(path));
  for (const char* s : {"What happened", "What to do first", "SAFETY", "T-204", "2026-11-30 06:10 UTC", "C₂H₂ rose",
                        "Resample oil for DGA within 48 hours", "NFPA 70E"})
    EXPECT_NE(text.find(s), std::string::npos) << s;
}

// The risk column is on the PDF's scale: 0.084 x 1,000 = 84 failures per
// 1,000 unit-years x consequence, as risk_text prints it (plumbing of the
// scale: no published source applies).
TEST(RankingCsv, HeaderRowsQuotingAndEmptyFields) {
  auto ranking = fixtures::small_ranking();
  ranking.units[1].site = "Northgate, \"old\" yard";
  const std::string csv = fleet_ranking_csv(ranking);
  const std::string header =
      "rank,tied,unit_id,site,rated_mva,health_index,band,remaining_life_years,beyond_horizon,limiting_factor,"
      "probability_of_failure,failures_per_1000_unit_years,consequence,risk,recommended_action,action_year,plan_year,"
      "first_action_priority,first_action_due,first_action_overdue,first_action_reference,first_action,action_reason,"
      "insufficient_data,note\n";
  ASSERT_EQ(csv.substr(0, header.size()), header);
  EXPECT_NE(csv.find("1,no,T-204,Kelder Road 132 kV,45,57.6,fair,11.5,no,paper,0.021,21,4,84,refurbish,2028,,1,"
                     "2026-12-07,no,T-204/inspection:grounding,Make safe or take out of service: grounding,,no,\n"),
            std::string::npos) << csv;
  EXPECT_NE(csv.find("T-031,Harbour West,60,81,good,40,yes,"), std::string::npos) << csv;
  EXPECT_NE(csv.find("\"Northgate, \"\"old\"\" yard\""), std::string::npos);
  EXPECT_NE(csv.find("4,yes,T-032"), std::string::npos);
  // Insufficient data: no rank, empty fields for absent values, the note quoted (it holds commas).
  EXPECT_NE(csv.find("\n,no,T-990,Marsh Lane,0,,,,no,,,,3,,,,,,,,,,,yes,\"no oil, load or inspection data\"\n"), std::string::npos)
      << csv;
  EXPECT_EQ(std::count(csv.begin(), csv.end(), '\n'), 8);  // header + 6 units + caution
  // The caution is the last line, a comment (report/safety_text.h).
  EXPECT_EQ(csv.substr(csv.size() - csv_caution_line().size() - 1), csv_caution_line() + "\n");
}

// An overdue first action says so, with the reference a planner quotes
// (issue #16).
TEST(RankingCsv, OverdueFirstActionMarked) {
  auto ranking = fixtures::small_ranking();
  ranking.units[0].first_action->overdue = true;
  const std::string csv = fleet_ranking_csv(ranking);
  EXPECT_NE(csv.find(",2026-12-07,yes,T-204/inspection:grounding,"), std::string::npos) << csv;
}

// Where the budget plan funds a unit's replacement later than the decision's
// year, every list of the ranking shows the plan's year beside it: the fleet
// report's ranking and life outlook, the CSV (plan_year), the cover and the
// summary. Plumbing of the plan's result (analytics::apply_plan): no published
// source applies.
TEST_F(FleetReportTest, ThePlansLaterYearStandsBesideTheActionYear) {
  auto ranking = fixtures::small_ranking();
  ranking.units[1].budget_plan = {analytics::PlanSchedule::State::later, 2032, 2035};   // T-117, replace 2030
  ranking.units[0].budget_plan = {analytics::PlanSchedule::State::unfunded, std::nullopt, 2035};  // T-204, refurbish 2028
  const std::string path = temp_path("fleet-plan-year.pdf");
  render_fleet_report(ranking, {}, {}, fixed_options(), path);
  const std::string text = squash(pdf_raw_text(path));
  EXPECT_NE(text.find("replace 2030 (budget plan: 2032)"), std::string::npos) << text;
  EXPECT_NE(text.find("refurbish 2028 (budget plan: not funded by 2035)"), std::string::npos) << text;
  const std::string csv = fleet_ranking_csv(ranking);
  EXPECT_NE(csv.find(",replace,2030,2032,"), std::string::npos) << csv;
  EXPECT_NE(csv.find(",refurbish,2028,not funded by 2035,"), std::string::npos) << csv;
  // On time: the year is given, so an empty cell only ever means no plan for it.
  auto on_time = ranking;
  on_time.units[1].budget_plan = {analytics::PlanSchedule::State::on_time, 2030, 2035};
  EXPECT_NE(fleet_ranking_csv(on_time).find(",replace,2030,2030,"), std::string::npos);

  PlannerWeek w;
  w.week_label = "2026-W49";
  w.as_of = ranking.as_of;
  w.needing_action = {{"T-117", "Northgate", "replace", 2030, "", ranking.units[1].budget_plan},
                      {"T-204", "Kelder Road 132 kV", "refurbish", 2028, "", {}}};
  EXPECT_NE(planner_week_text(w).find("T-117 (Northgate): replace by 2030 (budget plan: 2032)\n"), std::string::npos)
      << planner_week_text(w);
  EXPECT_NE(planner_week_text(w).find("T-204 (Kelder Road 132 kV): refurbish by 2028\n"), std::string::npos);
  const std::string cover = temp_path("cover-plan-year.pdf");
  render_weekly_index("2026-W49", ranking, {}, w, fixed_options(), cover);
  const std::string cover_text = squash(pdf_raw_text(cover));
  EXPECT_NE(cover_text.find("Budget plan"), std::string::npos) << cover_text;
  EXPECT_NE(cover_text.find("2032"), std::string::npos) << cover_text;
}

TEST(RankingCsv, EmptyRankingIsHeaderAndCaution) {
  const std::string csv = fleet_ranking_csv({});
  EXPECT_EQ(std::count(csv.begin(), csv.end(), '\n'), 2);  // header + caution
  EXPECT_NE(csv.find("\n# SAFETY: "), std::string::npos);
}

}  // namespace
}  // namespace ferrum::report
