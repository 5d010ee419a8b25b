// Site earth check: an earth conductor found stolen or missing at one unit
// prompts a check of the earths of the other units at that site (issue #16).
// Theft of earth copper rarely stops at one conductor, and a unit whose tank
// or neutral is not bonded to the earth grid puts anyone who touches it at
// risk (common practice, no published source).
//
// Input: the unit's own inspections and the "grounding" inspection records
// of the other units at its site (UnitData::site_inspections). A record says
// the earth is stolen or missing when it is rated unsafe, or rated poor or
// worse with a note naming theft or a missing, removed or cut conductor.
// Output: one action on this unit, need "site-earth-check", found = the date
// of the newest such record at another unit, due `due_days` later; none when
// this unit's own grounding was inspected on or after that date.
#pragma once

#include "analytics/assessment.h"
#include "analytics/unit_data.h"

namespace ferrum::analytics {

struct SiteEarthOptions {
  int due_days = 7;  // ferrum's default: a safety check, within a week
};

// True when an inspection record says an earth conductor is stolen or missing.
bool earth_missing(const InspectionRecord& r);

// Appends the site-earth-check action to out.actions when one is due.
void add_site_earth_check(const UnitData& data, Day as_of, const SiteEarthOptions& options, UnitAssessment& out);

}  // namespace ferrum::analytics
