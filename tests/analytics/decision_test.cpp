// Tests of the fleet decision (analytics/decision/decision.h): a matrix of
// storyline units, each expected decision with its source, and properties.
#include "analytics/decision/decision.h"

#include <gtest/gtest.h>

#include <functional>

#include "analytics/action_plan.h"
#include "analytics/electrical/electrical_assessment.h"
#include "analytics/fleet_ranking.h"
#include "analytics/remaining_life.h"

namespace fa = ferrum::analytics;

namespace {

const fa::Day kAsOf = fa::days_from_civil(2026, 11, 30);

using Defect = std::function<void(fa::UnitAssessment&)>;

void gassing_t3(fa::UnitAssessment& a) {
  a.dga.c57104_2008_condition = a.dga.c57104_2008_fault_condition = 3;
  a.dga.c57104_2019_status = a.dga.c57104_2019_fault_status = 3;
  a.dga.duval_triangle_1 = "T3";
  a.health_index = 30;  // capped by the correctable finding
}
void arcing(fa::UnitAssessment& a) {
  a.active_arcing = a.dga.active_arcing = true;
  a.dga.duval_triangle_1 = "D2";
  a.actions.push_back(fa::dated_action(1, kAsOf, 7, "Investigate acetylene: confirm with a resample and look for arcing",
                                   "acetylene", fa::kSourceOilSample, "oil-resample", fa::kCrewOilSampling));
  a.health_index = 30;
}
void unsafe_grounding(fa::UnitAssessment& a) {
  a.unsafe_inspection = true;
  a.inspection.push_back({"grounding", fa::Rating::unsafe, kAsOf - 10, {}, false, ""});
  a.actions.push_back(fa::dated_action(1, kAsOf, 0, "Make safe or take out of service: grounding", "rated unsafe",
                                   fa::kSourceInspection, "inspection:grounding", fa::kCrewMaintenance));
  a.health_index = 30;
}
void hot_joint(fa::UnitAssessment& a) {
  fa::InfraredFinding f;
  f.date = kAsOf - 30;
  f.component = "LV bushing X2 connector";
  f.severity = 4;
  a.infrared.push_back(f);
  a.actions.push_back(fa::dated_action(1, kAsOf, 7, "Retighten or repair the LV bushing X2 connector immediately",
                                   "infrared", fa::kSourceInfrared, "ir-repair:LV bushing X2 connector", fa::kCrewMaintenance,
                                   true));
  a.health_index = 50;
}
void wet_oil(fa::UnitAssessment& a) {
  a.oil.checks.push_back({"moisture", 40.0, 35.0, "max", "mg/kg", false, "IEEE C57.106-2015 Table 5"});
  a.oil.oil_class = "Class II";
  a.oil.paper_moisture_pct = 4.5;  // wet: at or above 4 % (IEEE Std 62-1995 classification, from memory; verify)
}
void aged_oil(fa::UnitAssessment& a) {
  a.oil.checks.push_back({"acidity", 0.3, 0.2, "max", "mg KOH/g", false, "IEEE C57.106-2015 Table 5"});
  a.oil.oil_class = "Class III";
}
void cooling_failure(fa::UnitAssessment& a) { a.thermal.top_oil_discrepancy_k = 9; }
void poor_bushing(fa::UnitAssessment& a) {
  a.inspection.push_back({"bushings", fa::Rating::poor, kAsOf - 10, {}, false, ""});
}

// Electrical field tests outside their limits (analytics/electrical/): one
// result of one test, 20 days before the assessment.
template <class R>
void one_test(fa::UnitAssessment& a, std::vector<R> fa::ElectricalSummary::*list, R r) {
  fa::ElectricalSummary s;
  r.date = kAsOf - 20;
  s.latest = r.date;
  (s.*list).push_back(r);
  a.electrical = s;
}
void failing_bushing_test(fa::UnitAssessment& a) {
  fa::BushingResult b;
  b.bushing = "H1";
  b.insulation = "C1";
  b.capacitance_change_pct = 12;
  b.verdict = "out of service";
  b.within_limit = false;
  one_test(a, &fa::ElectricalSummary::bushings, b);
}
void ratio_deviation(fa::UnitAssessment& a) {
  fa::TurnsRatioResult r;
  r.phase = "A";
  r.measured = 8.80;
  r.nameplate = 8.66;
  r.deviation_pct = (8.80 - 8.66) / 8.66 * 100;  // 1.6 %
  r.within_limit = false;
  one_test(a, &fa::ElectricalSummary::turns_ratio, r);
}
void questionable_insulation_resistance(fa::UnitAssessment& a) {
  fa::InsulationResistanceResult r;
  r.insulation = "HV-GROUND";
  r.one_minute_megohm = 1000;
  r.ten_minute_megohm = 1150;
  r.polarization_index = 1.15;
  r.reading = "questionable";
  one_test(a, &fa::ElectricalSummary::insulation_resistance, r);
}

// A unit built in `year` with paper DP `dp` (its own history from DP0 1000
// sets the rate), an index of 75 without findings, the defect applied, then
// remaining life and the action plan as assess_unit runs them.
fa::UnitAssessment story(int year, double dp, const Defect& defect = {}, double hi = 75) {
  fa::UnitAssessment a;
  a.as_of = kAsOf;
  a.unit.unit_id = "T" + std::to_string(year);
  a.unit.year_built = year;
  a.unit.rated_mva = 20;
  a.unit.criticality = 3;
  a.paper.dp_estimate = dp;
  a.health_index = a.condition_index = hi;
  if (defect) defect(a);
  fa::estimate_remaining_life(fa::RemainingLifeOptions{}, a);
  fa::finalize_actions(a);
  return a;
}

bool mentions(const std::string& text, const std::string& what) { return text.find(what) != std::string::npos; }

}  // namespace

