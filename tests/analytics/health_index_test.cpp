// Tests of the weighted health index (analytics/health_index.h).
// Weights and bands are those of Jahromi et al., IEEE EI Magazine 25(2), 2009,
// from memory, medium confidence: every check against them says so.
#include "analytics/health_index.h"

#include <gtest/gtest.h>

#include <random>

namespace fa = ferrum::analytics;

namespace {

fa::GasReading gas(const char* name, double ppm) {
  fa::GasReading g;
  g.gas = name;
  g.ppm = ppm;
  return g;
}

fa::OilCheck check(const char* test, double value, const char* source = "") {
  fa::OilCheck c;
  c.test = test;
  c.value = value;
  c.source = source;
  return c;
}

// A unit with every factor filled; the hand computation is in WorkedExample.
fa::UnitAssessment worked_unit() {
  fa::UnitAssessment a;
  a.as_of = fa::days_from_civil(2024, 6, 30);
  a.unit.unit_id = "T1";
  a.unit.hv_kv = 138;
  a.unit.year_built = 1994;
  a.dga.sample_date = fa::days_from_civil(2024, 3, 1);
  a.dga.gases = {gas("H2", 150), gas("CH4", 100), gas("C2H6", 70), gas("C2H4", 60),
                 gas("C2H2", 2),  gas("CO", 400),  gas("CO2", 2800)};
  a.oil.sample_date = a.dga.sample_date;
  a.oil.checks = {check("moisture", 22), check("breakdown", 50, "ASTM D1816 2 mm"), check("pf25", 0.08),
                  check("ift", 32),      check("color", 1.0),     check("acidity", 0.05)};
  a.paper.furan_2fal_ppb = 300;
  a.thermal.equivalent_ageing_factor = 0.3;
  fa::InfraredFinding ir;
  ir.date = fa::days_from_civil(2024, 1, 10);
  ir.component = "HV bushing H1 clamp";
  ir.severity = 2;
  a.infrared.push_back(ir);
  a.inspection.push_back({"bushings", fa::Rating::fair, fa::days_from_civil(2024, 2, 1), {}, false, ""});
  a.inspection.push_back({"cooling", fa::Rating::good, fa::days_from_civil(2024, 2, 1), {}, false, ""});
  return a;
}

const fa::FactorScore& factor(const fa::UnitAssessment& a, const std::string& name) {
  for (const auto& f : a.factors)
    if (f.name == name) return f;
  throw std::runtime_error("no factor " + name);
}

double contribution_sum(const fa::UnitAssessment& a) {
  double s = 0;
  for (const auto& f : a.factors) s += f.contribution;
  return s;
}

}  // namespace

// Jahromi DGAF check (computed by hand; bands from memory):
// H2 150 -> S2 x W2 = 4, CH4 100 -> 2x3 = 6, C2H6 70 -> 2x3 = 6, C2H4 60 -> 2x3 = 6,
// C2H2 2 -> 1x5 = 5, CO 400 -> 2x1 = 2, CO2 2800 -> 2x1 = 2; sum 31 / 18 = 1.722 -> C.
TEST(HealthIndex, DgaFactorMatchesDomainCheck) {
  fa::HealthIndexOptions o;
  auto a = worked_unit();
  auto dgaf = fa::dga_factor_value(a.dga.gases, o.gas_bands);
  ASSERT_TRUE(dgaf);
  EXPECT_NEAR(*dgaf, 31.0 / 18.0, 1e-12);
  EXPECT_EQ(fa::rating_from_cuts(*dgaf, o.dga_cuts), 2);  // rating C
}

