#include "daemon/config/site_time.h"

#include <cctype>
#include <cstdio>
#include <cstdlib>
#include <fstream>
#include <iterator>

#include "analytics/calendar.h"
#include "daemon/config/site_config.h"

namespace ferrum::config {
namespace {

std::int64_t be(const unsigned char* p, int bytes) {
  std::uint64_t v = 0;
  for (int i = 0; i < bytes; ++i) v = (v << 8) | p[i];
  if (bytes == 4) return static_cast<std::int32_t>(static_cast<std::uint32_t>(v));
  return static_cast<std::int64_t>(v);
}

bool plain_zone_name(const std::string& n) {
  if (n.empty() || n.size() > 64 || n.front() == '/' || n.find("..") != std::string::npos) return false;
  for (char c : n)
    if (!(std::isalnum(static_cast<unsigned char>(c)) || c == '/' || c == '_' || c == '-' || c == '+')) return false;
  return true;
}

}  // namespace

SiteTimeZone SiteTimeZone::load(const std::string& name, const std::string& zoneinfo_dir) {
  SiteTimeZone z;
  if (name == "UTC" || name.empty()) return z;
  if (!plain_zone_name(name)) throw ConfigError("site.time_zone: '" + name + "' is not an IANA zone name");
  std::string dir = zoneinfo_dir;
  if (dir.empty()) dir = std::getenv("TZDIR") ? std::getenv("TZDIR") : "/usr/share/zoneinfo";
  std::ifstream in(dir + "/" + name, std::ios::binary);
  const std::vector<unsigned char> b((std::istreambuf_iterator<char>(in)), std::istreambuf_iterator<char>());
  auto bad = [&]() { return ConfigError("site.time_zone: '" + name + "' is not a known time zone (" + dir + ")"); };
  // RFC 8536: header "TZif", version, 15 reserved, six 32-bit counts.
  auto header_ok = [&](std::size_t at) { return b.size() >= at + 44 && b[at] == 'T' && b[at + 1] == 'Z' && b[at + 2] == 'i' && b[at + 3] == 'f'; };
  if (!header_ok(0)) throw bad();
  std::size_t at = 0;
  int time_bytes = 4;
  auto counts = [&](std::size_t h, std::int64_t c[6]) {
    for (int i = 0; i < 6; ++i) {
      c[i] = be(&b[h + 20 + 4 * i], 4);
      if (c[i] < 0 || c[i] > (1 << 20)) throw bad();  // a damaged file, not a zone
    }
  };
  std::int64_t c[6];  // isutcnt, isstdcnt, leapcnt, timecnt, typecnt, charcnt
  counts(0, c);
  if (b[4] >= '2') {  // skip the version 1 block to the 64-bit one
    const std::size_t v1 = 44 + c[3] * 5 + c[4] * 6 + c[5] + c[2] * 8 + c[1] + c[0];
    if (!header_ok(v1)) throw bad();
    at = v1;
    time_bytes = 8;
    counts(at, c);
  }
  const std::int64_t timecnt = c[3], typecnt = c[4], charcnt = c[5];
  std::size_t p = at + 44;
  if (typecnt < 1 || b.size() < p + timecnt * (time_bytes + 1) + typecnt * 6 + charcnt) throw bad();
  for (std::int64_t i = 0; i < timecnt; ++i, p += time_bytes) z.transitions_.push_back(be(&b[p], time_bytes));
  for (std::int64_t i = 0; i < timecnt; ++i, ++p) {
    if (b[p] >= typecnt) throw bad();
    z.type_of_.push_back(b[p]);
  }
  std::vector<std::pair<std::int64_t, std::size_t>> raw;  // offset, abbreviation index
  for (std::int64_t i = 0; i < typecnt; ++i, p += 6) raw.emplace_back(be(&b[p], 4), b[p + 5]);
  const std::string chars(b.begin() + static_cast<std::ptrdiff_t>(p), b.begin() + static_cast<std::ptrdiff_t>(p + charcnt));
  z.types_.clear();
  for (const auto& [off, ai] : raw) z.types_.push_back({off, ai < chars.size() ? std::string(chars.c_str() + ai) : ""});
  z.initial_type_ = 0;
  z.name_ = name;
  return z;
}

SiteTimeZone::Local SiteTimeZone::at(std::int64_t t) const {
  std::size_t type = initial_type_;
  // Last transition at or before t.
  std::size_t lo = 0, hi = transitions_.size();
  while (lo < hi) {
    const std::size_t mid = (lo + hi) / 2;
    if (transitions_[mid] <= t) lo = mid + 1;
    else hi = mid;
  }
  if (lo > 0) type = type_of_[lo - 1];
  return {types_[type].offset, types_[type].abbreviation};
}

std::string site_timestamp(std::int64_t utc_seconds, const SiteTimeZone& zone) {
  const auto local = zone.at(utc_seconds);
  const std::int64_t t = utc_seconds + local.offset_seconds;
  const analytics::Day day = analytics::day_of(t);
  const std::int64_t sod = t - static_cast<std::int64_t>(day) * 86400;
  char buf[96];
  const std::int64_t off = local.offset_seconds < 0 ? -local.offset_seconds : local.offset_seconds;
  std::snprintf(buf, sizeof buf, "%s %02d:%02d:%02d %s (UTC%c%02d:%02d)", analytics::format_day(day).c_str(),
                static_cast<int>(sod / 3600), static_cast<int>(sod / 60 % 60), static_cast<int>(sod % 60),
                local.abbreviation.c_str(), local.offset_seconds < 0 ? '-' : '+', static_cast<int>(off / 3600),
                static_cast<int>(off / 60 % 60));
  std::string out = buf;
  // "UTC (UTC+00:00)" says one thing twice: the offset only for other zones.
  if (local.offset_seconds == 0 && local.abbreviation == "UTC") out.resize(out.find(" ("));
  return out;
}

std::string site_timestamp_of_stored(const std::string& stored_utc, const SiteTimeZone& zone) {
  int y = 0, mo = 0, d = 0, h = 0, mi = 0, sec = 0;
  char z = 0;
  if (std::sscanf(stored_utc.c_str(), "%4d-%2d-%2dT%2d:%2d:%2d%c", &y, &mo, &d, &h, &mi, &sec, &z) != 7 || z != 'Z')
    return stored_utc;
  const std::int64_t t =
      static_cast<std::int64_t>(analytics::days_from_civil(y, mo, d)) * 86400 + h * 3600 + mi * 60 + sec;
  return site_timestamp(t, zone);
}

}  // namespace ferrum::config
