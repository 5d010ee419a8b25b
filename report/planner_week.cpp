#include "report/planner_week.h"

#include "report/decision_text.h"
#include "report/safety_text.h"

#include <sstream>

namespace ferrum::report {

std::string planner_week_text(const PlannerWeek& w) {
  std::ostringstream o;
  // summary.txt is read alone and is the weekly mail's body: it opens with the caution.
  o << one_line_caution() << "\n\n";
  const std::string first = analytics::format_day(w.as_of - 6);
  o << "Week " << w.week_label << " (" << first << " to " << analytics::format_day(w.as_of) << "), " << w.units
    << " unit(s).\n";
  o << "\nUnits needing action: " << w.needing_action.size() << "\n";
  for (const auto& u : w.needing_action)
    o << "  " << u.unit_id << " (" << u.site << "): " << u.action << (u.year ? " by " + std::to_string(*u.year) : "")
      << (plan_note(u.budget_plan).empty() ? "" : " (" + plan_note(u.budget_plan) + ")") << "\n";
  auto actions = [&](const char* title, const std::vector<PlannerWeek::DueAction>& list) {
    o << "\n" << title << ": " << list.size() << "\n";
    for (const auto& a : list)
      o << "  " << analytics::format_day(a.due)
        << (a.booked ? " booked " + analytics::format_day(a.booked) : a.due < w.as_of ? " OVERDUE" : "") << "  "
        << a.unit_id << " ("
        << a.site << "), priority " << a.priority << ": " << a.text << "\n";
  };
  actions("Actions due in the next 7 days (or overdue)", w.due_7);
  actions("Actions due in 8 to 30 days", w.due_30);
  o << "\nChanged since last week: ";
  if (!w.have_previous_week) o << "no earlier week to compare with\n";
  else {
    o << w.changes.size() << "\n";
    for (const auto& c : w.changes) o << "  " << c.unit_id << " (" << c.site << "): " << c.what << "\n";
  }
  o << "\nAlerts raised this week: " << w.alerts.size() << "\n";
  for (const auto& a : w.alerts) o << "  " << a.raised_at << " " << a.unit_id << " " << a.kind << ": " << a.text << "\n";
  o << "\nFiles received this week, per party:";
  if (w.parties.empty()) o << " none";
  o << "\n";
  for (const auto& p : w.parties) {
    o << "  " << p.party << ": " << p.received << " received, " << p.rejected << " rejected";
    if (!p.rejected_names.empty()) {
      o << " (";
      for (std::size_t i = 0; i < p.rejected_names.size(); ++i) o << (i ? ", " : "") << p.rejected_names[i];
      o << ")";
    }
    o << "\n";
  }
  o << "\nOverdue oil samples, surveys and inspections: " << w.overdue.size() << "\n";
  for (const auto& d : w.overdue)
    o << "  " << d.unit_id << " (" << d.site << "): " << d.what << ", last "
      << (d.last ? analytics::format_day(*d.last) : std::string("never")) << "\n";
  int overdue = 0, booked = 0;
  for (const auto& r : w.work_list) {
    overdue += r.overdue;
    booked += r.status == "booked";
  }
  o << "\nWork list: " << w.work_list.size() << " open action(s), " << overdue << " overdue, " << booked
    << " booked (ferrum worklist --csv lists them all)\n";
  return o.str();
}

}  // namespace ferrum::report
