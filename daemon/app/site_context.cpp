#include "daemon/app/site_context.h"

#include <Poco/Environment.h>

#include <chrono>
#include <stdexcept>

#include "analytics/calendar.h"
#include "daemon/app/logging.h"

namespace ferrum::app {

std::unique_ptr<SiteContext> open_site(const Invocation& inv, Access access) {
  auto s = std::make_unique<SiteContext>();
  s->root = site::resolve_root(inv.get("root"));
  if (!std::filesystem::exists(s->root.config()))
    throw std::runtime_error("no ferrum.ini in " + s->root.root.string() + ": run 'ferrum init --root " +
                             s->root.root.string() + "' first, or give --root");
  s->config = config::load_site_config(s->root.config().string());
  site::create_layout(s->root);
  init_site_logging(s->root.log_dir(), s->config.log_level, s->config.log_file_mb, s->config.log_files);
  if (access != Access::read) {
    s->lock = std::make_unique<site::RootLock>();
    if (!s->lock->try_acquire(s->root, inv.command)) {
      const long pid = site::RootLock::holder_pid(s->root);
      throw std::runtime_error("another ferrum process" + (pid ? " (pid " + std::to_string(pid) + ")" : std::string()) +
                               " is working on " + s->root.root.string() +
                               "; drop files into drop/PARTY/ and the running daemon takes them");
    }
  }
  s->store = open_store(s->root, s->config, access == Access::serve);
  return s;
}

std::unique_ptr<store::Store> open_store(const site::SiteRoot& root, const config::SiteConfig& config,
                                         bool wait_for_database) {
  if (!config.store.shared()) return store::open_sqlite_store(root.database().string());
  std::error_code ec;
  const auto path = std::filesystem::weakly_canonical(root.root, ec);
  const std::string name = Poco::Environment::nodeName() + ":" + (ec ? root.root : path).string();
  if (wait_for_database) return store::open_postgresql_store_when_reachable(config.store.postgresql, name);
  return store::open_postgresql_store(config.store.postgresql, name);
}

int today(const Invocation& inv, const config::SiteConfig& config) {
  if (inv.has("as-of")) {
    const std::string v = inv.get("as-of");
    int y = 0, m = 0, d = 0;
    if (std::sscanf(v.c_str(), "%4d-%2d-%2d", &y, &m, &d) != 3 || !analytics::is_valid_date(y, m, d) || v.size() != 10)
      throw std::runtime_error("--as-of: '" + v + "' is not a date YYYY-MM-DD");
    return analytics::days_from_civil(y, m, d);
  }
  const auto now = std::chrono::duration_cast<std::chrono::seconds>(
                       std::chrono::system_clock::now().time_since_epoch()).count();
  return analytics::day_of(now + config.utc_offset_minutes * 60LL);
}

}  // namespace ferrum::app
