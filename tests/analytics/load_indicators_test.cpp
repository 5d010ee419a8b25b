#include "analytics/load_indicators.h"

#include <gtest/gtest.h>

#include <vector>

namespace ferrum::analytics {
namespace {

ThermalPoint pt(Timestamp t, double k, double hs, double step_h = 1) {
  ThermalPoint p;
  p.t = t;
  p.load_pu = k;
  p.hot_spot_c = hs;
  p.top_oil_c = hs - 20;
  p.step_h = step_h;
  p.ageing_rate = 1;
  p.ageing_h = step_h;
  return p;
}

// Limits of IEC 60076-7:2005 Table 4 (checked against a public reproduction): hours are
// counted strictly above each limit, so each one is checked on both sides.
TEST(LoadIndicators, HoursAboveEachLimitBothSides) {
  std::vector<ThermalPoint> v = {pt(0, 0.9, 119.9), pt(3600, 1.0, 120.0), pt(7200, 1.01, 120.1),
                                 pt(10800, 1.2, 139.9), pt(14400, 1.3, 140.1), pt(18000, 1.5, 159.9),
                                 pt(21600, 1.6, 160.1, 0.5)};
  const auto r = load_indicators(v, {});
  EXPECT_DOUBLE_EQ(r.hours_above_normal_cyclic, 4.5);
  EXPECT_DOUBLE_EQ(r.hours_above_long_emergency, 2.5);
  EXPECT_DOUBLE_EQ(r.hours_above_short_emergency, 0.5);
  EXPECT_DOUBLE_EQ(r.hours_above_nameplate, 4.5);  // 1.0 itself is not above nameplate
  EXPECT_DOUBLE_EQ(*r.peak_load_pu, 1.6);
  EXPECT_DOUBLE_EQ(*r.peak_hot_spot_c, 160.1);
  EXPECT_DOUBLE_EQ(r.period_h, 6.5);
  EXPECT_DOUBLE_EQ(r.loss_of_life_h, 6.5);
  EXPECT_FALSE(r.top_oil_discrepancy_k);
}

// Nearest-rank 99th percentile of 1..200 is the 198th value.
TEST(LoadIndicators, Percentile99) {
  std::vector<ThermalPoint> v;
  for (int i = 200; i >= 1; --i) v.push_back(pt(i, i / 100.0, 80));
  EXPECT_DOUBLE_EQ(*load_indicators(v, {}).p99_load_pu, 1.98);
}

TEST(LoadIndicators, TopOilDiscrepancyMeanOverMeasuredPoints) {
  std::vector<ThermalPoint> v = {pt(0, 1, 90), pt(1, 1, 90), pt(2, 1, 90)};
  v[0].measured_top_oil_c = v[0].top_oil_c + 4;
  v[2].measured_top_oil_c = v[2].top_oil_c + 8;
  const auto r = load_indicators(v, {});
  EXPECT_EQ(r.top_oil_measurements, 2u);
  EXPECT_DOUBLE_EQ(*r.top_oil_discrepancy_k, 6.0);
}

TEST(LoadIndicators, EmptySeries) {
  const auto r = load_indicators({}, {});
  EXPECT_FALSE(r.peak_load_pu);
  EXPECT_EQ(r.period_h, 0);
}

// Load rising linearly from 0.5 to 0.6 p.u. over two years: slope 0.05/yr on
// a mean of 0.55 = 9.09 %/yr (computed).
TEST(LoadGrowth, LinearRise) {
  std::vector<ThermalPoint> v;
  const Timestamp year = static_cast<Timestamp>(365.25 * 86400);
  for (int d = 0; d <= 730; ++d) {
    const Timestamp t = static_cast<Timestamp>(d) * 86400;
    v.push_back(pt(t, 0.5 + 0.1 * t / (2.0 * year), 80, 24));
  }
  const auto g = load_growth(v);
  ASSERT_TRUE(g.pct_per_year);
  EXPECT_NEAR(*g.pct_per_year, 100 * 0.05 / 0.55, 0.05);
}

TEST(LoadGrowth, ShortHistoryGivesNoTrend) {
  std::vector<ThermalPoint> v = {pt(0, 0.5, 80), pt(100 * 86400, 0.9, 80)};
  const auto g = load_growth(v);
  EXPECT_FALSE(g.pct_per_year);
  EXPECT_NE(g.note.find("shorter"), std::string::npos);
}

}  // namespace
}  // namespace ferrum::analytics
