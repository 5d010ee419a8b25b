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

bool RootLock::try_acquire(const SiteRoot& root) {
  fd_ = ::open(root.lock_file().c_str(), O_RDWR | O_CREAT | O_CLOEXEC, 0644);
  if (fd_ < 0) return false;
  if (::flock(fd_, LOCK_EX | LOCK_NB) != 0) {
    ::close(fd_);
    fd_ = -1;
    return false;
  }
  const std::string pid = std::to_string(::getpid()) + "\n";
  if (::ftruncate(fd_, 0) == 0) {
    [[maybe_unused]] auto n = ::pwrite(fd_, pid.data(), pid.size(), 0);
  }
  return true;
}

long RootLock::holder_pid(const SiteRoot& root) {
  const int fd = ::open(root.lock_file().c_str(), O_RDONLY | O_CLOEXEC);
  if (fd < 0) return 0;
  // Free lock: nobody holds it.
  if (::flock(fd, LOCK_SH | LOCK_NB) == 0) {
    ::close(fd);
    return 0;
  }
  ::close(fd);
  std::ifstream in(root.lock_file());
  long pid = 0;
  in >> pid;
  return pid;
}

}  // namespace ferrum::site