// ------------------------------------------------------------ the matrix
// Young, sound paper, no finding: normal maintenance (Jahromi 2009 HI table,
// from memory: HI above 70 needs normal maintenance).
TEST(DecisionMatrix, YoungSoundUnitIsRoutine) {
  auto a = story(2016, 900);
  EXPECT_EQ(a.decision.action, "routine");
  EXPECT_TRUE(a.decision.defects.empty());
}

// Old but sound paper (DP 700 after 50 years): age alone does not replace a
// unit whose measured paper is sound (CIGRE TB 761: condition, not age).
TEST(DecisionMatrix, OldUnitWithSoundPaperIsRoutine) {
  auto a = story(1976, 700);
  EXPECT_EQ(a.decision.action, "routine");
  EXPECT_EQ(a.remaining_life.limiting_factor, "paper");
}

// Paper at end of life (DP 230 at 58.4 years, 13.2 DP/year: 2.3 years left,
// March 2029): replace (Jahromi 2009 HI table: end of life, replace or
// rebuild; CIGRE TB 761), in 2029.
TEST(DecisionMatrix, EndOfLifePaperIsReplacedAfterTheLeadTime) {
  auto a = story(1968, 230);
  EXPECT_EQ(a.decision.action, "replace");
  EXPECT_EQ(a.decision.year, 2029);
  EXPECT_TRUE(mentions(a.decision.reason, "only rewinding would"));
  bool replace_in_year = false;
  for (const auto& act : a.actions)
    if (act.text.rfind("Replace the transformer", 0) == 0) replace_in_year = fa::civil_from_days(act.due).year == 2029;
  EXPECT_TRUE(replace_in_year);  // the unit report's action falls in the ranking's year
}

// Until the replacement the oil is resampled at the interval the gases call
// for (IEEE C57.104-2008 Table 3: Condition 1, TDCG rate < 10 ppm/day,
// annual), not a fixed six months beside it; without a Table 3 interval, six
// months (ferrum default, common practice, no published source).
TEST(DecisionMatrix, ResamplingUntilTheReplacementFollowsTheTable3Interval) {
  auto a = story(1968, 230, [](fa::UnitAssessment& u) {
    u.dga.sample_date = kAsOf - 30;
    u.dga.c57104_2008_interval = "annual";
    u.dga.c57104_2008_interval_days = 365;
  });
  ASSERT_EQ(a.decision.action, "replace");
  const fa::Action* resample = nullptr;
  for (const auto& act : a.actions)
    if (act.need == "oil-resample") resample = &act;
  ASSERT_NE(resample, nullptr);
  EXPECT_NE(resample->text.find("(annual, IEEE C57.104 Table 3)"), std::string::npos) << resample->text;
  EXPECT_EQ(resample->text.find("six months"), std::string::npos);
  EXPECT_EQ(resample->due, kAsOf - 30 + 365);
}

