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

// One sample at day 100 interpreted alone, on a 132 kV unit.
DgaSummary interpret_at_100(const testing::Gases& g) {
  UnitInfo unit;
  unit.hv_kv = 132;
  return interpret_dga_sample(gas_sample(100, g), unit, 100, {});
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
  // TDCG 390 -> 1090 in 90 days = 7.78 ppm/day. Table 3 is keyed on TDCG:
  // TDCG 1090 is Condition 2, rate < 10 -> quarterly (IEEE C57.104-2008 Tables 1 and 3),
  // although C2H2 sets the unit's Condition 4.
  EXPECT_NEAR(*out.dga.tdcg_rate_ppm_per_day, 700.0 / 90.0, 1e-9);
  EXPECT_EQ(out.dga.c57104_2008_tdcg_condition, 2);
  EXPECT_EQ(out.dga.c57104_2008_fault_condition, 4);  // C2H2 is a fault gas
  EXPECT_EQ(out.dga.c57104_2008_interval, "quarterly");
  ASSERT_FALSE(out.dga.c57104_2008_single_gases.empty());
  EXPECT_EQ(out.dga.c57104_2008_single_gases[0].rfind("C2H2 200 ppm (Condition 4", 0), 0u);
  EXPECT_EQ(out.dga.acetylene_trend, "appeared");  // below the limit in the sample before
  EXPECT_EQ(out.dga.duval_history.size(), 2u);
  bool resample = false, acetylene = false;
  const Day found = t0 + 90;  // the latest gas sample: due dates count from it
  for (const Action& a : out.actions) {
    EXPECT_EQ(a.found, found);
    EXPECT_EQ(a.source, kSourceOilSample);
    // The confirming resample and the Table 3 resample share need "oil-resample"
    // (merge_actions makes them one job later); told apart by their words.
    const bool investigate = a.text.rfind("Investigate acetylene", 0) == 0;
    if (a.need == "oil-resample" && !investigate) {
      resample = true;
      EXPECT_EQ(a.due, found + 91);  // quarterly (Table 3)
      EXPECT_EQ(a.priority, 3);
    }
    if (a.need == "oil-resample" && investigate) {
      acetylene = true;
      EXPECT_EQ(a.due, found + 7);  // OilOptions::acetylene_investigate_days
      EXPECT_EQ(a.priority, 1);
      EXPECT_EQ(a.text.rfind("Investigate acetylene", 0), 0u);
    }
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
  // Duval check value 45/90/15 -> T3 (inside the published zone), above typical levels.
  auto d = interpret_at_100({.h2 = 100, .ch4 = 45, .c2h6 = 10, .c2h4 = 90, .c2h2 = 15, .co = 200, .co2 = 1500});
  EXPECT_EQ(d.duval_triangle_1, "T3");
  EXPECT_EQ(d.c57104_2008_condition, 3);  // C2H2 15 ppm: Condition 3 (Table 1)
  EXPECT_FALSE(d.tdcg_rate_ppm_per_day);
  ASSERT_TRUE(d.c57104_2019_status);
  EXPECT_FALSE(d.c57104_2008_interval.empty());
  // Low gases: the fault-typing methods decline.
  auto low = interpret_at_100({.h2 = 10, .ch4 = 5, .c2h6 = 3, .c2h4 = 2, .c2h2 = 0, .co = 100, .co2 = 900});
  EXPECT_FALSE(low.duval_triangle_1);
  EXPECT_NE(low.duval_reading.find("concentrations too low"), std::string::npos);
  EXPECT_EQ(low.c57104_2019_status, 1);
}

const Action* find_need(const std::vector<Action>& actions, const std::string& need) {
  for (const Action& a : actions)
    if (a.need == need) return &a;
  return nullptr;
}

// Issue #16: an aged unit with TDCG 615 ppm and falling, CO2 4200 ppm.
// IEEE C57.104-2008 Table 1: CO2 4200 is Condition 3 (4001-10000), CO 410
// Condition 2 (351-570), TDCG 615 Condition 1 (<= 720); the unit's condition
// is the highest (3). Table 3 is keyed on TDCG and its rate: Condition 1, rate
// < 10 ppm/day -> annual, "continue normal operation". CO2 and CO get their
// own follow-up (paper ageing), not the sampling interval.
TEST(OilAssessment, CarbonDioxideAloneDoesNotSetTheIntervalOrProcedure) {
  UnitData d = unit_132kv();
  d.info.year_built = 1975;
  const Day t0 = days_from_civil(2025, 6, 1), t1 = days_from_civil(2026, 6, 1);
  d.oil_samples.push_back(gas_sample(t0, {.h2 = 60, .ch4 = 80, .c2h6 = 60, .c2h4 = 40, .c2h2 = -0.5, .co = 450, .co2 = 4300}));
  d.oil_samples.push_back(gas_sample(t1, {.h2 = 50, .ch4 = 70, .c2h6 = 50, .c2h4 = 35, .c2h2 = -0.5, .co = 410, .co2 = 4200}));
  for (OilSample& s : d.oil_samples) {  // sealed unit: O2/N2 0.02 (the C57.104-2019 row "<= 0.2")
    s.o2 = LabValue::measured(1000);
    s.n2 = LabValue::measured(50000);
  }
  UnitAssessment out;
  assess_oil(d, days_from_civil(2026, 12, 3), {}, out);
  ASSERT_TRUE(out.dga.tdcg_ppm);
  EXPECT_DOUBLE_EQ(*out.dga.tdcg_ppm, 615);
  EXPECT_EQ(out.dga.c57104_2008_condition, 3);        // the guide's condition: CO2 (Table 1)
  EXPECT_EQ(out.dga.c57104_2008_tdcg_condition, 1);   // TDCG 615 <= 720 (Table 1)
  EXPECT_EQ(out.dga.c57104_2008_fault_condition, 1);  // CO and CO2 left out
  EXPECT_EQ(out.dga.c57104_2008_interval, "annual");  // Table 3, Condition 1, rate < 10
  EXPECT_EQ(out.dga.c57104_2008_action, "Continue normal operation");
  ASSERT_EQ(out.dga.c57104_2008_single_gases.size(), 2u);  // CO2 (3) before CO (2)
  EXPECT_EQ(out.dga.c57104_2008_single_gases[0].rfind("CO2 4200 ppm (Condition 3", 0), 0u);
  EXPECT_NE(out.dga.c57104_2008_single_gases[0].find("furans"), std::string::npos);
  EXPECT_EQ(out.dga.c57104_2008_single_gases[1].rfind("CO 410 ppm (Condition 2", 0), 0u);
  for (const Action& a : out.actions) {
    EXPECT_EQ(a.text.find("extreme caution"), std::string::npos) << a.text;
    EXPECT_EQ(a.text.find("outage"), std::string::npos) << a.text;
  }
  const Action* resample = find_need(out.actions, "oil-resample");
  ASSERT_TRUE(resample);
  EXPECT_EQ(resample->due, t1 + 365);  // annual from the sample (Table 3)
  EXPECT_EQ(resample->crew, kCrewOilSampling);
  const Action* paper = find_need(out.actions, "paper-ageing-follow-up");
  ASSERT_TRUE(paper);
  EXPECT_EQ(paper->due, t1 + 180);  // OilOptions::paper_followup_days (ferrum's default)
  EXPECT_NE(paper->text.find("furans"), std::string::npos);
  // Anchored dates: a report a week later gives the same due dates.
  UnitAssessment later;
  assess_oil(d, days_from_civil(2026, 12, 10), {}, later);
  ASSERT_TRUE(find_need(later.actions, "oil-resample"));
  EXPECT_EQ(find_need(later.actions, "oil-resample")->due, resample->due);

  // CO2 15000 ppm: Condition 4 of C57.104-2008 Table 1 (> 10000) and above the
  // C57.104-2019 Table 2 row "O2/N2 <= 0.2, > 30 years" (14000, placeholder from
  // memory): Status 3 from CO2 alone. The fault-gas status stays 1, no outage.
  d.oil_samples.back().co2 = LabValue::measured(15000);
  UnitAssessment co2;
  assess_oil(d, days_from_civil(2026, 12, 3), {}, co2);
  EXPECT_EQ(co2.dga.c57104_2008_condition, 4);
  EXPECT_EQ(co2.dga.c57104_2008_interval, "annual");
  EXPECT_EQ(co2.dga.c57104_2019_status, 3);
  EXPECT_EQ(co2.dga.c57104_2019_fault_status, 1);
  for (const Action& a : co2.actions) EXPECT_EQ(a.text.find("outage"), std::string::npos) << a.text;
  ASSERT_TRUE(find_need(co2.actions, "paper-ageing-follow-up"));
  EXPECT_NE(find_need(co2.actions, "paper-ageing-follow-up")->reason.find("C57.104-2019 Status 3 from CO2"),
            std::string::npos);
}

// A fault gas above the TDCG condition gets its own investigation, and the
// fault condition (CO, CO2 left out) follows it. IEEE C57.104-2008 Table 1:
// C2H4 150 is Condition 3 (101-200); TDCG 320 is Condition 1.
TEST(OilAssessment, FaultGasAboveTdcgGetsItsOwnFollowUp) {
  UnitData d = unit_132kv();
  const Day t = days_from_civil(2026, 3, 1);
  d.oil_samples.push_back(gas_sample(t, {.h2 = 20, .ch4 = 60, .c2h6 = 40, .c2h4 = 150, .c2h2 = 0, .co = 50, .co2 = 900}));
  UnitAssessment out;
  assess_oil(d, t + 30, {}, out);
  EXPECT_EQ(out.dga.c57104_2008_tdcg_condition, 1);
  EXPECT_EQ(out.dga.c57104_2008_fault_condition, 3);
  EXPECT_EQ(out.dga.c57104_2008_interval, "annual");  // Table 3 from TDCG Condition 1, rate unknown
  const Action* investigate = find_need(out.actions, "oil-dga-investigate");
  ASSERT_TRUE(investigate);
  EXPECT_NE(investigate->reason.find("C2H4 150 ppm (Condition 3)"), std::string::npos);
  EXPECT_EQ(investigate->due, t + 30);  // OilOptions::fault_gas_followup_days (ferrum's default)
}

// Acetylene first detected earlier and higher in each sample since is
// "rising", with its first-detected date; not "appeared" (issue #16; common
// practice, no published source). Flat is "present".
TEST(OilAssessment, AcetyleneTrendAndFirstDetection) {
  UnitData d = unit_132kv();
  const Day t0 = days_from_civil(2024, 3, 1);
  d.oil_samples.push_back(gas_sample(t0 - 365, {.h2 = 20, .c2h2 = -0.5}));
  d.oil_samples.push_back(gas_sample(t0, {.h2 = 20, .c2h2 = 2}));
  d.oil_samples.push_back(gas_sample(t0 + 365, {.h2 = 25, .c2h2 = 4}));
  d.oil_samples.push_back(gas_sample(t0 + 730, {.h2 = 30, .c2h2 = 6}));
  UnitAssessment out;
  assess_oil(d, t0 + 740, {}, out);
  EXPECT_EQ(out.dga.acetylene_trend, "rising");
  ASSERT_TRUE(out.dga.acetylene_first_detected);
  EXPECT_EQ(*out.dga.acetylene_first_detected, t0);
  const auto investigate = [](const UnitAssessment& u, const std::string& start) -> const Action* {
    for (const auto& x : u.actions)
      if (x.need == "oil-resample" && x.text.rfind(start, 0) == 0) return &x;
    return nullptr;
  };
  const Action* a = investigate(out, "Investigate acetylene");
  ASSERT_TRUE(a);
  EXPECT_NE(a->reason.find("acetylene rising (4 -> 6 ppm, first detected 2024-03-01)"), std::string::npos) << a->reason;
  EXPECT_EQ(a->text.rfind("Investigate acetylene", 0), 0u);

  // With a communicating on-load tap changer the leak from its compartment is checked first
  // (common practice, no published source).
  d.info.oltc = OltcType::communicating;
  UnitAssessment oltc;
  assess_oil(d, t0 + 740, {}, oltc);
  ASSERT_TRUE(investigate(oltc, "Check first for a leak from the on-load tap-changer compartment"));

  d.oil_samples.back() = gas_sample(t0 + 730, {.h2 = 30, .c2h2 = 4});
  UnitAssessment flat;
  assess_oil(d, t0 + 740, {}, flat);
  EXPECT_EQ(flat.dga.acetylene_trend, "present");
}

// Issue #16: "corona" beside D2. Duval Triangle 1: CH4 20, C2H4 30, C2H2 60
// is 18/27/55 % -> D2 (C2H4 23-40 %, C2H2 > 29 %: Duval 2002 zone bounds).
// The key gas (H2 dominant, C2H2 5 % of combustibles < 15 %) reads partial
// discharge: it disagrees and is marked indicative only.
TEST(OilAssessment, KeyGasDisagreeingWithDuvalIsIndicativeOnly) {
  auto d = interpret_at_100({.h2 = 1000, .ch4 = 20, .c2h6 = 5, .c2h4 = 30, .c2h2 = 60, .co = 50, .co2 = 500});
  ASSERT_EQ(d.duval_triangle_1, "D2");
  EXPECT_TRUE(d.key_gas_indicative_only);
  EXPECT_EQ(d.key_gas.rfind("indicative only, disagrees with Duval Triangle 1 D2", 0), 0u) << d.key_gas;
  EXPECT_NE(d.key_gas.find("partial discharge"), std::string::npos);
  // Agreeing readings are not marked: the published arcing proportions
  // (H2 60 %, C2H2 30 %; IEEE C57.104-2008 key gases, from memory).
  auto arc = interpret_at_100({.h2 = 600, .ch4 = 50, .c2h6 = 10, .c2h4 = 40, .c2h2 = 300, .co = 0, .co2 = 500});
  ASSERT_TRUE(arc.duval_triangle_1);
  EXPECT_EQ(arc.duval_triangle_1->at(0), 'D');
  EXPECT_FALSE(arc.key_gas_indicative_only);
  EXPECT_EQ(arc.key_gas.rfind("arcing", 0), 0u);
}

// Ester-filled unit: IEEE C57.104 (both editions), Duval Triangle 1, the IEC
// 60599 ratios and the key gases are for mineral oil (their scopes); they are
// not applied, the report says so, and the gases are still trended.
TEST(OilAssessment, EsterUnitGetsNoMineralOilMethodsButTrendedGases) {
  UnitData d = unit_132kv();
  d.info.oil = OilType::ester;
  const Day t0 = days_from_civil(2025, 1, 1);
  for (int k = 0; k < 4; ++k)
    d.oil_samples.push_back(gas_sample(t0 + 120 * k, {.h2 = 100.0 + 50 * k, .ch4 = 40, .c2h6 = 300, .c2h4 = 20,
                                                      .c2h2 = 0, .co = 200, .co2 = 3000}));
  d.oil_samples.back().furan_2fal_ppb = LabValue::measured(300);
  UnitAssessment out;
  assess_oil(d, t0 + 400, {}, out);
  EXPECT_FALSE(out.dga.c57104_2008_condition);
  EXPECT_FALSE(out.dga.c57104_2019_status);
  EXPECT_FALSE(out.dga.duval_triangle_1);
  EXPECT_FALSE(out.dga.iec60599_ratio_fault);
  EXPECT_TRUE(out.dga.key_gas.empty());
  EXPECT_TRUE(has_text(out.methods_not_applied, "Duval Triangle 1: valid for mineral oil only"));
  EXPECT_TRUE(has_text(out.methods_not_applied, "IEEE C57.104-2008"));
  EXPECT_TRUE(has_text(out.methods_not_applied, "IEC 60599 gas ratios"));
  EXPECT_TRUE(has_text(out.methods_not_applied, "DP from 2-FAL"));
  EXPECT_FALSE(has_text(out.methods, "Duval"));
  EXPECT_FALSE(out.paper.dp_estimate);
  ASSERT_EQ(out.dga.gases.size(), 7u);
  ASSERT_TRUE(out.dga.gases[0].rate_ppm_per_year);  // H2 trended: +50 ppm per 120 days
  EXPECT_NEAR(*out.dga.gases[0].rate_ppm_per_year, 50 * 365.25 / 120, 1.0);  // least squares by hand
  EXPECT_EQ(out.gas_history.size(), 4u);
  const Action* resample = find_need(out.actions, "oil-resample");
  ASSERT_TRUE(resample);
  EXPECT_EQ(resample->due, t0 + 360 + 365);  // OilOptions::non_mineral_resample_days
}

// A 2-FAL result reported "ND" (below detection) is a result: good paper, not
// missing data (issue #16).
TEST(OilAssessment, FuranNotDetectedIsAResultNotMissing) {
  UnitData d = unit_132kv();
  OilSample s;
  s.date = days_from_civil(2026, 4, 1);
  s.furan_2fal_ppb = LabValue::below();  // "ND" as daemon/ingest parses it
  d.oil_samples.push_back(s);
  UnitAssessment out;
  assess_oil(d, s.date + 10, {}, out);
  EXPECT_FALSE(has_text(out.missing, "furan"));
  EXPECT_TRUE(out.paper.furan_below_detection);
  EXPECT_FALSE(out.paper.furan_detection_limit_ppb);
  ASSERT_TRUE(out.paper.sample_date);
}

}  // namespace
}  // namespace ferrum::analytics
