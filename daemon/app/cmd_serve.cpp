#include <spdlog/spdlog.h>
#include <unistd.h>

#include <filesystem>
#include <iostream>

#include "daemon/app/commands_impl.h"
#include "daemon/app/site_context.h"
#include "daemon/site/atomic_file.h"
#include "daemon/watch/server.h"

namespace ferrum::app {

namespace {

// The pidfile is written only once the root lock is held (a second daemon,
// refused, must not overwrite the first one's pidfile) and removed on exit.
class PidFile {
 public:
  explicit PidFile(std::string path) : path_(std::move(path)) {
    if (!path_.empty()) site::write_file_atomically(path_, std::to_string(::getpid()) + "\n");
  }
  ~PidFile() {
    std::error_code ec;
    if (!path_.empty()) std::filesystem::remove(path_, ec);
  }
  PidFile(const PidFile&) = delete;
  PidFile& operator=(const PidFile&) = delete;

 private:
  std::string path_;
};

}  // namespace

void check_serve_can_start(const std::string& root_option, const std::string& pidfile) {
  const site::SiteRoot root = site::resolve_root(root_option);
  if (!std::filesystem::exists(root.config()))
    throw std::runtime_error("no ferrum.ini in " + root.root.string() + ": run 'ferrum init --root " +
                             root.root.string() + "' first, or give --root");
  config::load_site_config(root.config().string());  // throws ConfigError
  {
    site::RootLock lock;
    if (!lock.try_acquire(root, "serve")) {
      const long pid = site::RootLock::holder_pid(root);
      throw std::runtime_error("another ferrum process" + (pid ? " (pid " + std::to_string(pid) + ")" : std::string()) +
                               " is working on " + root.root.string());
    }
    // Throws IncompatibleStore (a database that is up but not ours); a shared
    // database that is down is no reason not to start. Closed again at once.
    open_store(root, config::load_site_config(root.config().string()), true);
  }
  if (!pidfile.empty()) {
    const auto dir = std::filesystem::path(pidfile).parent_path();
    if (::access(dir.empty() ? "." : dir.c_str(), W_OK) != 0)
      throw std::runtime_error("cannot write the pidfile " + pidfile + ": its folder is not writable");
  }
}

int cmd_serve(const Invocation& inv) {
  if (!inv.args.empty()) throw UsageError("serve takes no arguments");
  // Everything that can fail is checked here, before any thread starts, so
  // that a misconfigured daemon says why (with --daemon, FerrumApp::run has
  // checked it once more before forking: docs/implementation-notes.md).
  auto site = open_site(inv, Access::serve);
  PidFile pidfile(inv.get("pidfile"));
  watch::start_signal_thread();
  watch::ServerOptions options;
  options.once = inv.has("once");
  watch::Server server(site->root, site->config, std::move(site->store), options);
  return server.run();
}

}  // namespace ferrum::app
