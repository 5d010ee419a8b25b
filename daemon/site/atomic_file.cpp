#include "daemon/site/atomic_file.h"

#include <fcntl.h>
#include <stdio.h>
#include <sys/syscall.h>
#include <unistd.h>

#include <algorithm>
#include <cerrno>
#include <stdexcept>
#include <system_error>
#include <utility>

#ifndef RENAME_NOREPLACE
#define RENAME_NOREPLACE (1 << 0)
#endif

namespace ferrum::site {
namespace {

[[noreturn]] void fail(const std::string& what, const std::filesystem::path& p) {
  throw std::system_error(errno, std::generic_category(), what + " " + p.string());
}

// A file-system name has at most 255 bytes: the temporary name keeps as much
// of the final name as fits beside its leading "." and its ".tmp-PID" (a
// 250-byte receipt name must not make the write fail).
std::string temporary_name(const std::string& name) {
  const std::string suffix = ".tmp-" + std::to_string(::getpid());
  const std::size_t room = 255 - 1 - suffix.size();
  return "." + name.substr(0, std::min(name.size(), room)) + suffix;
}

}  // namespace

void sync_directory(const std::filesystem::path& dir) {
  const int fd = ::open(dir.c_str(), O_RDONLY | O_DIRECTORY | O_CLOEXEC);
  if (fd < 0) return;  // best effort: some file systems refuse directory fds
  ::fsync(fd);
  ::close(fd);
}

void write_file_atomically(const std::filesystem::path& path, std::string_view content) {
  write_file_atomically(path, [&](const WritePiece& write) { write(content); });
}

AtomicFileWriter::AtomicFileWriter(std::filesystem::path path)
    : path_(std::move(path)), tmp_(path_.parent_path() / temporary_name(path_.filename().string())) {
  fd_ = ::open(tmp_.c_str(), O_WRONLY | O_CREAT | O_TRUNC | O_CLOEXEC, 0644);
  if (fd_ < 0) fail("cannot create", tmp_);
}

AtomicFileWriter::~AtomicFileWriter() {
  if (fd_ < 0) return;
  const int e = errno;
  ::close(fd_);
  ::unlink(tmp_.c_str());
  errno = e;
}

void AtomicFileWriter::write(std::string_view content) {
  if (fd_ < 0) throw std::logic_error("AtomicFileWriter::write after commit");
  const char* p = content.data();
  std::size_t left = content.size();
  while (left > 0) {
    const ssize_t n = ::write(fd_, p, left);
    if (n < 0) {
      if (errno == EINTR) continue;
      fail("cannot write", tmp_);
    }
    p += n;
    left -= static_cast<std::size_t>(n);
  }
}

void AtomicFileWriter::commit() {
  if (fd_ < 0) throw std::logic_error("AtomicFileWriter::commit twice");
  const int fd = fd_;
  fd_ = -1;
  int e = ::fsync(fd) == 0 ? 0 : errno;
  if (::close(fd) != 0 && e == 0) e = errno;
  if (e != 0) {
    ::unlink(tmp_.c_str());
    errno = e;
    fail("cannot flush", tmp_);
  }
  if (::rename(tmp_.c_str(), path_.c_str()) != 0) {
    const int e = errno;
    ::unlink(tmp_.c_str());
    errno = e;
    fail("cannot rename into", path_);
  }
  sync_directory(path_.parent_path());
}

void write_file_atomically(const std::filesystem::path& path, const std::function<void(const WritePiece& write)>& produce) {
  AtomicFileWriter file(path);  // an exception from `produce` removes the temporary file
  produce([&](std::string_view content) { file.write(content); });
  file.commit();
}

bool move_no_replace(const std::filesystem::path& from, const std::filesystem::path& to) {
  if (::syscall(SYS_renameat2, AT_FDCWD, from.c_str(), AT_FDCWD, to.c_str(), RENAME_NOREPLACE) == 0) {
    sync_directory(to.parent_path());
    if (to.parent_path() != from.parent_path()) sync_directory(from.parent_path());
    return true;
  }
  if (errno == EEXIST) return false;
  if (errno == EINVAL || errno == ENOSYS) {
    // File system without RENAME_NOREPLACE: link + unlink never overwrites either.
    if (::link(from.c_str(), to.c_str()) != 0) {
      if (errno == EEXIST) return false;
      fail("cannot move to", to);
    }
    ::unlink(from.c_str());
    sync_directory(to.parent_path());
    return true;
  }
  fail("cannot move to", to);
}

}  // namespace ferrum::site