// Band edges of the gas table (Jahromi 2009 DGA table, from memory): "<= 100"
// scores 1, just above scores 2; above the last edge scores 6.
TEST(HealthIndex, GasScoreBandEdges) {
  fa::HealthIndexOptions o;
  std::vector<fa::GasScoreBands> h2only{o.gas_bands[0]};
  EXPECT_DOUBLE_EQ(*fa::dga_factor_value({gas("H2", 100)}, h2only), 1);
  EXPECT_DOUBLE_EQ(*fa::dga_factor_value({gas("H2", 100.5)}, h2only), 2);
  EXPECT_DOUBLE_EQ(*fa::dga_factor_value({gas("H2", 700)}, h2only), 5);
  EXPECT_DOUBLE_EQ(*fa::dga_factor_value({gas("H2", 701)}, h2only), 6);
  fa::GasReading below;
  below.gas = "H2";
  below.below_limit = true;
  EXPECT_DOUBLE_EQ(*fa::dga_factor_value({below}, h2only), 1);  // tested, nothing found
  fa::GasReading absent;
  absent.gas = "H2";
  EXPECT_FALSE(fa::dga_factor_value({absent}, h2only));
}

// Rating cuts of the DGAF (Jahromi 2009, from memory): A < 1.2 <= B < 1.5 <= C
// < 2.0 <= D < 3.0 <= E.
TEST(HealthIndex, RatingCutEdges) {
  fa::RatingCuts c{1.2, 1.5, 2.0, 3.0};
  EXPECT_EQ(fa::rating_from_cuts(1.1999, c), 4);
  EXPECT_EQ(fa::rating_from_cuts(1.2, c), 3);
  EXPECT_EQ(fa::rating_from_cuts(1.9999, c), 2);
  EXPECT_EQ(fa::rating_from_cuts(2.0, c), 1);
  EXPECT_EQ(fa::rating_from_cuts(3.0, c), 0);
  // DP cuts, higher is better: Chendong translation of the furan cuts.
  fa::HealthIndexOptions o;
  EXPECT_EQ(fa::rating_from_cuts(718, o.dp_cuts, true), 4);
  EXPECT_EQ(fa::rating_from_cuts(717, o.dp_cuts, true), 3);
  EXPECT_EQ(fa::rating_from_cuts(431, o.dp_cuts, true), 0);
}

// The DP cuts are Chendong's log10(2FAL ppm) = 1.51 - 0.0035 DP evaluated at the
// furan cuts 0.1 / 0.25 / 0.5 / 1.0 ppm (Chendong 1991 from memory:
// 0.1 ppm -> 717 and 1 ppm -> 431 are its computed checks).
TEST(HealthIndex, DpCutsAreChendongTranslationOfFuranCuts) {
  fa::HealthIndexOptions o;
  for (int k = 0; k < 4; ++k)
    EXPECT_NEAR(o.dp_cuts[k], (1.51 - std::log10(o.furan_ppm_cuts[k])) / 0.0035, 0.6) << k;
}

// Worked example by hand (weights/bands: Jahromi 2009, from
// memory; thermal/infrared/inspection/age scales are ferrum's own):
//  dga      DGAF 1.722 -> C -> HIF 2, K 10: 20
//  oil      138 kV class: moisture 22 -> S2 x4 = 8, breakdown 50 -> S2 x3 = 6,
//           pf25 0.08 -> S1 x3 = 3, IFT 32 -> S1 x2 = 2, colour 1.0 -> S1 x2 = 2,
//           acid 0.05 -> S2 x1 = 2; 23/15 = 1.533 -> C -> HIF 2, K 6: 12
//  paper    2-FAL 0.3 ppm -> C -> HIF 2, K 5: 10
//  thermal  F_EQA 0.3 -> A -> HIF 4, K 10: 40
//  infrared worst severity 2 -> C -> HIF 2, K 8: 16
//  inspection worst "fair" -> B -> HIF 3, K 8: 24
//  age      30 years -> B -> HIF 3, K 2: 6
//  sum K HIF = 128; sum 4K = 4 x 49 = 196; HI = 100 x 128 / 196 = 65.306
// An ester-filled unit: the DGA factor's gas bands are mineral-oil values
// (Jahromi et al. 2009 scored mineral-oil units, from memory; verify), as the
// DGA interpretations ferrum withholds for other fluids, so its gases are not
// scored and the factor carries no weight.
TEST(HealthIndex, EsterGasesAreNotScoredOnMineralOilBands) {
  auto a = worked_unit();
  a.unit.oil = fa::OilType::ester;
  fa::score_health(fa::HealthIndexOptions{}, a);
  const auto& dga = factor(a, "dga");
  EXPECT_FALSE(dga.score);
  EXPECT_EQ(dga.contribution, 0);
  EXPECT_NE(dga.detail.find("mineral oil"), std::string::npos) << dga.detail;
}

