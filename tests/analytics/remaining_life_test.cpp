// Tests of the remaining-life estimates (analytics/remaining_life.h), each on
// a constructed unit whose answer is known in closed form.
#include "analytics/remaining_life.h"

#include <gtest/gtest.h>

#include <cmath>

namespace fa = ferrum::analytics;

namespace {

// Built 2004, assessed 2024-07-01: exactly 20 service years from mid-2004
// (7305 days = 20 x 365 + 5 leap days, / 365.25 = 20).
fa::UnitAssessment unit20() {
  fa::UnitAssessment a;
  a.as_of = fa::days_from_civil(2024, 7, 1);
  a.unit.unit_id = "T20";
  a.unit.year_built = 2004;
  return a;
}

}  // namespace

TEST(RemainingLife, ServiceYearsFromMidYear) {
  auto a = unit20();
  EXPECT_DOUBLE_EQ(*fa::service_years(a.unit, a.as_of), 20.0);
  a.unit.year_built = 0;
  EXPECT_FALSE(fa::service_years(a.unit, a.as_of));
  a.unit.year_built = 2030;
  EXPECT_FALSE(fa::service_years(a.unit, a.as_of));
}

// Paper, own history: DP0 1000 -> 600 in 20 years = 20 DP/year; to DP 200
// (end of life, checked in public sources) is 400 / 20 = 20 years. Range at
// +-30 % on the rate: 400/26 = 15.38 and 400/14 = 28.57 years.
TEST(RemainingLife, PaperFromOwnHistory) {
  auto a = unit20();
  a.paper.dp_estimate = 600;
  a.thermal.equivalent_ageing_factor = 0.1;  // thermal rate 4.68 DP/year: slower, not used
  auto e = fa::paper_life(fa::RemainingLifeOptions{}, a);
  ASSERT_TRUE(e.years);
  EXPECT_NEAR(*e.years, 20.0, 1e-9);
  EXPECT_NEAR(*e.low_years, 400.0 / 26, 1e-9);
  EXPECT_NEAR(*e.high_years, 400.0 / 14, 1e-9);
  EXPECT_NE(e.method.find("own history"), std::string::npos);
}

// Paper, projected with recent thermal ageing: at F_EQA = 1 the paper loses
// DP0 - 200 = 800 DP in 150 000 h (IEEE C57.91-2011 Table 1 "retained DP 200",
// from memory) = 17.112 years, i.e. 46.75 DP/year > 20 DP/year of history.
// From DP 600 the remaining 400 DP take half that life: 8.556 years.
TEST(RemainingLife, PaperProjectedWithFasterThermalAgeing) {
  auto a = unit20();
  a.paper.dp_estimate = 600;
  a.thermal.equivalent_ageing_factor = 1.0;
  auto e = fa::paper_life(fa::RemainingLifeOptions{}, a);
  EXPECT_NEAR(*e.years, 150000.0 / 8766 / 2, 1e-9);
  EXPECT_NE(e.method.find("recent thermal ageing"), std::string::npos);
}

TEST(RemainingLife, PaperEdges) {
  auto a = unit20();
  fa::RemainingLifeOptions o;
  EXPECT_FALSE(fa::paper_life(o, a).years);  // no DP
  a.paper.dp_estimate = 150;                  // past end of life
  EXPECT_DOUBLE_EQ(*fa::paper_life(o, a).years, 0);
  a.paper.dp_estimate = 1000;                 // no measurable ageing, no thermal data
  EXPECT_FALSE(fa::paper_life(o, a).years);
}

