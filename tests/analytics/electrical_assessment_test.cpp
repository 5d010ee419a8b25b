// The electrical tests of a unit combined into the assessment
// (analytics/electrical/electrical_assessment.h, electrical_health.h):
// nameplate values from the register, previous tests, grouping per date,
// actions and health-index factors. Each engineering value names its source.
#include <gtest/gtest.h>

#include <cmath>

#include "analytics/assess_unit.h"
#include "analytics/electrical/electrical_assessment.h"
#include "analytics/electrical/electrical_health.h"
#include "analytics/embedded_tables.h"

namespace ferrum::analytics {
namespace {

using K = ElectricalTestKind;

Day day(int y, int m, int d) { return days_from_civil(y, m, d); }

UnitData unit() {
  UnitData d;
  d.info.unit_id = "T1";
  d.info.hv_kv = 132;
  d.info.lv_kv = 33;
  d.info.vector_group = "Dyn11";
  d.info.phases = 3;
  d.info.conductor = "cu";
  d.info.tap_positions = 17;
  d.info.tap_nominal = 9;
  d.info.tap_step_pct = 1.25;
  d.info.impedance_pct = 10.5;
  d.info.year_built = 1990;
  return d;
}

ElectricalTest test(Day date, K kind, std::optional<double> value) {
  ElectricalTest t;
  t.date = date;
  t.test = kind;
  t.value = value;
  return t;
}

bool has_action(const UnitAssessment& a, const std::string& part) {
  for (const auto& act : a.actions)
    if (act.text.find(part) != std::string::npos) return true;
  return false;
}

// Dyn11 132/33 kV at tap 1 of 17 (nominal 9, 1.25 %): U_HV = 132·1.10 =
// 145.2 kV, ratio √3·145.2/33 = 7.621 (winding connections; tap numbering
// position 1 = highest HV voltage, ferrum's stated convention).
TEST(ElectricalAssessment, TurnsRatioNameplateFromRegisterAndTap) {
  UnitData d = unit();
  auto t = test(day(2025, 5, 1), K::turns_ratio, 7.621);
  t.tap = 1;
  t.phase = "A";
  d.electrical.push_back(t);
  const auto s = check_electrical_tests(d, {});
  ASSERT_TRUE(s);
  ASSERT_EQ(s->turns_ratio.size(), 1u);
  const auto& r = s->turns_ratio[0];
  EXPECT_NEAR(*r.nameplate, std::sqrt(3.0) * 145.2 / 33, 1e-9);  // computed, as above
  EXPECT_TRUE(*r.within_limit);
}

// ±0.5 % ratio tolerance (IEEE C57.12.00, from memory; verify): 6.928203·1.004
// is within, ·1.006 outside; the outside one adds the shorted-turns action.
TEST(ElectricalAssessment, TurnsRatioDeviationBothSidesAndAction) {
  for (double factor : {1.004, 1.006}) {
    UnitData d = unit();
    auto t = test(day(2025, 5, 1), K::turns_ratio, 4 * std::sqrt(3.0) * factor);
    t.tap = 9;
    t.phase = "B";
    d.electrical.push_back(t);
    const UnitAssessment a = assess_unit(d, day(2025, 6, 1), {});
    ASSERT_TRUE(a.electrical);
    const auto& r = a.electrical->turns_ratio.at(0);
    EXPECT_NEAR(*r.deviation_pct, (factor - 1) * 100, 1e-9);  // computed
    EXPECT_EQ(*r.within_limit, factor < 1.005);
    EXPECT_EQ(has_action(a, "shorted turns or a tap-changer contact"), factor > 1.005);
  }
}

TEST(ElectricalAssessment, TurnsRatioWithoutTapDataSaysWhy) {
  UnitData d = unit();
  d.info.tap_step_pct.reset();
  auto t = test(day(2025, 5, 1), K::turns_ratio, 7.0);
  t.tap = 3;
  d.electrical.push_back(t);
  const auto s = check_electrical_tests(d, {});
  EXPECT_FALSE(s->turns_ratio[0].nameplate);
  EXPECT_FALSE(s->turns_ratio[0].within_limit);
  EXPECT_NE(s->turns_ratio[0].note.find("tap_step_pct"), std::string::npos);
}

// Copper correction to 75 °C (IEEE C57.12.90, T_k 234.5; from memory, verify):
// 0.400 Ω at 20 °C -> 0.400·309.5/254.5 = 0.48644 Ω. Phase spread over the
// corrected values; 2 % spread limit (common practice, from memory).
TEST(ElectricalAssessment, WindingResistanceCorrectedAndSpreadPerDate) {
  UnitData d = unit();
  const double measured[] = {0.400, 0.404, 0.409};  // spread (0.409-0.400)/0.40433 = 2.23 %
  const char* phases[] = {"A", "B", "C"};
  for (int i = 0; i < 3; ++i) {
    auto t = test(day(2025, 5, 1), K::winding_resistance, measured[i]);
    t.winding = "HV";
    t.phase = phases[i];
    t.tap = 9;
    t.temp_c = 20;
    d.electrical.push_back(t);
  }
  const auto s = check_electrical_tests(d, {});
  ASSERT_EQ(s->winding_resistance.size(), 3u);
  EXPECT_NEAR(*s->winding_resistance[0].corrected_ohm, 0.400 * 309.5 / 254.5, 1e-12);  // computed, as above
  EXPECT_NEAR(*s->winding_resistance[0].phase_spread_pct, 0.009 / (1.213 / 3) * 100, 1e-9);
  for (const auto& r : s->winding_resistance) EXPECT_FALSE(*r.within_limit);  // 2.23 % > 2 %
}

// Property: the corrected resistance is the measured one when measured at
// the reference temperature (the correction formula of IEEE C57.12.90).
TEST(ElectricalAssessment, CorrectedEqualsMeasuredAtTheReferenceTemperature) {
  for (double ref : {20.0, 75.0, 85.0}) {
    UnitData d = unit();
    auto t = test(day(2025, 5, 1), K::winding_resistance, 0.3721);
    t.winding = "LV";
    t.temp_c = ref;
    d.electrical.push_back(t);
    ElectricalOptions o;
    o.reference_c = ref;
    EXPECT_DOUBLE_EQ(*check_electrical_tests(d, o)->winding_resistance[0].corrected_ohm, 0.3721);
  }
}

// Change against the previous test of the same winding, tap and phase:
// 5 % limit (common practice, from memory). Aluminium T_k 225 (IEEE
// C57.12.90, from memory; verify).
TEST(ElectricalAssessment, WindingResistanceChangeAgainstPreviousTest) {
  UnitData d = unit();
  d.info.conductor = "al";
  for (auto [date, ohm] : {std::pair{day(2020, 5, 1), 0.400}, std::pair{day(2025, 5, 1), 0.4222}}) {
    auto t = test(date, K::winding_resistance, ohm);
    t.winding = "HV";
    t.phase = "A";
    t.temp_c = 30;
    d.electrical.push_back(t);
  }
  const auto s = check_electrical_tests(d, {});
  ASSERT_EQ(s->winding_resistance.size(), 2u);
  EXPECT_FALSE(s->winding_resistance[0].change_pct);
  EXPECT_NEAR(*s->winding_resistance[1].change_pct, 5.55, 1e-9);  // computed: same T, so 0.4222/0.4 - 1
  EXPECT_FALSE(*s->winding_resistance[1].within_limit);
  EXPECT_NEAR(*s->winding_resistance[0].corrected_ohm, 0.400 * 300 / 255, 1e-12);  // aluminium, computed
}

// PF20 = PF·K with K interpolated from the site's table (ferrum ships none):
// 0.8 % at 30 °C with K(25)=0.9, K(35)=0.7 -> K 0.8 -> 0.64 %; within the
// 1.0 % in-service limit (IEEE C57.152, from memory; verify). Without a table
// a reading at 30 °C is not judged.
TEST(ElectricalAssessment, InsulationPowerFactorCorrectionFromTheSiteTable) {
  UnitData d = unit();
  auto t = test(day(2025, 5, 1), K::insulation_power_factor, 0.8);
  t.insulation = "CH";
  t.temp_c = 30;
  d.electrical.push_back(t);
  ElectricalOptions o;
  o.pf_correction = {{25, 0.9}, {35, 0.7}};
  const auto s = check_electrical_tests(d, o);
  EXPECT_NEAR(*s->insulation_power_factor[0].correction_factor, 0.8, 1e-12);
  EXPECT_NEAR(*s->insulation_power_factor[0].pf20_pct, 0.64, 1e-12);
  EXPECT_TRUE(*s->insulation_power_factor[0].within_limit);
  const auto none = check_electrical_tests(d, {});
  EXPECT_FALSE(none->insulation_power_factor[0].within_limit);
  EXPECT_FALSE(none->notes.empty());
}

TEST(ElectricalAssessment, PfCorrectionIsNeverExtrapolated) {
  const std::vector<std::pair<double, double>> table{{10, 1.2}, {20, 1.0}, {30, 0.8}};
  EXPECT_DOUBLE_EQ(*pf_correction_factor(table, 20), 1.0);
  EXPECT_DOUBLE_EQ(*pf_correction_factor(table, 15), 1.1);
  EXPECT_FALSE(pf_correction_factor(table, 9.9));
  EXPECT_FALSE(pf_correction_factor(table, 30.1));
  EXPECT_FALSE(pf_correction_factor({}, 20));
}

// Bushing C1 capacitance against the nameplate: 5 % investigate, 10 % out of
// service (IEEE C57.152, from memory; verify). 445 pF nameplate: 490 pF is
// +10.1 % (out of service: repair or replace the bushing, not the unit).
TEST(ElectricalAssessment, BushingOverItsLimitIsADefectOfTheBushing) {
  UnitData d = unit();
  auto first = test(day(2020, 5, 1), K::bushing_power_factor, 0.30);
  first.bushing = "H2";
  first.insulation = "C1";
  first.capacitance_pf = 446;
  first.nameplate_value = 445;
  auto later = first;
  later.date = day(2025, 5, 1);
  later.capacitance_pf = 490;
  later.nameplate_value.reset();
  d.electrical = {first, later};
  const UnitAssessment a = assess_unit(d, day(2025, 6, 1), {});
  ASSERT_EQ(a.electrical->bushings.size(), 2u);
  const auto& b = a.electrical->bushings[1];
  EXPECT_NEAR(*b.capacitance_change_pct, 45.0 / 445 * 100, 1e-9);  // computed
  EXPECT_EQ(b.verdict, "out of service");
  EXPECT_EQ(b.capacitance_basis, "nameplate");
  EXPECT_TRUE(has_action(a, "Take bushing H2 out of service: repair or replace the bushing, not the unit"));
  EXPECT_FALSE(has_action(a, "Plan replacement"));  // the unit is not condemned by its bushing
}

// Power factor more than twice the reference: investigate (IEEE C57.152, from
// memory; verify). Without a nameplate value the first test is the reference.
TEST(ElectricalAssessment, BushingPowerFactorAgainstFirstTestBothSides) {
  for (double pf : {0.60, 0.61}) {
    UnitData d = unit();
    auto first = test(day(2019, 5, 1), K::bushing_power_factor, 0.30);
    first.bushing = "X1";
    first.insulation = "C1";
    auto later = first;
    later.date = day(2025, 5, 1);
    later.value = pf;
    d.electrical = {first, later};
    const auto s = check_electrical_tests(d, {});
    const auto& b = s->bushings[1];
    EXPECT_EQ(b.within_limit, pf <= 0.60) << pf;
    EXPECT_NE(b.power_factor_basis.find("first test 2019-05-01"), std::string::npos);
  }
}

// PI = R10/R1 from the two readings of one date and insulation, read on the
// common practice scale (no published source): 3000/2500 = 1.2 questionable.
TEST(ElectricalAssessment, PolarizationIndexFromTheTwoReadings) {
  UnitData d = unit();
  for (auto [minutes, megohm] : {std::pair{1, 2500.0}, std::pair{10, 3000.0}}) {
    auto t = test(day(2025, 5, 1), K::insulation_resistance, megohm);
    t.insulation = "HV-GROUND";
    t.minutes = minutes;
    d.electrical.push_back(t);
  }
  const auto s = check_electrical_tests(d, {});
  ASSERT_EQ(s->insulation_resistance.size(), 1u);
  EXPECT_DOUBLE_EQ(*s->insulation_resistance[0].polarization_index, 1.2);
  EXPECT_EQ(s->insulation_resistance[0].reading, "questionable");
}

// Excitation pattern of a core-form unit: outer phases similar and above the
// middle one (IEEE C57.152, from memory; verify); change against the
// previous test at the same tap and voltage.
TEST(ElectricalAssessment, ExcitationPatternAndChange) {
  UnitData d = unit();
  const double before[] = {25, 18, 24.5}, now[] = {25, 27, 24.5};  // B now highest: unexpected
  const char* phases[] = {"A", "B", "C"};
  for (int i = 0; i < 3; ++i) {
    for (auto [date, ma] : {std::pair{day(2020, 5, 1), before[i]}, std::pair{day(2025, 5, 1), now[i]}}) {
      auto t = test(date, K::excitation_current, ma);
      t.phase = phases[i];
      t.tap = 9;
      t.test_kv = 10;
      d.electrical.push_back(t);
    }
  }
  const UnitAssessment a = assess_unit(d, day(2025, 6, 1), {});
  const auto& e = a.electrical->excitation_current;
  ASSERT_EQ(e.size(), 2u);
  EXPECT_TRUE(*e[0].pattern_expected);
  EXPECT_FALSE(*e[1].pattern_expected);
  EXPECT_NEAR(*e[1].change_pct, 50.0, 1e-9);  // computed: B 18 -> 27 mA
  EXPECT_TRUE(has_action(a, "excitation-current pattern"));
}

// Leakage reactance against the register's impedance: ±2 % three-phase,
// ±3 % per phase (IEEE C57.152, from memory; verify). 10.5 % nameplate:
// 10.70 is +1.90 % (within 2 %), 10.72 +2.10 % (outside); per phase 10.80
// (+2.86 %) is within 3 %.
TEST(ElectricalAssessment, LeakageReactanceAgainstRegisterImpedance) {
  UnitData d = unit();
  d.electrical.push_back(test(day(2025, 5, 1), K::leakage_reactance, 10.70));
  auto ph = test(day(2025, 5, 1), K::leakage_reactance, 10.80);
  ph.phase = "A";
  d.electrical.push_back(ph);
  auto s = check_electrical_tests(d, {});
  EXPECT_TRUE(*s->leakage_reactance[0].within_limit);
  EXPECT_TRUE(*s->leakage_reactance[1].within_limit);
  EXPECT_EQ(s->leakage_reactance[0].nameplate_basis, "register impedance_pct");
  d.electrical[0].value = 10.72;
  s = check_electrical_tests(d, {});
  EXPECT_FALSE(*s->leakage_reactance[0].within_limit);
}

TEST(ElectricalAssessment, NoTestsGiveNullAndOneMissingLine) {
  const UnitAssessment a = assess_unit(unit(), day(2025, 6, 1), {});
  EXPECT_FALSE(a.electrical);
  int mentions = 0;
  for (const auto& m : a.missing) mentions += m.find("electrical tests") != std::string::npos;
  EXPECT_EQ(mentions, 1);
  EXPECT_NE(a.confidence.find(", electrical tests)"), std::string::npos) << a.confidence;
}

// Rating cuts on the multiple of the limit (ferrum's own, data file):
// <= 0.5 A, <= 1 B, <= 1.5 C, <= 2 D, else E.
TEST(ElectricalHealth, RatingCutsOnTheMultipleOfTheLimit) {
  const std::array<double, 4> cuts{0.5, 1.0, 1.5, 2.0};
  EXPECT_EQ(electrical_hif(0.5, cuts), 4);
  EXPECT_EQ(electrical_hif(0.51, cuts), 3);
  EXPECT_EQ(electrical_hif(1.0, cuts), 3);  // at the limit: still within
  EXPECT_EQ(electrical_hif(1.01, cuts), 2);
  EXPECT_EQ(electrical_hif(2.0, cuts), 1);
  EXPECT_EQ(electrical_hif(2.01, cuts), 0);
}

TEST(ElectricalHealth, TableIsCompiledInWithEveryFactorAndSource) {
  const auto& specs = default_electrical_factors();
  ASSERT_EQ(specs.size(), 6u);
  for (const auto& s : specs) {
    EXPECT_GT(s.weight, 0) << s.name;
    EXPECT_FALSE(s.source.empty()) << s.name;
  }
  EXPECT_EQ(specs[0].name, "insulation_power_factor");
  EXPECT_DOUBLE_EQ(specs[0].weight, 10);  // from memory of Jahromi et al. 2009; verify
}

// A turns-ratio deviation of 1.2 % is 2.4 x the 0.5 % limit: rating E; the
// factor joins the index with its weight from the data file.
TEST(ElectricalHealth, TurnsRatioFactorJoinsTheIndex) {
  UnitData d = unit();
  auto t = test(day(2025, 5, 1), K::turns_ratio, 4 * std::sqrt(3.0) * 1.012);
  t.tap = 9;
  d.electrical.push_back(t);
  const UnitAssessment a = assess_unit(d, day(2025, 6, 1), {});
  const FactorScore* f = nullptr;
  for (const auto& x : a.factors)
    if (x.name == "turns_ratio") f = &x;
  ASSERT_TRUE(f);
  ASSERT_TRUE(f->score);
  EXPECT_EQ(*f->score, 0);
  EXPECT_DOUBLE_EQ(f->weight, 5);
  EXPECT_NE(f->detail.find("2.40 x the limit"), std::string::npos) << f->detail;
}

}  // namespace
}  // namespace ferrum::analytics
