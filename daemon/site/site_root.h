// One deployment is one folder, the site root:
//   ROOT/ferrum.ini   configuration          ROOT/drop/PARTY/   where parties drop files
//   ROOT/work         files claimed for processing, one sub-folder per party
//                     (atomic rename from drop/)
//   ROOT/archive/YYYY/MM/  imported files     ROOT/quarantine/   rejected files
//   ROOT/reports/     PDFs (reports/YYYY-Www/ weekly bundles, reports/alerts/)
//   ROOT/ferrum.db    SQLite (WAL)          ROOT/log/ferrum.log rotating log
//   ROOT/ferrum.lock  held by the process that writes the root; holds
//                     "PID COMMAND" (e.g. "4242 serve") of that process
#pragma once

#include <filesystem>
#include <string>
#include <string_view>

namespace ferrum::site {

struct SiteRoot {
  std::filesystem::path root;

  std::filesystem::path config() const { return root / "ferrum.ini"; }
  std::filesystem::path drop() const { return root / "drop"; }
  std::filesystem::path work() const { return root / "work"; }
  std::filesystem::path archive() const { return root / "archive"; }
  std::filesystem::path quarantine() const { return root / "quarantine"; }
  std::filesystem::path reports() const { return root / "reports"; }
  std::filesystem::path alerts() const { return root / "reports" / "alerts"; }
  std::filesystem::path database() const { return root / "ferrum.db"; }
  std::filesystem::path log_dir() const { return root / "log"; }
  std::filesystem::path lock_file() const { return root / "ferrum.lock"; }
  std::filesystem::path status_file() const { return root / "status.json"; }
  std::filesystem::path tables() const { return root / "tables"; }
};

// The root from --root, else $FERRUM_ROOT, else the current folder; made absolute.
SiteRoot resolve_root(const std::string& option_value);

// Creates the folders (idempotent). Does not touch an existing ferrum.ini.
void create_layout(const SiteRoot& root);

// Who holds the root lock: its pid and its ferrum command ("serve",
// "ingest", ...; empty when the lock file names no command).
struct LockHolder {
  long pid = 0;  // 0: nobody holds the lock
  std::string command;
  bool is_daemon() const { return pid != 0 && (command.empty() || command == "serve"); }
};

// An exclusive advisory lock on ROOT/ferrum.lock (flock), held while the
// object lives. try_acquire returns false when another process holds it.
// The holder writes "PID COMMAND" into the lock file, so that `ferrum status`
// can tell the daemon from a `ferrum ingest` run.
class RootLock {
 public:
  RootLock() = default;
  ~RootLock();
  RootLock(const RootLock&) = delete;
  RootLock& operator=(const RootLock&) = delete;
  // `command` is the ferrum command taking the lock ("serve", "ingest"),
  // written beside the pid.
  bool try_acquire(const SiteRoot& root, std::string_view command = {});
  // Pid written in the lock file by its holder, or 0.
  static long holder_pid(const SiteRoot& root);
  // Pid and command written in the lock file by its holder; pid 0 when the
  // lock is free. A lock file of an older version (pid only) gives an empty
  // command, taken as the daemon.
  static LockHolder holder(const SiteRoot& root);

 private:
  int fd_ = -1;
};

}  // namespace ferrum::site
