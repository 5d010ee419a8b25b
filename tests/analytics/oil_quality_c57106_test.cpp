#include "analytics/oil_quality_c57106.h"

#include <gtest/gtest.h>

namespace ferrum::analytics {
namespace {

// A copy, so that checks of a temporary result stay valid.
std::optional<OilCheck> find(const OilQualityResult& r, const std::string& test) {
  for (const OilCheck& c : r.checks)
    if (c.test == test) return c;
  return std::nullopt;
}

OilSample healthy() {
  OilSample s;
  s.moisture_ppm = LabValue::measured(10);
  s.acidity_mgkoh_g = LabValue::measured(0.05);
  s.ift_mn_m = LabValue::measured(38);
  s.pf25_pct = LabValue::measured(0.1);
  s.pf100_pct = LabValue::measured(1.0);
  s.color = LabValue::measured(1.0);
  s.breakdown_kv = LabValue::measured(60);
  s.breakdown_method = "ASTM D1816 2 mm";
  return s;
}

TEST(OilQualityC57106, VoltageClassBoundaries) {
  // IEEE C57.106 classes: <= 69 kV, > 69 to < 230 kV, >= 230 kV.
  EXPECT_EQ(c57106_voltage_class(69), 0);
  EXPECT_EQ(c57106_voltage_class(69.1), 1);
  EXPECT_EQ(c57106_voltage_class(229.9), 1);
  EXPECT_EQ(c57106_voltage_class(230), 2);
  EXPECT_FALSE(c57106_voltage_class(0));
}

// Limits: IEEE C57.106 service-aged oil table, values from memory ; verify.
TEST(OilQualityC57106, MoistureLimitByClassBothSides) {
  struct Case { double kv, limit; };
  for (Case c : {Case{69, 35}, Case{138, 25}, Case{230, 20}}) {
    OilSample s;
    s.moisture_ppm = LabValue::measured(c.limit);
    auto at = find(assess_oil_quality_c57106(s, c.kv), "moisture");
    ASSERT_TRUE(at);
    EXPECT_EQ(*at->limit, c.limit);
    EXPECT_EQ(at->limit_kind, "max");
    EXPECT_TRUE(*at->within_limit);
    s.moisture_ppm = LabValue::measured(c.limit + 0.1);
    EXPECT_FALSE(*find(assess_oil_quality_c57106(s, c.kv), "moisture")->within_limit);
  }
}

TEST(OilQualityC57106, AcidityIftPowerFactorColourLimits) {
  // <= 69 kV: acidity 0.20 max, IFT 25 min; >= 230 kV: 0.10, 32; PF 0.5 / 5.0 %; colour 3.5.
  OilSample s;
  s.acidity_mgkoh_g = LabValue::measured(0.20);
  s.ift_mn_m = LabValue::measured(25);
  s.pf25_pct = LabValue::measured(0.5);
  s.pf100_pct = LabValue::measured(5.0);
  s.color = LabValue::measured(3.5);
  auto low = assess_oil_quality_c57106(s, 34.5);
  for (const char* t : {"acidity", "ift", "pf25", "pf100", "color"}) {
    SCOPED_TRACE(t);
    EXPECT_TRUE(*find(low, t)->within_limit);
  }
  EXPECT_EQ(low.oil_class, "Class I");
  auto high = assess_oil_quality_c57106(s, 345);
  EXPECT_FALSE(*find(high, "acidity")->within_limit);  // 0.20 > 0.10
  EXPECT_FALSE(*find(high, "ift")->within_limit);      // 25 < 32
  EXPECT_EQ(*find(high, "ift")->limit, 32);
  s.pf25_pct = LabValue::measured(0.51);
  s.color = LabValue::measured(3.6);
  auto over = assess_oil_quality_c57106(s, 34.5);
  EXPECT_FALSE(*find(over, "pf25")->within_limit);
  EXPECT_FALSE(*find(over, "color")->within_limit);
}

TEST(OilQualityC57106, BreakdownByMethodAndGap) {
  OilSample s;
  s.breakdown_kv = LabValue::measured(47);
  s.breakdown_method = "ASTM D1816 2 mm";
  auto two = find(assess_oil_quality_c57106(s, 138), "breakdown");  // C57.106: 47 kV min, 69-230 kV
  EXPECT_EQ(*two->limit, 47);
  EXPECT_TRUE(*two->within_limit);
  s.breakdown_kv = LabValue::measured(46.9);
  EXPECT_FALSE(*find(assess_oil_quality_c57106(s, 138), "breakdown")->within_limit);
  s.breakdown_method = "D1816-1mm";
  EXPECT_EQ(*find(assess_oil_quality_c57106(s, 345), "breakdown")->limit, 30);  // 1 mm, >= 230 kV
  s.breakdown_method = "ASTM D877";  // Reclamation minimum (checked against a public reproduction): 25 kV below 287.5 kV
  EXPECT_EQ(*find(assess_oil_quality_c57106(s, 138), "breakdown")->limit, 25);
  EXPECT_EQ(*find(assess_oil_quality_c57106(s, 287.5), "breakdown")->limit, 30);
  s.breakdown_method = "IEC 60156";  // IEC 60422 Table 5 poor bound (from memory): B 40 kV
  EXPECT_EQ(*find(assess_oil_quality_c57106(s, 132), "breakdown")->limit, 40);
  EXPECT_EQ(*find(assess_oil_quality_c57106(s, 400), "breakdown")->limit, 50);
  EXPECT_EQ(*find(assess_oil_quality_c57106(s, 33), "breakdown")->limit, 30);
}

TEST(OilQualityC57106, UnknownBreakdownMethodHasNoLimitAndSaysWhy) {
  OilSample s;
  s.breakdown_kv = LabValue::measured(40);
  for (const char* m : {"", "VDE 0370", "ASTM D1816"}) {  // D1816 without gap: ambiguous
    s.breakdown_method = m;
    auto c = find(assess_oil_quality_c57106(s, 138), "breakdown");
    ASSERT_TRUE(c);
    EXPECT_EQ(*c->value, 40);
    EXPECT_FALSE(c->limit);
    EXPECT_FALSE(c->within_limit);
    EXPECT_NE(c->source.find("no limit"), std::string::npos);
  }
}

TEST(OilQualityC57106, ClassesFromClause7) {
  // C57.106 clause 7 (checked against a public reproduction): dielectric/water -> Class II; IFT/PF/acidity -> Class III.
  OilSample s = healthy();
  EXPECT_EQ(assess_oil_quality_c57106(s, 138).oil_class, "Class I");
  s.moisture_ppm = LabValue::measured(30);
  EXPECT_EQ(assess_oil_quality_c57106(s, 138).oil_class, "Class II");
  s.ift_mn_m = LabValue::measured(20);
  auto r = assess_oil_quality_c57106(s, 138);
  EXPECT_EQ(r.oil_class, "Class III");
  EXPECT_NE(r.class_reason.find("moisture"), std::string::npos);
  EXPECT_EQ(assess_oil_quality_c57106(OilSample{}, 138).oil_class, "not determined");
}

TEST(OilQualityC57106, UnknownVoltageGivesNoTabulatedLimit) {
  auto r = assess_oil_quality_c57106(healthy(), 0);
  EXPECT_FALSE(find(r, "moisture")->limit);
  EXPECT_FALSE(r.notes.empty());
}

}  // namespace
}  // namespace ferrum::analytics