// Hot thermal fault in oil (Duval T3, Condition 3, Status 3) in a young unit:
// investigate and repair the fault (IEEE C57.104-2019 operating procedures).
TEST(DecisionMatrix, YoungUnitWithThermalFaultIsInvestigated) {
  auto a = story(2014, 850, gassing_t3);
  EXPECT_EQ(a.decision.action, "investigate");
  ASSERT_EQ(a.decision.defects.size(), 1u);
  EXPECT_EQ(a.decision.defects[0].kind, "gassing");
  EXPECT_TRUE(mentions(a.decision.index_note, "held at 30"));
  EXPECT_TRUE(mentions(a.decision.index_note, "75"));
}

// The same fault in an old unit whose paper also has sound DP: still investigate
// (IEEE C57.104-2019 operating procedures).
TEST(DecisionMatrix, OldSoundUnitWithThermalFaultIsInvestigated) {
  auto a = story(1980, 650, gassing_t3);
  EXPECT_EQ(a.decision.action, "investigate");
}

// The same fault where the paper has 8 years left (DP 300 at 56 years),
// within the 10-year planning window: replace, and say why repairing is not
// worth it (ferrum's rule; common practice, no published source).
TEST(DecisionMatrix, FaultNearEndOfLifeIsReplacedWithTheReason) {
  auto a = story(1970, 300, gassing_t3);
  EXPECT_EQ(a.decision.action, "replace");
  EXPECT_TRUE(mentions(a.decision.reason, "is not worth it"));
  EXPECT_TRUE(mentions(a.decision.reason, "planning window"));
}

// Arcing (acetylene rising, D2) in a young unit: investigate at once, first
// action priority 1 (IEEE C57.104-2019 operating procedures for Status 3 and
// acetylene).
TEST(DecisionMatrix, ArcingIsInvestigatedFirstActionPriorityOne) {
  auto a = story(2012, 850, arcing);
  EXPECT_EQ(a.decision.action, "investigate");
  ASSERT_TRUE(a.decision.first_action);
  EXPECT_EQ(a.decision.first_action->priority, 1);
}

// An unsafe grounding on a sound unit: repair (make safe) this year, first
// action the make-safe (common practice: an unsafe item is made safe at once).
TEST(DecisionMatrix, UnsafeGroundingIsRepairedNow) {
  auto a = story(2012, 850, unsafe_grounding);
  EXPECT_EQ(a.decision.action, "repair");
  EXPECT_EQ(a.decision.year, 2026);
  ASSERT_TRUE(a.decision.first_action);
  EXPECT_TRUE(mentions(a.decision.first_action->text, "grounding"));
}

// A hot connection (infrared severity 4): repair (NETA MTS severity action,
// common practice).
TEST(DecisionMatrix, HotJointIsRepaired) {
  auto a = story(2012, 850, hot_joint);
  EXPECT_EQ(a.decision.action, "repair");
  EXPECT_EQ(a.decision.defects[0].kind, "hot_joint");
}

// Wet oil and wet paper (4.5 %) with paper still strong (DP 700): refurbish by
// drying out (IEEE C57.106 Class II reconditioning; drying paper above its
// brittle limit is common practice).
TEST(DecisionMatrix, WetOilIsDriedOut) {
  auto a = story(2005, 700, wet_oil);
  EXPECT_EQ(a.decision.action, "refurbish");
  EXPECT_TRUE(mentions(a.decision.treatment, "dry out the active part"));
  EXPECT_TRUE(a.decision.treats_paper);  // the plan credits it with years (plan.h)
}

// Wet oil and wet paper (4.5 %) but paper too brittle to dry out (DP 380, below
// the 400 of DecisionOptions::dry_out_min_dp; common practice, no published
// source): only the oil is dried, the plan gives it no years, and the reason
// says why the paper's water stays.
TEST(DecisionMatrix, WetButBrittlePaperIsNotDriedOut) {
  auto a = story(1979, 380, wet_oil);  // 13 DP/year since 1979: about 14 years left
  EXPECT_EQ(a.decision.action, "refurbish") << a.decision.reason;
  EXPECT_TRUE(mentions(a.decision.treatment, "dry and degas the oil"));
  EXPECT_FALSE(a.decision.treats_paper);
  EXPECT_TRUE(mentions(a.decision.reason, "too brittle to dry out")) << a.decision.reason;
}

