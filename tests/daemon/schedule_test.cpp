#include <gtest/gtest.h>

#include "analytics/calendar.h"
#include "daemon/watch/server.h"

using namespace ferrum;

namespace {

std::int64_t utc(int y, int m, int d, int h, int mi) {
  return analytics::start_of(analytics::days_from_civil(y, m, d)) + h * 3600 + mi * 60;
}

// 2026-12-01 is a Tuesday (ISO 8601 calendar); Monday = 0.
TEST(WeeklySchedule, NextMondaySixInTheSiteOffset) {
  // Monday 2026-12-07 06:00 at UTC+01:00 is 05:00 UTC.
  EXPECT_EQ(watch::next_weekly_time(utc(2026, 12, 1, 12, 0), 0, 6 * 60, 60), utc(2026, 12, 7, 5, 0));
}

TEST(WeeklySchedule, StrictlyAfterTheGivenMoment) {
  const auto monday = utc(2026, 12, 7, 5, 0);
  EXPECT_EQ(watch::next_weekly_time(monday, 0, 6 * 60, 60), monday + 7 * 86400);
  EXPECT_EQ(watch::next_weekly_time(monday - 1, 0, 6 * 60, 60), monday);
}

TEST(WeeklySchedule, NegativeOffsetCrossesMidnight) {
  // Tuesday 2026-12-01 23:30 at UTC-05:00 is 04:30 UTC on Wednesday.
  EXPECT_EQ(watch::next_weekly_time(utc(2026, 12, 1, 0, 0), 1, 23 * 60 + 30, -300), utc(2026, 12, 2, 4, 30));
}

TEST(Calendar, IsoWeeks) {
  // ISO 8601: 2026-12-01 is in week 49 of 2026; 2027-01-01 (a Friday) is in week 53 of 2026.
  EXPECT_EQ(analytics::iso_week_of(analytics::days_from_civil(2026, 12, 1)).week, 49);
  const auto w = analytics::iso_week_of(analytics::days_from_civil(2027, 1, 1));
  EXPECT_EQ(w.year, 2026);
  EXPECT_EQ(w.week, 53);
  EXPECT_EQ(analytics::weekday_of(analytics::days_from_civil(2026, 12, 1)), 1);
}

}  // namespace
