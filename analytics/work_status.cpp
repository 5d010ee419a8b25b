#include "analytics/work_status.h"

#include <cctype>
#include <utility>

#include "analytics/calendar.h"

namespace ferrum::analytics {

std::string fallback_need(const std::string& text) {
  std::string out;
  for (const char c : text) {
    if (std::isalnum(static_cast<unsigned char>(c))) {
      out += static_cast<char>(std::tolower(static_cast<unsigned char>(c)));
    } else if (!out.empty() && out.back() != '-') {
      out += '-';
    }
    if (out.size() >= 48) break;
  }
  while (!out.empty() && out.back() == '-') out.pop_back();
  return out;
}

const WorkStatus* latest_work_status(const std::vector<WorkStatus>& rows, const std::string& reference) {
  const WorkStatus* latest = nullptr;
  for (const WorkStatus& w : rows)
    if (w.reference == reference && (latest == nullptr || w.date >= latest->date)) latest = &w;
  return latest;
}

void apply_work_status(const std::vector<WorkStatus>& rows, const std::string& unit_id, std::vector<Action>& actions,
                       std::vector<Action>& closed) {
  std::vector<Action> open;
  open.reserve(actions.size());
  for (Action& act : actions) {
    if (act.reference.empty())
      act.reference = action_reference(unit_id, act.need.empty() ? fallback_need(act.text) : act.need);
    const WorkStatus* w = act.reference.empty() ? nullptr : latest_work_status(rows, act.reference);
    if (w == nullptr) {
      open.push_back(std::move(act));
    } else if (w->status == "booked") {
      act.status = "booked";
      act.work_date = w->date;
      act.work_note = w->note;
      act.overdue = false;
      open.push_back(std::move(act));
    } else if (act.found > w->date) {  // done or cancelled before the evidence: raised again
      act.work_note = std::string(w->status == "done" ? "done" : "cancelled") + " on " + format_day(w->date) +
                      "; raised again by evidence of " + format_day(act.found);
      open.push_back(std::move(act));
    } else {
      act.status = w->status;
      act.work_date = w->date;
      act.work_note = w->note;
      act.overdue = false;
      closed.push_back(std::move(act));
    }
  }
  actions = std::move(open);
}

}  // namespace ferrum::analytics