TEST(HealthIndex, WorkedExampleByHand) {
  auto a = worked_unit();
  fa::score_health(fa::HealthIndexOptions{}, a);
  ASSERT_TRUE(a.health_index);
  EXPECT_NEAR(*a.health_index, 100.0 * 128 / 196, 1e-9);
  EXPECT_EQ(a.band, "deteriorating");
  EXPECT_EQ(a.band_expected_life, "more than 10 years");
  EXPECT_EQ(*factor(a, "oil_quality").score, 2);
  EXPECT_EQ(*factor(a, "inspection").score, 3);
  EXPECT_NEAR(factor(a, "dga").contribution, 100.0 * 20 / 196, 1e-9);
  EXPECT_NEAR(factor(a, "thermal").contribution, 100.0 * 40 / 196, 1e-9);
  EXPECT_NEAR(contribution_sum(a), *a.health_index, 1e-9);
  EXPECT_EQ(a.confidence, "7 of 13 factors (no electrical tests)");  // 6 electrical factors, no tests
  ASSERT_EQ(a.freshness.size(), 4u);
  EXPECT_EQ(a.freshness[0].kind, "oil");
}

// Scale checks (computed): all factors at A give 100, all at C give 50.
TEST(HealthIndex, AllAGives100AllCGives50) {
  auto a = worked_unit();
  a.dga.gases = {gas("H2", 10)};
  a.oil.checks = {check("moisture", 5)};
  a.paper.furan_2fal_ppb = 50;
  a.thermal.equivalent_ageing_factor = 0.1;
  a.infrared[0].severity.reset();
  a.inspection[0].rating = fa::Rating::good;
  a.unit.year_built = 2014;
  fa::score_health(fa::HealthIndexOptions{}, a);
  EXPECT_NEAR(*a.health_index, 100, 1e-9);
  EXPECT_EQ(a.band, "sound");

  auto c = worked_unit();  // DGA, oil, paper, infrared already at C
  c.thermal.equivalent_ageing_factor = 1.5;
  c.inspection[0].rating = fa::Rating::poor;
  c.unit.year_built = 1984;  // 40 years
  fa::score_health(fa::HealthIndexOptions{}, c);
  EXPECT_NEAR(*c.health_index, 50, 1e-9);
  EXPECT_EQ(c.band, "worn");  // the 50 edge belongs to the worse band
}

TEST(HealthIndex, BandEdges) {
  fa::HealthIndexOptions o;
  EXPECT_EQ(fa::band_of(100, o.bands)->name, "sound");
  // Jahromi's table gives 85-100, 70-85, ... 0-30; ferrum puts each edge in
  // the worse band (a documented choice).
  EXPECT_EQ(fa::band_of(85.01, o.bands)->name, "sound");
  EXPECT_EQ(fa::band_of(85, o.bands)->name, "serviceable");
  EXPECT_EQ(fa::band_of(50.01, o.bands)->name, "deteriorating");
  EXPECT_EQ(fa::band_of(50, o.bands)->name, "worn");
  EXPECT_EQ(fa::band_of(30.01, o.bands)->name, "worn");
  EXPECT_EQ(fa::band_of(30, o.bands)->name, "failing");
  EXPECT_EQ(fa::band_of(0, o.bands)->name, "failing");
  EXPECT_EQ(fa::band_of(std::nan(""), o.bands), nullptr);
}

