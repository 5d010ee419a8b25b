// Gap handling and integration of the thermal kernel. The expected values
// come from the closed-form steady state (IEC 60076-7 §8.2)
// and from the gap rules stated in thermal_simulation.h (ferrum's own).
#include "analytics/thermal_simulation.h"

#include <gtest/gtest.h>

#include <vector>

namespace ferrum::analytics {
namespace {

constexpr Timestamp kHour = 3600;
const Timestamp kT0 = start_of(days_from_civil(2023, 7, 1));

UnitInfo onaf_unit(PaperType paper = PaperType::kraft) {
  UnitInfo u;
  u.unit_id = "T1";
  u.cooling = "ONAF";
  u.rated_mva = 40;
  u.paper = paper;
  return u;
}

std::vector<LoadPoint> constant(int n, Timestamp step, double k, double amb) {
  std::vector<LoadPoint> v;
  for (int i = 0; i < n; ++i) v.push_back({kT0 + i * step, k, amb});
  return v;
}

struct Run {
  SimulationStats stats;
  std::vector<ThermalPoint> points;
};

Run simulate(const std::vector<LoadPoint>& load, ThermalMethod m = ThermalMethod::iec60076_7,
             PaperType paper = PaperType::kraft, GapOptions g = {}) {
  Run r;
  r.points.resize(load.size());
  r.stats = simulate_thermal(resolve_thermal_model(onaf_unit(paper), m), load, g, r.points);
  r.points.resize(r.stats.written);
  return r;
}

// Rated load at 20 °C: 98 °C hot spot, V = 1, so 24 h consume 24 normal
// hours (IEC 60076-7:2005 Table 5 and eq. 2, computed).
TEST(ThermalSimulation, RatedSteadyLoadBothMethods) {
  for (auto m : {ThermalMethod::iec60076_7, ThermalMethod::ieee_c57_91}) {
    const auto r = simulate(constant(25, kHour, 1.0, 20), m);
    ASSERT_EQ(r.points.size(), 25u);
    for (const auto& p : r.points) EXPECT_NEAR(p.hot_spot_c, 98.0, 1e-6);
    EXPECT_NEAR(r.stats.covered_h, 24, 1e-9);
    EXPECT_NEAR(r.stats.loss_of_life_h, 24, 1e-6);
    EXPECT_EQ(r.stats.bridged_h, 0);
  }
}

// Sub-stepping makes the answer independent of the data interval: a step
// 0.6 -> 1.3 sampled hourly and every minute agree within 0.2 K after each hour.
TEST(ThermalSimulation, HourlyAndMinuteDataAgree) {
  std::vector<LoadPoint> hourly, minutes;
  for (int h = 0; h <= 12; ++h) hourly.push_back({kT0 + h * kHour, h == 0 ? 0.6 : 1.3, 20});
  for (int m = 0; m <= 12 * 60; ++m) minutes.push_back({kT0 + m * 60, m == 0 ? 0.6 : 1.3, 20});
  const auto a = simulate(hourly), b = simulate(minutes);
  for (int h = 1; h <= 12; ++h) EXPECT_NEAR(a.points[h].hot_spot_c, b.points[h * 60].hot_spot_c, 0.2) << h;
}

// The ageing integral does not depend on the data interval either: the same
// step load sampled hourly and every minute consumes the same equivalent
// hours within 1 % (IEC 60076-7 eq. 2 integrated along the §8.2.3 model;
// the hourly run integrates between sub-step nodes, the minute run per point).
TEST(ThermalSimulation, HourlyAndMinuteAgeingAgree) {
  std::vector<LoadPoint> hourly, minutes;
  for (int h = 0; h <= 12; ++h) hourly.push_back({kT0 + h * kHour, h == 0 ? 0.6 : 1.3, 20});
  for (int m = 0; m <= 12 * 60; ++m) minutes.push_back({kT0 + m * 60, m == 0 ? 0.6 : 1.3, 20});
  for (auto paper : {PaperType::kraft, PaperType::upgraded}) {
    const auto a = simulate(hourly, ThermalMethod::iec60076_7, paper);
    const auto b = simulate(minutes, ThermalMethod::iec60076_7, paper);
    ASSERT_GT(b.stats.loss_of_life_h, 12.0);  // K = 1.3 ages faster than normal
    EXPECT_NEAR(a.stats.loss_of_life_h / b.stats.loss_of_life_h, 1.0, 0.01);
  }
}

TEST(ThermalSimulation, DuplicateAndBackwardTimestampsDropped) {
  auto load = constant(6, kHour, 1.0, 20);
  load.insert(load.begin() + 3, load[2]);                 // duplicate of point 2
  load.insert(load.begin() + 5, {kT0 + kHour / 2, 1.0, 20});  // clock stepped back
  const auto r = simulate(load);
  EXPECT_EQ(r.stats.duplicates, 1u);
  EXPECT_EQ(r.stats.backward_jumps, 1u);
  EXPECT_EQ(r.points.size(), 6u);
  EXPECT_NEAR(r.stats.covered_h, 5, 1e-9);
}

// A 3 h hole in hourly data: 2 h bridged at the last known load, covered
// time still the whole span.
TEST(ThermalSimulation, ShortGapBridgedAtLastLoad) {
  auto load = constant(10, kHour, 1.0, 20);
  load.erase(load.begin() + 4, load.begin() + 6);  // points 4 and 5 missing
  const auto r = simulate(load);
  EXPECT_EQ(r.stats.expected_interval_s, kHour);
  EXPECT_NEAR(r.stats.bridged_h, 2, 1e-9);
  EXPECT_NEAR(r.points[4].bridged_h, 2, 1e-9);  // the point after the hole carries it
  EXPECT_NEAR(r.points[4].ageing_h, 3, 1e-6);   // V = 1 over the 3 h step
  EXPECT_NEAR(r.stats.covered_h, 9, 1e-9);
  EXPECT_EQ(r.stats.restarts, 0u);
  EXPECT_NEAR(r.points.back().hot_spot_c, 98.0, 1e-6);
}

// A clock jump forward by a day: the model restarts from steady state and
// the day is neither covered nor bridged.
TEST(ThermalSimulation, LongGapRestartsModel) {
  auto load = constant(4, kHour, 1.0, 20);
  for (int i = 0; i < 4; ++i) load.push_back({kT0 + 27 * kHour + i * kHour, 1.3, 20});
  const auto r = simulate(load);
  EXPECT_EQ(r.stats.restarts, 1u);
  EXPECT_NEAR(r.stats.unbridged_h, 24, 1e-9);
  EXPECT_NEAR(r.stats.covered_h, 6, 1e-9);
  EXPECT_EQ(r.points[4].step_h, 0);
  // Restart from the steady state at K = 1.3 (132.0 °C, IEC 60076-7 §8.2 closed form).
  EXPECT_NEAR(r.points[4].hot_spot_c, 132.0, 0.05);
}

TEST(ThermalSimulation, MissingAmbientFromMonthlyProfile) {
  auto load = constant(3, kHour, 1.0, 20);
  load[1].ambient_c = std::numeric_limits<double>::quiet_NaN();
  GapOptions g;
  g.ambient_profile[6] = 33;  // July
  const auto r = simulate(load, ThermalMethod::iec60076_7, PaperType::kraft, g);
  EXPECT_EQ(r.stats.ambient_from_profile, 1u);
  EXPECT_TRUE(r.points[1].ambient_from_profile);
  EXPECT_EQ(r.points[1].ambient_c, 33);
  EXPECT_FALSE(r.points[2].ambient_from_profile);
}

TEST(ThermalSimulation, InvalidLoadsCountedNotUsed) {
  auto load = constant(4, kHour, 1.0, 20);
  load[2].load_pu = std::numeric_limits<double>::quiet_NaN();
  load.push_back({kT0 + 4 * kHour, -0.2, 20});
  const auto r = simulate(load);
  EXPECT_EQ(r.stats.invalid_loads, 2u);
  EXPECT_EQ(r.points.size(), 3u);
}

TEST(ThermalSimulation, EmptyAndSinglePoint) {
  EXPECT_EQ(simulate({}).stats.written, 0u);
  const auto r = simulate(constant(1, kHour, 1.0, 20));
  EXPECT_EQ(r.stats.written, 1u);
  EXPECT_EQ(r.stats.covered_h, 0);
}

// Upgraded paper ages by F_AA (1 at 110 °C): at 98 °C a day costs
// 24·0.282 h (IEEE C57.91 eq., check value computed by hand).
TEST(ThermalSimulation, UpgradedPaperUsesArrhenius) {
  const auto r = simulate(constant(25, kHour, 1.0, 20), ThermalMethod::iec60076_7, PaperType::upgraded);
  EXPECT_NEAR(r.stats.loss_of_life_h, 24 * 0.282, 0.03);
}

}  // namespace
}  // namespace ferrum::analytics

