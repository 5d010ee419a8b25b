#include "analytics/calendar.h"

#include <cstdio>

namespace ferrum::analytics {

Day days_from_civil(int y, int m, int d) {
  y -= m <= 2;
  const int era = (y >= 0 ? y : y - 399) / 400;
  const unsigned yoe = static_cast<unsigned>(y - era * 400);
  const unsigned doy = (153u * static_cast<unsigned>(m + (m > 2 ? -3 : 9)) + 2) / 5 + static_cast<unsigned>(d) - 1;
  const unsigned doe = yoe * 365 + yoe / 4 - yoe / 100 + doy;
  return static_cast<Day>(era * 146097 + static_cast<int>(doe) - 719468);
}

CivilDate civil_from_days(Day z0) {
  int z = z0 + 719468;
  const int era = (z >= 0 ? z : z - 146096) / 146097;
  const unsigned doe = static_cast<unsigned>(z - era * 146097);
  const unsigned yoe = (doe - doe / 1460 + doe / 36524 - doe / 146096) / 365;
  const int y = static_cast<int>(yoe) + era * 400;
  const unsigned doy = doe - (365 * yoe + yoe / 4 - yoe / 100);
  const unsigned mp = (5 * doy + 2) / 153;
  const unsigned d = doy - (153 * mp + 2) / 5 + 1;
  const unsigned m = mp < 10 ? mp + 3 : mp - 9;
  return CivilDate{y + (m <= 2), static_cast<int>(m), static_cast<int>(d)};
}

bool is_valid_date(int y, int m, int d) {
  if (m < 1 || m > 12 || d < 1) return false;
  static const int kDays[] = {31, 28, 31, 30, 31, 30, 31, 31, 30, 31, 30, 31};
  const bool leap = (y % 4 == 0 && y % 100 != 0) || y % 400 == 0;
  const int max = (m == 2 && leap) ? 29 : kDays[m - 1];
  return d <= max;
}

std::string format_day(Day d) {
  const CivilDate c = civil_from_days(d);
  char buf[16];
  std::snprintf(buf, sizeof buf, "%04d-%02d-%02d", c.year, c.month, c.day);
  return buf;
}

std::string format_utc(Timestamp t) {
  const Day d = day_of(t);
  const CivilDate c = civil_from_days(d);
  const long long sod = t - start_of(d);  // 0 .. 86399
  char buf[40];
  std::snprintf(buf, sizeof buf, "%04d-%02d-%02dT%02lld:%02lld:%02lldZ", c.year, c.month, c.day, sod / 3600,
                (sod / 60) % 60, sod % 60);
  return buf;
}

int weekday_of(Day d) {
  // 1970-01-01 was a Thursday (index 3 with Monday = 0).
  const int w = (d + 3) % 7;
  return w < 0 ? w + 7 : w;
}

IsoWeek iso_week_of(Day d) {
  // The ISO year of a day is the year of the Thursday of its week.
  const Day thursday = d - weekday_of(d) + 3;
  const int year = civil_from_days(thursday).year;
  const Day jan1 = days_from_civil(year, 1, 1);
  return IsoWeek{year, (thursday - jan1) / 7 + 1};
}

}  // namespace ferrum::analytics
