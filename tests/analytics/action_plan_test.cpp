// Tests of the action plan (analytics/action_plan.h): merging by need, dates
// anchored on the evidence, coordination of the actions.
// The index thresholds follow the HI table of Jahromi et al. 2009 (from memory).
#include "analytics/action_plan.h"

#include <gtest/gtest.h>

#include <algorithm>
#include <tuple>

#include "analytics/assess_unit.h"

namespace fa = ferrum::analytics;

namespace {

fa::Action act(int priority, fa::Day found, int days, std::string text, std::string reason, std::string need,
               bool outage = false) {
  return fa::dated_action(priority, found, days, std::move(text), std::move(reason), fa::kSourceOilSample,
                          std::move(need), fa::kCrewOilSampling, outage);
}

const fa::Action* find_need(const std::vector<fa::Action>& v, const std::string& need) {
  auto it = std::find_if(v.begin(), v.end(), [&](const fa::Action& x) { return x.need == need; });
  return it == v.end() ? nullptr : &*it;
}

std::size_t count_need(const std::vector<fa::Action>& v, const std::string& need) {
  return static_cast<std::size_t>(std::count_if(v.begin(), v.end(), [&](const fa::Action& x) { return x.need == need; }));
}

fa::UnitAssessment fresh_unit(double hi) {
  fa::UnitAssessment a;
  a.unit.unit_id = "T1";
  a.as_of = 20000;
  a.health_index = hi;
  a.dga.sample_date = 19900;
  a.infrared.push_back({});
  a.infrared[0].date = 19900;
  a.inspection.push_back({"bushings", fa::Rating::good, 19900, {}, false, ""});
  return a;
}

}  // namespace

TEST(ActionPlan, DatedActionCountsFromItsEvidence) {
  const auto x = act(2, 19000, 30, "Resample", "why", "oil-resample");
  EXPECT_EQ(x.found, 19000);
  EXPECT_EQ(x.due, 19030);
  EXPECT_EQ(x.source, fa::kSourceOilSample);
  EXPECT_EQ(x.crew, fa::kCrewOilSampling);
}

// Without a need, actions of the same text (ignoring case, spacing and a
// final full stop) merge, as before issue #16.
TEST(ActionPlan, MergesSameTextWhenNoNeed) {
  std::vector<fa::Action> in{act(3, 100, 100, "Take an oil sample", "DGA rising", ""),
                             act(2, 100, 50, "take an  oil sample.", "acidity high", ""),
                             act(3, 100, 0, "Take an oil sample", "DGA rising", ""),
                             act(4, 0, 50, "Check gaskets", "seep", "")};
  auto out = fa::merge_actions(in);
  ASSERT_EQ(out.size(), 2u);
  EXPECT_EQ(out[0].priority, 2);
  EXPECT_EQ(out[0].due, 100);
  EXPECT_EQ(out[0].text, "take an  oil sample.");
  EXPECT_EQ(out[0].reason, "DGA rising; acidity high");
  EXPECT_EQ(out[1].text, "Check gaskets");
}

// One need is one action (issue #16): "Take an oil sample" for stale data
// and a DGA "resample within N days" are the one need oil-resample; the
// merged action keeps the most urgent priority and due date and lists both
// reasons (common practice, no published source).
TEST(ActionPlan, OneNeedIsOneActionWithEveryReason) {
  std::vector<fa::Action> in{act(4, 19500, 365, "Resample main-tank oil for DGA within 365 days",
                                 "C57.104-2008 Condition 1", "oil-resample"),
                             act(3, 19400, 455, "Take an oil sample for DGA, oil quality and furans",
                                 "latest oil data 1.6 years old", "oil-resample"),
                             act(3, 19900, 180, "Monitor: resample the oil and repeat the surveys within six months",
                                 "Health index 65", "oil-resample")};
  auto out = fa::merge_actions(in);
  ASSERT_EQ(out.size(), 1u);
  EXPECT_EQ(out[0].priority, 3);
  EXPECT_EQ(out[0].due, 19400 + 455);
  EXPECT_EQ(out[0].found, 19400);  // the found date of the due date kept
  EXPECT_EQ(out[0].reason, "C57.104-2008 Condition 1; latest oil data 1.6 years old; Health index 65");
}

