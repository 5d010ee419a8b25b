// Integration of the assessment steps (analytics/assess_unit.h): the order of
// the steps and what each leaves for the next.
#include "analytics/assess_unit.h"

#include <gtest/gtest.h>

#include <tuple>

namespace fa = ferrum::analytics;

namespace {

fa::UnitData sample_unit(double c2h2_ppm) {
  fa::UnitData d;
  d.info.unit_id = "T7";
  d.info.site = "Riverside";
  d.info.rated_mva = 40;
  d.info.hv_kv = 132;
  d.info.lv_kv = 33;
  d.info.cooling = "ONAF";
  d.info.year_built = 1990;
  for (int k = 0; k < 3; ++k) {
    fa::OilSample s;
    s.date = fa::days_from_civil(2022 + k, 3, 1);
    s.h2 = fa::LabValue::measured(40);
    s.ch4 = fa::LabValue::measured(20);
    s.c2h6 = fa::LabValue::measured(15);
    s.c2h4 = fa::LabValue::measured(10);
    s.c2h2 = k == 2 ? fa::LabValue::measured(c2h2_ppm) : fa::LabValue::below(0.5);
    s.co = fa::LabValue::measured(300);
    s.co2 = fa::LabValue::measured(2000);
    s.moisture_ppm = fa::LabValue::measured(12);
    s.oil_temp_c = fa::LabValue::measured(40);
    s.breakdown_kv = fa::LabValue::measured(60);
    s.breakdown_method = "ASTM D1816 2 mm";
    s.acidity_mgkoh_g = fa::LabValue::measured(0.03);
    s.ift_mn_m = fa::LabValue::measured(34);
    s.furan_2fal_ppb = fa::LabValue::measured(150);
    d.oil_samples.push_back(s);
  }
  d.inspections.push_back({fa::days_from_civil(2024, 1, 15), "bushings", fa::Rating::fair, "", "JS"});
  return d;
}

}  // namespace

TEST(AssessUnit, RunsEveryStepInOrder) {
  fa::Day as_of = fa::days_from_civil(2024, 6, 30);
  auto a = fa::assess_unit(sample_unit(0.5), as_of, fa::AssessmentOptions{});
  EXPECT_EQ(a.unit.unit_id, "T7");
  EXPECT_EQ(a.as_of, as_of);
  EXPECT_FALSE(a.dga.gases.empty());       // oil step ran before the index
  ASSERT_EQ(a.factors.size(), 13u);  // 7 + 6 electrical-test factors (analytics/data/health_index_electrical.csv)
  ASSERT_TRUE(a.health_index);             // dga, oil, paper, inspection, age at least
  double sum = 0;
  for (const auto& f : a.factors) sum += f.contribution;
  EXPECT_NEAR(sum, *a.health_index, 1e-9);
  EXPECT_EQ(a.freshness.size(), 4u);
  EXPECT_EQ(a.remaining_life.estimates.size(), 4u);  // life step ran after the index
  EXPECT_FALSE(a.decision.action.empty());           // and the decision after the actions
  ASSERT_TRUE(a.decision.first_action);
  EXPECT_EQ(a.decision.first_action->text, a.actions.front().text);
  for (std::size_t k = 1; k < a.actions.size(); ++k) {
    const auto& p = a.actions[k - 1];
    const auto& q = a.actions[k];
    // Jobs before the outage line that gathers them (action_plan.cpp, sort_actions).
    const bool po = p.need == "outage", qo = q.need == "outage";
    EXPECT_LE(std::tie(p.priority, p.due, po, p.text), std::tie(q.priority, q.due, qo, q.text));
  }
}

// 60 ppm acetylene is above the 35 ppm Condition 4 limit of IEEE C57.104-2008
// Table 1 (checked against a public reproduction): the CIGRE TB 761 cap puts the index in
// the worst band and gets a priority-1 action; the gassing is a correctable
// defect and does not limit the remaining life.
TEST(AssessUnit, SevereAcetyleneCapsIndexButNotLife) {
  fa::Day as_of = fa::days_from_civil(2024, 6, 30);
  auto a = fa::assess_unit(sample_unit(60), as_of, fa::AssessmentOptions{});
  ASSERT_EQ(a.dga.c57104_2008_condition, 4);
  ASSERT_TRUE(a.health_index);
  EXPECT_LE(*a.health_index, 30.0);
  EXPECT_EQ(a.band, "failing");
  EXPECT_NE(a.remaining_life.limiting_factor, "gases");
  ASSERT_FALSE(a.actions.empty());
  EXPECT_EQ(a.actions[0].priority, 1);
}
