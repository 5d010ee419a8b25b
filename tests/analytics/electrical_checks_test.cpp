// Electrical field tests (analytics/electrical/): worked values and both
// sides of every limit.
#include <gtest/gtest.h>

#include <array>
#include <cmath>

#include "analytics/electrical/bushings.h"
#include "analytics/electrical/excitation_current.h"
#include "analytics/electrical/insulation_power_factor.h"
#include "analytics/electrical/insulation_resistance.h"
#include "analytics/electrical/leakage_reactance.h"
#include "analytics/electrical/turns_ratio.h"
#include "analytics/electrical/winding_resistance.h"

namespace ferrum::analytics::electrical {
namespace {

TEST(ElectricalTurnsRatio, ParsesVectorGroups) {
  auto g = parse_vector_group("Dyn11");
  ASSERT_TRUE(g);
  EXPECT_EQ(g->hv, Winding::delta);
  EXPECT_EQ(g->lv, Winding::star);
  EXPECT_EQ(g->clock, 11);
  g = parse_vector_group("YNd1");
  ASSERT_TRUE(g);
  EXPECT_EQ(g->hv, Winding::star);
  EXPECT_EQ(g->lv, Winding::delta);
  EXPECT_EQ(g->clock, 1);
  EXPECT_TRUE(parse_vector_group("YNyn0"));
  EXPECT_EQ(parse_vector_group("1ph")->hv, Winding::single_phase);
  EXPECT_FALSE(parse_vector_group("Dyn12"));
  EXPECT_FALSE(parse_vector_group("dYn11"));
  EXPECT_FALSE(parse_vector_group("Dy"));
  EXPECT_FALSE(parse_vector_group(""));
  EXPECT_FALSE(parse_vector_group("Dyn11x"));
}

// Phase ratio of a Dyn unit: √3·U_HV/U_LV (winding connections; IEEE
// C57.152 turns ratio test, from memory; verify). 132/33 kV: 4·√3 = 6.9282.
TEST(ElectricalTurnsRatio, DynPhaseRatioIsRoot3TimesLineRatio) {
  const auto r = expected_phase_ratio(132, 33, *parse_vector_group("Dyn11"));
  ASSERT_TRUE(r.ratio);
  EXPECT_NEAR(*r.ratio, 6.928203230, 1e-9);  // computed: 4·√3
}

// YNd: U_HV/(√3·U_LV); Yy and Dd: U_HV/U_LV (winding connections).
TEST(ElectricalTurnsRatio, YdAndYyPhaseRatios) {
  EXPECT_NEAR(*expected_phase_ratio(132, 33, *parse_vector_group("YNd1")).ratio, 2.309401077, 1e-9);
  EXPECT_DOUBLE_EQ(*expected_phase_ratio(132, 33, *parse_vector_group("Yy0")).ratio, 4.0);
  EXPECT_DOUBLE_EQ(*expected_phase_ratio(132, 33, *parse_vector_group("Dd0")).ratio, 4.0);
  EXPECT_DOUBLE_EQ(*expected_phase_ratio(11, 0.4, *parse_vector_group("1ph")).ratio, 27.5);
  const auto z = expected_phase_ratio(33, 0.4, *parse_vector_group("Yzn11"));
  EXPECT_FALSE(z.ratio);
  EXPECT_FALSE(z.why.empty());
}

// Tap convention stated in turns_ratio.h (position 1 = highest HV voltage;
// common practice, no published source): 17 positions, nominal 9, 1.25 %.
TEST(ElectricalTurnsRatio, TapPositionChangesHvVoltage) {
  const TapChanger taps{17, 9, 1.25};
  EXPECT_NEAR(hv_kv_at_tap(132, taps, 1), 145.2, 1e-9);   // +10 %
  EXPECT_NEAR(hv_kv_at_tap(132, taps, 9), 132.0, 1e-12);  // nominal
  EXPECT_NEAR(hv_kv_at_tap(132, taps, 17), 118.8, 1e-9);  // −10 %
  EXPECT_DOUBLE_EQ(hv_kv_at_tap(132, std::nullopt, 3), 132.0);
  EXPECT_DOUBLE_EQ(hv_kv_at_tap(132, taps, std::nullopt), 132.0);
}

// IEEE C57.12.00 ratio tolerance ±0.5 % (from memory; verify): both sides.
TEST(ElectricalTurnsRatio, DeviationLimitBothSides) {
  const double np = 6.928203230;
  EXPECT_TRUE(check_ratio(np * 1.0049, np).within_limit);
  EXPECT_FALSE(check_ratio(np * 1.0051, np).within_limit);
  EXPECT_TRUE(check_ratio(np * 0.9951, np).within_limit);
  EXPECT_FALSE(check_ratio(np * 0.9949, np).within_limit);
  EXPECT_NEAR(check_ratio(np * 1.01, np).deviation_pct, 1.0, 1e-9);
}

// IEEE C57.12.90 copper correction (T_k 234.5, from memory; verify):
// 0.5 Ω at 20 °C -> 0.5·309.5/254.5 = 0.60806 Ω at 75 °C.
TEST(ElectricalWindingResistance, CopperCorrectionTo75C) {
  EXPECT_NEAR(corrected_resistance(0.5, 20, 75, Conductor::copper), 0.6080550098, 1e-9);
}

// IEEE C57.12.90 aluminium T_k 225 (from memory; verify): 0.5·300/245.
TEST(ElectricalWindingResistance, AluminiumCorrectionTo75C) {
  EXPECT_NEAR(corrected_resistance(0.5, 20, 75, Conductor::aluminium), 0.6122448980, 1e-9);
}

// Property of the IEEE C57.12.90 formula: at the reference temperature the
// corrected value is the measured one; correction is monotonic in T_m.
TEST(ElectricalWindingResistance, CorrectedEqualsMeasuredAtReference) {
  for (const double ref : {20.0, 75.0, 85.0})
    for (const double r : {0.001, 0.35, 12.0}) {
      EXPECT_DOUBLE_EQ(corrected_resistance(r, ref, ref, Conductor::copper), r);
      EXPECT_DOUBLE_EQ(corrected_resistance(r, ref, ref, Conductor::aluminium), r);
      EXPECT_GT(corrected_resistance(r, ref - 10, ref, Conductor::copper), r);
      EXPECT_LT(corrected_resistance(r, ref + 10, ref, Conductor::copper), r);
    }
}

// Phase spread limit 2 % (common practice, from memory; verify): both sides.
TEST(ElectricalWindingResistance, PhaseSpreadLimitBothSides) {
  const std::array<double, 3> close{1.000, 1.010, 1.019};
  const std::array<double, 3> apart{1.000, 1.010, 1.021};
  const auto s1 = phase_spread_pct(close);
  const auto s2 = phase_spread_pct(apart);
  ASSERT_TRUE(s1 && s2);
  EXPECT_NEAR(*s1, 0.019 / (3.029 / 3) * 100, 1e-9);  // computed: (max − min)/mean
  EXPECT_TRUE(winding_within_limits(s1, std::nullopt));
  EXPECT_LT(*s1, 2.0);
  EXPECT_GT(*s2, 2.0);
  EXPECT_FALSE(winding_within_limits(s2, std::nullopt));
  const std::array<double, 1> one{1.0};
  EXPECT_FALSE(phase_spread_pct(one));
}

// Change limit 5 % (common practice, from memory; verify): both sides and signs.
TEST(ElectricalWindingResistance, ChangeLimitBothSides) {
  EXPECT_NEAR(change_pct(1.049, 1.0), 4.9, 1e-9);
  EXPECT_TRUE(winding_within_limits(std::nullopt, change_pct(1.049, 1.0)));
  EXPECT_FALSE(winding_within_limits(std::nullopt, change_pct(1.051, 1.0)));
  EXPECT_TRUE(winding_within_limits(std::nullopt, change_pct(0.951, 1.0)));
  EXPECT_FALSE(winding_within_limits(std::nullopt, change_pct(0.949, 1.0)));
}

// Polarization index scale: common practice, no published source. Every
// band edge on both sides.
TEST(ElectricalInsulationResistance, PolarizationIndexBands) {
  EXPECT_DOUBLE_EQ(polarization_index(1000, 2500), 2.5);
  EXPECT_EQ(read_polarization_index(0.99), PiReading::dangerous);
  EXPECT_EQ(read_polarization_index(1.0), PiReading::poor);
  EXPECT_EQ(read_polarization_index(1.09), PiReading::poor);
  EXPECT_EQ(read_polarization_index(1.1), PiReading::questionable);
  EXPECT_EQ(read_polarization_index(1.24), PiReading::questionable);
  EXPECT_EQ(read_polarization_index(1.25), PiReading::fair);
  EXPECT_EQ(read_polarization_index(2.0), PiReading::fair);
  EXPECT_EQ(read_polarization_index(2.01), PiReading::good);
  EXPECT_EQ(pi_reading_name(PiReading::questionable), "questionable");
}

// Bushing C1 capacitance change: >5 % investigate, >10 % out of service;
// power factor > 2× nameplate investigate (IEEE C57.152, from memory; verify).
TEST(ElectricalBushings, CapacitanceChangeBands) {
  EXPECT_EQ(check_bushing(std::nullopt, std::nullopt, 504.9, 480).verdict, BushingVerdict::investigate);  // 5.19 %
  EXPECT_EQ(check_bushing(std::nullopt, std::nullopt, 503.9, 480).verdict, BushingVerdict::acceptable);   // 4.98 %
  EXPECT_EQ(check_bushing(std::nullopt, std::nullopt, 527.9, 480).verdict, BushingVerdict::investigate);  // 9.98 %
  EXPECT_EQ(check_bushing(std::nullopt, std::nullopt, 528.1, 480).verdict, BushingVerdict::out_of_service);
  EXPECT_EQ(check_bushing(std::nullopt, std::nullopt, 431.9, 480).verdict, BushingVerdict::out_of_service);  // −10.02 %
  const auto c = check_bushing(std::nullopt, std::nullopt, 504, 480);
  ASSERT_TRUE(c.capacitance_change_pct);
  EXPECT_NEAR(*c.capacitance_change_pct, 5.0, 1e-9);
  EXPECT_TRUE(c.within_limit);  // exactly 5 % is not above 5 %
}

TEST(ElectricalBushings, PowerFactorAgainstNameplate) {
  EXPECT_TRUE(check_bushing(0.59, 0.30, std::nullopt, std::nullopt).within_limit);
  EXPECT_FALSE(check_bushing(0.61, 0.30, std::nullopt, std::nullopt).within_limit);
  EXPECT_FALSE(check_bushing(0.5, std::nullopt, std::nullopt, std::nullopt).capacitance_change_pct);
  EXPECT_TRUE(check_bushing(0.5, std::nullopt, std::nullopt, std::nullopt).within_limit);
  // the worse of the two verdicts wins
  EXPECT_EQ(check_bushing(0.9, 0.3, 540, 480).verdict, BushingVerdict::out_of_service);
}

// Leakage reactance: ±2 % three-phase, ±3 % per phase (IEEE C57.152, from
// memory; verify): both sides of both limits.
TEST(ElectricalLeakageReactance, LimitsBothSides) {
  EXPECT_TRUE(check_leakage_reactance(10.19, 10.0, false).within_limit);
  EXPECT_FALSE(check_leakage_reactance(10.21, 10.0, false).within_limit);
  EXPECT_TRUE(check_leakage_reactance(9.81, 10.0, false).within_limit);
  EXPECT_FALSE(check_leakage_reactance(9.79, 10.0, false).within_limit);
  EXPECT_TRUE(check_leakage_reactance(10.29, 10.0, true).within_limit);
  EXPECT_FALSE(check_leakage_reactance(10.31, 10.0, true).within_limit);
  EXPECT_NEAR(check_leakage_reactance(10.3, 10.0, true).change_pct, 3.0, 1e-9);
}

}  // namespace
}  // namespace ferrum::analytics::electrical

