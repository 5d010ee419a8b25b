// The site's copies of the standard tables (ROOT/tables/*.csv): read,
// validated by analytics::load_standard_tables and installed for the
// analytics. A malformed or unknown file is refused (logged with line and
// column); the embedded table stays in force and nothing stops.
#pragma once

#include <string>
#include <vector>

#include "analytics/standard_tables.h"
#include "daemon/site/site_root.h"

namespace ferrum::assess {

// The overrides found in ROOT/tables/ (file names ending in .csv, sorted;
// other files and hidden files are left alone). Shown as "tables/NAME".
std::vector<analytics::TableOverride> read_site_tables(const site::SiteRoot& root);

// Reads, validates and installs the site's tables; logs each refusal.
// Returns the load (set in force and refusals).
analytics::TableLoad load_site_tables(const site::SiteRoot& root);

}  // namespace ferrum::assess
