#include <spdlog/spdlog.h>

#include <iostream>

#include "daemon/app/commands_impl.h"
#include "daemon/app/site_context.h"
#include "daemon/watch/server.h"

namespace ferrum::app {

int cmd_serve(const Invocation& inv) {
  if (!inv.args.empty()) throw UsageError("serve takes no arguments");
  // Everything that can fail is checked here, before any thread starts, so
  // that a misconfigured daemon says why (stack-notes.md: after --daemon's
  // fork, start-up errors are invisible).
  auto site = open_site(inv, Access::write);
  watch::start_signal_thread();
  watch::ServerOptions options;
  options.once = inv.has("once");
  watch::Server server(site->root, site->config, std::move(site->store), options);
  return server.run();
}

}  // namespace ferrum::app
