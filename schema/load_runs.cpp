#include "schema/load_runs.h"

#include <fcntl.h>
#include <unistd.h>

#include <algorithm>
#include <cerrno>
#include <cstdio>
#include <cstring>
#include <stdexcept>

#include "schema/store.h"

namespace ferrum::store {
namespace {

[[noreturn]] void fail(const std::string& what) {
  throw StoreError(what + ": " + std::strerror(errno));
}

// An unnamed file in `dir` (O_TMPFILE), or in the system's temporary folder
// where the file system has no unnamed files.
int open_unnamed(const std::string& dir) {
  int fd = ::open(dir.empty() ? "." : dir.c_str(), O_TMPFILE | O_RDWR | O_CLOEXEC, 0600);
  if (fd >= 0) return fd;
  std::FILE* f = std::tmpfile();
  if (!f) fail("cannot make a temporary file for queued load points");
  fd = ::dup(::fileno(f));
  std::fclose(f);
  if (fd < 0) fail("cannot make a temporary file for queued load points");
  return fd;
}

void write_all(int fd, const void* data, std::size_t bytes, off_t at) {
  const char* p = static_cast<const char*>(data);
  while (bytes > 0) {
    const ssize_t n = ::pwrite(fd, p, bytes, at);
    if (n < 0 && errno == EINTR) continue;
    if (n <= 0) fail("cannot write queued load points to a temporary file");
    p += n;
    bytes -= static_cast<std::size_t>(n);
    at += n;
  }
}

void read_all(int fd, void* data, std::size_t bytes, off_t at) {
  char* p = static_cast<char*>(data);
  while (bytes > 0) {
    const ssize_t n = ::pread(fd, p, bytes, at);
    if (n < 0 && errno == EINTR) continue;
    if (n <= 0) fail("cannot read queued load points back from a temporary file");
    p += n;
    bytes -= static_cast<std::size_t>(n);
    at += n;
  }
}

constexpr std::size_t kPoint = sizeof(QueuedPoint);

}  // namespace

LoadRuns::LoadRuns(std::string dir) : dir_(std::move(dir)) {}

LoadRuns::~LoadRuns() {
  if (fd_ >= 0) ::close(fd_);
}

void LoadRuns::add(std::span<const QueuedPoint> sorted) {
  if (sorted.empty()) return;
  if (fd_ < 0) fd_ = open_unnamed(dir_);
  write_all(fd_, sorted.data(), sorted.size() * kPoint, static_cast<off_t>(end_ * kPoint));
  runs_.push_back({end_, static_cast<std::int64_t>(sorted.size())});
  end_ += static_cast<std::int64_t>(sorted.size());
}

void LoadRuns::clear() {
  runs_.clear();
  end_ = 0;
  if (fd_ >= 0 && ::ftruncate(fd_, 0) != 0) {  // give the space back; a new file if that fails
    ::close(fd_);
    fd_ = -1;
  }
}

struct LoadRuns::Merge::Source {
  std::vector<QueuedPoint> buffer;  // a window of a run on file
  std::span<const QueuedPoint> points;  // what is left of the window (or of the run in memory)
  std::int64_t next = 0, left = 0;  // run on file: next point to read, points not yet read
};

LoadRuns::Merge::Merge(const LoadRuns& runs, std::span<const QueuedPoint> last, std::size_t buffer_bytes)
    : runs_(runs) {
  const std::size_t window =
      std::max<std::size_t>(1024, buffer_bytes / kPoint / std::max<std::size_t>(1, runs.runs_.size()));
  sources_.resize(runs.runs_.size() + 1);
  for (std::size_t i = 0; i < runs.runs_.size(); ++i) {
    Source& s = sources_[i];
    s.buffer.resize(static_cast<std::size_t>(std::min<std::int64_t>(runs.runs_[i].size, static_cast<std::int64_t>(window))));
    s.next = runs.runs_[i].offset;
    s.left = runs.runs_[i].size;
    refill(s);
  }
  sources_.back().points = last;
  const auto later = [this](int a, int b) { return key_less(sources_[b].points.front(), sources_[a].points.front()); };
  for (std::size_t i = 0; i < sources_.size(); ++i)
    if (!sources_[i].points.empty()) heap_.push_back(static_cast<int>(i));
  std::make_heap(heap_.begin(), heap_.end(), later);
}

LoadRuns::Merge::~Merge() = default;

void LoadRuns::Merge::refill(Source& s) {
  const std::size_t n = static_cast<std::size_t>(std::min<std::int64_t>(s.left, static_cast<std::int64_t>(s.buffer.size())));
  if (n > 0) read_all(runs_.fd_, s.buffer.data(), n * kPoint, static_cast<off_t>(s.next * kPoint));
  s.next += static_cast<std::int64_t>(n);
  s.left -= static_cast<std::int64_t>(n);
  s.points = std::span<const QueuedPoint>(s.buffer.data(), n);
}

bool LoadRuns::Merge::next(QueuedPoint& out) {
  if (heap_.empty()) return false;
  const auto later = [this](int a, int b) { return key_less(sources_[b].points.front(), sources_[a].points.front()); };
  std::pop_heap(heap_.begin(), heap_.end(), later);
  Source& s = sources_[static_cast<std::size_t>(heap_.back())];
  out = s.points.front();
  s.points = s.points.subspan(1);
  if (s.points.empty() && s.left > 0) refill(s);
  if (s.points.empty()) heap_.pop_back();
  else std::push_heap(heap_.begin(), heap_.end(), later);
  return true;
}

}  // namespace ferrum::store
