// The planner's week from assessments, the previous week, alerts and files.
// Plumbing (which list an item lands in); the one engineering interval is
// named where it is checked.
#include <gtest/gtest.h>

#include <unistd.h>

#include <filesystem>
#include <fstream>

#include "daemon/reporting/planner_week_builder.h"
#include "report/safety_text.h"

using namespace ferrum;

namespace {

analytics::UnitAssessment unit(const std::string& id, const std::string& site) {
  analytics::UnitAssessment a;
  a.unit.unit_id = id;
  a.unit.site = site;
  return a;
}

TEST(PlannerWeek, ActionsChangesAlertsFilesAndOverdue) {
  const analytics::Day today = analytics::days_from_civil(2026, 12, 7);
  std::vector<analytics::UnitAssessment> units = {unit("T1", "Quillmere"), unit("T2", "Ostrand Yard")};
  auto act = [](int priority, analytics::Day due, const char* text) {
    analytics::Action a;
    a.priority = priority;
    a.due = due;
    a.text = text;
    return a;
  };
  units[0].actions = {act(2, today + 20, "infrared survey"), act(1, today + 3, "resample oil"),
                      act(3, today + 45, "routine"), act(2, today - 1, "tighten connection")};
  units[0].freshness = {{"oil", today - 100, 0.3}, {"infrared", today - 400, 1.1}, {"inspection", today - 10, 0.0}};
  units[1].freshness = {{"oil", today - 366, 1.0}};
  analytics::FleetRanking ranking;
  ranking.as_of = today;
  ranking.units.resize(2);
  ranking.units[0].unit_id = "T1";
  ranking.units[0].site = "Quillmere";
  ranking.units[0].health_index = 48.4;
  ranking.units[0].band = "poor";
  ranking.units[0].recommended_action = "refurbish";
  ranking.units[1].unit_id = "T2";
  ranking.units[1].site = "Ostrand Yard";
  ranking.units[1].health_index = 80;
  ranking.units[1].band = "good";
  ranking.units[1].recommended_action = "routine";

  reporting::PlannerWeekInputs in;
  in.week_label = "2026-W50";
  in.as_of = today;
  in.units = &units;
  in.ranking = &ranking;
  in.previous_week_tsv = report::csv_caution_line() + "\nT1\tQuillmere\t62\tfair\tmonitor\nT2\tOstrand Yard\t80\tgood\troutine\n";
  store::Alert old_alert, new_alert;
  old_alert.unit_id = new_alert.unit_id = "T1";
  old_alert.raised_at = "2026-11-20T08:00:00Z";
  new_alert.raised_at = "2026-12-05T08:00:00Z";
  new_alert.kind = "acetylene";
  in.alerts = {old_alert, new_alert};
  store::FileRecord f1, f2, f3;
  f1.party = f2.party = "oil-lab";
  f3.party = "ir-crew";
  f1.status = "accepted";
  f2.status = "rejected";
  f2.original_name = "bad.csv";
  f3.status = "accepted";
  f1.received_at = "2026-12-02T09:00:00Z";
  f2.received_at = "2026-12-06T09:00:00Z";
  f3.received_at = "2026-11-25T09:00:00Z";  // before the week
  in.files = {f2, f1, f3};
  in.inspection_interval_days = 365;

  const report::PlannerWeek w = reporting::build_planner_week(in);
  ASSERT_EQ(w.needing_action.size(), 1u);  // T2 is on routine maintenance
  EXPECT_EQ(w.needing_action[0].unit_id + " " + w.needing_action[0].action, "T1 refurbish");
  ASSERT_EQ(w.due_7.size(), 2u);  // overdue first, then by due day
  EXPECT_EQ(w.due_7[0].text, "tighten connection");
  EXPECT_EQ(w.due_7[1].text, "resample oil");
  ASSERT_EQ(w.due_30.size(), 1u);
  EXPECT_EQ(w.due_30[0].text, "infrared survey");
  ASSERT_TRUE(w.have_previous_week);
  ASSERT_EQ(w.changes.size(), 1u);
  EXPECT_EQ(w.changes[0].what, "HI 62 -> 48; band fair -> poor; action monitor -> refurbish");
  ASSERT_EQ(w.alerts.size(), 1u);
  EXPECT_EQ(w.alerts[0].kind, "acetylene");
  ASSERT_EQ(w.parties.size(), 1u);
  EXPECT_EQ(w.parties[0].received, 2);
  EXPECT_EQ(w.parties[0].rejected, 1);
  EXPECT_EQ(w.parties[0].rejected_names, std::vector<std::string>{"bad.csv"});
  // Yearly oil sample and infrared survey (value from memory of IEEE
  // C57.104-2019 sampling intervals, verify; infrared: common practice, no
  // published source): T1 infrared 400 days, T2 oil 366 days and no
  // infrared or inspection at all.
  std::vector<std::string> overdue;
  for (const auto& d : w.overdue) overdue.push_back(d.unit_id + " " + d.what);
  EXPECT_EQ(overdue, (std::vector<std::string>{"T1 infrared survey", "T2 oil sample", "T2 infrared survey",
                                               "T2 inspection"}));
  EXPECT_FALSE(w.overdue[3].last.has_value());
  // summary.txt, read alone or as the mail's body, opens with the caution
  // (plumbing: no published source applies).
  EXPECT_EQ(report::planner_week_text(w).rfind(report::one_line_caution() + "\n\nWeek 2026-W50 ", 0), 0u);
}

TEST(PlannerWeek, WeekTsvRoundTripsAndPreviousWeekIsFound) {
  analytics::FleetRanking r;
  r.units.resize(1);
  r.units[0].unit_id = "T\t1";
  r.units[0].band = "fair";
  // The caution first, as a comment line the reader skips (plumbing: no published source applies).
  EXPECT_EQ(reporting::week_units_tsv(r), report::csv_caution_line() + "\nT 1\t\t-\tfair\t\n");
  const auto dir = std::filesystem::temp_directory_path() / ("ferrum-weeks-" + std::to_string(::getpid()));
  for (const char* w : {"2026-W47", "2026-W48", "2026-W49", "2026-W50"}) {
    std::filesystem::create_directories(dir / w);
    std::ofstream(dir / w / "week.tsv") << w;
  }
  std::filesystem::remove(dir / "2026-W49" / "week.tsv");  // an older bundle without the file
  EXPECT_EQ(reporting::previous_week_tsv(dir, "2026-W50"), "2026-W48");
  EXPECT_EQ(reporting::previous_week_tsv(dir, "2026-W47"), "");
  std::filesystem::remove_all(dir);
}

// "Units needing action" follows the fleet ranking (most at risk first, equal
// risk by unit id, no risk last), not the kind of action; each keeps its
// reason. Plumbing of the list: no published source applies.
TEST(PlannerWeek, UnitsNeedingActionAreInRiskOrder) {
  std::vector<analytics::UnitAssessment> units;
  analytics::FleetRanking ranking;
  auto ranked = [&](const char* id, const char* action, std::optional<double> risk, const char* reason) {
    analytics::RankedUnit r;
    r.unit_id = id;
    r.site = "Quillmere";
    r.recommended_action = action;
    r.risk = risk;
    r.action_reason = reason;
    r.insufficient_data = !risk;
    ranking.units.push_back(r);
    units.push_back(unit(id, "Quillmere"));
  };
  ranked("T5", "monitor", 0.09, "index falling");  // most at risk, mildest action
  ranked("T2", "replace", 0.05, "paper at end of life");
  ranked("T3", "investigate", 0.05, "turns ratio off");  // tied with T2: by unit id
  ranked("T1", "routine", 0.01, "");
  ranked("T9", "investigate", std::nullopt, "no index");
  reporting::PlannerWeekInputs in;
  in.week_label = "2026-W50";
  in.as_of = analytics::days_from_civil(2026, 12, 7);
  in.units = &units;
  in.ranking = &ranking;
  const auto w = reporting::build_planner_week(in);
  std::vector<std::string> order;
  for (const auto& u : w.needing_action) order.push_back(u.unit_id + " " + u.reason);
  EXPECT_EQ(order, (std::vector<std::string>{"T5 index falling", "T2 paper at end of life", "T3 turns ratio off",
                                             "T9 no index"}));
}

}  // namespace