namespace ferrum::analytics {
namespace {

// The kernel remembers the load terms of each distinct load value: a series
// with few distinct loads (rounded, as exports give them, many repeating
// after other values) gives, bit for bit, what one difference-equation step
// per point gives (IEC 60076-7:2005 §8.2.3 equations, iec_step, one-minute
// steps need no sub-steps on this unit). ferrum's own check of its cache.
TEST(ThermalSimulation, RepeatedLoadValuesGiveTheDirectStepsExactly) {
  std::vector<LoadPoint> load;
  for (int i = 0; i < 5000; ++i)
    load.push_back({kT0 + i * 60, 0.5 + 0.001 * ((i * 37) % 701), 15.0 + (i % 11)});  // 701 values, in no order
  const auto r = simulate(load);
  ASSERT_EQ(r.points.size(), load.size());
  const auto model = resolve_thermal_model(onaf_unit(), ThermalMethod::iec60076_7);
  IecThermalState s = iec_steady_state(model.iec, load[0].load_pu, load[0].ambient_c);
  for (std::size_t i = 1; i < load.size(); ++i) {
    iec_step(model.iec, load[i].load_pu, load[i].ambient_c, 1.0, s);
    ASSERT_EQ(r.points[i].hot_spot_c, s.hot_spot_c()) << i;
    ASSERT_EQ(r.points[i].top_oil_c, s.top_oil_c) << i;
  }
}

}  // namespace
}  // namespace ferrum::analytics
