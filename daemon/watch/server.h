// The daemon's main loop (`ferrum serve`).
//
// One thread does all the work, ticking every 200 ms:
//   1. files the DropWatcher says are complete go through the pipeline, in
//      arrival order per party; a failure that is not the file's fault (disk
//      full, database read-only) leaves the file in work/ and is retried with
//      back-off;
//   2. units changed by accepted files are re-assessed and their reports
//      re-rendered once no file touched them for the debounce time;
//      alerts are raised when an assessment turns worse;
//   3. the weekly bundle is produced when its time has come (also when the
//      daemon was down at that moment);
//   4. ROOT/status.json is rewritten (atomically) for `ferrum status`.
// Signals are taken by a dedicated thread with sigwait(): SIGTERM/SIGINT
// set the stop flag (the file in progress is finished or rolled back first),
// SIGHUP sets the reload flag. A handler never does work itself.
#pragma once

#include <atomic>
#include <chrono>
#include <map>
#include <memory>
#include <optional>
#include <set>
#include <string>

#include "daemon/config/site_config.h"
#include "daemon/site/site_root.h"
#include "schema/store.h"

namespace ferrum::watch {

struct ServerOptions {
  bool once = false;  // process what is waiting, render, exit (scripts and tests)
};

class Server {
 public:
  Server(site::SiteRoot root, config::SiteConfig config, std::unique_ptr<store::Store> store,
         ServerOptions options = {});
  ~Server();

  // Runs until stop is requested. Returns the exit code.
  int run();

  // Flags set by the signal thread (or tests).
  static std::atomic<bool> stop_requested;
  static std::atomic<bool> reload_requested;

 private:
  struct Impl;
  std::unique_ptr<Impl> impl_;
};

// Blocks SIGTERM, SIGINT, SIGHUP and SIGQUIT in the calling thread (call it
// before any other thread starts, so that all threads inherit the mask) and
// starts the thread that waits for them.
void start_signal_thread();

// Next weekly bundle moment (UTC seconds) strictly after `after`, for a
// weekday (0 = Monday) and minute of day in a fixed UTC offset.
std::int64_t next_weekly_time(std::int64_t after, int weekday, int minute_of_day, int utc_offset_minutes);

}  // namespace ferrum::watch
