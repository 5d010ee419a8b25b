#include "report/assessment_changes.h"

#include <algorithm>
#include <cmath>

#include "report/report_format.h"

namespace ferrum::report {
namespace {
using analytics::UnitAssessment;

void health_index_change(const UnitAssessment& cur, const UnitAssessment& prev, std::vector<std::string>& out) {
  if (cur.health_index && prev.health_index) {
    // Compare as printed, so the sentence agrees with the numbers shown.
    const long now = std::lround(*cur.health_index), before = std::lround(*prev.health_index);
    const std::string tail = " (previous report " + fmt_day(prev.as_of) + ": " + std::to_string(before) + ")";
    if (now < before)
      out.push_back("Health index worse by " + std::to_string(before - now) + " points: " + std::to_string(now) + tail + ".");
    else if (now > before)
      out.push_back("Health index better by " + std::to_string(now - before) + " points: " + std::to_string(now) + tail + ".");
    else
      out.push_back("Health index unchanged at " + std::to_string(now) + tail + ".");
  } else if (cur.health_index && !prev.health_index) {
    out.push_back("Health index available again: " + fmt_health_index(cur.health_index) + " (previous report had too little data).");
  } else if (!cur.health_index && prev.health_index) {
    out.push_back("Health index no longer computable (previous report: " + fmt_health_index(prev.health_index) + ").");
  }
  if (!cur.band.empty() && !prev.band.empty() && cur.band != prev.band)
    out.push_back("Condition band changed from " + prev.band + " to " + cur.band + ".");
}

void new_data(const UnitAssessment& cur, const UnitAssessment& prev, std::vector<std::string>& out) {
  for (const auto& f : cur.freshness) {
    if (!f.latest) continue;
    const auto it = std::find_if(prev.freshness.begin(), prev.freshness.end(),
                                 [&](const analytics::DataFreshness& p) { return p.kind == f.kind; });
    const bool had = it != prev.freshness.end() && it->latest;
    if (!had)
      out.push_back("New " + f.kind + " data: first records, latest " + fmt_day(f.latest) + ".");
    else if (*f.latest > *it->latest)
      out.push_back("New " + f.kind + " data up to " + fmt_day(f.latest) + " (previously " + fmt_day(it->latest) + ").");
  }
}

void condition_changes(const UnitAssessment& cur, const UnitAssessment& prev, std::vector<std::string>& out) {
  const auto& c = cur.dga;
  const auto& p = prev.dga;
  if (c.c57104_2008_condition && p.c57104_2008_condition && *c.c57104_2008_condition != *p.c57104_2008_condition)
    out.push_back("IEEE C57.104-2008 condition changed from " + std::to_string(*p.c57104_2008_condition) + " to " +
                  std::to_string(*c.c57104_2008_condition) + ".");
  if (c.duval_triangle_1 && p.duval_triangle_1 && *c.duval_triangle_1 != *p.duval_triangle_1)
    out.push_back("Duval Triangle 1 zone moved from " + *p.duval_triangle_1 + " to " + *c.duval_triangle_1 + ".");
  if (cur.active_arcing && !prev.active_arcing) out.push_back("Active-arcing gas signature is new since the previous report.");
  for (const auto& f : cur.inspection) {
    const auto it = std::find_if(prev.inspection.begin(), prev.inspection.end(),
                                 [&](const analytics::InspectionFinding& q) { return q.item == f.item; });
    if (it != prev.inspection.end() && it->rating != f.rating)
      out.push_back("Inspection: " + item_title(f.item) + " " + (f.rating > it->rating ? "worse" : "better") + ", " +
                    rating_title(it->rating) + " → " + rating_title(f.rating) + ".");
  }
  const size_t new_ir = static_cast<size_t>(std::count_if(cur.infrared.begin(), cur.infrared.end(), [&](const auto& f) {
    return std::none_of(prev.infrared.begin(), prev.infrared.end(),
                        [&](const auto& q) { return q.date == f.date && q.component == f.component; });
  }));
  if (new_ir > 0) out.push_back(std::to_string(new_ir) + " new infrared finding(s).");
  const auto& rl = cur.remaining_life;
  const auto& prl = prev.remaining_life;
  if (rl.years && prl.years && std::fabs(*rl.years - *prl.years) >= 0.5)
    out.push_back("Remaining life estimate " + fmt_number(rl.years, 1) + " years (previously " + fmt_number(prl.years, 1) + ").");
  for (const auto& a : cur.actions)
    if (std::none_of(prev.actions.begin(), prev.actions.end(), [&](const auto& q) { return q.text == a.text; }))
      out.push_back("New action: " + a.text);
}

}  // namespace

std::vector<std::string> describe_changes(const UnitAssessment& current, const UnitAssessment* previous) {
  if (!previous) return {"No previous report for this unit: nothing to compare with."};
  std::vector<std::string> out;
  health_index_change(current, *previous, out);
  condition_changes(current, *previous, out);
  new_data(current, *previous, out);
  if (out.empty()) out.push_back("No change since the previous report of " + fmt_day(previous->as_of) + ".");
  return out;
}

}  // namespace ferrum::report
