// The bodies of the commands (one file each: cmd_*.cpp). Each returns the
// process exit code (command_line.h: ExitCode).
#pragma once

#include <stdexcept>

#include "daemon/app/command_line.h"

namespace ferrum::app {

// Wrong arguments: exit status 2 with the message.
class UsageError : public std::runtime_error {
 public:
  using std::runtime_error::runtime_error;
};

int cmd_init(const Invocation& inv);
int cmd_ingest(const Invocation& inv);
int cmd_check(const Invocation& inv);
int cmd_report(const Invocation& inv);
int cmd_serve(const Invocation& inv);
// Everything `serve` needs before it may fork into the background: the site
// root, its configuration, a compatible database, a free root lock and a
// writable pidfile folder. Throws std::runtime_error saying what is wrong.
void check_serve_can_start(const std::string& root, const std::string& pidfile);
int cmd_status(const Invocation& inv);
int cmd_assess(const Invocation& inv);
int cmd_rank(const Invocation& inv);
int cmd_dga(const Invocation& inv);
int cmd_thermal(const Invocation& inv);
int cmd_ratio(const Invocation& inv);
int cmd_tables(const Invocation& inv);
int cmd_send(const Invocation& inv);
int cmd_plan(const Invocation& inv);
int cmd_worklist(const Invocation& inv);

}  // namespace ferrum::app
