#include "analytics/iec60076_7_characteristics.h"

#include <gtest/gtest.h>

namespace ferrum::analytics {
namespace {

bool contains(const std::vector<std::string>& v, const std::string& needle) {
  for (const auto& s : v)
    if (s.find(needle) != std::string::npos) return true;
  return false;
}

// Column choice: IEC 60076-7:2005 Table 5 separates distribution ONAN (up to
// 2.5 MVA) from medium/large ONAN.
TEST(Iec60076_7Characteristics, CoolingClassFromString) {
  EXPECT_EQ(iec_cooling_class("ONAN", 2.5), IecCoolingClass::onan_distribution);
  EXPECT_EQ(iec_cooling_class("ONAN", 2.6), IecCoolingClass::onan);
  EXPECT_EQ(iec_cooling_class("onaf", 40), IecCoolingClass::onaf);
  EXPECT_EQ(iec_cooling_class("OFAF", 200), IecCoolingClass::of);
  EXPECT_EQ(iec_cooling_class("ODAF", 400), IecCoolingClass::od);
  EXPECT_EQ(iec_cooling_class("KNAN", 10), IecCoolingClass::onan);
  bool known = true;
  EXPECT_EQ(iec_cooling_class("AN", 10, &known), IecCoolingClass::onan);
  EXPECT_FALSE(known);
}

// Table 5 ONAF column (from memory; verify).
TEST(Iec60076_7Characteristics, OnafRecommendedValues) {
  const auto p = iec_recommended_parameters(IecCoolingClass::onaf);
  EXPECT_EQ(p.x, 0.8);
  EXPECT_EQ(p.y, 1.3);
  EXPECT_EQ(p.k21, 2.0);
  EXPECT_EQ(p.tau_o_min, 150);
  EXPECT_EQ(p.top_oil_rise_k, 52);
}

// IEC 60076-7:2005 Table 5, ONAN medium and large power transformers: k21 = 2.0
// (checked against a public reproduction, issue 17; 3.0 was wrong for the 2005 edition).
TEST(Iec60076_7Characteristics, OnanMediumLargeK21) {
  EXPECT_EQ(iec_recommended_parameters(IecCoolingClass::onan).k21, 2.0);  // IEC 60076-7:2005, Table 5
}

TEST(Iec60076_7Characteristics, RegisterDataReplaceTableValuesAndSayWhere) {
  UnitInfo u;
  u.cooling = "ONAF";
  u.rated_mva = 40;
  u.top_oil_rise_k = 55;
  u.hot_spot_gradient_k = 25;
  u.load_loss_ratio = 4.5;
  const auto r = resolve_iec_parameters(u);
  EXPECT_EQ(r.p.top_oil_rise_k, 55);
  EXPECT_EQ(r.p.hot_spot_gradient_k, 25);
  EXPECT_EQ(r.p.r, 4.5);
  EXPECT_TRUE(contains(r.sources, "R = 4.5 (unit register)"));
  EXPECT_TRUE(contains(r.sources, "x = 0.8 (IEC 60076-7:2005 Table 5, ONAF)"));
  EXPECT_FALSE(contains(r.defaulted, "R"));
}

TEST(Iec60076_7Characteristics, ImplausibleRegisterValueIgnored) {
  UnitInfo u;
  u.cooling = "ONAN";
  u.rated_mva = 20;
  u.top_oil_rise_k = 550;  // typo in the register
  const auto r = resolve_iec_parameters(u);
  EXPECT_EQ(r.p.top_oil_rise_k, 52);
  EXPECT_TRUE(contains(r.sources, "out of range"));
  EXPECT_TRUE(contains(r.defaulted, "top_oil_rise_k"));
}

}  // namespace
}  // namespace ferrum::analytics
