// Recommended actions of one assessment: merges the actions that the oil,
// thermal and other parts appended, adds the actions that stale data and the
// unit's decision (analytics/decision/decision.h: replace, refurbish, repair,
// investigate, monitor, routine) call for, coordinates them, orders the list
// and records the decision with the unit's most urgent action.
//
// Every action is anchored on its evidence (issue #16): due = found + an
// interval, so due dates hold from week to week and fall overdue.
// One need is one action (Action::need): duplicates merge. Coordination
// (common practice, no published source):
//  * no oil reclamation for a unit the decision replaces;
//  * wet paper (water content at or above decision.wet_paper_pct) is dried out with
//    the active part, which oil reconditioning would not do; unless the
//    paper's DP is below dry_out_min_dp, too brittle to dry out;
//  * the jobs that need the unit out of service get one "Plan one outage for
//    the N jobs ..." action; the jobs stay on the list as their own actions
//    and the outage action counts them without repeating their words.
// The intervals of the stale-data actions are ferrum's own defaults.
// Order: priority (1 = most urgent), then due date, then text.
#pragma once

#include "analytics/assessment.h"
#include "analytics/decision/decision.h"

namespace ferrum::analytics {

struct ActionPlanOptions {
  double stale_after_years = 1.0;      // oil / infrared / inspection data older than this
  int data_due_days = 90;             // after the data went stale
  // The paper water content (%, Fessler equilibrium, analytics/moisture_oil_paper.h)
  // at or above which the active part is dried out instead of the oil being
  // reconditioned is decision.wet_paper_pct, the one the decision reads; the
  // DP below which drying is not advised is decision.dry_out_min_dp.
  int dry_out_due_days = 365;        // from the oil sample that found the wet paper
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
// actions, merges actions of one need (merge_actions), applies the
// coordination rules above, adds the one outage action, sets each action's
// reference (action_reference(unit id, need)) and overdue flag (due before
// a.as_of), sorts by priority, due date, text, and sets
// a.decision.first_action to the first of them and, for every action but a
// replacement, a.decision.year to the year of that action's due date, never
// before the as-of year (the year of next year's routine visit when there is
// no action).
void finalize_actions(const ActionPlanOptions& options, UnitAssessment& a);

// The merge and sort step alone: actions of one need (of the same text when
// the need is empty, ignoring case, spacing and a final full stop) become
// one, with the most urgent priority and wording, the earliest due date (and
// its found date), every distinct reason, and an outage when any needs one.
std::vector<Action> merge_actions(const std::vector<Action>& actions);

// The one outage action (need "outage") for every action with outage = true:
// "Plan one outage for the N jobs that need this unit out of service (each
// listed on its own)", the most urgent priority, the earliest due date. It
// names the count, never the jobs' texts. nullopt when no action needs an outage.
std::optional<Action> outage_action(const std::vector<Action>& actions);

}  // namespace ferrum::analytics
