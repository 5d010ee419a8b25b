// Electrical tests file kind: detection, the value column of each test, the
// descriptive columns, taps against the register, conversions.
// The rules tested are ferrum's drop contract (schema/drop-files.md,
// "Electrical field tests"); no engineering value is checked here.
#include <gtest/gtest.h>

#include "tests/ingest/ingest_test_support.h"

namespace ferrum::ingest {
namespace {

using namespace ferrum::ingest::testing;
using analytics::ElectricalTestKind;

const std::string kHeader =
    "unit_id,test_date,test,phase,tap,winding,temp_c,insulation,test_kv,bushing,minutes,ratio,resistance_ohm,"
    "power_factor_pct,capacitance_pf,resistance_megohm,current_ma,impedance_pct,nameplate_value\n";

TEST(ElectricalRows, DetectedAsTheSixthKindAndEveryTestParsed) {
  const auto c = check_text(kHeader +
                            "T1,2026-03-10,turns_ratio,a,9,,,,,,,6.931,,,,,,,\n"
                            "T1,2026-03-10,winding_resistance,A,9,hv,18,,,,,,0.4121,,,,,,\n"
                            "T1,2026-03-10,insulation_power_factor,,,,20,chl,10,,,,,0.28,5120,,,,\n"
                            "T1,2026-03-10,bushing_power_factor,,,,20,,10,h1,,,,,452,,,,445\n"
                            "T1,2026-03-10,insulation_resistance,,,,20,HV-ground,5,,10,,,,,5200,,,\n"
                            "T1,2026-03-10,excitation_current,B,9,,,,10,,,,,,,,17.9,,\n"
                            "T1,2026-03-10,leakage_reactance,,9,,,,,,,,,,,,,10.62,\n");
  ASSERT_TRUE(c.summary.acceptable()) << problems_text(c.summary);
  EXPECT_EQ(c.summary.kind, FileKind::electrical_tests);
  ASSERT_EQ(c.rows.tests.size(), 7u);
  const auto& t = c.rows.tests;
  EXPECT_EQ(t[0].test.test, ElectricalTestKind::turns_ratio);
  EXPECT_EQ(t[0].test.phase, "A");  // upper-cased
  EXPECT_EQ(t[0].test.tap, 9);
  EXPECT_DOUBLE_EQ(*t[0].test.value, 6.931);
  EXPECT_EQ(t[1].test.winding, "HV");
  EXPECT_DOUBLE_EQ(*t[1].test.temp_c, 18);
  EXPECT_EQ(t[2].test.insulation, "CHL");
  EXPECT_DOUBLE_EQ(*t[2].test.capacitance_pf, 5120);
  EXPECT_EQ(t[3].test.bushing, "H1");
  EXPECT_EQ(t[3].test.insulation, "C1");  // empty bushing insulation = C1
  EXPECT_FALSE(t[3].test.value);          // capacitance only
  EXPECT_DOUBLE_EQ(*t[3].test.nameplate_value, 445);
  EXPECT_EQ(t[4].test.minutes, 10);
  EXPECT_EQ(t[4].test.insulation, "HV-GROUND");
  EXPECT_DOUBLE_EQ(*t[5].test.value, 17.9);
  EXPECT_TRUE(t[6].test.phase.empty());
}

TEST(ElectricalRows, FahrenheitTemperatureIsConverted) {
  const auto c = check_text(
      "unit_id,test_date,test,winding,phase,temp_f,resistance_ohm\n"
      "T1,2026-03-10,winding_resistance,HV,A,68,0.41\n");
  ASSERT_TRUE(c.summary.acceptable()) << problems_text(c.summary);
  EXPECT_NEAR(*c.rows.tests.at(0).test.temp_c, 20.0, 1e-9);
  ASSERT_EQ(c.summary.conversions.size(), 1u);
}

TEST(ElectricalRows, AValueInAnotherTestsColumnIsAProblem) {
  const auto c = check_text(kHeader + "T1,2026-03-10,leakage_reactance,,,,,,,,,10.5,,,,,,10.6,\n");
  EXPECT_FALSE(c.summary.acceptable());
  EXPECT_TRUE(has_problem(c.summary, 2, "ratio", "ratio is not a value of a leakage_reactance test"))
      << problems_text(c.summary);
}

TEST(ElectricalRows, BushingNeedsPowerFactorOrCapacitance) {
  const auto c = check_text(kHeader + "T1,2026-03-10,bushing_power_factor,,,,20,C1,10,H2,,,,,,,,,\n");
  EXPECT_TRUE(has_problem(c.summary, 2, "", "needs power_factor_pct, capacitance_pf or both"))
      << problems_text(c.summary);
}

TEST(ElectricalRows, FileWithoutTheTestsValueColumnIsRejectedPerRow) {
  const auto c = check_text("unit_id,test_date,test,phase,ratio\nT1,2026-03-10,excitation_current,A,\n");
  EXPECT_TRUE(has_problem(c.summary, 2, "", "needs a current_ma column, which the file lacks"))
      << problems_text(c.summary);
}

TEST(ElectricalRows, HeaderWithoutValueColumnNamesTheGroup) {
  const auto c = check_text("unit_id,test_date,test,phase\nT1,2026-03-10,turns_ratio,A\n");
  EXPECT_FALSE(c.summary.recognised);
  EXPECT_NE(c.summary.rejection.find("at least one value column"), std::string::npos) << c.summary.rejection;
}

TEST(ElectricalRows, TapBeyondTheRegistersPositionsIsAProblem) {
  analytics::UnitInfo u;
  u.unit_id = "T9";
  u.hv_kv = 132;
  u.lv_kv = 33;
  u.tap_positions = 17;
  CheckOptions o = test_options();
  o.parse.lookup_unit = [&u](std::string_view id) { return id == "T9" ? &u : nullptr; };
  const auto c = check_text("unit_id,test_date,test,phase,tap,ratio\n"
                            "T9,2026-03-10,turns_ratio,A,17,6.0\n"
                            "T9,2026-03-10,turns_ratio,A,18,6.0\n",
                            o);
  EXPECT_TRUE(has_problem(c.summary, 3, "tap", "tap 18 is beyond the register's tap_positions 17"))
      << problems_text(c.summary);
  EXPECT_EQ(c.summary.problems.count(), 1);
}

TEST(ElectricalRows, ExcitationCurrentOfAThreePhaseUnitNeedsItsPhase) {
  const auto c = check_text("unit_id,test_date,test,phase,current_ma\n"
                            "T1,2026-03-10,excitation_current,,20\n"
                            "S1,2026-03-10,excitation_current,,20\n");  // S1 is single-phase
  EXPECT_TRUE(has_problem(c.summary, 2, "phase", "phase is missing")) << problems_text(c.summary);
  EXPECT_EQ(c.summary.problems.count(), 1);
}

TEST(ElectricalRows, InsulationResistanceNeedsMinutes) {
  const auto c = check_text("unit_id,test_date,test,insulation,resistance_megohm\n"
                            "T1,2026-03-10,insulation_resistance,HV-LV,2000\n");
  EXPECT_TRUE(has_problem(c.summary, 2, "", "needs a minutes column")) << problems_text(c.summary);
}

TEST(ElectricalRows, RegisterElectricalColumns) {
  const auto c = check_text(
      "unit_id,site,rated_mva,hv_kv,lv_kv,cooling,year_built,conductor,tap_positions,tap_nominal,tap_step_pct,"
      "impedance_pct\n"
      "T5,North,40,132,33,ONAF,1990,Copper,17,9,1.25,10.5\n"
      "T6,North,40,132,33,ONAF,1990,al,5,6,2.5,8\n"
      "T7,North,40,132,33,ONAF,1990,brass,,,,\n");
  ASSERT_EQ(c.rows.units.size(), 1u) << problems_text(c.summary);
  const auto& u = c.rows.units[0].unit;
  EXPECT_EQ(u.conductor, "cu");
  EXPECT_EQ(u.tap_positions, 17);
  EXPECT_EQ(u.tap_nominal, 9);
  EXPECT_DOUBLE_EQ(*u.tap_step_pct, 1.25);
  EXPECT_DOUBLE_EQ(*u.impedance_pct, 10.5);
  EXPECT_TRUE(has_problem(c.summary, 3, "tap_nominal", "nominal tap 6 is beyond tap_positions 5"));
  EXPECT_TRUE(has_problem(c.summary, 4, "conductor", "conductor must be cu or al"));
}

}  // namespace
}  // namespace ferrum::ingest
