// Site time: ferrum.ini [site] time_zone, an IANA zone name ("Europe/Berlin",
// default "UTC"), read from the system's compiled zone files
// (/usr/share/zoneinfo, RFC 8536 TZif). One function, site_timestamp(), gives
// every printed alert time (PDF, alerts.csv, mail), so they always agree.
#pragma once

#include <cstdint>
#include <memory>
#include <string>
#include <vector>

namespace ferrum::config {

class SiteTimeZone {
 public:
  // UTC.
  SiteTimeZone() = default;
  // Reads /usr/share/zoneinfo/NAME (or $TZDIR/NAME). Throws ConfigError for an
  // unknown or malformed zone, or a name that is not a plain zone path.
  static SiteTimeZone load(const std::string& name, const std::string& zoneinfo_dir = "");

  const std::string& name() const { return name_; }
  // Offset from UTC (seconds) and abbreviation ("CET") in force at a UTC time.
  // Past the zone file's last transition the last offset holds (Debian's
  // zone files list transitions to 2037).
  struct Local {
    std::int64_t offset_seconds = 0;
    std::string abbreviation = "UTC";
  };
  Local at(std::int64_t utc_seconds) const;

  bool operator==(const SiteTimeZone& o) const { return name_ == o.name_; }
  bool operator!=(const SiteTimeZone& o) const { return !(*this == o); }

 private:
  struct Type {
    std::int64_t offset = 0;
    std::string abbreviation;
  };
  std::string name_ = "UTC";
  std::vector<std::int64_t> transitions_;  // UTC seconds, increasing
  std::vector<unsigned char> type_of_;     // type index after each transition
  std::vector<Type> types_{{0, "UTC"}};
  std::size_t initial_type_ = 0;           // before the first transition
};

// "2026-11-30 07:10:05 CET (UTC+01:00)": the one timestamp of alerts in site
// time; in UTC itself "2026-11-30 06:10:05 UTC", without the offset.
std::string site_timestamp(std::int64_t utc_seconds, const SiteTimeZone& zone);
// The same for a time as the store keeps it ("2026-11-30T06:10:05Z", UTC, so
// that it sorts); anything else is returned as stored.
std::string site_timestamp_of_stored(const std::string& stored_utc, const SiteTimeZone& zone);

}  // namespace ferrum::config
