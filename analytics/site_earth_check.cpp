#include "analytics/site_earth_check.h"

#include <algorithm>
#include <cctype>
#include <string>

#include "analytics/action_plan.h"
#include "analytics/calendar.h"

namespace ferrum::analytics {
namespace {

constexpr const char* kEarthItem = "grounding";

std::string lower(std::string s) {
  for (char& c : s) c = static_cast<char>(std::tolower(static_cast<unsigned char>(c)));
  return s;
}

}  // namespace

bool earth_missing(const InspectionRecord& r) {
  if (r.item != kEarthItem) return false;
  if (r.rating == Rating::unsafe) return true;
  if (r.rating < Rating::poor) return false;
  const std::string note = lower(r.note);
  for (const char* word : {"stolen", "theft", "missing", "removed", "cut"})
    if (note.find(word) != std::string::npos) return true;
  return false;
}

void add_site_earth_check(const UnitData& data, Day as_of, const SiteEarthOptions& options, UnitAssessment& out) {
  const SiteInspection* newest = nullptr;
  std::vector<std::string> units;
  for (const auto& s : data.site_inspections) {
    if (s.unit_id == data.info.unit_id || s.record.date > as_of || !earth_missing(s.record)) continue;
    if (!newest || s.record.date > newest->record.date) newest = &s;
    if (std::find(units.begin(), units.end(), s.unit_id) == units.end()) units.push_back(s.unit_id);
  }
  if (!newest) return;
  const Day found = newest->record.date;
  // This unit's own earth was looked at since: the check is done.
  for (const auto& r : data.inspections)
    if (r.item == kEarthItem && r.date >= found && r.date <= as_of) return;
  std::string where;
  for (const auto& u : units) where += (where.empty() ? "" : ", ") + u;
  std::string reason = "inspection " + format_day(found) + " at " + newest->unit_id + " (same site): earth " +
                       "rated " + to_string(newest->record.rating);
  if (!newest->record.note.empty()) reason += " (" + newest->record.note + ")";
  if (units.size() > 1) reason += "; earths also reported stolen or missing at " + where;
  out.actions.push_back(dated_action(2, found, options.due_days,
                                     "Check this unit's earth connections (tank, neutral, surge arresters): an earth "
                                     "was found stolen or missing at " + newest->unit_id + " on the same site",
                                     reason, kSourceInspection, "site-earth-check", kCrewMaintenance));
}

}  // namespace ferrum::analytics
