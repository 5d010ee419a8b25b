// Decides when a dropped file is complete and may be taken.
//
// Events come from one Poco::DirectoryWatcher per party folder (and one on
// drop/ itself). docs/implementation-notes.md says what that watcher does on Linux: ADDED
// fires at creation, long before the writer is done; a rename into place
// gives only MOVED_TO; nothing is reported for files present at start-up or
// lost on queue overflow; and a handler that throws kills its thread. So:
//   * handlers only push the path onto a locked queue and never throw;
//   * a file renamed into place (MOVED_TO) is ready at once;
//   * any other file is ready once its size and modification time stayed
//     the same for the settle time;
//   * rescan() (at start-up and every rescan interval) adds every file it
//     finds, so lost events only delay a file.
// Ready files come out per party in arrival order.
//
// Thread-safety: the watchers' threads call only the queue; every other
// member is called from the daemon's main loop.
#pragma once

#include <Poco/DirectoryWatcher.h>

#include <chrono>
#include <filesystem>
#include <map>
#include <memory>
#include <mutex>
#include <string>
#include <vector>

namespace ferrum::watch {

class DropWatcher {
 public:
  using SteadyClock = std::chrono::steady_clock;

  explicit DropWatcher(std::filesystem::path drop_dir);
  ~DropWatcher();

  // Watches drop/ and these party folders (creating them when missing).
  // Can be called again after a configuration reload.
  void watch(const std::vector<std::string>& parties);

  // Adds every file currently in the drop folders as a candidate.
  void rescan();

  // Candidates whose content has settled (or that arrived by rename), oldest
  // arrival first. They are forgotten once returned.
  std::vector<std::filesystem::path> take_ready(std::chrono::seconds settle, SteadyClock::time_point now);

  std::size_t pending() const { return candidates_.size(); }
  // Events seen since start (for tests and status).
  std::size_t events_seen() const;

 private:
  struct Candidate {
    std::uint64_t arrival = 0;       // order of first sight
    bool renamed_in = false;
    std::uintmax_t size = 0;
    std::filesystem::file_time_type mtime{};
    SteadyClock::time_point last_change{};
  };
  struct Event {
    std::filesystem::path path;
    bool renamed_in;
  };

  void on_event(const std::filesystem::path& p, bool renamed_in) noexcept;
  void drain_events(SteadyClock::time_point now);
  void add_candidate(const std::filesystem::path& p, bool renamed_in, SteadyClock::time_point now);
  void watch_one(const std::filesystem::path& dir);

  std::filesystem::path drop_;
  std::map<std::string, std::unique_ptr<Poco::DirectoryWatcher>> watchers_;
  // Handler objects: one per watcher, kept alive with it.
  struct Handlers;
  std::map<std::string, std::unique_ptr<Handlers>> handlers_;
  mutable std::mutex mutex_;
  std::vector<Event> events_;  // guarded by mutex_
  std::size_t events_seen_ = 0;  // guarded by mutex_
  std::map<std::filesystem::path, Candidate> candidates_;
  std::uint64_t next_arrival_ = 0;
};

}  // namespace ferrum::watch