TEST(ActionPlan, SortedByPriorityThenDueThenText) {
  auto out = fa::merge_actions(
      {act(2, 0, 10, "b", "", ""), act(1, 0, 30, "z", "", ""), act(2, 0, 10, "a", "", ""), act(2, 0, 5, "c", "", "")});
  std::vector<std::string> t;
  for (const auto& a : out) t.push_back(a.text);
  EXPECT_EQ(t, (std::vector<std::string>{"z", "c", "a", "b"}));
}

// The plan records the decision with the most urgent action first
// (analytics/decision/decision.h; its rules are tested in decision_test.cpp).
// The decision year is that of the first action's due date, never before the
// as-of year.
TEST(ActionPlan, DecisionAndFirstActionRecorded) {
  auto a = fresh_unit(60);
  a.actions.push_back(act(1, 19990, 0, "Make safe or take out of service: grounding", "unsafe", "inspection:grounding"));
  fa::finalize_actions(a);
  ASSERT_TRUE(a.decision.first_action);
  EXPECT_EQ(a.decision.first_action->priority, 1);
  EXPECT_EQ(a.decision.first_action->text, a.actions.front().text);
  EXPECT_EQ(a.decision.first_action->reference, "T1/inspection:grounding");
  EXPECT_TRUE(a.decision.first_action->overdue);  // due 19990, before as_of 20000
  EXPECT_FALSE(a.decision.action.empty());
  EXPECT_EQ(a.decision.year, fa::civil_from_days(20000).year);
}

// An action due before the as-of day is overdue; one due on it is not
// (issue #16).
TEST(ActionPlan, OverdueWhenDueBeforeAsOf) {
  auto a = fresh_unit(90);
  a.actions.push_back(act(2, 19900, 99, "Retest A", "r", "electrical:a"));
  a.actions.push_back(act(2, 19900, 100, "Retest B", "r", "electrical:b"));
  fa::finalize_actions(a);
  ASSERT_NE(find_need(a.actions, "electrical:a"), nullptr);
  EXPECT_TRUE(find_need(a.actions, "electrical:a")->overdue);
  EXPECT_FALSE(find_need(a.actions, "electrical:b")->overdue);
  EXPECT_EQ(find_need(a.actions, "electrical:b")->reference, "T1/electrical:b");
}

// Stale data: found is the date of the latest data, so the due date holds;
// no data on record: the assessment date.
TEST(ActionPlan, StaleAndMissingDataAsked) {
  fa::UnitAssessment a;
  a.as_of = 20000;
  a.dga.sample_date = 20000 - 800;  // 2.2 years
  fa::finalize_actions(a);
  ASSERT_EQ(a.actions.size(), 3u);
  EXPECT_EQ(a.actions[0].text, "Take an oil sample for DGA, oil quality and furans");
  EXPECT_EQ(a.actions[0].need, "oil-resample");
  EXPECT_EQ(a.actions[0].found, 20000 - 800);
  EXPECT_EQ(a.actions[0].due, 20000 - 800 + 365 + 90);  // ferrum defaults: stale after 1 year, then 90 days
  EXPECT_TRUE(a.actions[0].overdue);
  EXPECT_NE(a.actions[0].reason.find("2.2 years"), std::string::npos);
  EXPECT_NE(a.actions[1].reason.find("no "), std::string::npos);
  EXPECT_EQ(a.actions[1].found, 20000);  // year built unknown: from the assessment
}

