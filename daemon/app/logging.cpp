#include "daemon/app/logging.h"

#include <spdlog/sinks/rotating_file_sink.h>
#include <spdlog/sinks/stdout_sinks.h>
#include <spdlog/spdlog.h>

namespace ferrum::app {

void set_log_level(const std::string& level) { spdlog::set_level(spdlog::level::from_str(level)); }

void init_stderr_logging(const std::string& level) {
  auto logger = std::make_shared<spdlog::logger>("ferrum", std::make_shared<spdlog::sinks::stderr_sink_mt>());
  logger->set_pattern("%Y-%m-%dT%H:%M:%S%z %^%l%$ %v");
  spdlog::set_default_logger(logger);
  set_log_level(level);
}

void init_site_logging(const std::filesystem::path& log_dir, const std::string& level, int file_mb, int files) {
  std::filesystem::create_directories(log_dir);
  std::vector<spdlog::sink_ptr> sinks;
  sinks.push_back(std::make_shared<spdlog::sinks::stderr_sink_mt>());
  sinks.push_back(std::make_shared<spdlog::sinks::rotating_file_sink_mt>(
      (log_dir / "ferrum.log").string(), static_cast<std::size_t>(file_mb) * 1024 * 1024,
      static_cast<std::size_t>(files)));
  auto logger = std::make_shared<spdlog::logger>("ferrum", sinks.begin(), sinks.end());
  logger->set_pattern("%Y-%m-%dT%H:%M:%S%z %l %v");
  logger->flush_on(spdlog::level::info);
  spdlog::set_default_logger(logger);
  set_log_level(level);
}

}  // namespace ferrum::app
