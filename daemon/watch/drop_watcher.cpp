#include "daemon/watch/drop_watcher.h"

#include <Poco/Delegate.h>
#include <Poco/File.h>
#include <spdlog/spdlog.h>
#include <sys/stat.h>

#include <algorithm>

#include "daemon/pipeline/pipeline.h"

namespace fs = std::filesystem;

namespace ferrum::watch {

// Poco delivers events to member functions of an object; this one forwards
// them to the watcher's queue and swallows everything (a throwing handler
// would silently kill the watcher thread).
struct DropWatcher::Handlers {
  DropWatcher* owner;
  void added(const Poco::DirectoryWatcher::DirectoryEvent& e) { forward(e, false); }
  void modified(const Poco::DirectoryWatcher::DirectoryEvent& e) { forward(e, false); }
  void moved_to(const Poco::DirectoryWatcher::DirectoryEvent& e) { forward(e, true); }
  void error(const Poco::Exception&) {}
  void forward(const Poco::DirectoryWatcher::DirectoryEvent& e, bool renamed_in) noexcept {
    try {
      owner->on_event(fs::path(e.item.path()), renamed_in);
    } catch (...) {
    }
  }
};

DropWatcher::DropWatcher(fs::path drop_dir) : drop_(std::move(drop_dir)) {}

DropWatcher::~DropWatcher() {
  for (auto& [dir, w] : watchers_) {
    auto* h = handlers_[dir].get();
    w->itemAdded -= Poco::delegate(h, &Handlers::added);
    w->itemModified -= Poco::delegate(h, &Handlers::modified);
    w->itemMovedTo -= Poco::delegate(h, &Handlers::moved_to);
  }
  watchers_.clear();
}

void DropWatcher::watch_one(const fs::path& dir) {
  const std::string key = dir.string();
  if (watchers_.count(key)) return;
  fs::create_directories(dir);
  auto h = std::make_unique<Handlers>();
  h->owner = this;
  auto w = std::make_unique<Poco::DirectoryWatcher>(key, Poco::DirectoryWatcher::DW_ITEM_ADDED |
                                                             Poco::DirectoryWatcher::DW_ITEM_MODIFIED |
                                                             Poco::DirectoryWatcher::DW_ITEM_MOVED_TO);
  w->itemAdded += Poco::delegate(h.get(), &Handlers::added);
  w->itemModified += Poco::delegate(h.get(), &Handlers::modified);
  w->itemMovedTo += Poco::delegate(h.get(), &Handlers::moved_to);
  handlers_[key] = std::move(h);
  watchers_[key] = std::move(w);
}

void DropWatcher::watch(const std::vector<std::string>& parties) {
  watch_one(drop_);
  for (const auto& p : parties) watch_one(drop_ / p);
  // The watch is registered on the watcher's own thread after construction:
  // files created in that window are only found by a scan.
  rescan();
}

void DropWatcher::on_event(const fs::path& p, bool renamed_in) noexcept {
  std::lock_guard<std::mutex> lock(mutex_);
  events_.push_back({p, renamed_in});
  ++events_seen_;
}

std::size_t DropWatcher::events_seen() const {
  std::lock_guard<std::mutex> lock(mutex_);
  return events_seen_;
}

void DropWatcher::add_candidate(const fs::path& p, bool renamed_in, SteadyClock::time_point now) {
  if (ingest::Pipeline::is_ignored_name(p.filename().string())) return;
  auto [it, inserted] = candidates_.try_emplace(p);
  if (inserted) {
    it->second.arrival = next_arrival_++;
    it->second.last_change = now;
    struct stat st {};
    if (::lstat(p.c_str(), &st) == 0) it->second.size = static_cast<std::uintmax_t>(st.st_size);
  }
  if (renamed_in) it->second.renamed_in = true;
}

void DropWatcher::drain_events(SteadyClock::time_point now) {
  std::vector<Event> events;
  {
    std::lock_guard<std::mutex> lock(mutex_);
    events.swap(events_);
  }
  for (const auto& e : events) add_candidate(e.path, e.renamed_in, now);
}

void DropWatcher::rescan() {
  const auto now = SteadyClock::now();
  // Events already queued come first: they carry the true arrival order,
  // which a directory listing does not.
  drain_events(now);
  std::error_code ec;
  std::vector<std::pair<fs::file_time_type, fs::path>> found;
  for (const auto& e : fs::directory_iterator(drop_, ec)) {
    const auto st = e.symlink_status(ec);
    if (st.type() == fs::file_type::directory) {
      for (const auto& f : fs::directory_iterator(e.path(), ec)) {
        if (f.symlink_status(ec).type() == fs::file_type::directory) continue;
        std::error_code tec;
        found.emplace_back(fs::last_write_time(f.path(), tec), f.path());
      }
      // Sub-folders are not watched (one watch per party folder): their
      // files are found here, at each rescan.
      ingest::Pipeline::add_subfolder_files(e.path(), found);
    } else {
      std::error_code tec;
      found.emplace_back(fs::last_write_time(e.path(), tec), e.path());
    }
  }
  // Files the events missed: oldest first (a listing is in no useful order).
  std::sort(found.begin(), found.end());
  for (const auto& [t, p] : found) add_candidate(p, false, now);
}

std::vector<fs::path> DropWatcher::take_ready(std::chrono::seconds settle, SteadyClock::time_point now) {
  drain_events(now);
  std::vector<std::pair<std::uint64_t, fs::path>> ready;
  for (auto it = candidates_.begin(); it != candidates_.end();) {
    Candidate& c = it->second;
    struct stat st {};
    if (::lstat(it->first.c_str(), &st) != 0) {  // gone (taken by another process, or renamed away)
      it = candidates_.erase(it);
      continue;
    }
    if (S_ISDIR(st.st_mode)) {
      // A folder is never a dropped file: a party folder created while the
      // daemon runs (by a reload, or by hand) must not be taken as a stray
      // file in drop/ and quarantined with everything in it.
      it = candidates_.erase(it);
      continue;
    }
    const bool regular = S_ISREG(st.st_mode);
    const auto mtime = fs::file_time_type(std::chrono::nanoseconds(
        static_cast<long long>(st.st_mtim.tv_sec) * 1000000000LL + st.st_mtim.tv_nsec));
    if (regular && (static_cast<std::uintmax_t>(st.st_size) != c.size || mtime != c.mtime)) {
      c.size = static_cast<std::uintmax_t>(st.st_size);
      c.mtime = mtime;
      c.last_change = now;
    }
    // Links, devices and the like are refused unread: no need to wait.
    if (!regular || c.renamed_in || now - c.last_change >= settle) {
      ready.emplace_back(c.arrival, it->first);
      it = candidates_.erase(it);
    } else {
      ++it;
    }
  }
  std::sort(ready.begin(), ready.end());
  std::vector<fs::path> out;
  for (auto& [a, p] : ready) out.push_back(std::move(p));
  return out;
}

}  // namespace ferrum::watch