namespace ferrum::analytics::electrical {
namespace {

// The table `ferrum ratio` prints: one row per tap, each the Dyn phase
// ratio (√3·U_HV(tap)/U_LV) with the ±0.5 % band of IEEE C57.12.00 (from
// memory; verify). 132/33 kV Dyn11, 17 taps of 1.25 %, nominal 9.
TEST(ElectricalTurnsRatio, RatioTablePerTap) {
  const auto group = *parse_vector_group("Dyn11");
  const auto t = ratio_table(132, 33, group, TapChanger{17, 9, 1.25}, std::nullopt);
  ASSERT_EQ(t.rows.size(), 17u);
  EXPECT_EQ(t.rows[0].tap, 1);
  EXPECT_NEAR(t.rows[0].ratio, 6.928203230 * 1.1, 1e-9);
  EXPECT_NEAR(t.rows[8].ratio, 6.928203230, 1e-9);
  EXPECT_NEAR(t.rows[8].low, 6.928203230 * 0.995, 1e-9);
  EXPECT_NEAR(t.rows[8].high, 6.928203230 * 1.005, 1e-9);
  const auto one = ratio_table(132, 33, group, TapChanger{17, 9, 1.25}, 5);
  ASSERT_EQ(one.rows.size(), 1u);
  EXPECT_NEAR(one.rows[0].hv_kv, 138.6, 1e-9);  // +5 %
  const auto none = ratio_table(132, 33, group, std::nullopt, std::nullopt);
  ASSERT_EQ(none.rows.size(), 1u);
  EXPECT_FALSE(none.rows[0].tap);
  const auto z = ratio_table(33, 0.4, *parse_vector_group("Dzn0"), TapChanger{5, 3, 2.5}, std::nullopt);
  EXPECT_TRUE(z.rows.empty());
  EXPECT_FALSE(z.why.empty());
}

}  // namespace
}  // namespace ferrum::analytics::electrical

