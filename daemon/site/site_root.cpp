#include "daemon/site/site_root.h"

#include <fcntl.h>
#include <sys/file.h>
#include <unistd.h>

#include <cstdlib>
#include <fstream>

namespace ferrum::site {

SiteRoot resolve_root(const std::string& option_value) {
  std::string r = option_value;
  if (r.empty()) {
    const char* env = std::getenv("FERRUM_ROOT");
    r = env && *env ? env : ".";
  }
  return SiteRoot{std::filesystem::absolute(r).lexically_normal()};
}

void create_layout(const SiteRoot& root) {
  for (const auto& p : {root.root, root.drop(), root.work(), root.archive(), root.quarantine(), root.reports(),
                        root.alerts(), root.log_dir()})
    std::filesystem::create_directories(p);
}

RootLock::~RootLock() {
  if (fd_ >= 0) ::close(fd_);
}

bool RootLock::try_acquire(const SiteRoot& root, std::string_view command) {
  fd_ = ::open(root.lock_file().c_str(), O_RDWR | O_CREAT | O_CLOEXEC, 0644);
  if (fd_ < 0) return false;
  if (::flock(fd_, LOCK_EX | LOCK_NB) != 0) {
    ::close(fd_);
    fd_ = -1;
    return false;
  }
  // Only [a-z0-9_-], at most 32 characters: the file is read back as "PID COMMAND".
  std::string word;
  for (const char c : command.substr(0, 32))
    if ((c >= 'a' && c <= 'z') || (c >= '0' && c <= '9') || c == '_' || c == '-') word += c;
  const std::string text = std::to_string(::getpid()) + (word.empty() ? "" : " " + word) + "\n";
  if (::ftruncate(fd_, 0) == 0) {
    [[maybe_unused]] auto n = ::pwrite(fd_, text.data(), text.size(), 0);
  }
  return true;
}

long RootLock::holder_pid(const SiteRoot& root) { return holder(root).pid; }

LockHolder RootLock::holder(const SiteRoot& root) {
  const int fd = ::open(root.lock_file().c_str(), O_RDONLY | O_CLOEXEC);
  if (fd < 0) return {};
  // Free lock: nobody holds it.
  if (::flock(fd, LOCK_SH | LOCK_NB) == 0) {
    ::close(fd);
    return {};
  }
  ::close(fd);
  std::ifstream in(root.lock_file());
  LockHolder h;
  in >> h.pid >> h.command;
  if (h.pid <= 0) h = {};
  return h;
}

}  // namespace ferrum::site
