#include "daemon/assess/site_tables.h"

#include <spdlog/spdlog.h>

#include <algorithm>
#include <filesystem>
#include <fstream>
#include <sstream>

namespace ferrum::assess {
namespace fs = std::filesystem;

namespace {
constexpr std::uintmax_t kMaxTableBytes = 1 << 20;
}

std::vector<analytics::TableOverride> read_site_tables(const site::SiteRoot& root) {
  std::vector<analytics::TableOverride> out;
  std::error_code ec;
  if (!fs::is_directory(root.tables(), ec)) return out;
  for (const auto& entry : fs::directory_iterator(root.tables(), ec)) {
    const std::string name = entry.path().filename().string();
    if (name.empty() || name.front() == '.' || entry.path().extension() != ".csv") continue;
    analytics::TableOverride o{name, "tables/" + name, ""};
    std::error_code size_ec;
    if (!entry.is_regular_file(size_ec) || fs::file_size(entry.path(), size_ec) > kMaxTableBytes) {
      o.refused = "not a regular file of at most 1 MiB";
    } else {
      std::ifstream in(entry.path(), std::ios::binary);
      std::ostringstream text;
      text << in.rdbuf();
      o.text = text.str();
    }
    out.push_back(std::move(o));
  }
  std::sort(out.begin(), out.end(), [](const auto& a, const auto& b) { return a.file < b.file; });
  return out;
}

analytics::TableLoad load_site_tables(const site::SiteRoot& root) {
  analytics::TableLoad load = analytics::load_standard_tables(read_site_tables(root));
  for (const auto& r : load.refused)
    spdlog::warn("standard table {} refused, the embedded table stays in force: {}", r.shown,
                 r.error.line > 0 ? r.error.text() : r.error.message);
  for (const auto& info : load.tables->info)
    if (info.site_override) spdlog::debug("standard table {} {} from {} ({})", info.file, info.id, info.origin, info.status_text());
  analytics::install_standard_tables(load.tables);
  return load;
}

}  // namespace ferrum::assess