// Aged oil (Class III) on a unit whose paper has 8 years left: reclamation
// cannot change the limiting factor (paper), so it is not the answer:
// replace, with the reason (common practice, no published source).
TEST(DecisionMatrix, AgedOilOnPaperLimitedUnitIsNotReclaimed) {
  auto a = story(1970, 300, aged_oil);
  EXPECT_EQ(a.decision.action, "replace");
  EXPECT_TRUE(a.decision.treatment.empty());
  for (const auto& act : a.actions) EXPECT_FALSE(mentions(act.text, "Refurbish")) << act.text;
}

// The same aged oil on a sound unit: reclaim the oil (IEEE C57.106 Class III:
// reclaim), and the reason says it does not restore the paper.
TEST(DecisionMatrix, AgedOilOnSoundUnitIsReclaimed) {
  auto a = story(2000, 750, aged_oil);
  EXPECT_EQ(a.decision.action, "refurbish");
  EXPECT_TRUE(mentions(a.decision.treatment, "reclaim"));
  EXPECT_TRUE(mentions(a.decision.reason, "does not restore the paper"));
  EXPECT_FALSE(a.decision.treats_paper);  // the plan gives an oil treatment no years (plan.h)
}

// Failed cooling (top oil 9 K above the model): repair (common practice).
TEST(DecisionMatrix, CoolingFailureIsRepaired) {
  auto a = story(2000, 750, cooling_failure);
  EXPECT_EQ(a.decision.action, "repair");
  EXPECT_EQ(a.decision.defects[0].kind, "cooling");
}

// A bushing rated poor: repair (common practice).
TEST(DecisionMatrix, PoorBushingIsRepaired) {
  auto a = story(2000, 750, poor_bushing);
  EXPECT_EQ(a.decision.action, "repair");
  EXPECT_EQ(a.decision.defects[0].kind, "bushing");
}

// A bushing whose C1 test calls for taking it out of service (capacitance up
// 12 %; IEEE C57.152-2013 clause 7.2.14, limits from memory; verify) is a
// defect of the unit: repair (replace the bushing), never "routine", and the
// bushing's own priority-1 action leads (decision rule 3, common practice).
TEST(DecisionMatrix, FailingBushingTestIsRepaired) {
  auto a = story(2005, 800, [](fa::UnitAssessment& u) {
    failing_bushing_test(u);
    for (auto& d : fa::electrical_defects(*u.electrical, u.as_of)) u.actions.push_back(d.action);
  });
  EXPECT_EQ(a.decision.action, "repair") << a.decision.reason;
  ASSERT_FALSE(a.decision.defects.empty());
  EXPECT_EQ(a.decision.defects[0].kind, "bushing");
  EXPECT_TRUE(mentions(a.decision.reason, "bushing H1 C1")) << a.decision.reason;
  ASSERT_TRUE(a.decision.first_action);
  EXPECT_EQ(a.decision.first_action->priority, 1);
}

// A bushing whose test asks for a retest ("investigate": power factor above
// twice its reference; IEEE C57.152-2013 clause 7.2.14, from memory; verify)
// is confirmed before anything is repaired: investigate, not repair
// (decision rule 3, common practice).
TEST(DecisionMatrix, BushingTestToConfirmIsInvestigated) {
  auto a = story(2005, 800, [](fa::UnitAssessment& u) {
    failing_bushing_test(u);
    u.electrical->bushings[0].verdict = "investigate";
  });
  EXPECT_EQ(a.decision.action, "investigate") << a.decision.reason;
  EXPECT_TRUE(mentions(a.decision.reason, "bushing H1 C1 test: investigate")) << a.decision.reason;
  EXPECT_FALSE(mentions(a.decision.reason, "Repair it")) << a.decision.reason;
}