namespace ferrum::analytics::electrical {
namespace {

// Service limit 1.0 % at 20 °C, 0.5 % new (IEEE C57.152, from memory;
// verify): both sides; K is the caller's table factor (here an illustrative
// 0.8, not a table value).
TEST(ElectricalInsulationPowerFactor, LimitsAndCorrection) {
  EXPECT_EQ(check_insulation_pf(0.99, 20, std::nullopt, std::nullopt, std::nullopt).within_limit, true);
  EXPECT_EQ(check_insulation_pf(1.01, 20, std::nullopt, std::nullopt, std::nullopt).within_limit, false);
  EXPECT_EQ(check_insulation_pf(0.49, 20, std::nullopt, std::nullopt, std::nullopt, kPfLimitNewPct).within_limit, true);
  EXPECT_EQ(check_insulation_pf(0.51, 20, std::nullopt, std::nullopt, std::nullopt, kPfLimitNewPct).within_limit, false);
  // at 30 °C without a factor: not corrected, not judged
  const auto raw = check_insulation_pf(1.2, 30, std::nullopt, std::nullopt, std::nullopt);
  EXPECT_FALSE(raw.pf20_pct);
  EXPECT_FALSE(raw.within_limit);
  const auto k = check_insulation_pf(1.2, 30, 0.8, 5000, 4800);
  ASSERT_TRUE(k.pf20_pct);
  EXPECT_NEAR(*k.pf20_pct, 0.96, 1e-12);
  EXPECT_TRUE(k.corrected);
  EXPECT_EQ(k.within_limit, true);
  EXPECT_NEAR(*k.capacitance_change_pct, 4.1666666667, 1e-9);  // computed: 200/4800
}

// Outer phases similar and higher than the middle one (IEEE C57.152 pattern,
// from memory; verify); 10 % similarity is ferrum's own reading.
TEST(ElectricalExcitationCurrent, CoreFormPattern) {
  EXPECT_TRUE(check_excitation_pattern(30, 20, 31).expected);
  EXPECT_TRUE(check_excitation_pattern(30, 20, 27.1).outer_similar);   // 9.67 %
  EXPECT_FALSE(check_excitation_pattern(30, 20, 26.9).outer_similar);  // 10.3 %
  EXPECT_FALSE(check_excitation_pattern(30, 32, 31).middle_lowest);
  EXPECT_FALSE(check_excitation_pattern(30, 32, 31).expected);
  EXPECT_NEAR(*excitation_change_pct(33, 30), 10.0, 1e-9);
  EXPECT_FALSE(excitation_change_pct(33, 0));
}

}  // namespace
}  // namespace ferrum::analytics::electrical
