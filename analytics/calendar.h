// Calendar arithmetic on plain integers, so that analytics never reads a clock.
//
// A Day is a count of days since 1970-01-01 (proleptic Gregorian). A Timestamp
// is seconds since 1970-01-01T00:00:00Z. Conversions follow Howard Hinnant's
// public-domain "days_from_civil" algorithm.
#pragma once

#include <cstdint>
#include <string>

namespace ferrum::analytics {

using Day = std::int32_t;
using Timestamp = std::int64_t;

struct CivilDate {
  int year = 1970;
  int month = 1;  // 1..12
  int day = 1;    // 1..31
};

// Days since 1970-01-01 for a civil date. REQUIRES: a valid date.
Day days_from_civil(int year, int month, int day);
CivilDate civil_from_days(Day d);

// True when year/month/day names a real calendar date.
bool is_valid_date(int year, int month, int day);

// "YYYY-MM-DD".
std::string format_day(Day d);

// "YYYY-MM-DDTHH:MM:SSZ" (ISO 8601, UTC).
std::string format_utc(Timestamp t);

// Day containing a timestamp, in UTC.
inline Day day_of(Timestamp t) {
  return static_cast<Day>(t >= 0 ? t / 86400 : -((-t + 86399) / 86400));
}

inline Timestamp start_of(Day d) { return static_cast<Timestamp>(d) * 86400; }

// Years between two days (365.25-day years).
inline double years_between(Day from, Day to) { return (to - from) / 365.25; }

// ISO 8601 week of a day: year and week number (1..53).
struct IsoWeek {
  int year = 1970;
  int week = 1;
};
IsoWeek iso_week_of(Day d);

// 0 = Monday ... 6 = Sunday.
int weekday_of(Day d);

}  // namespace ferrum::analytics
