// spdlog set-up: stderr (journald picks it up under systemd) and, when a site
// root is known, a size-rotated file ROOT/log/ferrum.log.
#pragma once

#include <filesystem>
#include <string>

namespace ferrum::app {

void init_stderr_logging(const std::string& level = "info");
void init_site_logging(const std::filesystem::path& log_dir, const std::string& level, int file_mb, int files);
void set_log_level(const std::string& level);

}  // namespace ferrum::app