// Missing factors are left out of both sums: without thermal (K 10, HIF 4) and
// infrared (K 8, HIF 2): (128 - 40 - 16) / (4 x 31) = 72 / 124 = 58.065.
TEST(HealthIndex, MissingFactorsAreLeftOutAndNamed) {
  auto a = worked_unit();
  a.thermal.equivalent_ageing_factor.reset();
  a.infrared.clear();
  a.oil.sample_date = a.dga.sample_date = fa::days_from_civil(2021, 6, 30);
  fa::score_health(fa::HealthIndexOptions{}, a);
  ASSERT_TRUE(a.health_index);
  EXPECT_NEAR(*a.health_index, 100.0 * 72 / 124, 1e-9);
  EXPECT_EQ(factor(a, "thermal").weight, 0);
  EXPECT_FALSE(factor(a, "infrared").score);
  EXPECT_NEAR(contribution_sum(a), *a.health_index, 1e-9);
  EXPECT_NE(a.confidence.find("5 of 13 factors (no thermal, infrared, electrical tests)"), std::string::npos) << a.confidence;
  EXPECT_NE(a.confidence.find("last oil sample 3.0 years old"), std::string::npos) << a.confidence;
  EXPECT_EQ(a.missing.size(), 3u);  // thermal, infrared, and one line for the electrical tests
}

TEST(HealthIndex, TooFewFactorsGivesNoIndex) {
  fa::UnitAssessment a;
  a.as_of = fa::days_from_civil(2024, 1, 1);
  a.unit.year_built = 2000;
  a.dga.gases = {gas("H2", 10)};
  fa::score_health(fa::HealthIndexOptions{}, a);  // dga + age = 2 < 3
  EXPECT_FALSE(a.health_index);
  EXPECT_TRUE(a.band.empty());
  EXPECT_NE(a.confidence.find("2 of 13 factors"), std::string::npos);
  EXPECT_NE(a.confidence.find("too few"), std::string::npos);
}

// The breakdown bands are for ASTM D1816 2 mm (Jahromi 2009, from memory): another method
// is left out rather than scored against the wrong limits.
TEST(HealthIndex, BreakdownOfOtherMethodLeftOut) {
  auto a = worked_unit();
  a.oil.checks = {check("breakdown", 20, "ASTM D877")};
  fa::score_health(fa::HealthIndexOptions{}, a);
  EXPECT_FALSE(factor(a, "oil_quality").score);
  a = worked_unit();
  a.oil.checks = {check("breakdown", 20, "ASTM D1816 2 mm")};
  fa::score_health(fa::HealthIndexOptions{}, a);
  EXPECT_EQ(*factor(a, "oil_quality").score, 0);  // S4 -> 4.0 >= 3.0 -> E
}