// Thermal: 180 000 h normal life (IEEE C57.91-2011 Table 1, from memory). At a
// constant F_EQA 0.5 the whole life lasts 180 000 / (0.5 x 8766) = 41.068 years;
// after 20 years 21.068 remain.
TEST(RemainingLife, ThermalAtConstantAgeing) {
  auto a = unit20();
  a.thermal.equivalent_ageing_factor = 0.5;
  auto e = fa::thermal_life(fa::RemainingLifeOptions{}, a);
  ASSERT_TRUE(e.years);
  EXPECT_NEAR(*e.years, 180000.0 / (0.5 * 8766) - 20, 1e-9);
  // Same answer when one recorded year consumed its share (0.5 x 8766 h).
  a.thermal.covered_hours = 8766;
  a.thermal.loss_of_life_hours = 4383;
  EXPECT_NEAR(*fa::thermal_life(fa::RemainingLifeOptions{}, a).years, 180000.0 / 4383 - 20, 1e-9);
  // A hotter recorded year (2 x the hours) shortens it by 4383 h / 4383 h/yr = 1 year.
  a.thermal.loss_of_life_hours = 8766;
  EXPECT_NEAR(*fa::thermal_life(fa::RemainingLifeOptions{}, a).years, 180000.0 / 4383 - 21, 1e-9);
}

namespace {
// End-of-life factors paper (weight 5) and thermal (weight 10) both at
// `score`: the end-of-life score is 100 x score / 4.
void eol_factors(fa::UnitAssessment& a, double score) {
  a.factors.clear();
  for (auto [name, w] : {std::pair{"paper", 5.0}, std::pair{"thermal", 10.0}}) {
    fa::FactorScore f;
    f.name = name;
    f.score = score;
    f.weight = w;
    a.factors.push_back(f);
  }
}
}  // namespace

// Condition: S(t) = 100 e^(B t) (exponential ageing curve) of the end-of-life
// score. S 60 at 20 years gives B = ln(0.6)/20 = -0.025541/yr, inside [2, 0.5]
// x ln(0.3)/60; 30 is then reached at t = 20 ln(0.3)/ln(0.6) = 47.138 years,
// i.e. 27.138 years from now.
TEST(RemainingLife, ConditionExponentialOwnRate) {
  auto a = unit20();
  eol_factors(a, 2.4);
  auto e = fa::condition_life(fa::RemainingLifeOptions{}, a);
  ASSERT_TRUE(e.years);
  EXPECT_NEAR(*e.years, 20 * std::log(0.3) / std::log(0.6) - 20, 1e-9);
  EXPECT_FALSE(e.range.empty());
}

// The own rate is limited to twice the expected rate (CNAIM v2.1 6.1.8 form,
// from memory): S 40 at 20 years would give ln(0.4)/20 = -0.0458 < 2 x
// ln(0.3)/60 = -0.04013; limited, ln(40/30)/0.04013 = 7.168 years.
TEST(RemainingLife, ConditionRateLimited) {
  auto a = unit20();
  eol_factors(a, 1.6);
  auto e = fa::condition_life(fa::RemainingLifeOptions{}, a);
  ASSERT_TRUE(e.years);
  EXPECT_NEAR(*e.years, std::log(40.0 / 30) / (-2 * std::log(0.3) / 60), 1e-9);
  eol_factors(a, 1.2);  // at the end-of-life score
  ASSERT_TRUE(fa::condition_life(fa::RemainingLifeOptions{}, a).years);
  EXPECT_DOUBLE_EQ(*fa::condition_life(fa::RemainingLifeOptions{}, a).years, 0);
}

// Only end-of-life evidence is aged: a dissolved-gas factor at the bottom
// (rating E) or a capped index changes nothing; with a single end-of-life
// factor there is no condition estimate (ferrum's rule, common practice).
TEST(RemainingLife, ConditionAgesEndOfLifeEvidenceOnly) {
  auto a = unit20();
  eol_factors(a, 2.4);
  a.health_index = 30;
  fa::FactorScore dga;
  dga.name = "dga";
  dga.score = 0;
  dga.weight = 10;
  a.factors.push_back(dga);
  auto e = fa::condition_life(fa::RemainingLifeOptions{}, a);
  ASSERT_TRUE(e.years);
  EXPECT_NEAR(*e.years, 20 * std::log(0.3) / std::log(0.6) - 20, 1e-9);
  a.factors.erase(a.factors.begin() + 1);  // paper only, and the dga factor
  EXPECT_FALSE(fa::condition_life(fa::RemainingLifeOptions{}, a).years);
}

