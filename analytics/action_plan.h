// Recommended actions of one assessment: merges the actions that the oil,
// thermal and other parts appended, adds the actions that stale data and the
// unit's decision (analytics/decision/decision.h: replace, refurbish, repair,
// investigate, monitor, routine) call for, orders the list and records the
// decision with the unit's most urgent action.
//
// The due dates of the stale-data actions are ferrum's own defaults.
// Order: priority (1 = most urgent), then due date, then text.
#pragma once

#include "analytics/assessment.h"
#include "analytics/decision/decision.h"

namespace ferrum::analytics {

struct ActionPlanOptions {
  double stale_after_years = 1.0;      // oil / infrared / inspection data older than this
  int data_due_days = 90;
  DecisionOptions decision;
};

// An action anchored on its evidence (issue #16): due = found + due_days, so
// the due date holds from week to week and falls overdue. `found` is the date
// of the sample, survey, inspection or test; where there is no dated evidence
// (no data on record, a decision on the whole unit) pass the assessment date.
// source: a kSource* value; crew: a kCrew* value; need: the stable key that
// makes one need one action ("oil-resample", "ir-repair:<component>", ...).
Action dated_action(int priority, Day found, int due_days, std::string text, std::string reason,
                    const char* source, std::string need, const char* crew, bool outage = false);

// Same as finalize_actions(ActionPlanOptions{}, a).
void finalize_actions(UnitAssessment& a);
// Adds the data-driven actions, decides (a.decision), adds the decision's
// actions, merges actions whose text is the same (ignoring case, spacing and
// a final full stop: the most urgent priority, the earliest due date and every
// distinct reason are kept), sorts by priority, due date, text, and sets
// a.decision.first_action to the first of them and, for every action but a
// replacement, a.decision.year to the year of that action's due date (the
// year of next year's routine visit when there is no action).
void finalize_actions(const ActionPlanOptions& options, UnitAssessment& a);

// The merge and sort step alone.
std::vector<Action> merge_actions(const std::vector<Action>& actions);

}  // namespace ferrum::analytics
