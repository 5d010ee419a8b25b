// The edge between ferrum.ini [costs]/[plan] and the budgeted plan. Plumbing:
// no engineering value is checked here, so no published source applies (the
// plan itself is checked in tests/analytics/plan_test.cpp).
#include <gtest/gtest.h>

#include "tests/daemon/temp_ini.h"

#include <unistd.h>

#include <cmath>
#include <filesystem>
#include <fstream>

#include "daemon/assess/plan_service.h"
#include "daemon/config/plan_config.h"

namespace fs = std::filesystem;
using namespace ferrum;

namespace {

config::SiteConfig load_plan_ini(const std::string& text) {
  return ferrum::testing::load_ini_text(text + "\n[party.p]\nkinds = *\n", "plan");
}

TEST(PlanService, IniKeysReachThePlanOptions) {
  const auto c = load_plan_ini(
      "[costs]\ncurrency = GBP\nclass1_max_kv = 66\nclass2_max_kv = 150\ncost_per_mva_class1 = 30000\n"
      "cost_per_mva_class2 = 25000\ncost_per_mva_class3 = 20000\nfixed_replacement_cost = 5\nrefurbishment_fraction = 0.3\n"
      "[plan]\nbudget_per_year = 1000000\nhorizon_years = 7\nstart_year = 2027\ncarry_over = Yes\nrefurbishment_years = 8\n"
      "[ranking]\npof_at_zero = 0.3\nexpected_life_years = 50\n");
  EXPECT_TRUE(config::plan_configured(c));
  const auto s = assess::plan_settings_from_config(c);
  EXPECT_EQ(s.costs.currency, "GBP");
  EXPECT_DOUBLE_EQ(s.costs.class1_max_kv, 66);
  EXPECT_DOUBLE_EQ(s.costs.class2_max_kv, 150);
  EXPECT_DOUBLE_EQ(s.costs.cost_per_mva[0], 30000);
  EXPECT_DOUBLE_EQ(s.costs.cost_per_mva[2], 20000);
  EXPECT_DOUBLE_EQ(s.costs.fixed_replacement_cost, 5);
  EXPECT_DOUBLE_EQ(s.costs.refurbishment_fraction, 0.3);
  EXPECT_DOUBLE_EQ(s.options.budget_per_year, 1000000);
  EXPECT_EQ(s.options.horizon_years, 7);
  EXPECT_EQ(s.options.start_year, 2027);
  EXPECT_TRUE(s.options.carry_over);
  EXPECT_DOUBLE_EQ(s.options.refurbishment_years, 8);
  EXPECT_DOUBLE_EQ(s.options.pof_at_zero, 0.3);          // the ranking's PoF
  EXPECT_DOUBLE_EQ(s.options.expected_life_years, 50);   // remaining life's ageing model
}

TEST(PlanService, NoBudgetIsNoPlanAndBadValuesNameTheKey) {
  const auto c = load_plan_ini("");
  EXPECT_FALSE(config::plan_configured(c));
  EXPECT_TRUE(std::isinf(assess::plan_settings_from_config(c).options.budget_per_year));
  for (const char* bad : {"[plan]\nbudget_per_year = -1\n", "[plan]\nhorizon_years = 2.5\n", "[plan]\ncarry_over = maybe\n",
                          "[costs]\nrefurbishment_fraction = 2\n", "[costs]\ncost_per_mva_class1 = lots\n"}) {
    try {
      load_plan_ini(bad);
      ADD_FAILURE() << "accepted: " << bad;
    } catch (const config::ConfigError& e) {
      const std::string text = bad;
      const std::string key = text.substr(text.find('\n') + 1, text.find(' ', text.find('\n')) - text.find('\n') - 1);
      EXPECT_NE(std::string(e.what()).find(key), std::string::npos) << e.what();
    }
  }
}

TEST(PlanService, MissingClassCostNamesTheUnits) {
  const auto c = load_plan_ini("[costs]\ncost_per_mva_class1 = 30000\n[plan]\nbudget_per_year = 100\n");
  analytics::PlanUnit a;
  a.unit_id = "T1";
  a.hv_kv = 132;  // class 2: no cost configured
  a.health_index = 40;
  a.action = "replace";
  analytics::PlanUnit b = a;
  b.unit_id = "T2";
  b.replacement_cost = 1e6;  // its own cost: fine
  analytics::PlanUnit quiet = a;
  quiet.unit_id = "T3";
  quiet.action = "routine";  // not a candidate (no life within the horizon): needs no cost
  const auto missing = assess::missing_costs({a, b, quiet}, c);
  ASSERT_EQ(missing.size(), 1u);
  EXPECT_NE(missing[0].find("cost_per_mva_class2"), std::string::npos);
  EXPECT_NE(missing[0].find("T1"), std::string::npos);
  EXPECT_EQ(missing[0].find("T2"), std::string::npos);
  std::string why;
  EXPECT_FALSE(assess::make_plan({a, b}, analytics::days_from_civil(2026, 6, 30), c, std::nullopt, std::nullopt, &why));
  EXPECT_NE(why.find("T1"), std::string::npos);
  EXPECT_TRUE(assess::make_plan({b, quiet}, analytics::days_from_civil(2026, 6, 30), c, std::nullopt, std::nullopt, &why));
}

// The plan's units: the ranking's row plus the register's HV voltage and the unit's own costs
// (replacement_cost, refurbishment_cost), matched by unit_id; a unit missing from the register keeps
// no own costs. Plumbing.
TEST(PlanService, RegisterCostsReachThePlanUnits) {
  analytics::FleetRanking ranking;
  analytics::RankedUnit r;
  r.unit_id = "T1";
  r.site = "Ostrand Yard";
  r.rated_mva = 40;
  r.health_index = 45;
  r.recommended_action = "refurbish";
  r.action_year = 2027;
  r.treats_paper = true;  // drying out the paper: a plan candidate
  r.consequence = 0.6;
  ranking.units = {r, r};
  ranking.units[1].unit_id = "T2";
  ranking.units[1].treats_paper = false;  // an oil treatment: maintenance
  analytics::UnitInfo info;
  info.unit_id = "T1";
  info.hv_kv = 132;
  info.replacement_cost = 2000000;
  info.refurbishment_cost = 350000;
  const auto units = assess::plan_units(ranking, {info});
  ASSERT_EQ(units.size(), 2u);
  EXPECT_DOUBLE_EQ(units[0].hv_kv, 132);
  EXPECT_DOUBLE_EQ(units[0].replacement_cost.value_or(0), 2000000);
  EXPECT_DOUBLE_EQ(units[0].refurbishment_cost.value_or(0), 350000);
  EXPECT_EQ(units[0].action, "refurbish");
  EXPECT_EQ(units[0].action_year, 2027);
  EXPECT_TRUE(units[0].treats_paper);
  EXPECT_FALSE(units[1].treats_paper);
  EXPECT_FALSE(units[1].replacement_cost);
  EXPECT_FALSE(units[1].refurbishment_cost);
  // The own refurbishment cost is what the plan pays (no [costs] class needed for it).
  const auto c = load_plan_ini("[costs]\ncurrency = NOK\n[plan]\nbudget_per_year = 400000\n");
  std::string why;
  const auto plan = assess::make_plan({units[0]}, analytics::days_from_civil(2026, 11, 30), c, std::nullopt, 3, &why);
  ASSERT_TRUE(plan) << why;
  EXPECT_EQ(plan->currency, "NOK");  // a label, never converted
  ASSERT_EQ(plan->years.size(), 3u);
  ASSERT_EQ(plan->years[1].funded.size(), 1u);
  EXPECT_DOUBLE_EQ(plan->years[1].funded[0].cost, 350000);
}

}  // namespace