// Age: expected life 60 years (ferrum default) minus 20 years in service = 40,
// range +-10 years; not limiting where the paper DP is measured.
TEST(RemainingLife, AgeAgainstExpectedLife) {
  auto a = unit20();
  fa::RemainingLifeOptions o;
  o.horizon_years = 100;
  auto e = fa::age_life(o, a);
  ASSERT_TRUE(e.years);
  EXPECT_NEAR(*e.years, 40, 1e-6);
  EXPECT_NEAR(*e.low_years, 30, 1e-6);
  EXPECT_NEAR(*e.high_years, 50, 1e-6);
  o.expected_life_years = 25;  // 5 years left by age
  a.paper.dp_estimate = 600;   // 20 years by paper: the measured evidence limits
  fa::estimate_remaining_life(o, a);
  EXPECT_EQ(a.remaining_life.limiting_factor, "paper");
  a.paper.dp_estimate.reset();  // without a DP, age limits
  fa::estimate_remaining_life(o, a);
  EXPECT_EQ(a.remaining_life.limiting_factor, "age");
  EXPECT_NEAR(*a.remaining_life.years, 5, 1e-6);
}

// The paper range comes from the two DP correlations: a De Pablo DP above the
// Chendong one widens the high end, and the range method says so.
TEST(RemainingLife, PaperRangeFromBothCorrelations) {
  auto a = unit20();
  a.paper.dp_estimate = 600;    // 400 DP over 20 years: 20 DP/year, 20 years left
  a.paper.dp_alternative = 700;
  auto e = fa::paper_life(fa::RemainingLifeOptions{}, a);
  ASSERT_TRUE(e.years && e.high_years && e.low_years);
  EXPECT_NEAR(*e.years, 20, 1e-9);
  EXPECT_NEAR(*e.high_years, 500 / (20 * 0.7), 1e-9);  // rate -30 %, DP 700
  EXPECT_NEAR(*e.low_years, 400 / (20 * 1.3), 1e-9);   // rate +30 %, DP 600
  EXPECT_NE(e.range.find("both correlations"), std::string::npos);
  // With a furan history falling 10 DP/year, the rate spans 10..20 DP/year:
  // high end 500/10 = 50 years, limited to the 40-year horizon; low end
  // 400/20 = 20 years (computed by hand).
  a.paper.dp_fall_per_year_history = 10;
  a.paper.dp_history_samples = 6;
  e = fa::paper_life(fa::RemainingLifeOptions{}, a);
  EXPECT_NEAR(*e.low_years, 20, 1e-9);
  EXPECT_NEAR(*e.high_years, 40, 1e-9);
  EXPECT_NE(e.range.find("6 furan samples"), std::string::npos);
}

// CNAIM checks (computed by hand; CNAIM formulas from memory):
// beta1 = ln(5.5/0.5)/60 = 0.03996 reaches HS 1.66 at 30 years; a unit at HS
// 3.0 at age 30 (beta2 = ln(6)/30 = 0.0597) reaches 5.45 ten years later.
TEST(RemainingLife, ExponentialTimeMatchesCnaimChecks) {
  double beta1 = std::log(5.5 / 0.5) / 60;
  EXPECT_NEAR(beta1, 0.03996, 1e-5);
  EXPECT_NEAR(*fa::exponential_time_to(0.5, 1.66, beta1), 30, 0.05);
  double beta2 = std::log(3.0 / 0.5) / 30;
  EXPECT_NEAR(beta2, 0.0597, 1e-4);
  EXPECT_NEAR(*fa::exponential_time_to(3.0, 5.45, beta2), 10, 0.01);
  EXPECT_DOUBLE_EQ(*fa::exponential_time_to(6, 5.5, beta2), 0);  // already past
  EXPECT_FALSE(fa::exponential_time_to(3, 5.5, 0));
  EXPECT_DOUBLE_EQ(*fa::exponential_time_to(3, 5.5, -0.1), 0);  // decaying, already below
  EXPECT_FALSE(fa::exponential_time_to(0, 5.5, 0.1));
}

