// A ferrum.ini written to a temporary file and read with the real loader, for
// tests of configuration keys. Plumbing.
#pragma once

#include <unistd.h>

#include <filesystem>
#include <fstream>
#include <string>

#include "daemon/config/site_config.h"

namespace ferrum::testing {

// Loads `text` as a whole ferrum.ini; the file is removed whatever happens.
inline config::SiteConfig load_ini_text(const std::string& text, const std::string& tag = "ini") {
  namespace fs = std::filesystem;
  const fs::path p = fs::temp_directory_path() / ("ferrum-" + tag + "-" + std::to_string(::getpid()) + ".ini");
  std::ofstream(p) << text;
  try {
    auto c = config::load_site_config(p.string());
    fs::remove(p);
    return c;
  } catch (...) {
    fs::remove(p);
    throw;
  }
}

}  // namespace ferrum::testing
