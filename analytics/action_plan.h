// Recommended actions of one assessment: merges the actions that the oil,
// thermal and other parts appended, adds the actions that the health index,
// the remaining life and stale data call for, and orders the list.
//
// Health-index actions follow the "requirement" column of the HI -> condition
// table of Jahromi et al., IEEE Electrical Insulation Magazine 25(2), 2009
// (from memory): below 30 replace or rebuild, 30-50 start
// planning replacement or rebuild, 50-70 more diagnostic testing. The due
// dates and the stale-data actions are ferrum's own defaults.
// Order: priority (1 = most urgent), then due date, then text.
#pragma once

#include "analytics/assessment.h"

namespace ferrum::analytics {

struct ActionPlanOptions {
  // Index at or below which (band edges belong to the worse band, as in
  // analytics/health_index.h):
  double replace_below_hi = 30;        // replacement is planned now
  double plan_below_hi = 50;           // planning of replacement/refurbishment starts
  double monitor_below_hi = 70;        // monitoring is intensified
  double replace_within_years = 5;     // remaining life below which replacement is planned
  double stale_after_years = 1.0;      // oil / infrared / inspection data older than this
  int replace_due_days = 90;
  int plan_due_days = 365;
  int monitor_due_days = 180;
  int data_due_days = 90;
};

// Same as finalize_actions(ActionPlanOptions{}, a).
void finalize_actions(UnitAssessment& a);
// Adds the HI-, life- and data-driven actions, merges actions whose text is
// the same (ignoring case, spacing and a final full stop: the most urgent
// priority, the earliest due date and every distinct reason are kept), and
// sorts by priority, due date, text.
void finalize_actions(const ActionPlanOptions& options, UnitAssessment& a);

// The merge and sort step alone.
std::vector<Action> merge_actions(const std::vector<Action>& actions);

}  // namespace ferrum::analytics