// Never on record for a unit in service for years: the date counts from the
// end of its first year in service, so it holds from week to week and falls
// overdue (as the weekly cover's overdue list says) instead of sliding with
// the assessment day (ferrum's rule, no published source).
TEST(ActionPlan, NeverTakenDataIsDueFromTheFirstYearInService) {
  fa::UnitAssessment a;
  a.as_of = fa::days_from_civil(2026, 12, 3);
  a.unit.year_built = 2023;
  a.dga.sample_date = a.as_of - 30;
  fa::finalize_actions(a);
  const fa::Action* ir = find_need(a.actions, "ir-survey");
  ASSERT_NE(ir, nullptr);
  EXPECT_EQ(ir->found, fa::days_from_civil(2024, 1, 1));
  EXPECT_EQ(ir->due, fa::days_from_civil(2024, 1, 1) + 90);  // ferrum default data_due_days
  EXPECT_TRUE(ir->overdue);
  EXPECT_NE(ir->reason.find("in service since 2023"), std::string::npos) << ir->reason;
  // A week later the date is the same.
  fa::UnitAssessment b = a;
  b.actions.clear();
  b.as_of += 7;
  fa::finalize_actions(b);
  EXPECT_EQ(find_need(b.actions, "ir-survey")->due, ir->due);
}

// The jobs that need an outage get one outage action with the earliest due date and the most urgent priority, instead of
// several outage actions at different priorities (issue #16; common
// practice, no published source).
TEST(ActionPlan, OneOutageActionGathersTheOutageJobs) {
  auto a = fresh_unit(90);
  a.actions.push_back(act(1, 19950, 7, "Retighten or repair the HV connector immediately", "IR", "ir-repair:HV", true));
  a.actions.push_back(act(3, 19800, 365, "Repair or maintain the gaskets and leaks", "leak", "inspection:gaskets", true));
  a.actions.push_back(act(2, 19990, 90, "Retest bushing H1", "C1", "electrical:bushing-H1", true));
  a.actions.push_back(act(3, 19990, 90, "Check the cooling", "top oil", "cooling-check", false));
  fa::finalize_actions(a);
  ASSERT_EQ(count_need(a.actions, "outage"), 1u);
  const fa::Action* o = find_need(a.actions, "outage");
  EXPECT_EQ(o->priority, 1);
  EXPECT_EQ(o->due, 19957);
  EXPECT_TRUE(o->outage);
  EXPECT_EQ(o->reference, "T1/outage");
  // It counts the jobs and does not repeat them: they stay on the list on their own.
  EXPECT_EQ(o->text, "Plan one outage for the 3 jobs that need this unit out of service (each listed on its own)");
  EXPECT_EQ(count_need(a.actions, "ir-repair:HV"), 1u);
  EXPECT_EQ(count_need(a.actions, "inspection:gaskets"), 1u);
  EXPECT_EQ(count_need(a.actions, "electrical:bushing-H1"), 1u);
  // The outage line shares the lead job's priority and due date; the job
  // comes first, so the unit's first action is the job itself (plumbing: no
  // published source applies).
  EXPECT_EQ(a.actions.front().need, "ir-repair:HV");
  ASSERT_TRUE(a.decision.first_action);
  EXPECT_EQ(a.decision.first_action->need, "ir-repair:HV");
}

// A job whose own words say "plan an outage" (an IEEE C57.104 status action)
// is not wrapped in the outage line: no list says "plan an outage" twice for
// one job (plumbing of the action list: no published source applies).
TEST(ActionPlan, OutageLineNeverWrapsAJobsOwnWords) {
  auto a = fresh_unit(90);
  a.actions.push_back(act(2, 19950, 30, "Exercise extreme caution; analyse individual gases for cause; plan an outage",
                          "DGA", "dga-status", true));
  a.actions.push_back(act(3, 19800, 365, "Repair or maintain the bushings", "inspection", "inspection:bushings", true));
  fa::finalize_actions(a);
  std::size_t mentions = 0;
  for (const auto& x : a.actions)
    for (auto p = x.text.find("lan an outage"); p != std::string::npos; p = x.text.find("lan an outage", p + 1)) ++mentions;
  EXPECT_EQ(mentions, 1u);  // the job's own words only
  const fa::Action* o = find_need(a.actions, "outage");
  ASSERT_NE(o, nullptr);
  EXPECT_EQ(o->text.find("caution"), std::string::npos);
  EXPECT_NE(o->text.find("2 jobs"), std::string::npos);
}

