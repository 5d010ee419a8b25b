#include "daemon/config/store_config.h"

#include <Poco/String.h>
#include <Poco/StringTokenizer.h>

#include "daemon/config/site_config.h"
#include "schema/store.h"

namespace ferrum::config {

bool StoreSettings::serves_site(const std::string& site) const {
  if (serves.empty()) return true;
  for (const auto& s : serves)
    if (Poco::icompare(s, site) == 0) return true;
  return false;
}

const std::vector<StoreKey>& store_keys() {
  static const std::vector<StoreKey> k = {
      {"site", "serves", "*", true,
       "Substations (register column site) whose unit reports this root writes, comma-separated;\n"
       "* = every one. Several roots sharing one PostgreSQL database each serve their region."},
      {"store", "backend", "sqlite", false,
       "Where the register, measurements and assessments are kept: sqlite (ferrum.db in this root)\n"
       "or postgresql (one database several roots share; README, 'When one machine is not enough')."},
      {"store", "postgresql", "", false,
       "libpq connection string of the shared database, e.g. host=/var/run/postgresql dbname=ferrum user=ferrum.\n"
       "No password here: it comes from the libpq password file (~/.pgpass of the daemon's user)."},
      {"store", "keep_load_points_years", "", true,
       "Raw load points older than this many years are replaced by daily thermal summaries (peak hot spot,\n"
       "peak top oil, ageing consumed, hours above each limit); assessments read the summaries. Empty: keep all."},
  };
  return k;
}

void apply_store_key(StoreSettings& s, const StoreKey& key, const std::string& value) {
  const std::string name = key.name;
  if (name == "serves") {
    s.serves.clear();
    Poco::StringTokenizer tok(value, ",", Poco::StringTokenizer::TOK_TRIM | Poco::StringTokenizer::TOK_IGNORE_EMPTY);
    for (const auto& t : tok) {
      if (t == "*") {
        if (tok.count() > 1) throw ConfigError("site.serves: '*' stands alone (every substation)");
        return;
      }
      s.serves.push_back(t);
    }
    if (s.serves.empty()) throw ConfigError("site.serves: give substations, or * for every one");
  } else if (name == "backend") {
    const std::string b = Poco::toLower(value);
    if (b != "sqlite" && b != "postgresql")
      throw ConfigError("store.backend: '" + value + "' must be sqlite or postgresql");
    s.backend = b;
  } else if (name == "keep_load_points_years") {
    int years = 0;
    if (!value.empty()) {
      std::size_t used = 0;
      try {
        years = std::stoi(value, &used);
      } catch (const std::exception&) {
        used = 0;
      }
      if (used != value.size() || years < 1 || years > 100)
        throw ConfigError("store.keep_load_points_years: '" + value + "' must be a whole number of years, 1 to 100, or empty");
    }
    s.keep_load_points_years = years;
  } else if (name == "postgresql") {
    if (!value.empty()) {
      const std::string problem = store::postgresql_conninfo_problem(value);
      if (!problem.empty()) throw ConfigError("store.postgresql: " + problem);
    }
    s.postgresql = value;
  }
}

void check_store_settings(const StoreSettings& s) {
  if (s.backend == "postgresql" && s.postgresql.empty())
    throw ConfigError("store.backend is postgresql but store.postgresql (the connection string) is empty");
}

}  // namespace ferrum::config
