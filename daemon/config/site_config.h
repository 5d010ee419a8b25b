// The site configuration, ROOT/ferrum.ini.
//
// Every key is declared once in a table (site_config.cpp: kKeys) with its
// type, default, bounds, whether SIGHUP may change it, and a comment; that
// one table drives loading, validation and the commented default file that
// `ferrum init` writes. Parties are sections of their own: [party.NAME].
#pragma once

#include <cctype>
#include <map>
#include <optional>
#include <set>
#include <stdexcept>
#include <string>
#include <utility>
#include <vector>

#include "daemon/config/mail_settings.h"
#include "daemon/config/site_time.h"
#include "daemon/config/store_config.h"
#include "daemon/ingest/field_parsers.h"
#include "daemon/ingest/header_map.h"

namespace ferrum::config {

// A configuration that cannot be used; the message names the key and why.
class ConfigError : public std::runtime_error {
 public:
  using std::runtime_error::runtime_error;
};

struct Party {
  std::string name;                 // folder name under drop/
  std::set<std::string> kinds;      // file kinds it may deliver
  std::set<std::string> sites;      // sites it serves; contains "*" for all
  bool may_deliver(const std::string& kind) const { return kinds.count(kind) > 0; }
  // Site names compare without regard to case.
  bool serves(const std::string& site) const {
    std::string lower = site;
    for (char& c : lower) c = static_cast<char>(std::tolower(static_cast<unsigned char>(c)));
    return sites.count("*") > 0 || sites.count(lower) > 0;
  }
};

// How a party's own exports are written (party_formats.h): its column map
// ROOT/columns/NAME.csv, and date_format and decimal in [party.NAME].
struct PartyFormats {
  ingest::HeaderMap columns;
  std::string date_format = "YYYY-MM-DD";  // as configured
  ingest::DateOrder date_order = ingest::DateOrder::iso;
  ingest::DecimalMark decimal = ingest::DecimalMark::automatic;
};

struct SiteConfig {
  // [site]
  std::string utility_name = "Unnamed utility";
  int utc_offset_minutes = 0;        // applied to times written without an offset
  std::string utc_offset_text = "+00:00";
  std::string paper = "a4";          // a4 or letter
  SiteTimeZone time_zone;            // [site] time_zone (IANA), alert times (site_time.h)
  // [ingest]
  int settle_seconds = 5;
  int rescan_seconds = 30;
  long long max_file_bytes = 2048LL * 1024 * 1024;
  std::vector<std::string> extra_inspection_items;
  // [schedule]
  int weekly_weekday = 0;            // 0 = Monday
  int weekly_minute_of_day = 6 * 60;
  int debounce_seconds = 10;
  // [analysis]
  std::string thermal_method = "iec60076_7";
  int inspection_interval_days = 365;
  double measured_top_oil_above_k = 5;  // K: hot spot from measured top oil above this discrepancy
  double site_wet_paper_pct = 2.5;       // %: site view, no transfer onto wetter paper
  double infrared_resolution_k = 1.0;  // rises below it: no load correction, no finding
  std::map<std::string, double> health_weights;  // factor name -> weight override
  std::map<std::string, std::vector<double>> health_bands;  // band key -> cut points override
  // [electrical]
  double electrical_reference_c = 75;                    // winding-resistance reference, degC
  std::vector<std::pair<double, double>> pf_correction;  // (test temperature degC, K), increasing
  // [ranking]
  std::map<std::string, double> ranking;         // key -> override of the ranking defaults
  // [costs], [plan]: checked text by key (daemon/config/plan_config.h)
  std::map<std::string, std::string> costs, plan;
  // [log]
  std::string log_level = "info";
  int log_file_mb = 10;
  int log_files = 5;
  // [party.*]
  std::map<std::string, Party> parties;
  // [mail], [recipients.*] (mail_settings.h)
  MailSettings mail;
  // [store], [site] serves (store_config.h)
  StoreSettings store;
  std::map<std::string, Recipient> recipients;

  // party name -> its formats (the defaults when it has none)
  std::map<std::string, PartyFormats> party_formats;

  const Party* party(const std::string& name) const {
    auto it = parties.find(name);
    return it == parties.end() ? nullptr : &it->second;
  }
  const PartyFormats& formats_of(const std::string& party) const {
    static const PartyFormats kDefaults;
    auto it = party_formats.find(party);
    return it == party_formats.end() ? kDefaults : it->second;
  }
};

// The six file kinds, by the names used in the configuration and receipts.
const std::vector<std::string>& file_kind_names();

// Reads and validates an ini file. Throws ConfigError naming the line or key.
SiteConfig load_site_config(const std::string& path);

// The commented default ferrum.ini that `ferrum init` writes.
std::string default_site_config_text();

// Human-readable list of the differences between two configurations
// (for the SIGHUP log line). Empty when equal.
std::vector<std::string> describe_changes(const SiteConfig& before, const SiteConfig& after);

// The value readers the key table uses, for the sections read elsewhere
// (mail_settings.cpp): a whole number within lo..hi, and a comma-separated
// list, trimmed and lower-cased. Throw ConfigError naming `key`.
long long parse_whole_number(const std::string& key, const std::string& text, long long lo, long long hi);
std::vector<std::string> parse_list(const std::string& text);

// Parses "+01:00", "-05:30", "Z", "UTC" into minutes. Throws ConfigError.
int parse_utc_offset(const std::string& text);

}  // namespace ferrum::config
