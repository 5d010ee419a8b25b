#include "analytics/oil_assessment.h"

#include <gtest/gtest.h>

#include <algorithm>
#include <cmath>

#include "dga_test_sample.h"

namespace ferrum::analytics {
namespace {
using testing::gas_sample;

UnitData unit_132kv() {
  UnitData d;
  d.info.unit_id = "T1";
  d.info.hv_kv = 132;
  d.info.year_built = 1995;
  return d;
}

bool has_text(const std::vector<std::string>& v, const std::string& part) {
  return std::any_of(v.begin(), v.end(), [&](const std::string& s) { return s.find(part) != std::string::npos; });
}

TEST(OilAssessment, NoSamplesReportsMissing) {
  UnitAssessment out;
  assess_oil(unit_132kv(), 20000, {}, out);
  EXPECT_TRUE(has_text(out.missing, "oil sample"));
  EXPECT_FALSE(out.dga.sample_date);
}

TEST(OilAssessment, ArcingUnitGetsUrgentActionsAndOnlyMainTankIsUsed) {
  UnitData d = unit_132kv();
  const Day t0 = days_from_civil(2023, 1, 10);
  d.oil_samples.push_back(gas_sample(t0, {.h2 = 50, .ch4 = 20, .c2h6 = 10, .c2h4 = 10, .c2h2 = -0.5, .co = 300, .co2 = 2000}));
  // Arcing signature: Duval 10/5/20 -> D1 (check point inside the published zone), scaled up.
  d.oil_samples.push_back(gas_sample(t0 + 90, {.h2 = 400, .ch4 = 100, .c2h6 = 20, .c2h4 = 50, .c2h2 = 200, .co = 320, .co2 = 2100}));
  OilSample oltc = gas_sample(t0 + 95, {.h2 = 5000, .c2h2 = 5000});
  oltc.sample_point = "oltc";
  d.oil_samples.push_back(oltc);
  UnitAssessment out;
  const Day as_of = t0 + 100;
  assess_oil(d, as_of, {}, out);
  ASSERT_TRUE(out.dga.sample_date);
  EXPECT_EQ(*out.dga.sample_date, t0 + 90);  // the OLTC sample is ignored
  EXPECT_EQ(out.gas_history.size(), 2u);
  EXPECT_EQ(out.dga.duval_triangle_1, "D1");
  EXPECT_EQ(out.dga.c57104_2008_condition, 4);  // C2H2 200 > 35 (C57.104-2008 Table 1)
  EXPECT_TRUE(out.dga.active_arcing);
  EXPECT_TRUE(out.active_arcing);
  EXPECT_EQ(out.dga.gases.size(), 7u);
  ASSERT_TRUE(out.dga.tdcg_rate_ppm_per_day);
  // TDCG 390 -> 1090 in 90 days = 7.78 ppm/day: Condition 4, rate < 10 -> weekly (Table 3).
  EXPECT_NEAR(*out.dga.tdcg_rate_ppm_per_day, 700.0 / 90.0, 1e-9);
  EXPECT_EQ(out.dga.c57104_2008_interval, "weekly");
  EXPECT_EQ(out.dga.duval_history.size(), 2u);
  bool resample = false, acetylene = false;
  for (const Action& a : out.actions) {
    EXPECT_GE(a.due, as_of);
    if (a.text.find("Resample") != std::string::npos) {
      resample = true;
      EXPECT_EQ(a.due, as_of + 7);
      EXPECT_EQ(a.priority, 1);
    }
    if (a.text.find("acetylene") != std::string::npos) acetylene = true;
  }
  EXPECT_TRUE(resample);
  EXPECT_TRUE(acetylene);
  EXPECT_TRUE(has_text(out.methods, "IEEE C57.104-2008 Table 1"));
  EXPECT_TRUE(has_text(out.methods, "Duval Triangle 1"));
  EXPECT_TRUE(has_text(out.missing, "furan test"));
}

TEST(OilAssessment, OilQualityMoistureAndPaper) {
  UnitData d = unit_132kv();
  d.info.oil_treated = days_from_civil(2020, 6, 1);
  OilSample s;
  s.date = days_from_civil(2023, 5, 1);
  s.moisture_ppm = LabValue::measured(30);  // > 25 mg/kg for 69-230 kV (C57.106, from memory)
  s.oil_temp_c = LabValue::measured(30);    // cold sample
  s.ift_mn_m = LabValue::measured(35);
  s.furan_2fal_ppb = LabValue::measured(1000);
  d.oil_samples.push_back(s);
  UnitAssessment out;
  assess_oil(d, s.date + 10, {}, out);
  EXPECT_EQ(out.oil.oil_class.rfind("Class II", 0), 0u);
  EXPECT_TRUE(std::any_of(out.actions.begin(), out.actions.end(),
                          [](const Action& a) { return a.text.rfind("Recondition", 0) == 0; }));
  ASSERT_TRUE(out.oil.relative_saturation_pct);
  EXPECT_TRUE(has_text(out.oil.notes, "cold sample"));
  ASSERT_TRUE(out.paper.dp_estimate);
  EXPECT_NEAR(*out.paper.dp_estimate, 431.4, 0.5);  // Chendong 1991, 1 ppm
  EXPECT_FALSE(out.paper.trustworthy);              // sampled after the oil treatment
  EXPECT_TRUE(has_text(out.missing, "DGA"));
}

// The DP fall over the furan history: 2-FAL chosen so that Chendong (1991,
// log10(2FAL ppm) = 1.51 - 0.0035 DP) gives DP 500, 480 and 460 two years
// apart: a fall of 10 DP per year (computed by hand); two samples are too few.
TEST(OilAssessment, DpFallFittedOverTheFuranHistory) {
  UnitData d = unit_132kv();
  const int years[] = {2020, 2022, 2024};
  const double dps[] = {500, 480, 460};
  for (int k = 0; k < 3; ++k) {
    OilSample s;
    s.date = days_from_civil(years[k], 1, 1);
    s.furan_2fal_ppb = LabValue::measured(1000 * std::pow(10.0, 1.51 - 0.0035 * dps[k]));
    d.oil_samples.push_back(s);
  }
  UnitAssessment out;
  assess_oil(d, days_from_civil(2024, 6, 1), {}, out);
  ASSERT_TRUE(out.paper.dp_fall_per_year_history);
  EXPECT_NEAR(*out.paper.dp_fall_per_year_history, 10, 0.02);
  EXPECT_EQ(out.paper.dp_history_samples, 3);
  d.oil_samples.pop_back();
  UnitAssessment two;
  assess_oil(d, days_from_civil(2024, 6, 1), {}, two);
  EXPECT_FALSE(two.paper.dp_fall_per_year_history);
}

TEST(OilAssessment, FullQualityTestsFromTheirSampleWaterFromANewerOne) {
  UnitData d = unit_132kv();
  OilSample full;
  full.date = days_from_civil(2025, 5, 1);
  full.moisture_ppm = LabValue::measured(12);
  full.oil_temp_c = LabValue::measured(50);
  full.breakdown_kv = LabValue::measured(60);
  full.breakdown_method = "ASTM D1816 2 mm";
  full.acidity_mgkoh_g = LabValue::measured(0.05);
  OilSample water_only;
  water_only.date = days_from_civil(2026, 5, 1);
  water_only.moisture_ppm = LabValue::measured(30);  // > 25 mg/kg for 69-230 kV (IEEE C57.106, from memory)
  water_only.oil_temp_c = LabValue::measured(50);
  d.oil_samples = {full, water_only};
  UnitAssessment out;
  assess_oil(d, water_only.date + 1, {}, out);
  ASSERT_TRUE(out.oil.sample_date);
  EXPECT_EQ(*out.oil.sample_date, full.date);
  auto check = [&](const std::string& test) {
    auto it = std::find_if(out.oil.checks.begin(), out.oil.checks.end(),
                           [&](const OilCheck& c) { return c.test == test; });
    return it == out.oil.checks.end() ? std::optional<OilCheck>() : std::optional<OilCheck>(*it);
  };
  ASSERT_TRUE(check("breakdown"));
  EXPECT_DOUBLE_EQ(*check("breakdown")->value, 60);
  ASSERT_TRUE(check("moisture"));
  EXPECT_DOUBLE_EQ(*check("moisture")->value, 30);  // the newer water result
  EXPECT_FALSE(*check("moisture")->within_limit);
  EXPECT_TRUE(has_text(out.oil.notes, "water content from the sample of 2026-05-01"));
}

TEST(OilAssessment, SingleSampleInterpretation) {
  UnitInfo unit;
  unit.hv_kv = 132;
  // Duval check value 45/90/15 -> T3 (inside the published zone), above typical levels.
  auto d = interpret_dga_sample(gas_sample(100, {.h2 = 100, .ch4 = 45, .c2h6 = 10, .c2h4 = 90, .c2h2 = 15, .co = 200, .co2 = 1500}),
                                unit, 100, {});
  EXPECT_EQ(d.duval_triangle_1, "T3");
  EXPECT_EQ(d.c57104_2008_condition, 3);  // C2H2 15 ppm: Condition 3 (Table 1)
  EXPECT_FALSE(d.tdcg_rate_ppm_per_day);
  ASSERT_TRUE(d.c57104_2019_status);
  EXPECT_FALSE(d.c57104_2008_interval.empty());
  // Low gases: the fault-typing methods decline.
  auto low = interpret_dga_sample(gas_sample(100, {.h2 = 10, .ch4 = 5, .c2h6 = 3, .c2h4 = 2, .c2h2 = 0, .co = 100, .co2 = 900}),
                                  unit, 100, {});
  EXPECT_FALSE(low.duval_triangle_1);
  EXPECT_NE(low.duval_reading.find("concentrations too low"), std::string::npos);
  EXPECT_EQ(low.c57104_2019_status, 1);
}

}  // namespace
}  // namespace ferrum::analytics
