// An opened site: its root, configuration, store and (for writers) the root
// lock. Commands open one at their start.
#pragma once

#include <memory>
#include <string>

#include "daemon/app/command_line.h"
#include "daemon/config/site_config.h"
#include "daemon/site/site_root.h"
#include "schema/store.h"

namespace ferrum::app {

struct SiteContext {
  site::SiteRoot root;
  config::SiteConfig config;
  std::unique_ptr<store::Store> store;
  std::unique_ptr<site::RootLock> lock;  // held by ingest and serve
};

// serve: write, and a shared database that cannot be reached yet is no
// error (the daemon starts, files wait in work/ until it is up).
enum class Access { read, write, serve };

// Opens the site named by --root (or $FERRUM_ROOT, or the current folder).
// With Access::write, takes the root lock and fails when another process
// (a running daemon) holds it. Logging goes to stderr and ROOT/log/.
// Throws std::runtime_error with a message for the user.
std::unique_ptr<SiteContext> open_site(const Invocation& inv, Access access);

// The site's store as ferrum.ini says: SQLite in ROOT/ferrum.db (default),
// or the shared PostgreSQL database, where this root is known by its host
// name and path ("host:/path"). `wait_for_database`: a PostgreSQL server
// that cannot be reached yet is connected to by the store's first call that
// finds it up (open_postgresql_store_when_reachable).
std::unique_ptr<store::Store> open_store(const site::SiteRoot& root, const config::SiteConfig& config,
                                         bool wait_for_database = false);

// Today as a day number: --as-of when given, else the clock, in the site's offset.
int today(const Invocation& inv, const config::SiteConfig& config);

}  // namespace ferrum::app
