#include "analytics/work_list.h"

#include <algorithm>
#include <cctype>
#include <tuple>

namespace ferrum::analytics {

namespace {

bool same_ignoring_case(const std::string& a, const std::string& b) {
  return a.size() == b.size() && std::equal(a.begin(), a.end(), b.begin(), [](char x, char y) {
           return std::tolower(static_cast<unsigned char>(x)) == std::tolower(static_cast<unsigned char>(y));
         });
}

bool passes(const std::string& wanted, const std::string& value) {
  return wanted.empty() || same_ignoring_case(wanted, value);
}

}  // namespace

void append_work_list(const UnitAssessment& a, const WorkListFilter& filter, std::vector<WorkListRow>& out) {
  if (!passes(filter.site, a.unit.site)) return;
  for (const Action& act : a.actions) {
    if (!passes(filter.crew, act.crew)) continue;
    WorkListRow r;
    r.unit_id = a.unit.unit_id;
    r.site = a.unit.site;
    r.reference = act.reference;
    r.text = act.text;
    r.reason = act.reason;
    r.source = act.source;
    r.crew = act.crew;
    r.priority = act.priority;
    r.found = act.found;
    r.due = act.due;
    r.overdue = act.overdue;
    r.outage = act.outage;
    r.status = act.status;
    r.work_date = act.work_date;
    r.work_note = act.work_note;
    out.push_back(std::move(r));
  }
}

void sort_work_list(std::vector<WorkListRow>& rows) {
  std::stable_sort(rows.begin(), rows.end(), [](const WorkListRow& x, const WorkListRow& y) {
    return std::tie(x.due, x.priority, x.unit_id, x.reference) < std::tie(y.due, y.priority, y.unit_id, y.reference);
  });
}

std::vector<WorkListRow> work_list(const std::vector<UnitAssessment>& fleet, const WorkListFilter& filter) {
  std::vector<WorkListRow> out;
  for (const UnitAssessment& a : fleet) append_work_list(a, filter, out);
  sort_work_list(out);
  return out;
}

}  // namespace ferrum::analytics