// A job the planners report done leaves the outage action too; a booked one
// stays in it (issue #16, work-status files; common practice, no published
// source).
TEST(ActionPlan, OutageActionListsOnlyTheJobsNotDone) {
  auto a = fresh_unit(90);
  a.actions.push_back(act(1, 19950, 7, "Retighten or repair the HV connector immediately", "IR", "ir-repair:HV", true));
  a.actions.push_back(act(3, 19800, 365, "Repair or maintain the gaskets and leaks", "leak", "inspection:gaskets", true));
  a.work_status = {{"T1/ir-repair:HV", "done", 19960, "connector replaced"},
                   {"T1/inspection:gaskets", "booked", 19995, ""}};
  fa::finalize_actions(a);
  ASSERT_EQ(count_need(a.actions, "ir-repair:HV"), 0u);
  const fa::Action* o = find_need(a.actions, "outage");
  ASSERT_NE(o, nullptr);
  EXPECT_EQ(o->text, "Plan an outage for the job that needs this unit out of service (listed on its own)");
  EXPECT_EQ(o->due, 19800 + 365);
}

TEST(ActionPlan, NoOutageActionWithoutOutageJobs) {
  auto a = fresh_unit(90);
  a.actions.push_back(act(3, 19990, 90, "Check the cooling", "top oil", "cooling-check", false));
  fa::finalize_actions(a);
  EXPECT_EQ(count_need(a.actions, "outage"), 0u);
}

namespace {
// A unit at the end of its paper life (remaining life 2 years, paper-limited).
fa::UnitAssessment end_of_paper_life() {
  auto a = fresh_unit(30);
  a.remaining_life.years = 2;
  a.remaining_life.limiting_factor = "paper";
  fa::LifeEstimate e;
  e.basis = "paper";
  e.years = 2.0;
  e.method = "DP from furans";
  a.remaining_life.estimates.push_back(e);
  a.actions.push_back(act(2, 19900, 180, "Reclaim the oil (Fuller's earth treatment)", "oil Class III",
                          "oil-reclaim"));
  return a;
}
}  // namespace

// Oil reclamation restores the oil, not the paper: not proposed for a unit
// the decision replaces at the end of its paper life (common practice, no
// published source).
// The resample that confirms acetylene and the DGA resample are one sample:
// both carry need "oil-resample" (oil_assessment.cpp), so merge_actions makes
// one job of them under the reference planners book, with the urgent
// priority, due date and words, so that a booking cannot leave the urgent one
// overdue (common practice, no published source).
TEST(ActionPlan, AcetyleneConfirmationAndResampleAreOneSample) {
  auto a = fresh_unit(80);
  a.actions.push_back(act(1, 19950, 7, "Investigate acetylene: confirm with a resample and look for arcing",
                          "acetylene rising", "oil-resample"));
  a.actions.push_back(act(2, 19950, 30, "Resample main-tank oil for DGA within 30 days", "Table 3: monthly",
                          "oil-resample"));
  a.work_status.push_back({"T1/oil-resample", "booked", 19960, "sampling round"});
  fa::finalize_actions(a);
  EXPECT_EQ(count_need(a.actions, "oil-resample"), 1u);
  const fa::Action* r = find_need(a.actions, "oil-resample");
  ASSERT_NE(r, nullptr);
  EXPECT_EQ(r->priority, 1);
  EXPECT_EQ(r->due, 19957);
  EXPECT_EQ(r->text.rfind("Investigate acetylene", 0), 0u) << r->text;
  EXPECT_EQ(r->text.find("within 30 days"), std::string::npos) << r->text;  // not beside a 7-day due date
  EXPECT_NE(r->reason.find("Table 3: monthly"), std::string::npos) << r->reason;
  EXPECT_EQ(r->status, "booked");  // the planners' booking holds the one job
  EXPECT_FALSE(r->overdue);
}

