// The planner's week: what the weekly cover (index.pdf) and the weekly mail
// put first. Built by the daemon (daemon/reporting/planner_week_builder) from
// the week's assessments, the ranking, the previous bundle, the alerts and
// the file records; rendered here as plain text and, by weekly_index.cpp, as
// the cover page. Plain data: no store, no clock.
#pragma once

#include <optional>
#include <string>
#include <vector>

#include "analytics/assessment.h"
#include "analytics/calendar.h"
#include "analytics/work_list.h"

namespace ferrum::report {

struct PlannerWeek {
  std::string week_label;        // "2026-W49"
  analytics::Day as_of = 0;      // last day of the week covered
  int units = 0;

  struct UnitAction {
    std::string unit_id, site, action;   // replace, repair, investigate, refurbish, monitor
    std::optional<int> year;
    std::string reason;                  // the decision's reason (RankedUnit::action_reason)
    analytics::PlanSchedule budget_plan;  // where the fleet's budget plan puts the action
  };
  std::vector<UnitAction> needing_action;  // in the fleet ranking's order: most at risk first

  struct DueAction {
    analytics::Day due = 0;
    int priority = 3;            // 1 = most urgent
    std::string unit_id, site, text;
    analytics::Day booked = 0;   // booking date of a booked action (work-status files), 0 when open
    std::string reason;          // why (Action::reason)
  };
  std::vector<DueAction> due_7;   // due within 7 days (or overdue), most urgent first
  std::vector<DueAction> due_30;  // due in 8..30 days

  struct Change {
    std::string unit_id, site, what;  // "HI 62 -> 48; band Fair -> Poor"
  };
  bool have_previous_week = false;
  std::vector<Change> changes;

  struct AlertLine {
    std::string raised_at, unit_id, kind, text;
  };
  std::vector<AlertLine> alerts;  // raised during the week

  struct PartyFiles {
    std::string party;
    int received = 0, rejected = 0;
    std::vector<std::string> rejected_names;
  };
  std::vector<PartyFiles> parties;  // files received during the week, per party

  struct Overdue {
    std::string unit_id, site, what;      // "oil sample", "infrared survey", "inspection"
    std::optional<analytics::Day> last;   // none: never
  };
  std::vector<Overdue> overdue;
  int inspection_interval_days = 365;  // the site's, after which an inspection is overdue

  // The fleet work list (analytics/work_list.h): every open action, soonest due first.
  std::vector<analytics::WorkListRow> work_list;
};

// The plain-text summary (summary.txt of the bundle, body of the weekly mail),
// opening with the one-line caution (report/safety_text.h).
std::string planner_week_text(const PlannerWeek& week);

}  // namespace ferrum::report
