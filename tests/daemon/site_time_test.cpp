// [site] time_zone and the one printed alert time (daemon/config/site_time.h).
// Offsets are those of the IANA tz database (the system's zone files).
#include "daemon/config/site_time.h"

#include <gtest/gtest.h>

#include "analytics/calendar.h"
#include "daemon/config/site_config.h"
#include "tests/daemon/temp_ini.h"

namespace ferrum::config {
namespace {

std::int64_t utc(int y, int m, int d, int h, int mi) {
  return analytics::start_of(analytics::days_from_civil(y, m, d)) + h * 3600 + mi * 60;
}

TEST(SiteTime, DefaultIsUtc) {
  // UTC itself without its offset (plumbing of the wording: no published source applies).
  EXPECT_EQ(site_timestamp(utc(2026, 11, 30, 6, 10), SiteTimeZone()), "2026-11-30 06:10:00 UTC");
}

// IANA tz database: Europe/Berlin is CET (UTC+1) in winter and CEST (UTC+2)
// from the last Sunday of March 01:00 UTC (EU summer-time directive 2000/84/EC).
TEST(SiteTime, BerlinWinterAndSummer) {
  const auto z = SiteTimeZone::load("Europe/Berlin");
  EXPECT_EQ(site_timestamp(utc(2026, 11, 30, 23, 30), z), "2026-12-01 00:30:00 CET (UTC+01:00)");
  EXPECT_EQ(site_timestamp(utc(2026, 7, 1, 6, 0), z), "2026-07-01 08:00:00 CEST (UTC+02:00)");
  // 2026-03-29 is the last Sunday of March: the change is at 01:00 UTC.
  EXPECT_EQ(z.at(utc(2026, 3, 29, 0, 59)).offset_seconds, 3600);
  EXPECT_EQ(z.at(utc(2026, 3, 29, 1, 0)).offset_seconds, 7200);
}

// The stored alert times (UTC, ISO 8601) print in site time in the weekly
// cover, the fleet report and `ferrum status` too (issue #16). IANA tz
// database: Europe/Berlin is CET, UTC+1, in winter.
TEST(SiteTime, StoredTimesPrintInSiteTime) {
  const auto z = SiteTimeZone::load("Europe/Berlin");
  EXPECT_EQ(site_timestamp_of_stored("2026-11-30T23:30:00Z", z), "2026-12-01 00:30:00 CET (UTC+01:00)");
  EXPECT_EQ(site_timestamp_of_stored("not a time", z), "not a time");
  EXPECT_EQ(site_timestamp_of_stored("2026-11-30T23:30:00+01:00", z), "2026-11-30T23:30:00+01:00");
}

// IANA tz database: America/Chicago is CST, UTC-6, in December.
TEST(SiteTime, WestOfGreenwich) {
  EXPECT_EQ(site_timestamp(utc(2026, 12, 3, 3, 0), SiteTimeZone::load("America/Chicago")),
            "2026-12-02 21:00:00 CST (UTC-06:00)");
}

TEST(SiteTime, ConfigKeyAndBadNames) {
  const auto c = testing::load_ini_text("[site]\ntime_zone = Europe/Berlin\n[party.a]\nkinds = *\n", "tz");
  EXPECT_EQ(c.time_zone.name(), "Europe/Berlin");
  EXPECT_EQ(testing::load_ini_text("[party.a]\nkinds = *\n", "tz0").time_zone.name(), "UTC");
  for (const char* bad : {"Mars/Olympus", "../../etc/passwd", "/usr/share/zoneinfo/UTC", "Europe/Ber lin"})
    EXPECT_THROW(testing::load_ini_text(std::string("[site]\ntime_zone = ") + bad + "\n[party.a]\nkinds = *\n", "tzb"),
                 ConfigError)
        << bad;
}

}  // namespace
}  // namespace ferrum::config
