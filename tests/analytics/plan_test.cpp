// The budgeted replacement and refurbishment plan (analytics/plan/plan.h).
#include "analytics/plan/plan.h"

#include <gtest/gtest.h>

#include <cmath>
#include <map>
#include <random>

namespace ferrum::analytics {
namespace {

// Costs of the hand-computed fleet: class 1 (<= 72.5 kV) 30,000 per MVA,
// class 2 (<= 170 kV) 50,000, class 3 80,000; 100,000 fixed per replacement;
// refurbishment 25 % of the replacement cost. Invented round numbers.
CostOptions test_costs() {
  CostOptions c;
  c.currency = "EUR";
  c.cost_per_mva[0] = 30000;
  c.cost_per_mva[1] = 50000;
  c.cost_per_mva[2] = 80000;
  c.fixed_replacement_cost = 100000;
  c.refurbishment_fraction = 0.25;
  return c;
}

PlanUnit unit(const std::string& id, double hi, std::optional<double> life, const std::string& action, double mva,
              double kv, double consequence, std::optional<int> year = 2026) {
  PlanUnit u;
  u.unit_id = id;
  u.site = "North";
  u.health_index = hi;
  u.remaining_life_years = life;
  u.action = action;
  u.action_year = year;
  u.rated_mva = mva;
  u.hv_kv = kv;
  u.consequence = consequence;
  return u;
}

const Day kAsOf = days_from_civil(2026, 6, 30);

PlanOptions three_years(double budget) {
  PlanOptions o;
  o.budget_per_year = budget;
  o.horizon_years = 3;
  return o;
}

TEST(PlanCosts, ClassesFixedCostAndOverrides) {
  const auto c = test_costs();
  // 10 MVA at 132 kV: class 2, 10 x 50,000 + 100,000 = 600,000; refurbishment 25 % = 150,000.
  auto u = unit("A", 40, 2, "replace", 10, 132, 1);
  EXPECT_EQ(voltage_class(132, c), 2);
  EXPECT_EQ(voltage_class(72.5, c), 1);  // a bound belongs to the lower class
  EXPECT_EQ(voltage_class(400, c), 3);
  EXPECT_DOUBLE_EQ(replacement_cost(u, c), 600000);
  EXPECT_DOUBLE_EQ(refurbishment_cost(u, c), 150000);
  u.replacement_cost = 1000000;  // the unit's own: refurbishment follows it unless given too
  EXPECT_DOUBLE_EQ(replacement_cost(u, c), 1000000);
  EXPECT_DOUBLE_EQ(refurbishment_cost(u, c), 250000);
  u.refurbishment_cost = 90000;
  EXPECT_DOUBLE_EQ(refurbishment_cost(u, c), 90000);
}

TEST(PlanAgeing, RateFromRemainingLifeLimitedLikeTheConditionEstimate) {
  PlanOptions o;
  const double expected = std::log(30.0 / 100) / 60;  // -0.020066/year: HI 100 to 30 in 60 years
  // HI 80 reaching 30 in 40 years: ln(30/80)/40 = -0.024521, within 0.5x..2x expected.
  EXPECT_NEAR(ageing_rate(unit("X", 80, 40, "routine", 1, 33, 1), o), std::log(30.0 / 80) / 40, 1e-12);
  // HI 40 reaching 30 in 2 years would be -0.1438/year: limited to 2x expected (CNAIM v2.1 6.1.8, from memory).
  EXPECT_NEAR(ageing_rate(unit("X", 40, 2, "replace", 1, 33, 1), o), 2 * expected, 1e-12);
  // Life beyond the horizon: the expected rate.
  auto far = unit("X", 90, 40, "routine", 1, 33, 1);
  far.beyond_horizon = true;
  EXPECT_NEAR(ageing_rate(far, o), expected, 1e-12);
}

TEST(PlanRisk, SameMappingAsTheRanking) {
  PlanOptions o;
  // PoF(HI) = 0.002 x 100^((100-HI)/100): 2 per 1,000 unit-years at 100, 200 at 0, 20 at 50 (ferrum defaults).
  EXPECT_NEAR(plan_risk(100, 1, o), 2, 1e-9);
  EXPECT_NEAR(plan_risk(0, 1, o), 200, 1e-9);
  EXPECT_NEAR(plan_risk(50, 0.5, o), 10, 1e-9);
}

// Two units, three years (2026-2028), as of 2026-06-30, ferrum's default ageing (hand computation;
// ageing rate 2 x ln(0.3)/60 = -0.040132/year for both, see PlanAgeing):
//  A: HI 40, life 2 years, replace in 2026, consequence 1, 10 MVA 132 kV: 600,000.
//     Risk 2 x 100^0.6 = 31.698; after replacement 2: removes 29.698, 4.950e-5 per unit of money.
//  B: HI 50, life 4 years, refurbish in 2026, consequence 0.5, 20 MVA 33 kV: 20 x 30,000 + 100,000 =
//     700,000, refurbishment 175,000. Risk 0.5 x 2 x 100^0.5 = 10; a refurbishment goes back 10 years
//     on its curve: 50 e^0.40132 = 74.690, risk 3.208: removes 6.792, 3.881e-5 per unit of money.
// Budget 600,000:
//  2026: A first (higher ratio), 600,000; B does not fit and waits. Fleet risk 2 + 10 = 12.
//  2027: B at HI 50 e^-0.040132 = 48.033 (risk 10.948), refurbished to 48.033 e^0.40132 = 71.752
//        (risk 3.672), 175,000. A, new in 2026, at 100 e^-0.020066 = 98.013: risk 2.192. Fleet 5.864.
//  2028: A 100 e^-0.040132, B 71.752 e^-0.040132: fleet 6.579.
// Without any plan: 41.698, 45.028, 48.480. Unlimited: both in 2026, 2 + 3.208 = 5.208.
TEST(PlanFleet, TwoUnitsByHand) {
  const std::vector<PlanUnit> units = {unit("A", 40, 2, "replace", 10, 132, 1), unit("B", 50, 4, "refurbish", 20, 33, 0.5)};
  const auto plan = plan_fleet(units, kAsOf, test_costs(), three_years(600000));
  ASSERT_EQ(plan.years.size(), 3u);
  EXPECT_EQ(plan.start_year, 2026);
  ASSERT_EQ(plan.years[0].funded.size(), 1u);
  EXPECT_EQ(plan.years[0].funded[0].unit_id, "A");
  EXPECT_EQ(plan.years[0].funded[0].action, "replace");
  EXPECT_DOUBLE_EQ(plan.years[0].spent, 600000);
  ASSERT_EQ(plan.years[0].deferred.size(), 1u);
  EXPECT_EQ(plan.years[0].deferred[0].unit_id, "B");
  EXPECT_NEAR(plan.years[0].deferred[0].risk, 10, 1e-9);
  EXPECT_NEAR(plan.years[0].risk_with_plan, 12, 1e-9);
  ASSERT_EQ(plan.years[1].funded.size(), 1u);
  EXPECT_EQ(plan.years[1].funded[0].unit_id, "B");
  EXPECT_EQ(plan.years[1].funded[0].deferred_years, 1);
  EXPECT_DOUBLE_EQ(plan.years[1].spent, 175000);
  EXPECT_NEAR(plan.years[1].funded[0].risk_before, 10.948, 1e-3);
  EXPECT_NEAR(plan.years[1].funded[0].risk_after, 3.672, 1e-3);
  EXPECT_NEAR(plan.years[1].risk_with_plan, 5.864, 1e-3);
  EXPECT_NEAR(plan.years[2].risk_with_plan, 6.579, 1e-3);
  EXPECT_TRUE(plan.years[2].funded.empty());
  EXPECT_NEAR(plan.years[0].risk_without_plan, 41.698, 1e-3);
  EXPECT_NEAR(plan.years[1].risk_without_plan, 45.028, 1e-3);
  EXPECT_NEAR(plan.years[2].risk_without_plan, 48.480, 1e-3);
  EXPECT_NEAR(plan.years[0].risk_unlimited, 5.208, 1e-3);
  EXPECT_DOUBLE_EQ(plan.total_spent, 775000);
  EXPECT_TRUE(plan.unfunded.empty());
}

// Same fleet, budget 400,000. Without carry-over A (600,000) never fits: B is refurbished in 2026
// and A is still waiting at the end. With carry-over: 2026 B (175,000), 225,000 left;
// 2027 400,000 + 225,000 = 625,000 funds A.
TEST(PlanFleet, CarryOverByHand) {
  const std::vector<PlanUnit> units = {unit("A", 40, 2, "replace", 10, 132, 1), unit("B", 50, 4, "refurbish", 20, 33, 0.5)};
  auto o = three_years(400000);
  auto plan = plan_fleet(units, kAsOf, test_costs(), o);
  ASSERT_EQ(plan.years[0].funded.size(), 1u);
  EXPECT_EQ(plan.years[0].funded[0].unit_id, "B");
  EXPECT_TRUE(plan.years[1].funded.empty());
  EXPECT_DOUBLE_EQ(plan.years[1].budget, 400000);
  ASSERT_EQ(plan.unfunded.size(), 1u);
  EXPECT_EQ(plan.unfunded[0], "A");
  o.carry_over = true;
  plan = plan_fleet(units, kAsOf, test_costs(), o);
  EXPECT_DOUBLE_EQ(plan.years[1].budget, 625000);
  ASSERT_EQ(plan.years[1].funded.size(), 1u);
  EXPECT_EQ(plan.years[1].funded[0].unit_id, "A");
  EXPECT_TRUE(plan.unfunded.empty());
}

// A routine unit whose life ends in 2029 becomes a replacement candidate in 2029, not before;
// a unit without an index is listed as not planned; a replacement due after the horizon is not a candidate.
TEST(PlanFleet, LifeEndingWithinTheHorizonAndUnitsLeftOut) {
  auto routine = unit("R", 60, 3.4, "monitor", 5, 33, 1);  // 2026 + floor(3.4) = 2029
  auto later = unit("L", 45, 12, "replace", 5, 33, 1, 2038);
  PlanUnit blank;
  blank.unit_id = "N";
  blank.action = "investigate";
  PlanOptions o;
  o.budget_per_year = std::numeric_limits<double>::infinity();
  const auto plan = plan_fleet({routine, later, blank}, kAsOf, test_costs(), o);
  ASSERT_EQ(plan.years.size(), 10u);
  for (const auto& y : plan.years)
    for (const auto& f : y.funded) {
      EXPECT_EQ(f.unit_id, "R");
      EXPECT_EQ(y.year, 2029);
      EXPECT_EQ(f.action, "replace");
    }
  ASSERT_EQ(plan.not_planned.size(), 1u);
  EXPECT_NE(plan.not_planned[0].find("N:"), std::string::npos);
}

// Random fleets for the properties (fixed seed: the same fleets on every run). Indices up to 80:
// below 81.8, the index a new unit ages to in ten years at the expected rate. Replacing a unit in
// better condition than that earlier rather than later leaves an older new unit at the horizon's
// end (the end-of-horizon effect of any fixed-horizon plan), so a larger budget could then leave
// marginally more risk; the decision module does not recommend replacing such units on condition.
std::vector<PlanUnit> random_fleet(std::mt19937& rng, int n) {
  std::uniform_real_distribution<double> hi(15, 80), life(0, 30), mva(2, 120), cons(0.05, 1);
  std::uniform_int_distribution<int> act(0, 3), kv(0, 2), year(2026, 2031);
  const double kvs[] = {33, 132, 400};
  const char* actions[] = {"replace", "refurbish", "monitor", "routine"};
  std::vector<PlanUnit> units;
  for (int i = 0; i < n; ++i)
    units.push_back(unit("U" + std::to_string(100 + i), hi(rng), life(rng), actions[act(rng)], mva(rng), kvs[kv(rng)],
                         cons(rng), year(rng)));
  return units;
}

TEST(PlanProperties, SpendingNeverExceedsTheBudget) {
  std::mt19937 rng(22);
  for (int trial = 0; trial < 200; ++trial) {
    const auto units = random_fleet(rng, 12);
    for (double budget : {0.0, 1e6, 3e6, 1e7})
      for (bool carry : {false, true}) {
        PlanOptions o;
        o.budget_per_year = budget;
        o.carry_over = carry;
        const auto plan = plan_fleet(units, kAsOf, test_costs(), o);
        double cumulative_budget = 0, cumulative_spent = 0;
        for (const auto& y : plan.years) {
          EXPECT_LE(y.spent, y.budget);
          double sum = 0;
          for (const auto& f : y.funded) sum += f.cost;
          EXPECT_DOUBLE_EQ(sum, y.spent);
          cumulative_budget += budget;
          cumulative_spent += y.spent;
          EXPECT_LE(cumulative_spent, cumulative_budget * (1 + 1e-12));
          if (!carry) EXPECT_DOUBLE_EQ(y.budget, budget);
        }
      }
  }
}

// "Riskier" with equal cost: replacements of the same consequence, so the risk removed per unit of
// money (risk now - risk of a new unit) orders like the risk itself. Checked every year: no deferred
// candidate is riskier than a funded one of the same cost. (A refurbishment removes what its
// ageing rate gives back, and a unit of higher consequence keeps more residual risk when new, so
// across actions or consequences the order is that of the risk removed, not of the risk carried.)
TEST(PlanProperties, OfTwoUnitsWithEqualCostTheRiskierIsNeverFundedLater) {
  std::mt19937 rng(2215);
  for (int trial = 0; trial < 200; ++trial) {
    auto units = random_fleet(rng, 10);
    for (auto& u : units) {  // equal cost, same consequence; actions stay mixed between the pairs
      u.replacement_cost = 1e6;
      u.refurbishment_cost = 1e6;
      u.consequence = 0.7;
      u.action = "replace";
    }
    PlanOptions o;
    o.budget_per_year = 2e6;
    const auto plan = plan_fleet(units, kAsOf, test_costs(), o);
    for (const auto& y : plan.years)
      for (const auto& f : y.funded)
        for (const auto& d : y.deferred)
          EXPECT_LE(d.risk, f.risk_before + 1e-9) << y.year << " " << d.unit_id << " " << f.unit_id;
  }
}

TEST(PlanProperties, ALargerBudgetNeverLeavesMoreTotalRisk) {
  std::mt19937 rng(7);
  for (int trial = 0; trial < 200; ++trial) {
    const auto units = random_fleet(rng, 12);
    double previous = std::numeric_limits<double>::infinity();
    for (double budget : {0.0, 5e5, 1e6, 2e6, 4e6, 8e6, 1.6e7, 1e9}) {
      PlanOptions o;
      o.budget_per_year = budget;
      const auto plan = plan_fleet(units, kAsOf, test_costs(), o);
      EXPECT_LE(plan.total_risk_with_plan, previous * (1 + 1e-12)) << "trial " << trial << " budget " << budget;
      previous = plan.total_risk_with_plan;
      EXPECT_LE(plan.total_risk_with_plan, plan.total_risk_without_plan * (1 + 1e-12));
      EXPECT_GE(plan.total_risk_with_plan, plan.total_risk_unlimited * (1 - 1e-12));
    }
  }
}

TEST(PlanProperties, WithAnUnlimitedBudgetEveryCandidateIsFundedInItsFirstYear) {
  std::mt19937 rng(1);
  for (int trial = 0; trial < 200; ++trial) {
    const auto units = random_fleet(rng, 12);
    PlanOptions o;  // budget_per_year defaults to unlimited
    const auto plan = plan_fleet(units, kAsOf, test_costs(), o);
    EXPECT_TRUE(plan.unfunded.empty());
    std::map<std::string, int> funded_in;
    for (const auto& y : plan.years) {
      EXPECT_TRUE(y.deferred.empty());
      for (const auto& f : y.funded) {
        EXPECT_EQ(f.deferred_years, 0) << f.unit_id;
        funded_in[f.unit_id] = y.year;
      }
      EXPECT_NEAR(y.risk_with_plan, y.risk_unlimited, 1e-9);
    }
    for (const auto& u : units)
      if (u.action == "replace" || u.action == "refurbish") {
        if (*u.action_year < 2036) EXPECT_EQ(funded_in[u.unit_id], std::max(2026, *u.action_year)) << u.unit_id;
      }
  }
}

}  // namespace
}  // namespace ferrum::analytics