// CIGRE TB 761: one severe indicator must not be averaged away. DGA condition 4
// caps the worked example (65.3) at 30, the top of the worst band; the
// contributions still add up to the index and the DGA detail says why.
TEST(HealthIndex, WorstIndicatorCapBindsAndIsExplained) {
  auto a = worked_unit();
  a.dga.c57104_2008_condition = 4;
  a.dga.c57104_2008_fault_condition = 4;  // the cap reads the fault-gas condition (CO, CO2 left out)
  fa::score_health(fa::HealthIndexOptions{}, a);
  EXPECT_DOUBLE_EQ(*a.health_index, 30);
  EXPECT_EQ(a.band, "failing");  // 30 is the top of the worst band
  EXPECT_NEAR(contribution_sum(a), 30, 1e-9);
  EXPECT_NE(factor(a, "dga").detail.find("CIGRE TB 761"), std::string::npos);

  // An active gassing fault is found and repaired (IEEE C57.104-2019 operating
  // procedures): it caps the index (risk), not the condition.
  EXPECT_NEAR(*a.condition_index, 65.3, 0.05);

  auto u = worked_unit();
  u.inspection[0].rating = fa::Rating::unsafe;  // worst item: HIF 0 and the cap
  fa::score_health(fa::HealthIndexOptions{}, u);
  EXPECT_DOUBLE_EQ(*u.health_index, 30);
  // The unsafe item is correctable: the condition index is the weighted score
  // without its cap (ferrum's own split, used for replacement advice only).
  ASSERT_TRUE(u.condition_index);
  EXPECT_GT(*u.condition_index, 30);

  auto s = worked_unit();
  s.dga.c57104_2019_status = s.dga.c57104_2019_fault_status = 3;  // cap 50, below 65.3: binds
  fa::score_health(fa::HealthIndexOptions{}, s);
  EXPECT_DOUBLE_EQ(*s.health_index, 50);
  auto n = worked_unit();
  n.dga.c57104_2008_condition = 3;  // no cap for condition 3
  n.dga.c57104_2008_fault_condition = 3;
  fa::score_health(fa::HealthIndexOptions{}, n);
  EXPECT_NEAR(*n.health_index, 100.0 * 128 / 196, 1e-9);
  // Issue #16: CO2 alone at Condition 4 (IEEE C57.104-2008 Table 1, > 10000 ppm)
  // marks paper ageing, not a fault: the fault-gas condition stays 1, no cap.
  auto co2 = worked_unit();
  co2.dga.c57104_2008_condition = 4;
  co2.dga.c57104_2008_fault_condition = 1;
  fa::score_health(fa::HealthIndexOptions{}, co2);
  EXPECT_NEAR(*co2.health_index, 100.0 * 128 / 196, 1e-9);
}

// 2-FAL reported below detection ("ND") is scored as good paper (the best
// band of the furan cuts, 0.1 ppm: CIGRE TB 761 scoring as configured in
// analytics/data/health_index.csv), not left out as missing (issue #16).
TEST(HealthIndex, FuranBelowDetectionScoresAsGoodPaper) {
  auto a = worked_unit();
  a.paper.furan_2fal_ppb.reset();
  a.paper.furan_below_detection = true;
  fa::score_health(fa::HealthIndexOptions{}, a);
  ASSERT_TRUE(factor(a, "paper").score);
  EXPECT_EQ(*factor(a, "paper").score, 4);  // best
  EXPECT_NE(factor(a, "paper").detail.find("below detection"), std::string::npos);
  auto limit = worked_unit();
  limit.paper.furan_2fal_ppb.reset();
  limit.paper.furan_below_detection = true;
  limit.paper.furan_detection_limit_ppb = 50;  // "<50" ppb = 0.05 ppm, below the first cut
  fa::score_health(fa::HealthIndexOptions{}, limit);
  EXPECT_EQ(*factor(limit, "paper").score, 4);
}

TEST(HealthIndex, CapAboveIndexIsNotBinding) {
  auto a = worked_unit();
  a.dga.c57104_2019_status = a.dga.c57104_2019_fault_status = 3;
  fa::HealthIndexOptions o;
  for (auto& c : o.caps) c.cap = 80;
  fa::score_health(o, a);
  EXPECT_NEAR(*a.health_index, 100.0 * 128 / 196, 1e-9);
  EXPECT_NE(factor(a, "dga").detail.find("not binding"), std::string::npos);
}

