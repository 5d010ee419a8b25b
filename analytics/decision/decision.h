// The one place that decides what to do with a unit: replace, refurbish,
// repair, investigate, monitor or routine, with the year and the reason in
// words. The fleet ranking, the unit report and `assess --json` all read the
// UnitAssessment::decision this module fills, so they cannot disagree.
//
// Two kinds of evidence are kept apart (CIGRE TB 761 (2019) separates the
// condition of the insulation, which ends the unit's life, from the defects
// that maintenance corrects):
//  * end of life, which no maintenance undoes: paper DP, thermal life
//    consumed, age against expected life, chronic deterioration found by
//    inspection (tank or radiators corroded, rated very poor or worse). The
//    remaining life (analytics/remaining_life.h) comes from this kind only.
//  * correctable defects: an active gassing fault (IEEE C57.104-2008 Condition
//    3/4, C57.104-2019 Status 3, acetylene arcing), a hot connection (infrared
//    severity 3-4), wet or aged oil (IEEE C57.106 Class II/III or a failed
//    water or breakdown test), an unsafe inspection item, a cooling failure,
//    a deteriorated bushing or other fitting rated poor or worse, an
//    electrical field test outside its limit (a bushing's C1/C2 test, the
//    turns ratio, winding resistance, leakage reactance, excitation pattern,
//    winding insulation power factor or resistance).
//
// The rules, in order (thresholds in DecisionOptions, from ferrum.ini [ranking]):
//  1. Remaining life within replace_within_years: replace.
//  2. A defect and remaining life within planning_window_years: replace, and
//     the reason says why repairing the defect is not worth it. A defect alone
//     never leads to replace.
//  3. A defect: its own action (gassing: investigate, following the C57.104
//     operating procedures; an electrical test of the active part or the
//     winding insulation: investigate, confirm and locate before repair; wet
//     or aged oil: refurbish, with the treatment that restores the oil; every
//     other defect, a bushing test calling for taking it out of service
//     included: repair; a bushing test to be confirmed first: investigate).
//  4. Remaining life within planning_window_years: refurbish by drying out
//     when the paper is wet, still strong enough to be dried (DP at or above
//     dry_out_min_dp) and paper or thermal ageing limits the life (drying slows
//     paper ageing; it cannot restore DP), otherwise replace at the end of
//     life. Oil reclamation is never offered for a paper-limited unit.
//  Monitor also covers a hot spot above the normal cyclic limit (manage the
//  load: an operating matter, not a defect of the unit).
//  5. No index: investigate (collect the missing data).
//  6. Index at or below investigate_below_hi without end-of-life evidence or a
//     defect to explain it: investigate; at or below monitor_below_hi, or a
//     DGA result above normal, or a minor infrared finding: monitor.
//  7. Otherwise routine.
// Index thresholds follow the band requirements of the HI table of Jahromi et
// al., IEEE Electrical Insulation Magazine 25(2), 2009 (from memory); the life
// windows, the lead time and the defect classes are ferrum's own defaults
// (common practice, no published source).
//
// Years: a replacement cannot be in service before the procurement lead time
// has passed (lead_time_months, default 24): its year is that of as_of +
// max(remaining life, lead time), and until then the unit keeps the actions
// that manage its risk. Every other action's year is the year of its due date,
// never before the as-of year (an overdue action is due now).
#pragma once

#include <string>
#include <vector>

#include "analytics/assessment.h"

namespace ferrum::analytics {

struct DecisionOptions {
  double replace_within_years = 5;       // remaining life at or below which the unit is replaced
  double planning_window_years = 10;     // a defect within this much remaining life leads to replacement
  int lead_time_months = 24;             // procurement lead time of a replacement
  double investigate_below_hi = 50;      // index (band edges belong to the worse band)
  double monitor_below_hi = 70;
  double cooling_discrepancy_k = 5;      // measured top oil above the model by more: cooling failure
                                         // (assess_unit sets ThermalOptions::discrepancy_threshold_k)
  // Paper water content, %, at or above which the active part is dried out
  // (the one threshold: the decision and the action plan both read it;
  // ferrum.ini [ranking] wet_paper_pct). 4 %: the lower edge of "wet" in the
  // usual paper-moisture classification (dry below 2 %, moderately wet 2-4 %,
  // wet above 4 %; IEEE Std 62-1995, from memory; verify).
  double wet_paper_pct = 4.0;
  double dry_out_min_dp = 400;   // below it the paper is too brittle to dry out the active part (common practice)
  // Inspection items whose poor state is chronic (end of life), not a repair.
  std::vector<std::string> chronic_items{"main_tank", "radiators"};  // assess_unit sets RemainingLifeOptions::chronic_items
  Rating chronic_rating = Rating::very_poor;     // chronic items at or worse than this are end-of-life evidence
  Rating defect_rating = Rating::poor;           // other items at or worse than this are defects
  int replace_priority_days = 90;                // "start procurement" due within it is priority 2
  int investigate_due_days = 90;                 // due of "investigate the low index"
  int monitor_due_days = 180;
};

// Classifies the evidence of an assessment (oil, thermal, inspection, remaining
// life and actions already filled) and decides. Pure.
Decision decide(const DecisionOptions& options, const UnitAssessment& a);

// The actions the decision itself calls for (procurement and replacement,
// drying out, investigation of a low index, monitoring), to be merged into
// the assessment's list.
std::vector<Action> decision_actions(const DecisionOptions& options, const UnitAssessment& a, const Decision& d);

}  // namespace ferrum::analytics