TEST(ActionPlan, NoReclamationForAUnitToBeReplaced) {
  auto a = end_of_paper_life();
  fa::finalize_actions(a);
  ASSERT_EQ(a.decision.action, "replace");
  EXPECT_EQ(count_need(a.actions, "oil-reclaim"), 0u);
  ASSERT_NE(find_need(a.actions, "replace"), nullptr);
  const std::string& why = find_need(a.actions, "replace")->reason;
  EXPECT_NE(why.find("il reclamation not proposed"), std::string::npos) << why;
  // After the decision's sentences the note is a sentence of its own
  // (wording only, no published source applies).
  EXPECT_EQ(why.find(".;"), std::string::npos) << why;
  EXPECT_NE(why.find(". Oil reclamation not proposed: it does not restore the paper."), std::string::npos) << why;
}

namespace {
// Oil Class II from the sample of day 19800, paper water and DP as given.
fa::UnitAssessment oil_class2_unit(double paper_water_pct, double dp) {
  auto a = fresh_unit(80);
  a.oil.paper_moisture_pct = paper_water_pct;
  a.oil.sample_date = 19800;
  a.paper.dp_estimate = dp;
  a.actions.push_back(act(3, 19800, 180, "Recondition the oil (filtering, vacuum dehydration)", "oil Class II",
                          "oil-recondition"));
  return a;
}
}  // namespace

// Wet paper is dried out with the active part; reconditioning the oil would
// not dry it (paper water at or above 4 %: common practice, no published
// source). The drying needs an outage and the maintenance crew.
TEST(ActionPlan, WetPaperIsDriedOutInsteadOfReconditioningTheOil) {
  auto a = oil_class2_unit(6.5, 550);
  fa::finalize_actions(a);
  const fa::Action* d = find_need(a.actions, "dry-out");
  ASSERT_NE(d, nullptr);
  EXPECT_EQ(std::make_tuple(d->outage, d->crew, d->found), std::make_tuple(true, std::string(fa::kCrewMaintenance), 19800));
  EXPECT_EQ(d->due, 19800 + 180);  // the earlier due date of the reconditioning it replaces
  EXPECT_NE(d->reason.find("6.5 %"), std::string::npos);
  EXPECT_NE(d->reason.find("instead of oil reconditioning"), std::string::npos);
  EXPECT_EQ(count_need(a.actions, "oil-recondition"), 0u);
  EXPECT_EQ(count_need(a.actions, "outage"), 1u);
}

// Below dry_out_min_dp (400) the paper is too brittle to dry out: no drying,
// the reconditioning stays and says why (common practice, no published
// source).
TEST(ActionPlan, BrittlePaperIsNotDriedOut) {
  auto a = oil_class2_unit(6.5, 350);
  fa::finalize_actions(a);
  EXPECT_EQ(count_need(a.actions, "dry-out"), 0u);
  const fa::Action* r = find_need(a.actions, "oil-recondition");
  ASSERT_NE(r, nullptr);
  EXPECT_NE(r->reason.find("too brittle to dry out"), std::string::npos);
}

// Dry paper (below 4 %): the oil is reconditioned, nothing is dried out.
TEST(ActionPlan, DryPaperKeepsOilReconditioning) {
  auto a = oil_class2_unit(2.0, 700);
  fa::finalize_actions(a);
  EXPECT_EQ(count_need(a.actions, "dry-out"), 0u);
  EXPECT_EQ(count_need(a.actions, "oil-recondition"), 1u);
}

namespace {
fa::UnitData onan_unit(const char* id, int year_built) {
  fa::UnitData d;
  d.info.unit_id = id;
  d.info.cooling = "ONAN";
  d.info.rated_mva = 20;
  d.info.year_built = year_built;
  return d;
}
}  // namespace

