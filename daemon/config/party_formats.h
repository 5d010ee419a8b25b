// A party's own export conventions, loaded with its [party.NAME] section:
//  * ROOT/columns/NAME.csv, its column map (ingest/header_map.h), when the
//    file exists;
//  * date_format: YYYY-MM-DD (default), DD/MM/YYYY, MM/DD/YYYY or
//    DD.MM.YYYY, optionally followed by HH:MM or HH:MM:SS;
//  * decimal: point, comma or auto (default: a comma in semicolon-separated
//    files, else a point).
// Any fault is a ConfigError naming the file and line or the key, so that a
// SIGHUP with a broken map keeps the configuration in force.
#pragma once

#include <filesystem>

#include <Poco/Util/AbstractConfiguration.h>

#include "daemon/config/site_config.h"

namespace ferrum::config {

// The formats of party `name`. Throws ConfigError.
PartyFormats load_party_formats(const Poco::Util::AbstractConfiguration& ini, const std::filesystem::path& columns_dir,
                                const std::string& name);

// True when both read files the same way (map, date format, decimal).
bool same_formats(const PartyFormats& a, const PartyFormats& b);

}  // namespace ferrum::config
