// The [store] keys of ferrum.ini and [site] serves (issue 23: a shared
// PostgreSQL store for several daemons). Declared here, in their own table,
// and added to the site configuration's key table by site_config.cpp.
#pragma once

#include <string>
#include <vector>

namespace ferrum::config {

struct StoreSettings {
  std::string backend = "sqlite";  // sqlite or postgresql
  std::string postgresql;          // libpq connection string, no password
  // [site] serves: the substations whose unit reports this root writes;
  // empty = every one ("*").
  std::vector<std::string> serves;
  // [store] keep_load_points_years: raw load points older than this many
  // years are replaced by daily thermal summaries; 0 = keep them all.
  int keep_load_points_years = 0;

  bool shared() const { return backend == "postgresql"; }
  // True when this root writes the unit reports of units at `site`.
  bool serves_site(const std::string& site) const;
};

struct StoreKey {
  const char* section;
  const char* name;
  const char* default_text;
  bool reloadable;
  const char* comment;
};

const std::vector<StoreKey>& store_keys();

// Checks and stores one key's text; throws ConfigError naming section.key.
void apply_store_key(StoreSettings& s, const StoreKey& key, const std::string& value);

// What no single key can check: postgresql given when the backend is
// postgresql. Throws ConfigError.
void check_store_settings(const StoreSettings& s);

}  // namespace ferrum::config