// The whole assessment run twice, a week apart, on the same data: the due
// dates of the same findings do not move (issue #16: dates anchored on the
// evidence, not on the report date).
TEST(ActionPlan, DueDatesHoldAWeekApart) {
  fa::UnitData d = onan_unit("T9", 1995);
  fa::InfraredScan s;
  s.date = 20000 - 60;
  s.component = "HV bushing H1 connector";
  s.spot_c = 70;
  s.reference_c = 40;  // 30 K over reference: NETA priority 1
  s.load_pct = 80;
  d.infrared.push_back(s);
  fa::InspectionRecord leak;
  leak.date = 20000 - 30;
  leak.item = "gaskets_and_leaks";
  leak.rating = fa::Rating::poor;
  leak.note = "active leaks; top-ups every quarter";
  fa::InspectionRecord earth;
  earth.date = 20000 - 30;
  earth.item = "grounding";
  earth.rating = fa::Rating::unsafe;
  d.inspections = {leak, earth};
  fa::OilSample o;
  o.date = 20000 - 700;
  o.furan_2fal_ppb = fa::LabValue::measured(300);
  d.oil_samples.push_back(o);
  const auto w1 = fa::assess_unit(d, 20000, {});
  const auto w2 = fa::assess_unit(d, 20007, {});
  for (const char* need : {"ir-repair:HV bushing H1 connector", "inspection:gaskets_and_leaks", "inspection:grounding",
                           "oil-resample", "outage"}) {
    SCOPED_TRACE(need);
    const fa::Action* a1 = find_need(w1.actions, need);
    const fa::Action* a2 = find_need(w2.actions, need);
    ASSERT_NE(a1, nullptr);
    ASSERT_NE(a2, nullptr);
    EXPECT_EQ(a1->due, a2->due);
    EXPECT_EQ(a1->found, a2->found);
  }
  // The severity-4 joint was due 7 days after the survey: overdue in both weeks.
  EXPECT_TRUE(find_need(w1.actions, "ir-repair:HV bushing H1 connector")->overdue);  // ferrum default, 7 days
  // The unsafe earth is due on its inspection day (common practice, no published source).
  EXPECT_EQ(find_need(w1.actions, "inspection:grounding")->due, 20000 - 30);
}

// Inspection findings that call for work become maintenance jobs, due from
// the inspection date by rating (fair: next routine maintenance, 365 days;
// poor: 90 days: ferrum defaults, common practice, no published source).
TEST(ActionPlan, InspectionFindingsBecomeJobs) {
  fa::UnitData d = onan_unit("T8", 1980);
  auto rec = [](fa::Day day, const char* item, fa::Rating r, const char* note) {
    fa::InspectionRecord x;
    x.date = day;
    x.item = item;
    x.rating = r;
    x.note = note;
    return x;
  };
  d.inspections = {rec(19900, "gaskets_and_leaks", fa::Rating::poor, "active leaks; top-ups every quarter"),
                   rec(19900, "control_cabinet", fa::Rating::fair, "heater not working"),
                   rec(19900, "on_load_tap_changer", fa::Rating::fair, "diverter overdue for maintenance"),
                   rec(19900, "bushings", fa::Rating::good, "")};
  const auto a = fa::assess_unit(d, 20000, {});
  const fa::Action* leak = find_need(a.actions, "inspection:gaskets_and_leaks");
  ASSERT_NE(leak, nullptr);
  EXPECT_EQ(leak->crew, fa::kCrewMaintenance);
  EXPECT_EQ(leak->source, fa::kSourceInspection);
  EXPECT_EQ(leak->priority, 3);
  EXPECT_EQ(leak->due, 19900 + 90);
  EXPECT_TRUE(leak->outage);  // gasket repair with the unit out of service: common practice
  EXPECT_NE(leak->reason.find("top-ups"), std::string::npos);
  const fa::Action* heater = find_need(a.actions, "inspection:control_cabinet");
  ASSERT_NE(heater, nullptr);
  EXPECT_EQ(heater->due, 19900 + 365);
  EXPECT_FALSE(heater->outage);  // a cabinet heater is changed live: common practice
  const fa::Action* oltc = find_need(a.actions, "inspection:on_load_tap_changer");
  ASSERT_NE(oltc, nullptr);
  EXPECT_TRUE(oltc->outage);  // diverter maintenance needs an outage: common practice
  EXPECT_EQ(find_need(a.actions, "inspection:bushings"), nullptr);  // rated good: no job
}
