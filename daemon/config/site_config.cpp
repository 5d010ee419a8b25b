#include "daemon/config/site_config.h"

#include "daemon/config/party_formats.h"

#include <Poco/AutoPtr.h>
#include <Poco/Exception.h>
#include <Poco/String.h>
#include <Poco/StringTokenizer.h>
#include <Poco/Util/IniFileConfiguration.h>

#include <algorithm>
#include <cctype>
#include <filesystem>
#include <fstream>
#include <functional>
#include <sstream>

#include "daemon/config/plan_config.h"

namespace ferrum::config {
namespace {

enum class Type { text, integer, number, list };

// One configuration key. `apply` validates the text and stores it.
struct Key {
  const char* section;
  std::string name;
  Type type;
  const char* default_text;
  bool reloadable;  // SIGHUP may change it without a restart
  const char* comment;
  std::function<void(SiteConfig&, const std::string&)> apply;
};

long long parse_int(const std::string& key, const std::string& text, long long lo, long long hi) {
  std::size_t pos = 0;
  long long v = 0;
  try {
    v = std::stoll(text, &pos);
  } catch (const std::exception&) {
    throw ConfigError(key + ": '" + text + "' is not a whole number");
  }
  if (pos != text.size()) throw ConfigError(key + ": '" + text + "' is not a whole number");
  if (v < lo || v > hi)
    throw ConfigError(key + ": " + text + " is outside " + std::to_string(lo) + ".." + std::to_string(hi));
  return v;
}

double parse_number(const std::string& key, const std::string& text, double lo, double hi) {
  std::size_t pos = 0;
  double v = 0;
  try {
    v = std::stod(text, &pos);
  } catch (const std::exception&) {
    throw ConfigError(key + ": '" + text + "' is not a number");
  }
  if (pos != text.size() || !(v >= lo && v <= hi))
    throw ConfigError(key + ": '" + text + "' must be a number from " + std::to_string(lo) + " to " + std::to_string(hi));
  return v;
}

std::vector<std::string> split_list(const std::string& text) {
  std::vector<std::string> out;
  Poco::StringTokenizer tok(text, ",", Poco::StringTokenizer::TOK_TRIM | Poco::StringTokenizer::TOK_IGNORE_EMPTY);
  for (const auto& t : tok) out.push_back(Poco::toLower(t));
  return out;
}

const char* const kWeekdays[] = {"monday", "tuesday", "wednesday", "thursday", "friday", "saturday", "sunday"};
const char* const kHealthFactors[] = {"dga", "oil_quality", "paper", "thermal", "infrared", "inspection", "age",
                                      // electrical field tests (analytics/data/health_index_electrical.csv)
                                      "insulation_power_factor", "turns_ratio", "leakage_reactance",
                                      "winding_resistance", "bushings", "insulation_resistance"};

// [electrical]: the electrical field tests (issue 18).
void add_electrical_keys(std::vector<Key>& k) {
  k.push_back({"electrical", "reference_c", Type::number, "75", true,
               "Reference temperature of the winding-resistance correction, degC (IEEE C57.12.90 form).",
               [](SiteConfig& c, const std::string& v) { c.electrical_reference_c = parse_number("electrical.reference_c", v, 0, 200); }});
  k.push_back({"electrical", "pf_correction", Type::list, "", true,
               "Insulation power-factor correction factors K (PF20 = PF x K) by test temperature,\n"
               "as temp:K pairs from a table the site trusts, e.g. 15:1.1, 20:1.0, 25:0.9 (illustrative\n"
               "numbers, not a standard's table; ferrum ships none). Empty: only readings at 20 degC are judged.",
               [](SiteConfig& c, const std::string& v) {
                 c.pf_correction.clear();
                 for (const auto& part : split_list(v)) {
                   const auto colon = part.find(':');
                   if (colon == std::string::npos)
                     throw ConfigError("electrical.pf_correction: '" + part + "' must be temp:K");
                   const double t = parse_number("electrical.pf_correction", Poco::trim(part.substr(0, colon)), -40, 120);
                   const double f = parse_number("electrical.pf_correction", Poco::trim(part.substr(colon + 1)), 0.01, 100);
                   if (!c.pf_correction.empty() && !(t > c.pf_correction.back().first))
                     throw ConfigError("electrical.pf_correction: temperatures must be increasing");
                   c.pf_correction.emplace_back(t, f);
                 }
               }});
}

std::vector<Key> make_keys() {
  std::vector<Key> k;
  k.push_back({"site", "name", Type::text, "Unnamed utility", true, "Shown on every report.",
               [](SiteConfig& c, const std::string& v) { c.utility_name = v; }});
  k.push_back({"site", "utc_offset", Type::text, "+00:00", false,
               "UTC offset of times written without one in dropped files (e.g. +01:00). Reports state it.",
               [](SiteConfig& c, const std::string& v) {
                 c.utc_offset_minutes = parse_utc_offset(v);
                 c.utc_offset_text = v;
               }});
  k.push_back({"site", "time_zone", Type::text, "UTC", true,
               "IANA time zone of the site (e.g. Europe/Berlin): alert times are printed in it.",
               [](SiteConfig& c, const std::string& v) { c.time_zone = SiteTimeZone::load(v); }});
  k.push_back({"site", "paper", Type::text, "a4", true, "Report paper size: a4 or letter.",
               [](SiteConfig& c, const std::string& v) {
                 const std::string p = Poco::toLower(v);
                 if (p != "a4" && p != "letter") throw ConfigError("site.paper: '" + v + "' must be a4 or letter");
                 c.paper = p;
               }});
  for (const StoreKey& sk : store_keys())  // [site] serves, [store]: the shared database
    k.push_back({sk.section, sk.name, Type::text, sk.default_text, sk.reloadable, sk.comment,
                 [&sk](SiteConfig& c, const std::string& v) { apply_store_key(c.store, sk, v); }});
  k.push_back({"ingest", "settle_seconds", Type::integer, "5", true,
               "A copied file is taken once its size and time stopped changing for this long.\n"
               "Files renamed into place from a temporary name (.name, name.part, name.tmp) are taken at once.",
               [](SiteConfig& c, const std::string& v) { c.settle_seconds = static_cast<int>(parse_int("ingest.settle_seconds", v, 0, 3600)); }});
  k.push_back({"ingest", "rescan_seconds", Type::integer, "30", true,
               "Full rescan of the party folders, because file-system events can be lost.",
               [](SiteConfig& c, const std::string& v) { c.rescan_seconds = static_cast<int>(parse_int("ingest.rescan_seconds", v, 1, 86400)); }});
  k.push_back({"ingest", "max_file_mb", Type::integer, "2048", true,
               "Larger files are refused without being read.",
               [](SiteConfig& c, const std::string& v) { c.max_file_bytes = parse_int("ingest.max_file_mb", v, 1, 1 << 20) * 1024 * 1024; }});
  k.push_back({"ingest", "extra_inspection_items", Type::list, "", true,
               "Inspection items accepted in addition to the built-in vocabulary (comma-separated).",
               [](SiteConfig& c, const std::string& v) { c.extra_inspection_items = split_list(v); }});
  k.push_back({"schedule", "weekly_day", Type::text, "monday", true,
               "Weekday of the weekly report bundle (site time).",
               [](SiteConfig& c, const std::string& v) {
                 const std::string d = Poco::toLower(v);
                 for (int i = 0; i < 7; ++i)
                   if (d == kWeekdays[i]) { c.weekly_weekday = i; return; }
                 throw ConfigError("schedule.weekly_day: '" + v + "' is not a weekday name");
               }});
  k.push_back({"schedule", "weekly_time", Type::text, "06:00", true, "Time of day of the weekly bundle, HH:MM site time.",
               [](SiteConfig& c, const std::string& v) {
                 int h = -1, m = -1;
                 char colon = 0;
                 std::istringstream in(v);
                 in >> h >> colon >> m;
                 if (!in || colon != ':' || h < 0 || h > 23 || m < 0 || m > 59 || !in.eof())
                   throw ConfigError("schedule.weekly_time: '" + v + "' must be HH:MM");
                 c.weekly_minute_of_day = h * 60 + m;
               }});
  k.push_back({"schedule", "debounce_seconds", Type::integer, "10", true,
               "Unit reports are re-rendered this long after the last file that changed the unit.",
               [](SiteConfig& c, const std::string& v) { c.debounce_seconds = static_cast<int>(parse_int("schedule.debounce_seconds", v, 0, 86400)); }});
  k.push_back({"analysis", "thermal_method", Type::text, "iec60076_7", true,
               "Hot-spot model: iec60076_7 (difference equations) or ieee_c57_91 (clause 7 exponential).",
               [](SiteConfig& c, const std::string& v) {
                 const std::string m = Poco::toLower(v);
                 if (m != "iec60076_7" && m != "ieee_c57_91")
                   throw ConfigError("analysis.thermal_method: '" + v + "' must be iec60076_7 or ieee_c57_91");
                 c.thermal_method = m;
               }});
  k.push_back({"analysis", "inspection_interval_days", Type::integer, "365", true,
               "An inspection older than this is reported overdue.",
               [](SiteConfig& c, const std::string& v) {
                 c.inspection_interval_days = static_cast<int>(parse_int("analysis.inspection_interval_days", v, 1, 3650));
               }});
  k.push_back({"analysis", "measured_top_oil_above_k", Type::number, "5", true,
               "Measured top oil above the thermal model by more than this (K, mean): hot spot and ageing\n"
               "are taken from the measured top oil (IEC 60076-7:2018 allows it as input).",
               [](SiteConfig& c, const std::string& v) {
                 c.measured_top_oil_above_k = parse_number("analysis.measured_top_oil_above_k", v, 0, 50);
               }});
  k.push_back({"analysis", "site_wet_paper_pct", Type::number, "2.5", true,
               "Site view: a unit with more water in paper than this (%) takes no transferred load.",
               [](SiteConfig& c, const std::string& v) {
                 c.site_wet_paper_pct = parse_number("analysis.site_wet_paper_pct", v, 0, 20);
               }});
  k.push_back({"analysis", "infrared_resolution_k", Type::number, "1", true,
               "Infrared rises below this (K, the camera's resolution) are not corrected to rated load\n"
               "and give no finding.",
               [](SiteConfig& c, const std::string& v) {
                 c.infrared_resolution_k = parse_number("analysis.infrared_resolution_k", v, 0, 10);
               }});
  for (const char* f : kHealthFactors) {
    const std::string name = std::string("weight_") + f;
    k.push_back({"health", name, Type::number, "", true,
                 f == std::string("dga") ? "Health-index factor weights. Empty = the published default (README, 'Health index').\n"
                                           "A weight of 0 leaves the factor out."
                                         : "",
                 [f, name](SiteConfig& c, const std::string& v) {
                   if (v.empty()) return;
                   c.health_weights[f] = parse_number("health." + name, v, 0, 100);
                 }});
  }
  // Score bands of the health index: comma-separated cut points.
  struct BandKey {
    const char* name;
    std::size_t count;
    bool increasing;
    const char* comment;
  };
  static const BandKey kBands[] = {
      {"dga_cuts", 4, true, "Score bands (cut points, comma-separated). Empty = the published defaults (README).\n"
                            "Rating cuts A|B|C|D|E of the DGA factor DGAF, e.g. 1.2, 1.5, 2.0, 3.0."},
      {"oil_cuts", 4, true, "Rating cuts of the oil-quality factor, e.g. 1.2, 1.5, 2.0, 3.0."},
      {"furan_ppm_cuts", 4, true, "Rating cuts on 2-FAL in ppm, e.g. 0.1, 0.25, 0.5, 1.0."},
      {"dp_cuts", 4, false, "Rating cuts on DP (decreasing), e.g. 717, 603, 517, 431."},
      {"ageing_factor_cuts", 4, true, "Rating cuts on the equivalent ageing factor, e.g. 0.5, 1.0, 2.0, 4.0."},
      {"age_cuts", 4, true, "Rating cuts on age in years, e.g. 20, 35, 45, 55."},
      {"gas_h2", 5, true, "Per-gas score bands (ppm upper limits of scores 1..5), e.g. gas_h2 = 100, 200, 300, 500, 700."},
      {"gas_ch4", 5, true, ""},
      {"gas_c2h6", 5, true, ""},
      {"gas_c2h4", 5, true, ""},
      {"gas_c2h2", 5, true, ""},
      {"gas_co", 5, true, ""},
      {"gas_co2", 5, true, ""},
  };
  for (const auto& b : kBands) {
    const std::string name = b.name;
    const std::size_t count = b.count;
    const bool increasing = b.increasing;
    k.push_back({"health", name, Type::list, "", true, b.comment,
                 [name, count, increasing](SiteConfig& c, const std::string& v) {
                   if (v.empty()) return;
                   std::vector<double> cuts;
                   for (const auto& part : split_list(v)) cuts.push_back(parse_number("health." + name, part, -1e12, 1e12));
                   if (cuts.size() != count)
                     throw ConfigError("health." + name + ": give " + std::to_string(count) + " numbers");
                   for (std::size_t i = 1; i < cuts.size(); ++i)
                     if (increasing ? !(cuts[i] > cuts[i - 1]) : !(cuts[i] < cuts[i - 1]))
                       throw ConfigError("health." + name + ": the numbers must be " +
                                         (increasing ? "increasing" : "decreasing"));
                   c.health_bands[name] = cuts;
                 }});
  }
  struct RankingKey {
    const char* name;
    double lo, hi;
    const char* comment;
  };
  static const RankingKey kRanking[] = {
      {"pof_as_new", 0, 1, "Fleet ranking: probability of failure per year at health index 100 and at 0\n"
                           "(exponential in between). Empty = ferrum's defaults 0.002 and 0.2 (README)."},
      {"pof_at_zero", 0, 1, ""},
      {"weight_criticality", 0, 100, "Consequence = weighted criticality (1-5), customers served and rated MVA.\n"
                                     "Empty = defaults 0.5, 0.3, 0.2."},
      {"weight_customers", 0, 100, ""},
      {"weight_mva", 0, 100, ""},
      {"customers_reference", 1, 1e9, "Customers and MVA at which their part of the consequence reaches 1 (10000, 100)."},
      {"mva_reference", 1, 1e6, ""},
      {"life_horizon_years", 5, 200, "Remaining life beyond this many years is reported as \"more than N years\" (40)."},
      {"lead_time_months", 0, 120, "Procurement lead time of a replacement transformer: no replacement is planned\n"
                                   "sooner than this after the assessment day (24)."},
      {"replace_within_years", 0, 50, "Remaining life (end-of-life evidence only) at or below which a unit is replaced (5)."},
      {"planning_window_years", 0, 50, "A correctable defect leads to replacement only when the remaining life is\n"
                                       "within this window; a unit whose life ends within it is planned for replacement (10)."},
      {"expected_life_years", 10, 150, "Expected life of a transformer, for the age estimate of remaining life (60)."},
      {"wet_paper_pct", 1, 10, "Paper water content, %, at or above which the active part is dried out instead of\n"
                               "the oil being reconditioned (4, common practice)."},
      {"dry_out_min_dp", 100, 1000, "Paper DP below which drying out is not advised: too brittle (400)."},
  };
  for (const auto& r : kRanking) {
    const std::string name = r.name;
    const double lo = r.lo, hi = r.hi;
    k.push_back({"ranking", name, Type::number, "", true, r.comment, [name, lo, hi](SiteConfig& c, const std::string& v) {
                   if (v.empty()) return;
                   c.ranking[name] = parse_number("ranking." + name, v, lo, hi);
                 }});
  }
  add_electrical_keys(k);
  for (const PlanKey& p : plan_keys())  // [costs], [plan]: the budgeted plan
    k.push_back({p.section, p.name, Type::text, p.default_text, true, p.comment, [&p](SiteConfig& c, const std::string& v) {
                   check_plan_key(p, v);
                   (std::string(p.section) == "costs" ? c.costs : c.plan)[p.name] = v;
                 }});
  k.push_back({"log", "level", Type::text, "info", true, "trace, debug, info, warn, error.",
               [](SiteConfig& c, const std::string& v) {
                 const std::string l = Poco::toLower(v);
                 static const char* ok[] = {"trace", "debug", "info", "warn", "error", "critical", "off"};
                 if (std::find_if(std::begin(ok), std::end(ok), [&](const char* s) { return l == s; }) == std::end(ok))
                   throw ConfigError("log.level: '" + v + "' is not a log level");
                 c.log_level = l;
               }});
  k.push_back({"log", "file_mb", Type::integer, "10", false, "Size of one log file before it rotates.",
               [](SiteConfig& c, const std::string& v) { c.log_file_mb = static_cast<int>(parse_int("log.file_mb", v, 1, 1024)); }});
  k.push_back({"log", "files", Type::integer, "5", false, "Rotated log files kept.",
               [](SiteConfig& c, const std::string& v) { c.log_files = static_cast<int>(parse_int("log.files", v, 1, 100)); }});
  return k;
}

const std::vector<Key>& keys() {
  static const std::vector<Key> k = make_keys();
  return k;
}

std::string trim(const std::string& s) { return Poco::trim(s); }

// Checks the file's syntax line by line, so that an error names its line
// (Poco's reader silently accepts malformed lines).
void check_syntax(const std::string& path) {
  std::ifstream in(path);
  if (!in) throw ConfigError("cannot read " + path);
  std::string line;
  int n = 0;
  while (std::getline(in, line)) {
    ++n;
    const std::string t = trim(line);
    if (t.empty() || t[0] == ';' || t[0] == '#') continue;
    if (t[0] == '[') {
      if (t.back() != ']' || t.size() < 3)
        throw ConfigError(path + ":" + std::to_string(n) + ": a section header must look like [name]");
      continue;
    }
    const auto eq = t.find('=');
    if (eq == std::string::npos || trim(t.substr(0, eq)).empty())
      throw ConfigError(path + ":" + std::to_string(n) + ": expected 'key = value', found '" + t + "'");
  }
}

void load_party(const Poco::Util::AbstractConfiguration& ini, const std::string& name, SiteConfig& c,
                const std::string& path) {
  if (name.empty() || name.find_first_of("/\\.") != std::string::npos || name == "receipts")
    throw ConfigError("party." + name + ": a party name must be a plain folder name");
  Party p;
  p.name = name;
  Poco::Util::AbstractConfiguration::Keys ks;
  ini.keys("party." + name, ks);
  for (const auto& k : ks)
    if (k != "kinds" && k != "sites" && k != "date_format" && k != "decimal")
      throw ConfigError("party." + name + "." + k + ": unknown key (kinds, sites, date_format, decimal)");
  for (const auto& kind : split_list(ini.getString("party." + name + ".kinds", ""))) {
    const auto& all = file_kind_names();
    if (kind == "*") {
      p.kinds.insert(all.begin(), all.end());
      continue;
    }
    if (std::find(all.begin(), all.end(), kind) == all.end())
      throw ConfigError("party." + name + ".kinds: '" + kind + "' is not a file kind");
    p.kinds.insert(kind);
  }
  if (p.kinds.empty()) throw ConfigError("party." + name + ".kinds: list at least one file kind");
  for (const auto& s : split_list(ini.getString("party." + name + ".sites", "*"))) p.sites.insert(s);
  c.party_formats[name] = load_party_formats(ini, std::filesystem::path(path).parent_path() / "columns", name);
  c.parties[name] = std::move(p);
}

}  // namespace

const std::vector<std::string>& file_kind_names() {
  static const std::vector<std::string> k = {"units_register", "oil_lab",    "infrared",        "load_series",
                                             "inspection",     "electrical_tests", "work_status"};
  return k;
}

long long parse_whole_number(const std::string& key, const std::string& text, long long lo, long long hi) {
  return parse_int(key, text, lo, hi);
}

std::vector<std::string> parse_list(const std::string& text) { return split_list(text); }

int parse_utc_offset(const std::string& text) {
  const std::string t = Poco::toUpper(trim(text));
  if (t == "Z" || t == "UTC" || t == "+00:00" || t == "-00:00") return 0;
  if (t.size() == 6 && (t[0] == '+' || t[0] == '-') && t[3] == ':' && std::isdigit(t[1]) && std::isdigit(t[2]) &&
      std::isdigit(t[4]) && std::isdigit(t[5])) {
    const int h = (t[1] - '0') * 10 + (t[2] - '0');
    const int m = (t[4] - '0') * 10 + (t[5] - '0');
    if (h <= 14 && m < 60) return (t[0] == '-' ? -1 : 1) * (h * 60 + m);
  }
  throw ConfigError("site.utc_offset: '" + text + "' must look like +01:00 or -05:30");
}

SiteConfig load_site_config(const std::string& path) {
  check_syntax(path);
  Poco::AutoPtr<Poco::Util::IniFileConfiguration> ini;
  try {
    ini = new Poco::Util::IniFileConfiguration(path);
  } catch (const Poco::Exception& e) {
    throw ConfigError("cannot read " + path + ": " + e.displayText());
  }
  SiteConfig c;
  // Every key: the file's value, else the default.
  for (const Key& k : keys()) {
    const std::string full = std::string(k.section) + "." + k.name;
    const std::string value = trim(ini->getString(full, k.default_text));
    k.apply(c, value);
  }
  // Unknown sections and keys are errors: a typo must not silently fall back
  // to a default.
  Poco::Util::AbstractConfiguration::Keys sections;
  ini->keys(sections);
  for (const auto& s : sections) {
    if (s == "party") {
      Poco::Util::AbstractConfiguration::Keys names;
      ini->keys("party", names);
      for (const auto& n : names) load_party(*ini, n, c, path);
      continue;
    }
    if (s == "mail" || s == "recipients") continue;  // load_mail_settings
    Poco::Util::AbstractConfiguration::Keys ks;
    ini->keys(s, ks);
    bool known_section = false;
    for (const Key& k : keys()) known_section |= s == k.section;
    if (!known_section) throw ConfigError(path + ": unknown section [" + s + "]");
    for (const auto& name : ks) {
      bool found = false;
      for (const Key& k : keys()) found |= s == k.section && name == k.name;
      if (!found) throw ConfigError(path + ": unknown key " + s + "." + name);
    }
  }
  check_store_settings(c.store);
  if (c.parties.empty()) throw ConfigError(path + ": no [party.NAME] section: nobody may drop files");
  load_mail_settings(*ini, c);
  return c;
}

std::string default_site_config_text() {
  std::ostringstream o;
  o << "; ferrum site configuration.\n"
       "; Lines starting with ';' are comments. Every key is shown with its default.\n"
       "; After editing, send SIGHUP to the daemon (systemctl reload ferrum) or restart it;\n"
       "; keys marked (restart) need a restart.\n";
  std::string section;
  for (const Key& k : keys()) {
    if (section != k.section) {
      section = k.section;
      o << "\n[" << section << "]\n";
    }
    if (*k.comment) {
      std::istringstream lines(k.comment);
      std::string l;
      while (std::getline(lines, l)) o << "; " << l << "\n";
    }
    if (!k.reloadable) o << "; (restart)\n";
    o << k.name << " = " << k.default_text << "\n";
  }
  o << "\n; Parties: one section per party, named after its folder under drop/.\n"
       "; kinds: file kinds it may deliver (units_register, oil_lab, infrared, load_series,\n"
       ";        inspection, electrical_tests, work_status, or * for all); sites: sites it serves (* for all).\n"
       "; Optional: date_format (YYYY-MM-DD, DD/MM/YYYY, MM/DD/YYYY or DD.MM.YYYY, then\n"
       ";        optionally HH:MM[:SS]), decimal (point, comma or auto); the party's own\n"
       ";        column names are mapped in ROOT/columns/NAME.csv (their_column,ferrum_column).\n"
       "[party.planning]\n"
       "kinds = *\n"
       "sites = *\n";
  o << mail_config_sample();
  return o.str();
}

std::vector<std::string> describe_changes(const SiteConfig& a, const SiteConfig& b) {
  std::vector<std::string> out;
  auto cmp = [&](const char* name, const auto& x, const auto& y) {
    if (x != y) {
      std::ostringstream o;
      o << name << ": " << x << " -> " << y;
      out.push_back(o.str());
    }
  };
  cmp("site.name", a.utility_name, b.utility_name);
  cmp("site.utc_offset", a.utc_offset_text, b.utc_offset_text);
  cmp("site.paper", a.paper, b.paper);
  cmp("site.time_zone", a.time_zone.name(), b.time_zone.name());
  cmp("ingest.settle_seconds", a.settle_seconds, b.settle_seconds);
  cmp("ingest.rescan_seconds", a.rescan_seconds, b.rescan_seconds);
  cmp("ingest.max_file_bytes", a.max_file_bytes, b.max_file_bytes);
  cmp("schedule.weekly_weekday", a.weekly_weekday, b.weekly_weekday);
  cmp("schedule.weekly_minute_of_day", a.weekly_minute_of_day, b.weekly_minute_of_day);
  cmp("schedule.debounce_seconds", a.debounce_seconds, b.debounce_seconds);
  cmp("analysis.thermal_method", a.thermal_method, b.thermal_method);
  cmp("analysis.inspection_interval_days", a.inspection_interval_days, b.inspection_interval_days);
  cmp("analysis.measured_top_oil_above_k", a.measured_top_oil_above_k, b.measured_top_oil_above_k);
  cmp("analysis.site_wet_paper_pct", a.site_wet_paper_pct, b.site_wet_paper_pct);
  cmp("analysis.infrared_resolution_k", a.infrared_resolution_k, b.infrared_resolution_k);
  cmp("log.level", a.log_level, b.log_level);
  if (a.health_weights != b.health_weights) out.push_back("health weights changed");
  if (a.ranking != b.ranking) out.push_back("ranking settings changed");
  if (a.mail != b.mail) out.push_back("mail settings changed");
  if (a.recipients != b.recipients) out.push_back("mail recipients changed");
  if (a.costs != b.costs || a.plan != b.plan) out.push_back("costs or plan settings changed");
  if (a.health_bands != b.health_bands) out.push_back("health score bands changed");
  if (a.extra_inspection_items != b.extra_inspection_items) out.push_back("ingest.extra_inspection_items changed");
  for (const auto& [name, p] : b.parties) {
    auto it = a.parties.find(name);
    if (it == a.parties.end()) out.push_back("party " + name + " added");
    else if (it->second.kinds != p.kinds || it->second.sites != p.sites) out.push_back("party " + name + " changed");
    else if (!same_formats(a.formats_of(name), b.formats_of(name)))
      out.push_back("party " + name + " column map or formats changed");
  }
  for (const auto& [name, p] : a.parties)
    if (!b.parties.count(name)) out.push_back("party " + name + " removed");
  return out;
}

}  // namespace ferrum::config
