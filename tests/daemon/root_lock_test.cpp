// The root lock and what `ferrum status` reads from it: who holds it (pid and
// ferrum command), and whether that is the daemon.
// Plumbing: no engineering value is checked here, so no published source applies.
#include <gtest/gtest.h>
#include <sys/file.h>
#include <unistd.h>

#include <filesystem>
#include <fstream>

#include "daemon/site/site_root.h"

using namespace ferrum;

namespace {

class RootLockTest : public ::testing::Test {
 protected:
  void SetUp() override {
    char tmpl[] = "/tmp/ferrum-lock-XXXXXX";
    ASSERT_NE(::mkdtemp(tmpl), nullptr);
    root.root = tmpl;
  }
  void TearDown() override { std::filesystem::remove_all(root.root); }

  // Holds the lock on another open file description (flock conflicts across
  // descriptions, also within one process) with the given text in the file.
  int hold_with(const std::string& text) {
    {
      std::ofstream(root.lock_file()) << text;
    }
    const int fd = ::open(root.lock_file().c_str(), O_RDWR);
    EXPECT_EQ(::flock(fd, LOCK_EX | LOCK_NB), 0);
    return fd;
  }

  site::SiteRoot root;
};

TEST_F(RootLockTest, FreeLockHasNoHolder) {
  EXPECT_EQ(site::RootLock::holder(root).pid, 0);
  { std::ofstream(root.lock_file()) << "4242 serve\n"; }  // left by a process that has exited
  EXPECT_EQ(site::RootLock::holder(root).pid, 0);
  EXPECT_FALSE(site::RootLock::holder(root).is_daemon());
}

TEST_F(RootLockTest, IngestHoldingTheLockIsNotTheDaemon) {
  const int fd = hold_with("4242 ingest\n");
  const auto h = site::RootLock::holder(root);
  EXPECT_EQ(h.pid, 4242);
  EXPECT_EQ(h.command, "ingest");
  EXPECT_FALSE(h.is_daemon());
  ::close(fd);
}

TEST_F(RootLockTest, ServeAndOldPidOnlyFilesAreTheDaemon) {
  int fd = hold_with("4242 serve\n");
  EXPECT_TRUE(site::RootLock::holder(root).is_daemon());
  ::close(fd);
  fd = hold_with("4243\n");  // written by a version before the command was recorded
  const auto h = site::RootLock::holder(root);
  EXPECT_EQ(h.pid, 4243);
  EXPECT_EQ(h.command, "");
  EXPECT_TRUE(h.is_daemon());
  EXPECT_EQ(site::RootLock::holder_pid(root), 4243);
  ::close(fd);
}

TEST_F(RootLockTest, AcquireWritesOwnPidAndRefusesASecondHolder) {
  site::RootLock lock;
  ASSERT_TRUE(lock.try_acquire(root));
  EXPECT_EQ(site::RootLock::holder(root).pid, static_cast<long>(::getpid()));
  site::RootLock second;
  EXPECT_FALSE(second.try_acquire(root));
}

// The command is the one the caller names (not guessed from the process's
// arguments, where `ferrum --root DIR serve` puts the root first); only
// [a-z0-9_-] is kept.
TEST_F(RootLockTest, AcquireWritesTheNamedCommand) {
  {
    site::RootLock lock;
    ASSERT_TRUE(lock.try_acquire(root, "serve"));
    EXPECT_TRUE(site::RootLock::holder(root).is_daemon());
  }
  {
    site::RootLock lock;
    ASSERT_TRUE(lock.try_acquire(root, "ingest"));
    EXPECT_EQ(site::RootLock::holder(root).command, "ingest");
    EXPECT_FALSE(site::RootLock::holder(root).is_daemon());
  }
  site::RootLock lock;
  ASSERT_TRUE(lock.try_acquire(root, "in gest/\n.."));
  EXPECT_EQ(site::RootLock::holder(root).command, "ingest");
}

}  // namespace
