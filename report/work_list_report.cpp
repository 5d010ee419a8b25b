#include "report/work_list_report.h"

#include <algorithm>
#include <sstream>

#include "report/csv_field.h"
#include "report/report_format.h"

namespace ferrum::report {
namespace {

std::string day_or_empty(analytics::Day d) { return d == 0 ? std::string() : analytics::format_day(d); }

// "overdue", "booked 2026-12-10" or "".
std::string state_text(const analytics::WorkListRow& r) {
  if (r.status == "booked") return "booked " + day_or_empty(r.work_date);
  return r.overdue ? "overdue" : "";
}

}  // namespace

std::string work_list_csv(const std::vector<analytics::WorkListRow>& rows) {
  std::ostringstream o;
  o << "due,overdue,status,booked_date,priority,found,source,outage,crew,unit_id,site,reference,action,note\n";
  for (const auto& r : rows) {
    o << day_or_empty(r.due) << ',' << (r.overdue ? "yes" : "no") << ',' << (r.status.empty() ? "open" : r.status)
      << ',' << (r.status == "booked" ? day_or_empty(r.work_date) : "") << ',' << r.priority << ','
      << day_or_empty(r.found) << ',' << quote(r.source) << ',' << (r.outage ? "yes" : "no") << ',' << quote(r.crew)
      << ',' << quote(r.unit_id) << ',' << quote(r.site) << ',' << quote(r.reference) << ',' << quote(r.text) << ','
      << quote(r.work_note) << '\n';
  }
  return o.str();
}

std::string work_list_text(const std::vector<analytics::WorkListRow>& rows, analytics::Day as_of) {
  std::ostringstream o;
  o << "Work list as of " << analytics::format_day(as_of) << ": " << rows.size() << " open action"
    << (rows.size() == 1 ? "" : "s") << "\n";
  for (const auto& r : rows) {
    const std::string state = state_text(r);
    o << "  " << day_or_empty(r.due) << (state.empty() ? "" : " (" + state + ")") << "  P" << r.priority << "  "
      << r.unit_id << " (" << r.site << ")  " << (r.crew.empty() ? "-" : r.crew) << (r.outage ? ", outage" : "")
      << "  " << r.reference << ": " << r.text;
    if (r.found != 0) o << " [found " << analytics::format_day(r.found) << (r.source.empty() ? "" : ", " + r.source) << "]";
    o << "\n";
  }
  return o.str();
}

void work_list_section(PageFlow& flow, const std::vector<analytics::WorkListRow>& rows, analytics::Day as_of,
                       std::size_t max_rows) {
  flow.section("Work list", 40);
  if (rows.empty()) {
    flow.paragraph("No open action.", type::body, FontFace::regular, palette::muted);
    return;
  }
  flow.paragraph("Every open action of the fleet, soonest due first, as of " + analytics::format_day(as_of) +
                     ". Due dates count from the date the evidence was found. A booked action shows its booking "
                     "date; done and cancelled actions (the planners' work-status files) are not listed. Quote the "
                     "reference in a work-status file.",
                 type::small, FontFace::regular, palette::muted);
  Table t;
  t.font_size = 6.8;
  // The reference sits under the action (as in the unit report): a column of
  // its own would break long references mid-word.
  // Date columns wide enough for a bold ISO date on one line.
  t.columns = {{"Due", 1.05},  {"State", 1.0},  {"Found", 1.05}, {"Outage", 0.62}, {"Crew", 1.05},
               {"Unit", 0.7}, {"Site", 0.85}, {"Action and reference", 2.3}, {"Why", 1.4}};
  const std::size_t n = max_rows == 0 ? rows.size() : std::min(rows.size(), max_rows);
  for (std::size_t i = 0; i < n; ++i) {
    const auto& r = rows[i];
    const std::string state = state_text(r);
    t.rows.push_back({day_or_empty(r.due), state.empty() ? kNoValue : state,
                      r.found == 0 ? kNoValue : analytics::format_day(r.found), r.outage ? "yes" : "no",
                      r.crew.empty() ? kNoValue : r.crew, r.unit_id, r.site,
                      r.reference.empty() ? r.text : r.text + "\nref. " + r.reference,
                      r.reason.empty() ? kNoValue : short_reason(r.reason)});
    t.emphasis.push_back(r.overdue || r.priority == 1);
  }
  flow.table(t);
  if (n < rows.size())
    flow.paragraph(std::to_string(rows.size() - n) + " more action" + (rows.size() - n == 1 ? "" : "s") +
                       " due later: ferrum worklist --csv lists them all.",
                   type::small, FontFace::regular, palette::muted);
}

}  // namespace ferrum::report