// The same deviation read at three taps is one finding, not three (one need,
// one reason; common practice).
TEST(DecisionMatrix, ReadingsOfOneFindingAreNamedOnce) {
  auto a = story(2005, 800, [](fa::UnitAssessment& u) {
    ratio_deviation(u);
    auto r = u.electrical->turns_ratio[0];
    for (int tap : {1, 9, 17}) {
      r.tap = tap;
      u.electrical->turns_ratio.push_back(r);
    }
  });
  ASSERT_EQ(a.decision.defects.size(), 1u);
  EXPECT_TRUE(mentions(a.decision.defects[0].text, "on phase A (and 3 more readings)")) << a.decision.defects[0].text;
}

// A turns-ratio deviation of 1.6 % against the ±0.5 % limit (IEEE
// C57.12.00-2015 clause 9.1; from memory, verify) points to shorted turns or
// a tap-changer contact: investigate (confirm and locate), not repair blindly
// and not replace on a unit with sound paper (decision rule 3).
TEST(DecisionMatrix, TurnsRatioDeviationIsInvestigated) {
  auto a = story(2005, 800, ratio_deviation);
  EXPECT_EQ(a.decision.action, "investigate") << a.decision.reason;
  ASSERT_FALSE(a.decision.defects.empty());
  EXPECT_EQ(a.decision.defects[0].kind, "winding_test");
  EXPECT_TRUE(mentions(a.decision.reason, "turns-ratio deviation of 1.62 %")) << a.decision.reason;
}

// The same deviation near the end of paper life: the unit is replaced, and the
// reason says why the finding is not worth repairing (decision rule 2).
TEST(DecisionMatrix, ElectricalFindingNearEndOfLifeIsReplaced) {
  auto a = story(1970, 300, ratio_deviation);
  EXPECT_EQ(a.decision.action, "replace") << a.decision.reason;
  EXPECT_TRUE(mentions(a.decision.reason, "turns-ratio deviation")) << a.decision.reason;
}

// An insulation resistance rated "questionable" asks for a retest, not a
// decision (common practice scale, no published source): a sound unit stays
// routine.
TEST(DecisionMatrix, QuestionableInsulationResistanceIsNoDefect) {
  auto a = story(2016, 900, questionable_insulation_resistance);
  EXPECT_TRUE(a.decision.defects.empty());
  EXPECT_EQ(a.decision.action, "routine") << a.decision.reason;
}

// Tank corrosion rated very poor is chronic deterioration: end-of-life
// evidence, not a defect to repair (CIGRE TB 761 separates the two).
TEST(DecisionMatrix, TankCorrosionIsEndOfLifeEvidence) {
  auto a = story(1990, 650, [](fa::UnitAssessment& u) {
    u.inspection.push_back({"main_tank", fa::Rating::very_poor, kAsOf - 10, {}, false, ""});
  });
  EXPECT_TRUE(a.decision.defects.empty());
  bool chronic = false;
  for (const auto& e : a.decision.end_of_life) chronic = chronic || e.kind == "chronic";
  EXPECT_TRUE(chronic);
  EXPECT_NE(a.decision.action, "repair");
}

// Wet paper on a unit with 8 years left but brittle paper (DP 300): no drying
// out (common practice: brittle paper is not dried out), replace.
TEST(DecisionMatrix, BrittleWetPaperIsNotDriedOut) {
  auto a = story(1970, 300, [](fa::UnitAssessment& u) { u.oil.paper_moisture_pct = 4; });
  EXPECT_EQ(a.decision.action, "replace");
}

// One wet-paper threshold: the decision's treatment and the action plan's
// "dry out" job agree on both sides of it (4 %, DecisionOptions::wet_paper_pct;
// the moderately-wet/wet edge of the paper-moisture classification of IEEE
// Std 62-1995, from memory; verify). Before, the decision dried out from
// 2.5 % and the action list from 4 %.
TEST(DecisionMatrix, DecisionAndActionsShareTheWetPaperThreshold) {
  for (double water : {3.0, 3.99, 4.0, 4.5}) {
    auto a = story(2005, 700, [water](fa::UnitAssessment& u) {
      wet_oil(u);
      u.oil.paper_moisture_pct = water;
    });
    const bool dries_paper = mentions(a.decision.treatment, "active part");
    const bool has_dry_out = std::any_of(a.actions.begin(), a.actions.end(),
                                         [](const fa::Action& x) { return x.need == "dry-out"; });
    EXPECT_EQ(dries_paper, water >= 4.0) << water << " %: " << a.decision.treatment;
    EXPECT_EQ(has_dry_out, dries_paper) << water << " %";
    EXPECT_EQ(a.decision.treats_paper, dries_paper) << water << " %";
  }
}

