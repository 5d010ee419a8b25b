#include "report/unit_report.h"

#include <gtest/gtest.h>

#include <chrono>

#include "report/report_format.h"
#include "report/safety_block.h"
#include "tests/report/pdf_tools.h"
#include "tests/report/report_fixtures.h"

namespace ferrum::report {
namespace {
using namespace testing;

using UnitReportTest = RenderedPdfTest;

TEST_F(UnitReportTest, FilledUnitShowsEverySectionActionAndKeyNumber) {
  const auto unit = fixtures::filled_unit();
  const auto prev = fixtures::previous_of_filled();
  const std::string path = temp_path("filled.pdf");
  render_unit_report(unit, &prev, fixtures::source_files(), fixed_options(), path);
  ASSERT_TRUE(qpdf_check(path));
  const std::string text = squash(pdf_raw_text(path));
  for (const char* heading : {"Summary", "Dissolved gases", "Oil quality and paper", "Loading and heat",
                              "Infrared and inspection", "Health index explained", "Sources, methods and assumptions"})
    EXPECT_NE(text.find(heading), std::string::npos) << heading;
  for (const auto& action : unit.actions) EXPECT_NE(text.find(squash(action.text)), std::string::npos) << action.text;
  EXPECT_NE(text.find("Health index 58 of 100: fair"), std::string::npos);  // 57.6 printed as a whole number
  EXPECT_NE(text.find("11.5 years (range 7.0–16.0), limited by paper"), std::string::npos);
  EXPECT_NE(text.find("126.4 °C"), std::string::npos);       // peak hot spot
  EXPECT_NE(text.find("19 mg/kg"), std::string::npos);       // moisture, whole mg/kg
  EXPECT_NE(text.find("0.21 mg KOH/g"), std::string::npos);  // acidity keeps two decimals
  EXPECT_NE(text.find("T-204"), std::string::npos);
  EXPECT_NE(text.find("YNd11"), std::string::npos);
  EXPECT_NE(text.find("northline_dga_2026-10-20_batch0412.csv"), std::string::npos);
  EXPECT_NE(text.find("UTC+01:00"), std::string::npos);
  EXPECT_NE(text.find("C₂H₂"), std::string::npos);            // subscripts survive extraction
  EXPECT_NE(text.find("µL/L"), std::string::npos);
  EXPECT_NE(text.find("Health index worse by 5 points"), std::string::npos);  // 63 -> 58
}

// The unit report says where the fleet's budget plan puts a replacement the
// ranking dates earlier, or that it could not know. Plumbing of the plan's
// result: no published source applies.
TEST_F(UnitReportTest, SaysWhereTheBudgetPlanPutsTheReplacement) {
  auto unit = fixtures::filled_unit();
  unit.decision.action = "replace";
  unit.decision.year = 2028;
  using S = analytics::PlanSchedule::State;
  auto text_with = [&](analytics::PlanSchedule plan, const std::string& name) {
    unit.budget_plan = plan;
    const std::string path = temp_path(name);
    render_unit_report(unit, nullptr, fixtures::source_files(), fixed_options(), path);
    return squash(pdf_raw_text(path));
  };
  EXPECT_NE(text_with({S::later, 2029, 2035}, "plan-later.pdf").find("budget-constrained plan funds this replace in 2029"),
            std::string::npos);
  EXPECT_NE(text_with({S::not_known, std::nullopt, 0}, "plan-unknown.pdf").find("may fund this replace later"),
            std::string::npos);
  const std::string on_time = text_with({S::on_time, 2028, 2035}, "plan-on-time.pdf");
  EXPECT_EQ(on_time.find("budget-constrained plan"), std::string::npos);
}

// Work the planners reported done is listed (work-status files), so that a
// report does not look as if it ignored a repair while the finding still
// stands in older data. Plumbing: no published source applies.
TEST_F(UnitReportTest, ListsTheWorkReportedDone) {
  auto unit = fixtures::filled_unit();
  analytics::Action done;
  done.text = "Check the cooling system";
  done.reference = "T-204/cooling-check";
  done.status = "done";
  done.work_date = analytics::days_from_civil(2026, 12, 1);
  done.work_note = "fan motor 2 replaced";
  unit.closed_actions.push_back(done);
  const std::string path = temp_path("closed.pdf");
  render_unit_report(unit, nullptr, fixtures::source_files(), fixed_options(), path);
  const std::string text = squash(pdf_raw_text(path));
  EXPECT_NE(text.find(squash("T-204/cooling-check (Check the cooling system) done on 2026-12-01: fan motor 2 replaced")),
            std::string::npos);
}

// The band's generic expected life (Jahromi's HI table, analytics/health_index.h)
// never stands beside the unit's own remaining life, which it could
// contradict (9 years beside "more than 15 years"); without an estimate of the
// unit's own it is printed as the band's typical figure. Layout rule: no
// published source applies.
TEST_F(UnitReportTest, BandExpectedLifeNeverContradictsTheUnitsOwnEstimate) {
  auto unit = fixtures::filled_unit();
  unit.decision.index_note.clear();
  unit.band_expected_life = "more than 15 years";
  unit.remaining_life.years = 9;
  unit.remaining_life.beyond_horizon = false;
  std::string path = temp_path("band-life-own.pdf");
  render_unit_report(unit, nullptr, fixtures::source_files(), fixed_options(), path);
  std::string text = squash(pdf_raw_text(path));
  EXPECT_EQ(text.find("more than 15 years"), std::string::npos);
  EXPECT_NE(text.find("this unit's own estimate"), std::string::npos);
  unit.remaining_life.years.reset();
  path = temp_path("band-life-none.pdf");
  render_unit_report(unit, nullptr, fixtures::source_files(), fixed_options(), path);
  text = squash(pdf_raw_text(path));
  EXPECT_NE(text.find("Typical life left in this band: more than 15 years"), std::string::npos);
}

// Issue #16, "numbers printed two ways": the rating keeps its digits, the
// score scale is stated beside the scores, the ageing factor has three
// significant figures, the gas chart has a recent-years view beside the whole
// history, and the site view's line and the measured-top-oil basis are shown
// (common practice, no published source; IEC 60076-7:2018 for the basis).
TEST_F(UnitReportTest, NumbersPrintOneWayAndRecentGasViewAndSiteLine) {
  auto unit = fixtures::filled_unit();
  unit.unit.rated_mva = 7.5;
  unit.thermal.equivalent_ageing_factor = 0.001234;
  unit.thermal.hot_spot_from_measured_top_oil = true;
  unit.thermal.top_oil_discrepancy_k = 10.2;
  unit.site_summary = "Site Kelder Road 132 kV: 2 units, 52.5 MVA installed, peak load 40.1 MVA (sum of the units' "
                      "peaks). N-1 fails: with T-204 (45 MVA) out the other units carry 9.8 MVA.";
  const std::string path = temp_path("numbers.pdf");
  render_unit_report(unit, nullptr, fixtures::source_files(), fixed_options(), path);
  const std::string text = squash(pdf_raw_text(path));
  EXPECT_NE(text.find("7.5 MVA"), std::string::npos);
  EXPECT_EQ(text.find(" 8 MVA"), std::string::npos);  // not rounded to a whole number
  EXPECT_NE(text.find("0.00123"), std::string::npos);
  EXPECT_NE(text.find("Score (0–4, 4 = best)"), std::string::npos);
  EXPECT_NE(text.find("last 3 years"), std::string::npos);
  EXPECT_NE(text.find("all samples since 2022-03-13"), std::string::npos);
  EXPECT_NE(text.find("N-1 fails: with T-204"), std::string::npos);
  EXPECT_NE(text.find("Hot spot and ageing from the measured top oil"), std::string::npos);
}

// A heading never stands at a page's foot with nothing under it: the "What
// to do" heading keeps the table's first row on its page, however tall the
// row (layout rule: no published source applies).
TEST_F(UnitReportTest, WhatToDoHeadingKeepsItsFirstActionOnItsPage) {
  auto unit = fixtures::filled_unit();
  std::string tall = "Start of the first action";
  for (int i = 0; i < 25; ++i) tall += " and then a further step of the same job";
  for (auto& act : unit.actions) act.priority = 2;
  unit.actions.front().priority = 1;
  unit.actions.front().text = tall;
  const std::string path = temp_path("orphan-heading.pdf");
  render_unit_report(unit, nullptr, fixtures::source_files(), fixed_options(), path);
  bool seen = false;
  for (int n = 1; n <= pdf_pages(path); ++n) {
    const std::string page = squash(run("pdftotext -f " + std::to_string(n) + " -l " + std::to_string(n) + " '" + path +
                                        "' - 2>/dev/null"));
    if (page.find("What to do: prioritized actions") == std::string::npos) continue;
    seen = true;
    EXPECT_NE(page.find("Start of the first action"), std::string::npos) << "page " << n;
  }
  EXPECT_TRUE(seen);
}

// The action table is a planner's: the evidence date and kind, the due date
// with an OVERDUE marker, the crew, whether an outage is needed and the
// reference quoted in a work-status file (issue #16).
TEST_F(UnitReportTest, ActionTableCarriesThePlannersColumns) {
  const auto unit = fixtures::filled_unit();
  const std::string path = temp_path("actions-planner.pdf");
  render_unit_report(unit, nullptr, fixtures::source_files(), fixed_options(), path);
  ASSERT_TRUE(qpdf_check(path));
  const std::string text = squash(pdf_raw_text(path));
  for (const char* s : {"Found", "Crew", "2026-09-21", "inspection", "2026-11-20", "OVERDUE", "infrared survey",
                        "outage: yes", "outage: no", "oil sampling", "ref. T-204/inspection:radiators",
                        "ref. T-204/oil-resample"})
    EXPECT_NE(text.find(s), std::string::npos) << s;
  // Only the radiator job (2026-09-21 + 60 days) is past the as-of day.
  std::size_t n = 0;
  for (auto at = text.find("OVERDUE"); at != std::string::npos; at = text.find("OVERDUE", at + 1)) ++n;
  EXPECT_EQ(n, 1u);
}

// A booked action shows its booking date instead of "OVERDUE" (issue #16,
// work-status files; common practice, no published source).
TEST_F(UnitReportTest, BookedActionShowsItsBookingDateNotOverdue) {
  auto unit = fixtures::filled_unit();
  bool booked = false;
  for (auto& act : unit.actions)
    if (act.overdue && !booked) {
      act.status = "booked";
      act.work_date = unit.as_of + 5;
      booked = true;
    }
  ASSERT_TRUE(booked);
  const std::string path = temp_path("actions-booked.pdf");
  render_unit_report(unit, nullptr, fixtures::source_files(), fixed_options(), path);
  const std::string text = squash(pdf_raw_text(path));
  EXPECT_NE(text.find("booked " + analytics::format_day(unit.as_of + 5)), std::string::npos);
  EXPECT_EQ(text.find("OVERDUE"), std::string::npos);
}

// An estimate at the planning horizon prints as "more than N years", never as
// a figure the methods cannot support. // common practice, no published source
TEST_F(UnitReportTest, LifeBeyondHorizonPrintsMoreThan) {
  auto unit = fixtures::filled_unit();
  unit.remaining_life.years = unit.remaining_life.low_years = unit.remaining_life.high_years = 40.0;
  unit.remaining_life.horizon_years = 40;
  unit.remaining_life.beyond_horizon = true;
  const std::string path = temp_path("horizon.pdf");
  render_unit_report(unit, nullptr, {}, fixed_options(), path);
  const std::string text = squash(pdf_raw_text(path));
  EXPECT_NE(text.find("Remaining life: more than 40 years"), std::string::npos);
}

TEST_F(UnitReportTest, SafetyBlockOnFirstAndLastPage) {
  const std::string path = temp_path("safety.pdf");
  render_unit_report(fixtures::filled_unit(), nullptr, {}, fixed_options(), path);
  const int pages = pdf_pages(path);
  ASSERT_GT(pages, 2);
  auto page_text = [&](int n) {
    return squash(run("pdftotext -f " + std::to_string(n) + " -l " + std::to_string(n) + " '" + path + "' - 2>/dev/null"));
  };
  for (int p : {1, pages}) {
    const std::string t = page_text(p);
    EXPECT_NE(t.find("SAFETY"), std::string::npos) << "page " << p;
    EXPECT_NE(t.find("NFPA 70E"), std::string::npos) << "page " << p;
    EXPECT_NE(t.find("PCB"), std::string::npos) << "page " << p;
    EXPECT_NE(t.find("confirmed by qualified personnel"), std::string::npos) << "page " << p;
    EXPECT_NE(t.find("page " + std::to_string(p) + " of " + std::to_string(pages)), std::string::npos);
  }
  // The arcing fixture raises the warning at the top of page 1.
  EXPECT_NE(page_text(1).find("WARNING"), std::string::npos);
}

TEST_F(UnitReportTest, NoWarningBoxWithoutUnsafeFinding) {
  auto unit = fixtures::filled_unit();
  unit.active_arcing = false;
  unit.dga.active_arcing = false;
  const std::string path = temp_path("calm.pdf");
  render_unit_report(unit, nullptr, {}, fixed_options(), path);
  EXPECT_EQ(pdf_raw_text(path).find("WARNING"), std::string::npos);
}

TEST_F(UnitReportTest, UnsafeInspectionIsNamedInTheWarning) {
  auto unit = fixtures::filled_unit();
  unit.active_arcing = false;
  unit.unsafe_inspection = true;
  unit.inspection[1].rating = analytics::Rating::unsafe;
  const std::string path = temp_path("unsafe.pdf");
  render_unit_report(unit, nullptr, {}, fixed_options(), path);
  const std::string first = squash(run("pdftotext -l 1 '" + path + "' - 2>/dev/null"));
  EXPECT_NE(first.find("WARNING"), std::string::npos);
  EXPECT_NE(first.find("rated UNSAFE (bushings)"), std::string::npos);
}

// Issue #16: an ester-filled unit's report lists the methods not applied and
// why, draws no Duval triangle, and still shows the gas rates in µL/L per year.
TEST_F(UnitReportTest, EsterUnitListsMethodsNotApplied) {
  auto unit = fixtures::filled_unit();
  unit.unit.oil = analytics::OilType::ester;
  unit.methods_not_applied = {"Duval Triangle 1: valid for mineral oil only; this unit is filled with ester"};
  const std::string path = temp_path("ester.pdf");
  render_unit_report(unit, nullptr, {}, fixed_options(), path);
  const std::string text = squash(pdf_raw_text(path));
  EXPECT_NE(text.find("not applied to this ester-filled unit"), std::string::npos);
  EXPECT_NE(text.find("Methods not applied to this unit, and why"), std::string::npos);
  EXPECT_NE(text.find("valid for mineral oil only"), std::string::npos);
  EXPECT_EQ(text.find("Plotted samples"), std::string::npos);  // no triangle
  EXPECT_NE(text.find("Rate, µL/L per year"), std::string::npos);
}

// Issue #16: rates in one unit: the TDCG rate is shown per year like the gas
// table, with Table 3's per-day value beside it (1.9 per day x 365.25 = 694).
TEST_F(UnitReportTest, TdcgRateShownPerYearLikeTheGasTable) {
  const std::string path = temp_path("rates.pdf");
  render_unit_report(fixtures::filled_unit(), nullptr, {}, fixed_options(), path);
  const std::string text = squash(pdf_raw_text(path));
  EXPECT_NE(text.find("rate 694 µL/L per year"), std::string::npos);
  EXPECT_NE(text.find("1.9 µL/L per day, the unit of C57.104-2008 Table 3"), std::string::npos);
}

TEST_F(UnitReportTest, UnitWithNoDataRendersAndSaysWhatIsMissing) {
  const std::string path = temp_path("empty.pdf");
  render_unit_report(fixtures::empty_unit(), nullptr, {}, fixed_options(), path);
  ASSERT_TRUE(qpdf_check(path));
  const std::string text = squash(pdf_raw_text(path));
  EXPECT_NE(text.find("Health index: not computed"), std::string::npos);
  EXPECT_NE(text.find("No dissolved-gas analysis on record"), std::string::npos);
  EXPECT_NE(text.find("No load data on record"), std::string::npos);
  EXPECT_NE(text.find("oil-lab results (no sample on record)"), std::string::npos);
  EXPECT_NE(text.find("SAFETY"), std::string::npos);
}

TEST_F(UnitReportTest, SameInputGivesSameBytes) {
  const auto unit = fixtures::filled_unit();
  const std::string a = temp_path("det-a.pdf"), b = temp_path("det-b.pdf");
  render_unit_report(unit, nullptr, fixtures::source_files(), fixed_options(), a);
  render_unit_report(unit, nullptr, fixtures::source_files(), fixed_options(), b);
  EXPECT_EQ(file_bytes(a), file_bytes(b));
  // Only the creation date option changes the bytes.
  auto other = fixed_options();
  other.creation_date = "2027-01-02T03:04:05Z";
  render_unit_report(unit, nullptr, fixtures::source_files(), other, b);
  EXPECT_NE(file_bytes(a), file_bytes(b));
}

TEST_F(UnitReportTest, MetadataAndBookmarks) {
  const std::string path = temp_path("meta.pdf");
  render_unit_report(fixtures::filled_unit(), nullptr, {}, fixed_options(), path);
  const std::string info = run("pdfinfo '" + path + "' 2>/dev/null");
  EXPECT_NE(info.find("T-204"), std::string::npos);
  EXPECT_NE(info.find("Author:"), std::string::npos);
  EXPECT_NE(info.find("ferrum"), std::string::npos);
  EXPECT_NE(info.find("2026"), std::string::npos);  // creation date
  const std::string fonts = run("pdffonts '" + path + "' 2>/dev/null");
  EXPECT_NE(fonts.find("DejaVuSans"), std::string::npos);
  EXPECT_EQ(fonts.find(" no  "), std::string::npos) << fonts;  // every font embedded
  const std::string qpdf = run("qpdf --json --json-key=outlines '" + path + "' 2>/dev/null");
  for (const char* b : {"Summary", "Dissolved gases", "Loading and heat", "SAFETY"})
    EXPECT_NE(qpdf.find(b), std::string::npos) << b;
}

TEST_F(UnitReportTest, LetterPaperAndNoTempFileLeft) {
  auto o = fixed_options();
  o.paper = ReportOptions::Paper::letter;
  const std::string path = temp_path("letter.pdf");
  render_unit_report(fixtures::filled_unit(), nullptr, {}, o, path);
  EXPECT_NE(run("pdfinfo '" + path + "' 2>/dev/null").find("612 x 792"), std::string::npos);
  EXPECT_FALSE(std::ifstream(path + ".tmp").good());
}

TEST(UnitReportErrors, BadPathAndBadDateThrowRenderError) {
  ReportOptions o;
  o.creation_date = "yesterday";
  EXPECT_THROW(render_unit_report(fixtures::empty_unit(), nullptr, {}, o, temp_path("x.pdf")), RenderError);
  o.creation_date = "2026-12-01T10:00:00Z";
  try {
    render_unit_report(fixtures::empty_unit(), nullptr, {}, o, "/nonexistent-dir/x.pdf");
    FAIL() << "expected RenderError";
  } catch (const RenderError& e) {
    EXPECT_NE(std::string(e.what()).find("libharu error 0x"), std::string::npos) << e.what();
  }
}

TEST(UnitReportSpeed, FilledReportRendersQuickly) {
  const auto unit = fixtures::filled_unit();
  ReportOptions o;
  o.creation_date = "2026-12-01T10:00:00Z";
  const auto t0 = std::chrono::steady_clock::now();
  render_unit_report(unit, nullptr, fixtures::source_files(), o, temp_path("speed.pdf"));
  const auto ms = std::chrono::duration<double, std::milli>(std::chrono::steady_clock::now() - t0).count();
  std::printf("unit report rendered in %.1f ms\n", ms);
  EXPECT_LT(ms, 500);  // generous for Debug/sanitizer builds; Release target is < 50 ms
}

}  // namespace
}  // namespace ferrum::report
