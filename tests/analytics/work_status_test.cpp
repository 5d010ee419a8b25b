// Planners close the loop (issue #16): work-status rows applied to a unit's
// actions, and the fleet work list. The rules are ferrum's own bookkeeping
// (analytics/work_status.h, analytics/work_list.h): common practice, no
// published source.
#include <gtest/gtest.h>

#include "analytics/action_plan.h"
#include "analytics/assess_unit.h"
#include "analytics/work_list.h"
#include "analytics/work_status.h"

namespace ferrum::analytics {
namespace {

Day day(int y, int m, int d) { return days_from_civil(y, m, d); }

// An oil resample found on 2026-06-01, due 90 days later, overdue by 2026-12-01.
Action resample(Day found = day(2026, 6, 1)) {
  Action a = dated_action(2, found, 90, "Resample the oil", "gases rising", kSourceOilSample, "oil-resample",
                          kCrewOilSampling);
  a.overdue = true;  // as finalize_actions sets it for an as-of after the due date
  return a;
}

Action outage() {
  return dated_action(1, day(2026, 9, 22), 30, "Plan an outage", "hot joint", kSourceInfrared, "outage",
                      kCrewMaintenance, true);
}

TEST(WorkStatus, ABookedActionShowsItsBookingDateInsteadOfOverdue) {
  std::vector<Action> actions = {resample(), outage()};
  std::vector<Action> closed;
  const std::vector<WorkStatus> rows = {{"T1/oil-resample", "booked", day(2026, 12, 10), "crew A"}};
  apply_work_status(rows, "T1", actions, closed);
  ASSERT_EQ(actions.size(), 2u);  // common practice, no published source: booked work stays on the list
  EXPECT_EQ(actions[0].reference, "T1/oil-resample");
  EXPECT_EQ(actions[0].status, "booked");
  EXPECT_EQ(actions[0].work_date, day(2026, 12, 10));
  EXPECT_EQ(actions[0].work_note, "crew A");
  EXPECT_FALSE(actions[0].overdue);
  EXPECT_EQ(actions[0].due, day(2026, 6, 1) + 90);  // the due date is kept
  EXPECT_EQ(actions[1].reference, "T1/outage");
  EXPECT_TRUE(actions[1].status.empty());
  EXPECT_TRUE(closed.empty());
}

TEST(WorkStatus, ADoneActionLeavesTheList) {
  std::vector<Action> actions = {resample(), outage()};
  std::vector<Action> closed;
  const std::vector<WorkStatus> rows = {{"T1/oil-resample", "booked", day(2026, 6, 20), ""},
                                        {"T1/oil-resample", "done", day(2026, 7, 2), "sampled"}};
  apply_work_status(rows, "T1", actions, closed);
  ASSERT_EQ(actions.size(), 1u);  // common practice, no published source: the latest row counts
  EXPECT_EQ(actions[0].need, "outage");
  ASSERT_EQ(closed.size(), 1u);
  EXPECT_EQ(closed[0].status, "done");
  EXPECT_EQ(closed[0].work_date, day(2026, 7, 2));
  EXPECT_FALSE(closed[0].overdue);
}

TEST(WorkStatus, NewerEvidenceRaisesADoneOrCancelledActionAgain) {
  // Resampled on 2026-07-02, but a sample of 2026-10-06 raises the need again.
  std::vector<Action> actions = {resample(day(2026, 10, 6))};
  std::vector<Action> closed;
  apply_work_status({{"T1/oil-resample", "done", day(2026, 7, 2), ""}}, "T1", actions, closed);
  ASSERT_EQ(actions.size(), 1u);  // common practice, no published source
  EXPECT_TRUE(actions[0].status.empty());
  EXPECT_NE(actions[0].work_note.find("done on 2026-07-02"), std::string::npos) << actions[0].work_note;
  EXPECT_TRUE(closed.empty());

  std::vector<Action> again = {outage()};  // found 2026-09-22
  apply_work_status({{"T1/outage", "cancelled", day(2026, 9, 1), ""}}, "T1", again, closed);
  EXPECT_EQ(again.size(), 1u);  // cancelled before the finding: raised again
  apply_work_status({{"T1/outage", "cancelled", day(2026, 9, 22), ""}}, "T1", again, closed);
  EXPECT_TRUE(again.empty());  // cancelled on the finding's day or later: it leaves
  ASSERT_EQ(closed.size(), 1u);
  EXPECT_EQ(closed[0].status, "cancelled");
}

TEST(WorkStatus, ARowForAnotherReferenceChangesNothing) {
  std::vector<Action> actions = {resample()};
  std::vector<Action> closed;
  apply_work_status({{"T2/oil-resample", "done", day(2026, 7, 2), ""}, {"T1/oil-reclaim", "done", day(2026, 7, 2), ""}},
                    "T1", actions, closed);
  ASSERT_EQ(actions.size(), 1u);
  EXPECT_TRUE(actions[0].overdue);
  EXPECT_TRUE(actions[0].status.empty());
}

TEST(WorkStatus, AssessUnitAppliesTheUnitsRows) {
  // A unit with no data gets data actions; marking one done takes it off.
  UnitData d;
  d.info.unit_id = "T7";
  d.info.site = "North";
  d.info.rated_mva = 20;
  d.info.year_built = 2000;
  const Day as_of = day(2026, 12, 1);
  const UnitAssessment before = assess_unit(d, as_of, {});
  ASSERT_FALSE(before.actions.empty());
  const Action first = before.actions.front();
  ASSERT_FALSE(first.reference.empty());
  EXPECT_EQ(first.reference.rfind("T7/", 0), 0u);
  d.work_status = {{first.reference, "done", as_of, ""}};
  const UnitAssessment after = assess_unit(d, as_of, {});
  EXPECT_EQ(after.actions.size(), before.actions.size() - 1);
  for (const Action& a : after.actions) EXPECT_NE(a.reference, first.reference);
  ASSERT_EQ(after.closed_actions.size(), 1u);
  EXPECT_EQ(after.closed_actions[0].reference, first.reference);
}

UnitAssessment unit(const std::string& id, const std::string& site, std::vector<Action> actions) {
  UnitAssessment a;
  a.unit.unit_id = id;
  a.unit.site = site;
  std::vector<Action> closed;
  apply_work_status({}, id, actions, closed);  // sets the references
  a.actions = std::move(actions);
  return a;
}

TEST(WorkList, SortedByDueDateAcrossTheFleetAndFilteredBySiteAndCrew) {
  const std::vector<UnitAssessment> fleet = {
      unit("T1", "North", {resample(day(2026, 10, 1)), outage()}),  // due 2026-12-30, 2026-10-22
      unit("T2", "South", {resample(day(2026, 6, 1))}),             // due 2026-08-30
  };
  const auto all = work_list(fleet);
  ASSERT_EQ(all.size(), 3u);  // common practice, no published source: soonest due first
  EXPECT_EQ(all[0].reference, "T2/oil-resample");
  EXPECT_EQ(all[0].site, "South");
  EXPECT_EQ(all[1].reference, "T1/outage");
  EXPECT_TRUE(all[1].outage);
  EXPECT_EQ(all[1].crew, kCrewMaintenance);
  EXPECT_EQ(all[1].found, day(2026, 9, 22));
  EXPECT_EQ(all[2].reference, "T1/oil-resample");

  const auto north = work_list(fleet, {"north", ""});  // any case
  ASSERT_EQ(north.size(), 2u);
  EXPECT_EQ(north[0].unit_id, "T1");
  const auto sampling = work_list(fleet, {"", "Oil Sampling"});
  ASSERT_EQ(sampling.size(), 2u);
  EXPECT_EQ(sampling[0].reference, "T2/oil-resample");
  EXPECT_EQ(sampling[1].reference, "T1/oil-resample");
  EXPECT_EQ(work_list(fleet, {"South", kCrewMaintenance}).size(), 0u);
}

TEST(WorkList, ABookedActionKeepsItsPlaceAndShowsItsBookingDate) {
  std::vector<Action> actions = {resample(), outage()};
  std::vector<Action> closed;
  apply_work_status({{"T1/oil-resample", "booked", day(2026, 12, 10), ""}}, "T1", actions, closed);
  UnitAssessment a;
  a.unit.unit_id = "T1";
  a.unit.site = "North";
  a.actions = actions;
  const auto rows = work_list({a});
  ASSERT_EQ(rows.size(), 2u);
  EXPECT_EQ(rows[0].reference, "T1/oil-resample");  // due 2026-08-30 still sorts first
  EXPECT_EQ(rows[0].status, "booked");
  EXPECT_EQ(rows[0].work_date, day(2026, 12, 10));
  EXPECT_FALSE(rows[0].overdue);
}

}  // namespace
}  // namespace ferrum::analytics
