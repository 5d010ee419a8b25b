#include "analytics/gas_trend.h"

#include <gtest/gtest.h>

#include "dga_test_sample.h"

namespace ferrum::analytics {
namespace {

TEST(GasTrend, ExactLineRecoversSlope) {
  // Least squares through points on a line returns the line's slope: 0.1 ppm/day = 36.525 ppm/yr.
  auto t = least_squares_trend({{0, 10}, {100, 20}, {200, 30}, {300, 40}});
  ASSERT_TRUE(t.applicable);
  EXPECT_NEAR(*t.ppm_per_day, 0.1, 1e-12);
  EXPECT_NEAR(*t.ppm_per_year, 36.525, 1e-9);
}

TEST(GasTrend, TextbookRegressionExample) {
  // x = 0, 60, 120, 180; y = 1, 3, 2, 5: mean (90, 2.75), Sxy = 330, Sxx = 18000
  // -> slope 330/18000 ppm/day (hand computed).
  auto t = least_squares_trend({{0, 1}, {60, 3}, {120, 2}, {180, 5}});
  EXPECT_NEAR(*t.ppm_per_day, 330.0 / 18000.0, 1e-12);
}

TEST(GasTrend, TooFewSamples) {
  auto t = least_squares_trend({{0, 1}, {200, 3}});
  EXPECT_FALSE(t.applicable);
  EXPECT_NE(t.why_not.find("too few"), std::string::npos);
  EXPECT_TRUE(least_squares_trend({{0, 1}, {100, 2}, {200, 3}}).applicable);
}

TEST(GasTrend, RepeatsWithinMinGapCountOnce) {
  // Day 200 and 205 are 5 days apart (< 7): only day 205 is used, leaving 2 samples.
  auto t = least_squares_trend({{0, 1}, {200, 3}, {205, 3}});
  EXPECT_FALSE(t.applicable);
  EXPECT_EQ(t.samples_used, 2);
  // 7 days apart is not a repeat.
  EXPECT_TRUE(least_squares_trend({{0, 1}, {200, 3}, {207, 3}}).applicable);
}

TEST(GasTrend, ShortSpanGuardBothSides) {
  // C57.104-2019 (from memory): regression over about 4 months or more.
  EXPECT_FALSE(least_squares_trend({{0, 1}, {60, 2}, {119, 3}}).applicable);
  EXPECT_TRUE(least_squares_trend({{0, 1}, {60, 2}, {120, 3}}).applicable);
}

TEST(GasTrend, UsesOnlyRecentSamplesWithinSpan) {
  GasTrendOptions o;
  o.max_samples = 3;
  // Old points on a steep line are ignored: the last three are flat.
  auto t = least_squares_trend({{0, 0}, {100, 100}, {200, 50}, {300, 50}, {400, 50}}, o);
  EXPECT_NEAR(*t.ppm_per_day, 0, 1e-12);
  EXPECT_EQ(t.from, 200);
  // Span limit: points older than 730 days before the latest are dropped.
  auto s = least_squares_trend({{0, 1000}, {800, 10}, {900, 10}, {1000, 10}});
  EXPECT_EQ(s.samples_used, 3);
}

TEST(GasTrend, FromSamplesBelowLimitCountsZeroMissingSkipped) {
  using testing::gas_sample;
  std::vector<OilSample> v = {gas_sample(0, {.h2 = -5}), gas_sample(100, {.h2 = 10}),
                              gas_sample(150, {.h2 = testing::kNotAnalysed}), gas_sample(200, {.h2 = 20})};
  auto t = gas_trend(v, Gas::h2);
  EXPECT_EQ(t.samples_used, 3);
  EXPECT_NEAR(*t.ppm_per_day, 0.1, 1e-12);
}

}  // namespace
}  // namespace ferrum::analytics
