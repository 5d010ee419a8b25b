#include "daemon/ingest/field_parsers.h"

#include <array>
#include <charconv>
#include <optional>
#include <cmath>

namespace ferrum::ingest {

namespace {

using analytics::Day;
using analytics::LabValue;
using analytics::Timestamp;

char lower(char c) { return (c >= 'A' && c <= 'Z') ? static_cast<char>(c - 'A' + 'a') : c; }
char upper(char c) { return (c >= 'a' && c <= 'z') ? static_cast<char>(c - 'a' + 'A') : c; }
bool is_digit(char c) { return c >= '0' && c <= '9'; }

template <class T>
Parsed<T> failure(const char* why) {
  Parsed<T> p;
  p.error = why;
  return p;
}

template <class T>
Parsed<T> success(T value) {
  Parsed<T> p;
  p.value = std::move(value);
  return p;
}

// Reads exactly `n` digits at s[pos]; -1 when they are not all digits.
int read_digits(std::string_view s, std::size_t pos, std::size_t n) {
  if (pos + n > s.size()) return -1;
  int v = 0;
  for (std::size_t i = pos; i < pos + n; ++i) {
    if (!is_digit(s[i])) return -1;
    v = v * 10 + (s[i] - '0');
  }
  return v;
}

constexpr const char* kBadDate = "not a date: write dates as YYYY-MM-DD, e.g. 2026-03-14";
constexpr const char* kNoSuchDate = "no such calendar date (check month and day)";

// The date part of a date or timestamp: YYYY-MM-DD at the start of `s`.
Parsed<Day> parse_date_prefix(std::string_view s) {
  if (s.size() < 10 || s[4] != '-' || s[7] != '-') return failure<Day>(kBadDate);
  const int y = read_digits(s, 0, 4), m = read_digits(s, 5, 2), d = read_digits(s, 8, 2);
  if (y < 0 || m < 0 || d < 0) return failure<Day>(kBadDate);
  if (!analytics::is_valid_date(y, m, d)) {
    return failure<Day>(kNoSuchDate);
  }
  return success<Day>(analytics::days_from_civil(y, m, d));
}

// 'Z' or ±hh[:mm] / ±hhmm at the whole of `s`; minutes east of UTC.
Parsed<int> parse_offset(std::string_view s) {
  constexpr const char* kBad = "bad UTC offset: write Z, +02:00 or -05:00";
  if (s.size() == 1 && (s[0] == 'Z' || s[0] == 'z')) return success(0);
  if (s.empty() || (s[0] != '+' && s[0] != '-')) return failure<int>(kBad);
  const int sign = s[0] == '-' ? -1 : 1;
  const int h = read_digits(s, 1, 2);
  int m = 0;
  if (s.size() == 6 && s[3] == ':') {
    m = read_digits(s, 4, 2);
  } else if (s.size() == 5) {
    m = read_digits(s, 3, 2);
  } else if (s.size() != 3) {
    return failure<int>(kBad);
  }
  if (h < 0 || m < 0 || m > 59 || h * 60 + m > 14 * 60) return failure<int>(kBad);
  return success(sign * (h * 60 + m));
}

}  // namespace

std::string format_number(double v) {
  char buf[32];
  const auto [end, ec] = std::to_chars(buf, buf + sizeof buf, v, std::chars_format::general, 6);
  return ec == std::errc() ? std::string(buf, end) : std::string("?");
}

std::string_view trim(std::string_view text) {
  while (!text.empty() && (text.front() == ' ' || text.front() == '\t')) text.remove_prefix(1);
  while (!text.empty() && (text.back() == ' ' || text.back() == '\t')) text.remove_suffix(1);
  return text;
}

bool iequals(std::string_view a, std::string_view b) {
  if (a.size() != b.size()) return false;
  for (std::size_t i = 0; i < a.size(); ++i) {
    if (lower(a[i]) != lower(b[i])) return false;
  }
  return true;
}

namespace {

// Clinger's fast path: [-]digits[.digits] with at most 15 digits is an exact
// integer divided by an exact power of ten, and IEEE division rounds
// correctly, so the result is the same double from_chars gives, at a
// fraction of its cost. Anything else: nullopt (the general path decides).
std::optional<double> plain_decimal(std::string_view s, char point) {
  static constexpr double kPow10[] = {1e0, 1e1, 1e2, 1e3, 1e4, 1e5, 1e6, 1e7, 1e8,
                                      1e9, 1e10, 1e11, 1e12, 1e13, 1e14, 1e15};
  std::size_t i = 0;
  const bool negative = !s.empty() && s[0] == '-';
  if (negative) ++i;
  std::int64_t mantissa = 0;
  int digits = 0, fraction = -1;  // fraction: digits after the point, -1 before it
  for (; i < s.size(); ++i) {
    const char c = s[i];
    if (is_digit(c)) {
      if (++digits > 15) return std::nullopt;
      mantissa = mantissa * 10 + (c - '0');
      if (fraction >= 0) ++fraction;
    } else if (c == point && fraction < 0) {
      fraction = 0;
    } else {
      return std::nullopt;
    }
  }
  if (fraction == 0 || digits == 0 || (fraction < 0 ? digits : digits - fraction) == 0) return std::nullopt;
  const double v = static_cast<double>(mantissa) / kPow10[fraction < 0 ? 0 : fraction];
  return negative ? -v : v;
}

}  // namespace

Parsed<double> parse_number(std::string_view text, bool decimal_comma) {
  text = trim(text);
  if (text.empty()) return failure<double>("a number is needed here");
  if (const auto v = plain_decimal(text, decimal_comma ? ',' : '.')) return success(*v);
  std::array<char, 64> buf;  // only the first n bytes are used: no need to clear it per number
  if (text.size() >= buf.size()) return failure<double>("not a number");
  std::size_t n = 0, commas = 0, points = 0;
  for (std::size_t i = 0; i < text.size(); ++i) {
    char c = text[i];
    if (c == '+' && i == 0) continue;  // from_chars takes no leading '+'
    if (c == ',') {
      if (!decimal_comma) {
        return failure<double>("a comma is not a decimal separator in this file (comma-separated, or the party's decimal "
            "is point): use a point");
      }
      ++commas;
      c = '.';
    } else if (c == '.') {
      ++points;
    }
    buf[n++] = c;
  }
  if (commas + points > 1) {
    return failure<double>("not a number (write no thousands separators and one decimal separator)");
  }
  double v = 0;
  const auto [end, ec] = std::from_chars(buf.data(), buf.data() + n, v);
  if (ec != std::errc() || end != buf.data() + n || !std::isfinite(v)) {
    return failure<double>("not a number");
  }
  return success(v);
}

Parsed<std::int64_t> parse_integer(std::string_view text) {
  text = trim(text);
  if (!text.empty() && text.front() == '+') text.remove_prefix(1);
  std::int64_t v = 0;
  const auto [end, ec] = std::from_chars(text.data(), text.data() + text.size(), v);
  if (text.empty() || ec != std::errc() || end != text.data() + text.size()) {
    return failure<std::int64_t>("not a whole number");
  }
  return success(v);
}

namespace {

constexpr const char* kBadRegionalDate[] = {
    kBadDate,
    "not a date: this party writes dates as DD/MM/YYYY (e.g. 14/03/2026); YYYY-MM-DD is also accepted",
    "not a date: this party writes dates as MM/DD/YYYY (e.g. 03/14/2026); YYYY-MM-DD is also accepted",
    "not a date: this party writes dates as DD.MM.YYYY (e.g. 14.03.2026); YYYY-MM-DD is also accepted",
};

constexpr const char* kBadRegionalTime[] = {
    nullptr,
    "not a timestamp: this party writes DD/MM/YYYY hh:mm[:ss] (e.g. 14/03/2026 06:15), optionally "
    "followed by Z or +hh:mm; ISO 8601 (2026-03-14T06:15+01:00) is also accepted",
    "not a timestamp: this party writes MM/DD/YYYY hh:mm[:ss] (e.g. 03/14/2026 06:15), optionally "
    "followed by Z or +hh:mm; ISO 8601 (2026-03-14T06:15+01:00) is also accepted",
    "not a timestamp: this party writes DD.MM.YYYY hh:mm[:ss] (e.g. 14.03.2026 06:15), optionally "
    "followed by Z or +hh:mm; ISO 8601 (2026-03-14T06:15+01:00) is also accepted",
};

// One or two digits at s[pos]; advances pos. -1 when there is no digit.
int read_one_or_two(std::string_view s, std::size_t& pos) {
  if (pos >= s.size() || !is_digit(s[pos])) return -1;
  int v = s[pos++] - '0';
  if (pos < s.size() && is_digit(s[pos])) v = v * 10 + (s[pos++] - '0');
  return v;
}

// A regional date (order != iso) at the start of `s`; `end` is set past it.
Parsed<Day> parse_regional_prefix(std::string_view s, DateOrder order, std::size_t& end) {
  const char* bad = kBadRegionalDate[static_cast<int>(order)];
  const char sep = order == DateOrder::dmy_dot ? '.' : '/';
  std::size_t pos = 0;
  const int a = read_one_or_two(s, pos);
  if (a < 0 || pos >= s.size() || s[pos++] != sep) return failure<Day>(bad);
  const int b = read_one_or_two(s, pos);
  if (b < 0 || pos >= s.size() || s[pos++] != sep) return failure<Day>(bad);
  const int y = read_digits(s, pos, 4);
  if (y < 0 || (pos + 4 < s.size() && is_digit(s[pos + 4]))) return failure<Day>(bad);
  end = pos + 4;
  const int d = order == DateOrder::mdy_slash ? b : a;
  const int m = order == DateOrder::mdy_slash ? a : b;
  if (!analytics::is_valid_date(y, m, d)) return failure<Day>(kNoSuchDate);
  return success<Day>(analytics::days_from_civil(y, m, d));
}

// h:mm or hh:mm, optional :ss and a fraction (dropped), at s[pos]; advances
// pos. False when the text is not a clock time.
bool read_clock(std::string_view s, std::size_t& pos, int& h, int& mi, int& sec) {
  h = read_one_or_two(s, pos);
  if (h < 0 || pos >= s.size() || s[pos++] != ':') return false;
  mi = read_digits(s, pos, 2);
  if (mi < 0) return false;
  pos += 2;
  sec = 0;
  if (pos < s.size() && s[pos] == ':') {
    sec = read_digits(s, pos + 1, 2);
    if (sec < 0) return false;
    pos += 3;
    if (pos < s.size() && (s[pos] == '.' || s[pos] == ',')) {
      const std::size_t start = ++pos;
      while (pos < s.size() && is_digit(s[pos])) ++pos;
      if (pos == start) return false;
    }
  }
  return true;
}

constexpr const char* kNoSuchTime = "no such time of day (hh 00-23, mm and ss 00-59)";

}  // namespace

bool parse_date_format(std::string_view text, DateOrder& order, bool& with_time) {
  std::string u;
  for (char c : trim(text)) u += upper(c);
  with_time = false;
  for (std::string_view time : {" HH:MM:SS", " HH:MM"}) {
    if (u.size() > time.size() && std::string_view(u).ends_with(time)) {
      u.resize(u.size() - time.size());
      with_time = true;
      break;
    }
  }
  for (DateOrder o : {DateOrder::iso, DateOrder::dmy_slash, DateOrder::mdy_slash, DateOrder::dmy_dot}) {
    if (u == date_format_name(o)) {
      order = o;
      return true;
    }
  }
  return false;
}

bool parse_decimal_mark(std::string_view text, DecimalMark& mark) {
  text = trim(text);
  if (iequals(text, "auto")) mark = DecimalMark::automatic;
  else if (iequals(text, "point")) mark = DecimalMark::point;
  else if (iequals(text, "comma")) mark = DecimalMark::comma;
  else return false;
  return true;
}

const char* date_format_name(DateOrder order) {
  switch (order) {
    case DateOrder::iso: return "YYYY-MM-DD";
    case DateOrder::dmy_slash: return "DD/MM/YYYY";
    case DateOrder::mdy_slash: return "MM/DD/YYYY";
    case DateOrder::dmy_dot: return "DD.MM.YYYY";
  }
  return "YYYY-MM-DD";
}

Parsed<Day> parse_date(std::string_view text, DateOrder order) {
  text = trim(text);
  if (text.size() == 10 && text[4] == '-') return parse_date_prefix(text);
  if (order == DateOrder::iso) return failure<Day>(kBadDate);
  std::size_t end = 0;
  const Parsed<Day> day = parse_regional_prefix(text, order, end);
  if (!day.ok() || end == text.size()) return day;
  // A time of day after the date: checked, then ignored by a date column.
  std::size_t pos = end + 1;
  int h = 0, mi = 0, sec = 0;
  if ((text[end] != ' ' && text[end] != 'T') || !read_clock(text, pos, h, mi, sec) || pos != text.size()) {
    return failure<Day>(kBadRegionalDate[static_cast<int>(order)]);
  }
  if (h > 23 || mi > 59 || sec > 59) return failure<Day>(kNoSuchTime);
  return day;
}

Parsed<TimeValue> parse_timestamp(std::string_view text, int site_utc_offset_min, DateOrder order) {
  constexpr const char* kBadIso =
      "not a timestamp: write YYYY-MM-DDThh:mm[:ss] with optional Z or +hh:mm, e.g. "
      "2026-03-14T06:15+01:00";
  const char* kBad = order == DateOrder::iso ? kBadIso : kBadRegionalTime[static_cast<int>(order)];
  text = trim(text);
  const bool iso = text.size() >= 10 && text[4] == '-';
  std::size_t end = 10;
  const Parsed<Day> day = iso || order == DateOrder::iso ? parse_date_prefix(text)
                                                         : parse_regional_prefix(text, order, end);
  if (!day.ok()) return failure<TimeValue>(day.error == kNoSuchDate ? day.error : kBad);
  if (text.size() <= end + 1 || (text[end] != 'T' && text[end] != 't' && text[end] != ' ')) {
    return failure<TimeValue>(kBad);
  }
  std::size_t pos = end + 1;
  int h = 0, mi = 0, s = 0;
  // ISO 8601 wants two-digit hours; a regional format takes 6:15 too.
  if ((iso && (text.size() < end + 3 || !is_digit(text[end + 2]))) || !read_clock(text, pos, h, mi, s)) {
    return failure<TimeValue>(kBad);
  }
  if (h > 23 || mi > 59 || s > 59) return failure<TimeValue>(kNoSuchTime);
  TimeValue out;
  std::string_view zone = trim(text.substr(pos));
  int offset = site_utc_offset_min;
  if (zone.empty()) {
    out.offset_assumed = true;
  } else {
    const Parsed<int> z = parse_offset(zone);
    if (!z.ok()) return failure<TimeValue>(z.error);
    offset = z.value;
  }
  out.utc = analytics::start_of(day.value) + h * 3600 + mi * 60 + s -
            static_cast<Timestamp>(offset) * 60;
  return success(out);
}

Parsed<LabValue> parse_lab_value(std::string_view text, bool decimal_comma) {
  text = trim(text);
  if (text.empty()) return success(LabValue{});
  if (iequals(text, "ND")) return success(LabValue::below());
  if (text.front() == '<') {
    const std::string_view limit = trim(text.substr(1));
    if (iequals(limit, "ND")) return success(LabValue::below());
    const Parsed<double> v = parse_number(limit, decimal_comma);
    if (!v.ok()) return failure<LabValue>("not a lab value: write a number, <limit (e.g. <5) or ND");
    if (v.value < 0) return failure<LabValue>("a detection limit cannot be negative");
    return success(LabValue::below(v.value));
  }
  const Parsed<double> v = parse_number(text, decimal_comma);
  if (!v.ok()) return failure<LabValue>(v.error);
  return success(LabValue::measured(v.value));
}

std::string to_snake_case(std::string_view text) {
  std::string out;
  out.reserve(text.size());
  for (char c : text) {
    if (c == ' ' || c == '-' || c == '_' || c == '\t') {
      if (!out.empty() && out.back() != '_') out += '_';
    } else {
      out += lower(c);
    }
  }
  while (!out.empty() && out.back() == '_') out.pop_back();
  return out;
}

Parsed<std::string> parse_cooling(std::string_view text) {
  constexpr const char* kBad =
      "unknown cooling class: write an IEC 60076-2 code such as ONAN, ONAF, OFAF, ODAF, OFWF, "
      "ODWF or a combined rating such as ONAN/ONAF";
  std::string best;
  int best_rank = -1;
  std::string stage;
  const auto take_stage = [&]() -> bool {
    static constexpr std::string_view kInternal = "NFD", kExternal = "NF";
    if (stage.size() != 4 || std::string_view("OKL").find(stage[0]) == std::string_view::npos ||
        kInternal.find(stage[1]) == std::string_view::npos ||
        (stage[2] != 'A' && stage[2] != 'W') || kExternal.find(stage[3]) == std::string_view::npos) {
      return false;
    }
    // More forced internal circulation ranks above more forced external cooling.
    const int rank = static_cast<int>(kInternal.find(stage[1]) * 2 + kExternal.find(stage[3]));
    if (rank >= best_rank) {
      best_rank = rank;
      best = stage;
    }
    stage.clear();
    return true;
  };
  for (char c : trim(text)) {
    if (c == ' ') continue;
    if (c == '/') {
      if (!take_stage()) return failure<std::string>(kBad);
    } else {
      stage += upper(c);
    }
  }
  if (!take_stage()) return failure<std::string>(kBad);
  return success(best);
}

Parsed<std::string> parse_vector_group(std::string_view text) {
  constexpr const char* kBad =
      "not a vector group: write HV letters (D, Y, YN, Z, ZN) then LV letters with a clock "
      "number 0-11, e.g. Dyn11 or YNd1";
  std::string u;
  for (char c : trim(text)) {
    if (c != ' ') u += upper(c);
  }
  std::string out;
  std::size_t i = 0;
  const auto take_letters = [&](bool high_voltage) -> bool {
    if (i >= u.size()) return false;
    const char c = u[i];
    const std::string_view allowed = high_voltage ? "DYZI" : "DYZAI";
    if (allowed.find(c) == std::string_view::npos) return false;
    out += high_voltage ? c : lower(c);
    ++i;
    if ((c == 'Y' || c == 'Z') && i < u.size() && u[i] == 'N') {
      out += high_voltage ? 'N' : 'n';
      ++i;
    }
    return true;
  };
  if (!take_letters(true)) return failure<std::string>(kBad);
  int groups = 0;
  while (i < u.size()) {
    if (!take_letters(false)) return failure<std::string>(kBad);
    const std::size_t start = i;
    int clock = 0;
    while (i < u.size() && is_digit(u[i]) && i - start < 2) clock = clock * 10 + (u[i++] - '0');
    if (i == start || clock > 11) return failure<std::string>(kBad);
    out += std::to_string(clock);
    ++groups;
  }
  if (groups == 0) return failure<std::string>(kBad);
  return success(out);
}

Parsed<std::string> parse_breakdown_method(std::string_view text) {
  std::string s;
  for (char c : text) {
    if (is_digit(c) || (lower(c) >= 'a' && lower(c) <= 'z') || c == '.') s += lower(c);
  }
  if (const auto at = s.find("d1816"); at != std::string::npos) {
    const std::string_view gap = std::string_view(s).substr(at + 5);
    const auto has = [&](std::string_view g) { return gap.find(g) != std::string_view::npos; };
    if (has("2mm") || has("2.0mm") || has("0.08in")) return success<std::string>("ASTM D1816 2 mm");
    if (has("1mm") || has("1.0mm") || has("0.04in")) return success<std::string>("ASTM D1816 1 mm");
    return failure<std::string>(
        "ASTM D1816 needs its gap: write ASTM D1816 1 mm or ASTM D1816 2 mm");
  }
  if (s.find("d877") != std::string::npos) return success<std::string>("ASTM D877");
  if (s.find("60156") != std::string::npos) return success<std::string>("IEC 60156");
  return failure<std::string>(
      "unknown breakdown test method: use ASTM D1816 1 mm, ASTM D1816 2 mm, ASTM D877 or "
      "IEC 60156");
}

}  // namespace ferrum::ingest