TEST(RemainingLife, SmallestEstimateLimitsAndOthersAreKept) {
  auto a = unit20();
  a.paper.dp_estimate = 600;                 // 20 years
  a.thermal.equivalent_ageing_factor = 0.1;  // thermal: far longer
  eol_factors(a, 2.4);                       // 27.1 years
  fa::estimate_remaining_life(fa::RemainingLifeOptions{}, a);
  EXPECT_EQ(a.remaining_life.limiting_factor, "paper");
  EXPECT_NEAR(*a.remaining_life.years, 20, 1e-9);
  EXPECT_EQ(a.remaining_life.estimates.size(), 4u);  // paper, thermal, age, condition
  EXPECT_FALSE(a.remaining_life.beyond_horizon);
}

// A correctable defect (here severe gassing, IEEE C57.104-2008 Condition 4 and
// C57.104-2019 Status 3, active arcing) leaves remaining life as the paper,
// thermal and condition evidence gives it: the fault is investigated and
// repaired (IEEE C57.104-2019 clause 6 operating procedures), the paper stays
// as it was. // common practice, no published source for the life figure.
TEST(RemainingLife, DefectAloneNeverShortensLife) {
  auto a = unit20();
  a.paper.dp_estimate = 600;
  a.thermal.equivalent_ageing_factor = 0.1;
  a.health_index = 60;
  fa::estimate_remaining_life(fa::RemainingLifeOptions{}, a);
  const double before = *a.remaining_life.years;
  a.dga.c57104_2008_condition = 4;
  a.dga.c57104_2019_status = a.dga.c57104_2019_fault_status = 3;
  a.dga.active_arcing = a.active_arcing = true;
  fa::estimate_remaining_life(fa::RemainingLifeOptions{}, a);
  EXPECT_EQ(a.remaining_life.limiting_factor, "paper");
  EXPECT_DOUBLE_EQ(*a.remaining_life.years, before);
  for (const auto& e : a.remaining_life.estimates) EXPECT_NE(e.basis, "gases");
}

// Property: the estimate never passes the horizon and is flagged when it
// reaches it; it never rises as DP falls. // common practice, no published source
TEST(RemainingLife, NeverAboveHorizonAndFallsWithDp) {
  fa::RemainingLifeOptions o;
  o.horizon_years = 40;
  std::optional<double> previous;
  for (double dp = 1000; dp >= 150; dp -= 25) {
    auto a = unit20();
    a.paper.dp_estimate = dp;
    a.thermal.equivalent_ageing_factor = 0.01;  // young paper, slow thermal ageing
    fa::estimate_remaining_life(o, a);
    ASSERT_TRUE(a.remaining_life.years) << dp;
    EXPECT_LE(*a.remaining_life.years, 40) << dp;
    EXPECT_LE(*a.remaining_life.high_years, 40) << dp;
    EXPECT_EQ(a.remaining_life.beyond_horizon, *a.remaining_life.years >= 40) << dp;
    EXPECT_DOUBLE_EQ(a.remaining_life.horizon_years, 40);
    if (previous) {
      EXPECT_LE(*a.remaining_life.years, *previous) << dp;
    }
    previous = a.remaining_life.years;
  }
  auto healthy = unit20();
  healthy.paper.dp_estimate = 990;
  healthy.thermal.equivalent_ageing_factor = 0.0;
  healthy.health_index = 99;
  fa::estimate_remaining_life(o, healthy);
  EXPECT_TRUE(healthy.remaining_life.beyond_horizon);
  EXPECT_DOUBLE_EQ(*healthy.remaining_life.years, 40);
}

TEST(RemainingLife, NothingKnownGivesNoEstimate) {
  fa::UnitAssessment a;
  fa::estimate_remaining_life(fa::RemainingLifeOptions{}, a);
  EXPECT_FALSE(a.remaining_life.years);
  EXPECT_TRUE(a.remaining_life.limiting_factor.empty());
  EXPECT_FALSE(a.missing.empty());
}
