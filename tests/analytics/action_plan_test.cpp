// Tests of action merging and the HI-driven actions (analytics/action_plan.h).
// The index thresholds follow the HI table of Jahromi et al. 2009 (from memory).
#include "analytics/action_plan.h"

#include <gtest/gtest.h>

namespace fa = ferrum::analytics;

TEST(ActionPlan, MergesSameTextKeepingMostUrgentAndAllReasons) {
  std::vector<fa::Action> in{{3, 200, "Take an oil sample", "DGA rising"},
                             {2, 150, "take an  oil sample.", "acidity high"},
                             {3, 100, "Take an oil sample", "DGA rising"},
                             {4, 50, "Check gaskets", "seep"}};
  auto out = fa::merge_actions(in);
  ASSERT_EQ(out.size(), 2u);
  EXPECT_EQ(out[0].priority, 2);
  EXPECT_EQ(out[0].due, 100);
  EXPECT_EQ(out[0].text, "take an  oil sample.");
  EXPECT_EQ(out[0].reason, "DGA rising; acidity high");
  EXPECT_EQ(out[1].text, "Check gaskets");
}

TEST(ActionPlan, SortedByPriorityThenDueThenText) {
  auto out = fa::merge_actions({{2, 10, "b", ""}, {1, 30, "z", ""}, {2, 10, "a", ""}, {2, 5, "c", ""}});
  std::vector<std::string> t;
  for (const auto& a : out) t.push_back(a.text);
  EXPECT_EQ(t, (std::vector<std::string>{"z", "c", "a", "b"}));
}

namespace {
fa::UnitAssessment fresh_unit(double hi) {
  fa::UnitAssessment a;
  a.as_of = 20000;
  a.health_index = hi;
  a.dga.sample_date = 19900;
  a.infrared.push_back({});
  a.infrared[0].date = 19900;
  a.inspection.push_back({"bushings", fa::Rating::good, 19900, {}, false, ""});
  return a;
}
}  // namespace

// The plan records the decision with the most urgent action first
// (analytics/decision/decision.h; its rules are tested in decision_test.cpp).
TEST(ActionPlan, DecisionAndFirstActionRecorded) {
  auto a = fresh_unit(60);
  a.actions.push_back({1, 20005, "Make safe or take out of service: grounding", "unsafe"});
  fa::finalize_actions(a);
  ASSERT_TRUE(a.decision.first_action);
  EXPECT_EQ(a.decision.first_action->priority, 1);
  EXPECT_EQ(a.decision.first_action->text, a.actions.front().text);
  EXPECT_FALSE(a.decision.action.empty());
  EXPECT_EQ(a.decision.year, fa::civil_from_days(20005).year);
}

TEST(ActionPlan, StaleAndMissingDataAsked) {
  fa::UnitAssessment a;
  a.as_of = 20000;
  a.dga.sample_date = 20000 - 800;  // 2.2 years
  fa::finalize_actions(a);
  ASSERT_EQ(a.actions.size(), 3u);
  EXPECT_EQ(a.actions[0].text, "Take an oil sample for DGA, oil quality and furans");
  EXPECT_NE(a.actions[0].reason.find("2.2 years"), std::string::npos);
  EXPECT_NE(a.actions[1].reason.find("no "), std::string::npos);
}
