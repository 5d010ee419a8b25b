// libFuzzer target: the site configuration reader (daemon/config/
// site_config.h load_site_config) on any file content.
//
// The contract: a usable file gives a SiteConfig, anything else throws
// ConfigError naming the line or key. Any other exception escaping (a Poco
// exception, std::out_of_range from a number conversion, ...) would stop the
// daemon on SIGHUP instead of keeping the old configuration, so it is a
// finding: it is not caught here and libFuzzer reports it as a crash.
#include <unistd.h>

#include <cstddef>
#include <cstdint>
#include <cstdio>
#include <cstdlib>
#include <fstream>
#include <string>

#include "daemon/config/site_config.h"

namespace {

// One file per process, rewritten for every input.
const std::string& scratch_path() {
  static const std::string path = [] {
    const char* dir = std::getenv("TMPDIR");
    return std::string(dir && *dir ? dir : "/tmp") + "/ferrum-fuzz-config-" + std::to_string(getpid()) + ".ini";
  }();
  return path;
}

struct RemoveAtExit {
  ~RemoveAtExit() { std::remove(scratch_path().c_str()); }
} remove_at_exit;

}  // namespace

extern "C" int LLVMFuzzerTestOneInput(const std::uint8_t* data, std::size_t size) {
  {
    std::ofstream out(scratch_path(), std::ios::binary | std::ios::trunc);
    out.write(reinterpret_cast<const char*>(data), static_cast<std::streamsize>(size));
    if (!out) std::abort();
  }
  try {
    const ferrum::config::SiteConfig c = ferrum::config::load_site_config(scratch_path());
    // A loaded configuration can be compared with the defaults (the SIGHUP
    // log line does this).
    (void)ferrum::config::describe_changes(ferrum::config::SiteConfig{}, c);
  } catch (const ferrum::config::ConfigError&) {
    // The documented outcome for a bad file.
  }
  return 0;
}