// No index: investigate (collect the data) (common practice).
TEST(DecisionMatrix, NoIndexIsInvestigated) {
  fa::UnitAssessment a;
  a.as_of = kAsOf;
  fa::finalize_actions(a);
  EXPECT_EQ(a.decision.action, "investigate");
}

// Index thresholds at the band edges (Jahromi 2009 HI table, from memory;
// each edge belongs to the worse band): 50 investigate, 50.1 and 70 monitor,
// 70.1 routine, with sound paper and no defect.
TEST(DecisionMatrix, IndexThresholdsBothSides) {
  EXPECT_EQ(story(2016, 900, {}, 50).decision.action, "investigate");
  EXPECT_EQ(story(2016, 900, {}, 50.1).decision.action, "monitor");
  EXPECT_EQ(story(2016, 900, {}, 70).decision.action, "monitor");
  EXPECT_EQ(story(2016, 900, {}, 70.1).decision.action, "routine");
}

// ------------------------------------------------------------ properties
// No correctable defect alone yields replace, on a young unit with sound paper
// (issue rule; CIGRE TB 761 separates defects from end of life).
TEST(DecisionProperties, NoDefectAloneYieldsReplace) {
  for (const Defect& d : std::vector<Defect>{gassing_t3, arcing, unsafe_grounding, hot_joint, wet_oil, aged_oil,
                                             cooling_failure, poor_bushing, failing_bushing_test, ratio_deviation}) {
    auto a = story(2010, 800, d);
    EXPECT_NE(a.decision.action, "replace") << a.decision.reason;
    EXPECT_FALSE(a.decision.defects.empty());
    EXPECT_TRUE(a.remaining_life.beyond_horizon);  // the defect did not shorten life
  }
}

// Every unit with a priority-1 action shows it in its ranking row.
TEST(DecisionProperties, PriorityOneActionShownInTheRankingRow) {
  std::vector<fa::UnitAssessment> fleet{story(2012, 850, arcing), story(2013, 850, unsafe_grounding),
                                        story(2014, 850, hot_joint), story(1968, 230), story(2016, 900)};
  const auto r = fa::rank_fleet(fleet, kAsOf, fa::RankingOptions{});
  int checked = 0;
  for (const auto& a : fleet) {
    bool p1 = false;
    for (const auto& act : a.actions) p1 = p1 || act.priority == 1;
    for (const auto& row : r.units) {
      if (row.unit_id != a.unit.unit_id) continue;
      EXPECT_EQ(row.recommended_action, a.decision.action);
      EXPECT_EQ(row.action_year, a.decision.year);
      if (!p1) continue;
      ASSERT_TRUE(row.first_action) << row.unit_id;
      EXPECT_EQ(row.first_action->priority, 1) << row.unit_id;
      ++checked;
    }
  }
  EXPECT_EQ(checked, 3);
}

// A shorter lead time brings the replacement forward; the decision's
// replacement year never precedes the lead time (issue rule, common practice).
// DP 205 at 58.4 years: 0.4 years of life (April 2027).
TEST(DecisionProperties, LeadTimeSetsTheEarliestReplacementYear) {
  auto a = story(1968, 205);
  EXPECT_EQ(a.decision.year, 2028);  // default 24 months: November 2028
  // Procurement starts at once, so that its due date plus the lead time is
  // the in-service date the decision states (no page contradicts another).
  for (const auto& act : a.actions)
    if (act.text.rfind("Start procurement", 0) == 0) {
      EXPECT_EQ(act.due, kAsOf) << act.text;
    }
  fa::ActionPlanOptions o;
  o.decision.lead_time_months = 0;
  a.actions.clear();
  fa::finalize_actions(o, a);
  EXPECT_EQ(a.decision.year, 2027);  // no lead time: the end of life itself
  o.decision.lead_time_months = 48;
  a.actions.clear();
  fa::finalize_actions(o, a);
  EXPECT_EQ(a.decision.year, 2030);
}
