// Row parsers, through check_stream: each kind, each conversion, each check.
#include <gtest/gtest.h>

#include <cmath>

#include "tests/ingest/ingest_test_support.h"

namespace ferrum::ingest {
namespace {

using namespace ferrum::ingest::testing;
using analytics::days_from_civil;

// ---------------------------------------------------------------- register

constexpr const char* kRegisterHeader =
    "unit_id,site,rated_mva,hv_kv,lv_kv,cooling,year_built,phases,vector_group,oil_type,paper,"
    "criticality,oil_treated_date\n";

TEST(UnitRows, FullRowAndDefaults) {
  const auto c = check_text(std::string(kRegisterHeader) +
                            "T1,North,40,132,33,ONAN/ONAF,1998,3,dyn11,Natural Ester,thermally upgraded,5,2019-05-02\n"
                            "T2,North,25,66,11,ONAN,1975,,,,,,\n");
  ASSERT_TRUE(c.summary.acceptable()) << problems_text(c.summary);
  EXPECT_EQ(c.summary.kind, FileKind::units_register);
  ASSERT_EQ(c.rows.units.size(), 2u);
  const auto& u = c.rows.units[0].unit;
  EXPECT_EQ(u.unit_id, "T1");
  EXPECT_DOUBLE_EQ(u.rated_mva, 40);
  EXPECT_EQ(u.cooling, "ONAF");  // dual rating: highest stage
  EXPECT_EQ(u.vector_group, "Dyn11");
  EXPECT_EQ(u.oil, analytics::OilType::ester);
  EXPECT_EQ(u.paper, analytics::PaperType::upgraded);
  EXPECT_EQ(u.criticality, 5);
  EXPECT_EQ(u.oil_treated, days_from_civil(2019, 5, 2));
  const auto& d = c.rows.units[1].unit;
  EXPECT_EQ(d.phases, 3);
  EXPECT_EQ(d.criticality, 3);
  EXPECT_EQ(d.oil, analytics::OilType::mineral);
  EXPECT_FALSE(d.oil_treated.has_value());
}

TEST(UnitRows, ImpossibleValues) {
  const auto c = check_text(std::string(kRegisterHeader) +
                            "A,N,0,132,33,ONAN,1998,3,,,,,\n"      // line 2: rated_mva 0
                            "B,N,40,132,33,ONAN,2031,3,,,,,\n"     // line 3: future
                            "C,N,40,132,33,ONAN,1870,3,,,,,\n"     // line 4: too old
                            "D,N,40,132,33,ONAN,1998,2,,,,,\n"     // line 5: phases
                            "E,N,40,132,33,ONAN,1998,3,Dyn13,,,,\n"  // line 6: clock number
                            "F,N,40,132,33,ONAN,1998,3,,,,7,\n"    // line 7: criticality
                            "G,N,40,132,33,water,1998,3,,,,,\n"    // line 8: cooling
                            "A,N,40,132,33,ONAN,1998,3,,,,,\n");   // line 9: A again (line 2 was bad: no dup)
  EXPECT_TRUE(has_problem(c.summary, 2, "rated_mva", "rated power must be above 0"));
  EXPECT_TRUE(has_problem(c.summary, 3, "year_built", "year_built 2031 is in the future"));
  EXPECT_TRUE(has_problem(c.summary, 4, "year_built", "before 1880"));
  EXPECT_TRUE(has_problem(c.summary, 5, "phases", "phases must be 1 or 3"));
  EXPECT_TRUE(has_problem(c.summary, 6, "vector_group", "not a vector group"));
  EXPECT_TRUE(has_problem(c.summary, 7, "criticality", "criticality 7"));
  EXPECT_TRUE(has_problem(c.summary, 8, "cooling", "unknown cooling class"));
  EXPECT_EQ(c.summary.problems.count(), 7) << problems_text(c.summary);
}

TEST(UnitRows, HvNotAboveLvIsAWarningAndDuplicateIdAProblem) {
  const auto c = check_text(std::string(kRegisterHeader) +
                            "T1,N,40,33,132,ONAN,1998,3,,,,,\n"
                            "T1,N,40,132,33,ONAN,1998,3,,,,,\n");
  EXPECT_TRUE(has_problem(c.summary, 3, "", "duplicate row: same unit_id as line 2"));
  EXPECT_EQ(c.summary.problems.count(), 1);
  ASSERT_FALSE(c.summary.warnings.entries().empty());
  EXPECT_NE(c.summary.warnings.entries()[0].message.find("hv_kv is not above lv_kv"), std::string::npos);
}

TEST(UnitRows, RegisterNeedsNoLookup) {
  CheckOptions o = test_options();
  o.parse.lookup_unit = nullptr;
  const auto c = check_text(std::string(kRegisterHeader) + "NEW,N,40,132,33,ONAN,1998,3,,,,,\n", o);
  EXPECT_TRUE(c.summary.acceptable()) << problems_text(c.summary);
}

// The register's on-load tap changer (issue #16): none, sealed or communicating;
// anything else is a problem naming the line and column. Plumbing, no engineering value.
TEST(UnitRows, OnLoadTapChanger) {
  const auto c = check_text(
      "unit_id,site,rated_mva,hv_kv,lv_kv,cooling,year_built,oltc\n"
      "T1,N,40,132,33,ONAN,1998,Communicating\n"
      "T2,N,40,132,33,ONAN,1998,sealed\n"
      "T3,N,40,132,33,ONAN,1998,\n"
      "T4,N,40,132,33,ONAN,1998,leaky\n");
  ASSERT_EQ(c.rows.units.size(), 3u) << problems_text(c.summary);
  EXPECT_EQ(c.rows.units[0].unit.oltc, analytics::OltcType::communicating);
  EXPECT_EQ(c.rows.units[1].unit.oltc, analytics::OltcType::sealed);
  EXPECT_EQ(c.rows.units[2].unit.oltc, analytics::OltcType::unknown);
  EXPECT_TRUE(has_problem(c.summary, 5, "oltc", "oltc must be none, sealed or communicating"));
}

// ----------------------------------------------------------------- oil lab

// A furan result "ND" is a result below detection, not a missing value (issue #16).
TEST(OilRows, FuranNotDetected) {
  const auto c = check_text("unit_id,sample_date,furan_2fal_ppb\nT1,2026-03-14,ND\nT1,2026-04-14,<10\n");
  ASSERT_TRUE(c.summary.acceptable()) << problems_text(c.summary);
  ASSERT_EQ(c.rows.oil.size(), 2u);
  EXPECT_TRUE(c.rows.oil[0].sample.furan_2fal_ppb.is_below_limit());
  EXPECT_TRUE(c.rows.oil[0].sample.furan_2fal_ppb.present());
  EXPECT_TRUE(c.rows.oil[1].sample.furan_2fal_ppb.is_below_limit());
  EXPECT_DOUBLE_EQ(c.rows.oil[1].sample.furan_2fal_ppb.value, 10);
}

TEST(OilRows, GasesDetectionLimitsAndBreakdown) {
  const auto c = check_text(
      "unit_id,sample_date,lab_ref,h2_ppm,c2h2_ppm,co_ppm,moisture_ppm,breakdown_kv,breakdown_method\n"
      "T1,2026-03-14,L-1,12.5,<0.5,ND,8,62,d1816 2mm\n"
      "T1,2026-04-14,L-2,14,<ND,,9,,\n");
  ASSERT_TRUE(c.summary.acceptable()) << problems_text(c.summary);
  ASSERT_EQ(c.rows.oil.size(), 2u);
  const auto& s = c.rows.oil[0].sample;
  EXPECT_EQ(c.rows.oil[0].unit_id, "T1");
  EXPECT_EQ(s.date, days_from_civil(2026, 3, 14));
  EXPECT_DOUBLE_EQ(s.h2.value, 12.5);
  EXPECT_TRUE(s.c2h2.is_below_limit());
  EXPECT_DOUBLE_EQ(s.c2h2.value, 0.5);
  EXPECT_TRUE(s.co.is_below_limit());
  EXPECT_TRUE(std::isnan(s.co.value));
  EXPECT_EQ(s.breakdown_method, "ASTM D1816 2 mm");
  EXPECT_EQ(s.sample_point, "main_tank");
  EXPECT_FALSE(c.rows.oil[1].sample.co.present());  // empty: not measured
  std::int64_t below = 0;
  for (const auto& w : c.summary.warnings.entries()) {
    if (w.message == "value below detection limit") below += w.count;
  }
  EXPECT_EQ(below, 3);
}

TEST(OilRows, SemicolonFileWithDecimalComma) {
  const auto c = check_text("unit_id;sample_date;h2_ppm;acidity_mgkoh_g;furan_2fal_ppm\n"
                            "T1;2026-03-14;12,5;0,08;<0,05\n");
  ASSERT_TRUE(c.summary.acceptable()) << problems_text(c.summary);
  EXPECT_TRUE(c.summary.decimal_comma);
  const auto& s = c.rows.oil.at(0).sample;
  EXPECT_DOUBLE_EQ(s.h2.value, 12.5);
  EXPECT_DOUBLE_EQ(s.acidity_mgkoh_g.value, 0.08);
  // furan_2fal_ppm -> ppb x 1000, the detection limit converted too.
  EXPECT_TRUE(s.furan_2fal_ppb.is_below_limit());
  EXPECT_DOUBLE_EQ(s.furan_2fal_ppb.value, 50.0);
  ASSERT_EQ(c.summary.conversions.size(), 1u);
  EXPECT_EQ(c.summary.conversions[0].column, "furan_2fal_ppm");
}

TEST(OilRows, OilTemperatureInFahrenheit) {
  const auto c = check_text("unit_id,sample_date,oil_temp_f,h2_ppm\nT1,2026-03-14,122,5\n");
  ASSERT_TRUE(c.summary.acceptable()) << problems_text(c.summary);
  EXPECT_DOUBLE_EQ(c.rows.oil.at(0).sample.oil_temp_c.value, 50.0);  // (122 - 32) * 5/9
}

TEST(OilRows, ImpossibleValuesAndUnknownUnits) {
  const auto c = check_text(
      "unit_id,sample_date,h2_ppm,moisture_ppm,oil_temp_c\n"
      "T1,2026-01-10,-3,10,40\n"        // 2: negative gas
      "T1,2026-01-11,3,400000,40\n"     // 3: "40 %" moisture
      "T1,2031-02-01,3,10,40\n"         // 4: future
      "T-999,2026-01-12,3,10,40\n"      // 5: unknown unit
      "T1,2026-01-13,3,10,300\n"        // 6: temperature
      "T1,2026-01-14,,,\n"              // 7: no test value
      "T1,2026-02-30,3,10,40\n");       // 8: no such date
  EXPECT_TRUE(has_problem(c.summary, 2, "h2_ppm", "hydrogen cannot be negative"));
  EXPECT_TRUE(has_problem(c.summary, 3, "moisture_ppm", "moisture 400000 mg/kg is not possible"));
  EXPECT_TRUE(has_problem(c.summary, 4, "sample_date", "date 2031-02-01 is in the future"));
  EXPECT_TRUE(has_problem(c.summary, 5, "unit_id", "unit T-999 is not in the units register"));
  EXPECT_TRUE(has_problem(c.summary, 6, "oil_temp_c", "oil temperature 300 °C is not possible"));
  EXPECT_TRUE(has_problem(c.summary, 7, "", "no test value"));
  EXPECT_TRUE(has_problem(c.summary, 8, "sample_date", "no such calendar date"));
  EXPECT_EQ(c.summary.problems.count(), 7) << problems_text(c.summary);
  EXPECT_TRUE(c.rows.oil.empty());
}

TEST(OilRows, FutureToleranceIsOneDay) {
  // now = 2026-06-01T12:00Z; 2026-06-02 is within a day, 2026-06-03 is not.
  const auto c = check_text("unit_id,sample_date,h2_ppm\nT1,2026-06-02,1\nT1,2026-06-03,1\n");
  EXPECT_EQ(c.rows.oil.size(), 1u);
  EXPECT_TRUE(has_problem(c.summary, 3, "sample_date", "in the future"));
}

TEST(OilRows, DuplicateKeyAndBreakdownWithoutMethod) {
  const auto c = check_text("unit_id,sample_date,lab_ref,sample_point,breakdown_kv\n"
                            "T1,2026-03-14,A,main tank,55\n"
                            "T1,2026-03-14,A,OLTC,40\n"
                            "T1,2026-03-14,A,Main-Tank,56\n");
  EXPECT_TRUE(has_problem(c.summary, 4, "", "same unit_id, sample_date, lab_ref and sample_point as line 2"));
  EXPECT_EQ(c.summary.problems.count(), 1);
  EXPECT_EQ(c.rows.oil.at(1).sample.sample_point, "oltc");
  bool warned = false;
  for (const auto& w : c.summary.warnings.entries()) {
    warned = warned || (w.column == "breakdown_kv" && w.count == 3);
  }
  EXPECT_TRUE(warned);
}

TEST(OilRows, BadBreakdownMethod) {
  const auto c = check_text("unit_id,sample_date,breakdown_kv,breakdown_method\nT1,2026-03-14,55,D1816\n");
  EXPECT_TRUE(has_problem(c.summary, 2, "breakdown_method", "needs its gap"));
}

// ---------------------------------------------------------------- infrared

TEST(InfraredRows, FahrenheitColumnsAndOptionalFields) {
  const auto c = check_text(
      "unit_id,survey_date,component,spot_f,reference_f,ambient_c,load_pct,emissivity,note\n"
      "T1,2026-03-14,HV bushing X1,212,86,20,75,0.95,\"hot clamp, re-torque\"\n"
      "T1,2026-03-14,LV bushing,100,,21,,,\n");
  ASSERT_TRUE(c.summary.acceptable()) << problems_text(c.summary);
  const auto& s = c.rows.ir.at(0).scan;
  EXPECT_DOUBLE_EQ(s.spot_c, 100.0);        // 212 degF
  EXPECT_DOUBLE_EQ(*s.reference_c, 30.0);   // 86 degF
  EXPECT_DOUBLE_EQ(*s.ambient_c, 20.0);
  EXPECT_DOUBLE_EQ(*s.emissivity, 0.95);
  EXPECT_EQ(s.note, "hot clamp, re-torque");
  EXPECT_FALSE(c.rows.ir.at(1).scan.reference_c.has_value());
  EXPECT_EQ(c.summary.conversions.size(), 2u);
}

TEST(InfraredRows, RowChecks) {
  const auto c = check_text("unit_id,survey_date,component,spot_c,reference_c,ambient_c,emissivity\n"
                            "T1,2026-03-14,bushing,60,,,\n"          // 2: no reference nor ambient
                            "T1,2026-03-14,tank,60,30,,1.2\n"        // 3: emissivity
                            "T1,2026-03-14,clamp,60,30,,0\n"         // 4: emissivity 0
                            "T1,2026-03-14,clamp,61,30,,\n"          // 5
                            "T1,2026-03-14,Clamp,62,30,,\n");        // 6: duplicate of 5
  EXPECT_TRUE(has_problem(c.summary, 2, "", "reference_c or an ambient_c"));
  EXPECT_TRUE(has_problem(c.summary, 3, "emissivity", "emissivity 1.2 is not possible"));
  EXPECT_TRUE(has_problem(c.summary, 4, "emissivity", "emissivity must be above 0"));
  EXPECT_TRUE(has_problem(c.summary, 6, "", "same unit_id, survey_date and component as line 5"));
  EXPECT_EQ(c.summary.problems.count(), 4) << problems_text(c.summary);
}

// -------------------------------------------------------------- inspection

TEST(InspectionRows, VocabularyVariantsAndRatings) {
  const auto c = check_text("unit_id,inspection_date,item,rating,note,inspector\n"
                            "T1,2026-03-14,On-Load Tap Changer,Very Poor,noisy,J. Doe\n"
                            "T1,2026-03-14,BUSHINGS,good,,\n"
                            "T1,2026-03-14,doghouse,good,,\n"
                            "T1,2026-03-14,radiators,excellent,,\n"
                            "T1,2026-03-14,bushings,fair,,\n");
  ASSERT_EQ(c.rows.inspections.size(), 2u);
  EXPECT_EQ(c.rows.inspections[0].record.item, "on_load_tap_changer");
  EXPECT_EQ(c.rows.inspections[0].record.rating, analytics::Rating::very_poor);
  EXPECT_EQ(c.rows.inspections[0].record.inspector, "J. Doe");
  EXPECT_TRUE(has_problem(c.summary, 4, "item", "unknown inspection item; use one of: bushings"));
  EXPECT_TRUE(has_problem(c.summary, 5, "rating", "rating must be good, fair"));
  EXPECT_TRUE(has_problem(c.summary, 6, "", "same unit_id, inspection_date and item as line 3"));
}

TEST(InspectionRows, VocabularyIsAParameter) {
  CheckOptions o = test_options();
  o.parse.inspection_items.push_back("doghouse");
  const auto c = check_text("unit_id,inspection_date,item,rating\nT1,2026-03-14,Dog House,poor\n", o);
  EXPECT_FALSE(c.summary.acceptable());  // "dog_house" is not "doghouse"
  const auto d = check_text("unit_id,inspection_date,item,rating\nT1,2026-03-14,doghouse,poor\n", o);
  EXPECT_TRUE(d.summary.acceptable()) << problems_text(d.summary);
}

// -------------------------------------------------------------- load series

TEST(LoadRows, PerUnitAndTimeOffsets) {
  const auto c = check_text("unit_id,timestamp,load_pu,ambient_c,top_oil_c\n"
                            "T1,2026-03-14T06:15Z,0.8,12,45\n"
                            "T1,2026-03-14T08:15+02:00,0.9,,\n"
                            "T1,2026-03-14 07:15,1.0,,\n",
                            test_options(60));
  ASSERT_TRUE(c.summary.acceptable()) << problems_text(c.summary);
  ASSERT_EQ(c.rows.load.size(), 3u);
  // All three name the same instant, 1773468900 (computed with Python's datetime).
  for (const auto& r : c.rows.load) EXPECT_EQ(r.point.t, 1773468900);
  EXPECT_FALSE(c.rows.load[0].offset_assumed);
  EXPECT_TRUE(c.rows.load[2].offset_assumed);
  EXPECT_EQ(c.summary.offset_assumed_rows, 1);
  EXPECT_DOUBLE_EQ(c.rows.load[0].point.ambient_c, 12);
  EXPECT_TRUE(std::isnan(c.rows.load[1].point.ambient_c));
  bool warned = false;
  for (const auto& w : c.summary.warnings.entries()) {
    warned = warned || (w.message.find("site offset +01:00 assumed") != std::string::npos &&
                        w.count == 1 && w.first_line == 4);
  }
  EXPECT_TRUE(warned);
}

TEST(LoadRows, AmperesToPerUnitThreePhase) {
  // Common practice: I_rated = S / (sqrt(3) U) = 40e6 / (sqrt(3) * 132e3) = 174.95 A,
  // so 87.5 A is 0.500 per unit.
  const auto c = check_text("unit_id,timestamp,load_a\nT1,2026-03-14T06:15Z,87.5\n");
  ASSERT_TRUE(c.summary.acceptable()) << problems_text(c.summary);
  EXPECT_NEAR(c.rows.load.at(0).point.load_pu, 0.5, 0.0005);
  EXPECT_NEAR(c.rows.load.at(0).point.load_pu, 87.5 / 174.95, 1e-4);
  ASSERT_EQ(c.summary.conversions.size(), 1u);
  EXPECT_EQ(c.summary.conversions[0].column, "load_a");
}

TEST(LoadRows, AmperesToPerUnitSinglePhase) {
  // Single-phase: I_rated = S / U = 10e6 / 66e3 = 151.5 A.
  const auto c = check_text("unit_id,timestamp,load_a\nS1,2026-03-14T06:15Z,151.515\n");
  ASSERT_TRUE(c.summary.acceptable()) << problems_text(c.summary);
  EXPECT_NEAR(c.rows.load.at(0).point.load_pu, 1.0, 1e-4);
}

TEST(LoadRows, MvaAndKva) {
  const auto a = check_text("unit_id,timestamp,load_mva\nT1,2026-03-14T06:15Z,30\n");
  EXPECT_DOUBLE_EQ(a.rows.load.at(0).point.load_pu, 0.75);
  const auto b = check_text("unit_id,timestamp,load_kva\nT1,2026-03-14T06:15Z,30000\n");
  EXPECT_DOUBLE_EQ(b.rows.load.at(0).point.load_pu, 0.75);
  ASSERT_EQ(b.summary.conversions.size(), 1u);
  EXPECT_EQ(b.summary.conversions[0].original_unit, "kVA");
}

TEST(LoadRows, Rejections) {
  const auto c = check_text("unit_id,timestamp,load_pu,ambient_f\n"
                            "T1,2026-03-14T06:15Z,50,50\n"          // 2: 50 pu
                            "T1,2031-03-14T06:15Z,0.5,50\n"         // 3: future
                            "T9,2026-03-14T06:15Z,0.5,50\n"         // 4: unknown unit
                            "T1,2026-03-14T06:15Z,0.5,-100\n"       // 5: -73 degC
                            "T1,14.03.2026 06:15,0.5,50\n"          // 6: not ISO
                            "T1,2026-03-14T06:15Z,-0.5,50\n");      // 7: reverse flow: warning
  EXPECT_TRUE(has_problem(c.summary, 2, "load_pu", "load of 50 per unit is not possible"));
  EXPECT_TRUE(has_problem(c.summary, 3, "timestamp", "is in the future"));
  EXPECT_TRUE(has_problem(c.summary, 4, "unit_id", "unit T9 is not in the units register"));
  EXPECT_TRUE(has_problem(c.summary, 5, "ambient_f", "after unit conversion"));
  EXPECT_TRUE(has_problem(c.summary, 6, "timestamp", "not a timestamp"));
  EXPECT_EQ(c.summary.problems.count(), 5) << problems_text(c.summary);
  ASSERT_EQ(c.rows.load.size(), 1u);
  EXPECT_DOUBLE_EQ(c.rows.load[0].point.load_pu, 0.5);
}

TEST(LoadRows, AmperesWithoutLookupIsAProblem) {
  CheckOptions o = test_options();
  o.parse.lookup_unit = nullptr;
  const auto c = check_text("unit_id,timestamp,load_a\nT1,2026-03-14T06:15Z,87.5\n", o);
  EXPECT_TRUE(has_problem(c.summary, 2, "load_a", "without the unit's register data"));
}

// ---------------------------------------------------------- whole file

TEST(CheckStream, UnknownKindIsRejectedAtTheHeaderLine) {
  const auto c = check_text("# lab export\nunit,date,h2\nT1,2026-01-01,5\n");
  EXPECT_FALSE(c.summary.recognised);
  EXPECT_TRUE(has_problem(c.summary, 2, "", "matches no kind"));
  EXPECT_NE(c.summary.rejection.find("oil-lab results needs"), std::string::npos);
}

TEST(CheckStream, UnknownColumnsAndEmptyRowsAreWarnings) {
  const auto c = check_text("unit_id,sample_date,h2_ppm,colour_of_car\nT1,2026-01-01,5,red\n,,,\n");
  EXPECT_TRUE(c.summary.acceptable()) << problems_text(c.summary);
  ASSERT_EQ(c.summary.warnings.entries().size(), 2u);
  EXPECT_EQ(c.summary.warnings.entries()[0].column, "colour_of_car");
  EXPECT_EQ(c.summary.rows_read, 1);
}

TEST(CheckStream, SinkMayRefuseTheKind) {
  struct Refuse : RowSink {
    bool begin(const KindDetection& d) override { return d.kind != FileKind::load_series; }
    int rows = 0;
    void load_point(const LoadRow&) override { ++rows; }
  } sink;
  std::istringstream in("unit_id,timestamp,load_pu\nT1,2026-03-14T06:15Z,0.5\n");
  const CheckSummary s = check_stream(in, test_options(), sink);
  EXPECT_TRUE(s.stopped_by_sink);
  EXPECT_FALSE(s.acceptable());
  EXPECT_EQ(sink.rows, 0);
}

TEST(CheckStream, KeepsFirstHundredProblemsAndCountsAll) {
  std::string text = "unit_id,sample_date,h2_ppm\n";
  for (int i = 0; i < 250; ++i) text += "T1,2026-01-01,-1\n";
  const auto c = check_text(text);
  EXPECT_EQ(c.summary.problems.count(), 250);
  EXPECT_EQ(c.summary.problems.kept().size(), 100u);
}

}  // namespace
}  // namespace ferrum::ingest
