#include "daemon/site/site_root.h"

#include <fcntl.h>
#include <sys/file.h>
#include <unistd.h>

#include <cstdlib>
#include <fstream>
#include <iterator>
#include <sstream>

namespace ferrum::site {

namespace {

// This process's ferrum command ("serve", "ingest", ...): the first argument
// after the program name that is not an option (`ferrum COMMAND [options]`),
// read from /proc/self/cmdline; only [a-z0-9_-], at most 32 characters.
std::string own_command() {
  std::ifstream in("/proc/self/cmdline", std::ios::binary);
  const std::string all((std::istreambuf_iterator<char>(in)), std::istreambuf_iterator<char>());
  std::istringstream args(all);
  std::string arg;
  std::getline(args, arg, '\0');  // the program
  while (std::getline(args, arg, '\0')) {
    if (arg.empty() || arg[0] == '-') continue;
    std::string out;
    for (const char c : arg.substr(0, 32))
      if ((c >= 'a' && c <= 'z') || (c >= '0' && c <= '9') || c == '_' || c == '-') out += c;
    return out;
  }
  return "";
}

}  // namespace

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
  const std::string command = own_command();
  const std::string text = std::to_string(::getpid()) + (command.empty() ? "" : " " + command) + "\n";
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