// Property: a worse input never raises the index. Fixed seed; each case
// worsens one input of a random fully-filled unit.
TEST(HealthIndex, MonotoneInEveryInput) {
  std::mt19937 rng(20240630);
  auto uni = [&](double lo, double hi) { return std::uniform_real_distribution<double>(lo, hi)(rng); };
  auto pick = [&](int n) { return std::uniform_int_distribution<int>(0, n - 1)(rng); };
  const char* gases[] = {"H2", "CH4", "C2H6", "C2H4", "C2H2", "CO", "CO2"};
  const double gas_max[] = {1000, 800, 200, 300, 100, 1600, 9000};
  fa::HealthIndexOptions o;
  for (int i = 0; i < 1000; ++i) {
    auto a = worked_unit();
    a.unit.hv_kv = uni(10, 400);
    for (int g = 0; g < 7; ++g) a.dga.gases[g] = gas(gases[g], uni(0, gas_max[g]));
    a.oil.checks = {check("moisture", uni(0, 50)), check("breakdown", uni(20, 70), "D1816 2 mm"),
                    check("pf25", uni(0, 1.5)),    check("ift", uni(10, 40)),
                    check("color", uni(0, 4)),     check("acidity", uni(0, 0.3))};
    a.paper.furan_2fal_ppb = uni(0, 2000);
    a.thermal.equivalent_ageing_factor = uni(0, 6);
    a.infrared[0].severity = pick(5);
    if (*a.infrared[0].severity == 0) a.infrared[0].severity.reset();
    a.inspection[0].rating = static_cast<fa::Rating>(1 + pick(5));
    a.unit.year_built = 1950 + pick(70);
    auto worse = a;
    switch (pick(12)) {
      case 0: *worse.dga.gases[pick(7)].ppm *= uni(1, 3); break;
      case 1: *worse.oil.checks[0].value += uni(0, 20); break;
      case 2: *worse.oil.checks[1].value -= uni(0, 20); break;
      case 3: *worse.oil.checks[3].value -= uni(0, 10); break;
      case 4: *worse.paper.furan_2fal_ppb += uni(0, 1000); break;
      case 5: *worse.thermal.equivalent_ageing_factor += uni(0, 3); break;
      case 6: worse.infrared[0].severity = std::min(4, worse.infrared[0].severity.value_or(0) + 1); break;
      case 7: worse.unit.year_built -= 1 + pick(20); break;
      case 8: worse.dga.c57104_2008_condition = worse.dga.c57104_2008_fault_condition = 4; break;
      case 9: worse.dga.c57104_2019_status = worse.dga.c57104_2019_fault_status = 3; break;
      case 10:
        worse.inspection[0].rating =
            static_cast<fa::Rating>(std::min(5, static_cast<int>(worse.inspection[0].rating) + 1));
        break;
      case 11: worse.thermal.hours_above_long_emergency = uni(0.1, 10); break;
    }
    fa::score_health(o, a);
    fa::score_health(o, worse);
    ASSERT_LE(*worse.health_index, *a.health_index + 1e-9) << "case " << i;
  }
}

// Thermal history (ferrum's own scale): hours above the hot-spot limits cap
// the F_EQA rating at B / C / D; F_EQA 0.3 alone is A.
TEST(HealthIndex, ThermalLimitHoursCapRating) {
  auto a = worked_unit();
  a.thermal.hours_above_normal_cyclic = 2;
  fa::score_health(fa::HealthIndexOptions{}, a);
  EXPECT_EQ(*factor(a, "thermal").score, 3);
  auto b = worked_unit();
  b.thermal.hours_above_normal_cyclic = 0;
  b.thermal.hours_above_short_emergency = 0.5;
  fa::score_health(fa::HealthIndexOptions{}, b);
  EXPECT_EQ(*factor(b, "thermal").score, 1);
}

TEST(HealthIndex, FreshnessOnePerKind) {
  auto a = worked_unit();
  auto f = fa::data_freshness(a);
  ASSERT_EQ(f.size(), 4u);
  EXPECT_EQ(f[1].kind, "infrared");
  EXPECT_EQ(*f[1].latest, fa::days_from_civil(2024, 1, 10));
  EXPECT_EQ(f[3].kind, "load");
  EXPECT_FALSE(f[3].latest);  // no thermal.to
  EXPECT_NEAR(*f[2].age_years, (a.as_of - fa::days_from_civil(2024, 2, 1)) / 365.25, 1e-12);
}
