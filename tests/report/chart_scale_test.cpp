#include "report/chart_scale.h"

#include <gtest/gtest.h>

namespace ferrum::report {
namespace {

std::vector<double> values(const std::vector<Tick>& ticks) {
  std::vector<double> v;
  for (const auto& t : ticks) v.push_back(t.value);
  return v;
}
std::vector<std::string> labels(const std::vector<Tick>& ticks) {
  std::vector<std::string> v;
  for (const auto& t : ticks) v.push_back(t.label);
  return v;
}

TEST(NiceStep, OneTwoFiveSteps) {
  EXPECT_DOUBLE_EQ(nice_step(100, 6), 20);   // 100/5 = 20 -> 2x10
  EXPECT_DOUBLE_EQ(nice_step(101, 6), 50);   // 20.2 needs the next step up
  EXPECT_DOUBLE_EQ(nice_step(1, 6), 0.2);
  EXPECT_DOUBLE_EQ(nice_step(7, 6), 2);      // 1.4 -> 2
  EXPECT_DOUBLE_EQ(nice_step(4, 5), 1);      // exactly four intervals of 1
  EXPECT_DOUBLE_EQ(nice_step(0, 6), 1);      // degenerate span
}

TEST(NiceTicks, CoversRangeWithRoundValues) {
  EXPECT_EQ(values(nice_ticks(0, 100, 6)), (std::vector<double>{0, 20, 40, 60, 80, 100}));
  EXPECT_EQ(values(nice_ticks(3, 97, 6)), (std::vector<double>{0, 20, 40, 60, 80, 100}));
  EXPECT_EQ(labels(nice_ticks(0, 1, 6)), (std::vector<std::string>{"0.0", "0.2", "0.4", "0.6", "0.8", "1.0"}));
  // Span 10 in at most 5 intervals: step 2 would need -6..6 (6 intervals), so step 5.
  EXPECT_EQ(values(nice_ticks(-5, 5, 6)), (std::vector<double>{-5, 0, 5}));
}

TEST(NiceTicks, NeverMoreThanMaxAndAlwaysCovering) {
  for (double lo : {-13.0, 0.0, 0.7, 47.0, 1234.0})
    for (double span : {0.03, 1.0, 9.9, 55.0, 1e4})
      for (int max : {3, 5, 6, 8}) {
        const auto t = nice_ticks(lo, lo + span, max);
        ASSERT_GE(t.size(), 2u);
        EXPECT_LE(static_cast<int>(t.size()), max) << lo << " " << span << " " << max;
        EXPECT_LE(t.front().value, lo + 1e-9);
        EXPECT_GE(t.back().value, lo + span - 1e-9);
      }
}

TEST(NiceTicks, SingleValueIsWidened) {
  const auto t = nice_ticks(50, 50, 6);
  EXPECT_LT(t.front().value, 50);
  EXPECT_GT(t.back().value, 50);
  EXPECT_EQ(labels(nice_ticks(0, 0, 3)).front(), "-1");
}

TEST(NiceTicks, NoNegativeZeroLabel) {
  for (const auto& t : nice_ticks(-0.3, 0.3, 7)) EXPECT_NE(t.label, "-0.0");
}

TEST(DecadeTicks, PowersOfTenAroundTheData) {
  EXPECT_EQ(labels(decade_ticks(0.8, 2530)), (std::vector<std::string>{"0.1", "1", "10", "100", "1000", "10000"}));
  EXPECT_EQ(values(decade_ticks(10, 100)), (std::vector<double>{10, 100}));
  EXPECT_EQ(values(decade_ticks(20, 30)), (std::vector<double>{10, 100}));
  EXPECT_EQ(decade_ticks(0, 50).front().value, 0.1);  // non-positive lower end raised
}

TEST(LogScaleChoice, RatioThreshold) {
  EXPECT_FALSE(wants_log_scale(10, 1000));   // exactly 100x: linear still reads
  EXPECT_TRUE(wants_log_scale(10, 1001));
  EXPECT_FALSE(wants_log_scale(0, 1000));    // no positive minimum
}

TEST(CalendarTicks, MonthsThenYears) {
  using analytics::days_from_civil;
  const auto months = calendar_ticks(days_from_civil(2025, 12, 1), days_from_civil(2026, 11, 30), 7);
  // Two-month steps align to January (odd months), not to the first data month.
  EXPECT_EQ(labels(months), (std::vector<std::string>{"2026-01", "2026-03", "2026-05", "2026-07", "2026-09", "2026-11"}));
  const auto years = calendar_ticks(days_from_civil(2022, 3, 13), days_from_civil(2026, 10, 13), 7);
  EXPECT_EQ(labels(years), (std::vector<std::string>{"2023", "2024", "2025", "2026"}));
  const auto first = calendar_ticks(days_from_civil(2026, 1, 15), days_from_civil(2026, 3, 20), 7);
  EXPECT_EQ(labels(first), (std::vector<std::string>{"2026-02", "2026-03"}));  // first tick at or after the start
  for (const auto& t : years) EXPECT_EQ(analytics::civil_from_days(static_cast<analytics::Day>(t.value)).day, 1);
}

TEST(AxisScale, LinearAndLogPositions) {
  const AxisScale lin{0, 200, false, 100, 400};
  EXPECT_DOUBLE_EQ(*lin.position(0), 100);
  EXPECT_DOUBLE_EQ(*lin.position(100), 300);
  EXPECT_DOUBLE_EQ(*lin.position(250), 600);  // outside maps outside; clipping decides
  EXPECT_FALSE(lin.contains(250));
  const AxisScale log{1, 1000, true, 0, 300};
  EXPECT_DOUBLE_EQ(*log.position(10), 100);
  EXPECT_DOUBLE_EQ(*log.position(100), 200);
  EXPECT_FALSE(log.position(0).has_value());
  EXPECT_FALSE(log.position(-3).has_value());
}

TEST(ClipSegment, InsideCrossingAndOutside) {
  const Box box{0, 0, 10, 10};
  const auto inside = clip_segment({1, 1}, {9, 9}, box);
  ASSERT_TRUE(inside);
  EXPECT_DOUBLE_EQ(inside->b.x, 9);
  const auto crossing = clip_segment({5, 5}, {15, 5}, box);
  ASSERT_TRUE(crossing);
  EXPECT_DOUBLE_EQ(crossing->a.x, 5);
  EXPECT_DOUBLE_EQ(crossing->b.x, 10);
  const auto through = clip_segment({-5, 5}, {5, 15}, box);  // enters left edge, leaves top
  ASSERT_TRUE(through);
  EXPECT_DOUBLE_EQ(through->a.x, 0);
  EXPECT_DOUBLE_EQ(through->a.y, 10);
  EXPECT_DOUBLE_EQ(through->b.y, 10);
  EXPECT_FALSE(clip_segment({11, 0}, {20, 5}, box));      // entirely right of the box
  EXPECT_FALSE(clip_segment({-1, -1}, {-1, 20}, box));    // vertical, left of the box
  EXPECT_FALSE(clip_segment({-5, 4}, {4, 15}, box));      // passes the corner outside
}

}  // namespace
}  // namespace ferrum::report
