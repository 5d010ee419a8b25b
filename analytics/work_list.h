// The fleet work list (issue #16): every open action of every unit, one
// row each, for a planner to schedule from. Open = on the unit's action list
// after the planners' work status (analytics/work_status.h): booked actions
// are listed with their booking date; done and cancelled ones are not.
//
// Order: due date, then priority (1 = most urgent), unit, reference.
// Filters: site and crew, compared without regard to case; empty = all.
// Method: ferrum's own listing, no published source. Pure.
#pragma once

#include <string>
#include <vector>

#include "analytics/assessment.h"

namespace ferrum::analytics {

struct WorkListRow {
  std::string unit_id, site;
  std::string reference;   // "<unit id>/<need>"
  std::string text;
  std::string reason;      // why (Action::reason)
  std::string source;      // kSource*
  std::string crew;        // kCrew*
  int priority = 3;
  Day found = 0;           // 0: not dated
  Day due = 0;
  bool overdue = false;
  bool outage = false;
  std::string status;      // "" (open) or "booked"
  Day work_date = 0;       // booking date when booked
  std::string work_note;
};

struct WorkListFilter {
  std::string site;  // "" = every site
  std::string crew;  // "" = every crew
};

// One row per action of the assessed units that passes the filter, sorted.
std::vector<WorkListRow> work_list(const std::vector<UnitAssessment>& fleet, const WorkListFilter& filter = {});

// The rows of one unit's actions (unfiltered, unsorted): for callers that
// stream the fleet and sort at the end (sort_work_list).
void append_work_list(const UnitAssessment& a, const WorkListFilter& filter, std::vector<WorkListRow>& out);
void sort_work_list(std::vector<WorkListRow>& rows);

}  // namespace ferrum::analytics
