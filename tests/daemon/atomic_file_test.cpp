// Atomic writes (daemon/site/atomic_file.h): a file given piece by piece is
// written whole, and a failing producer leaves the old file and no
// temporary one. Plumbing: no engineering values.
#include "daemon/site/atomic_file.h"

#include <stdexcept>

#include "tests/daemon/temp_dir.h"

using namespace ferrum;
using ferrum::testing::text_of;

namespace {

using AtomicFileTest = ferrum::testing::TempDirTest;

TEST_F(AtomicFileTest, PiecesAreWrittenInOrder) {
  site::write_file_atomically(dir / "f.txt", [](const site::WritePiece& write) {
    write("one ");
    write("");
    write(std::string(100000, 'x'));
    write(" two");
  });
  EXPECT_EQ(text_of(dir / "f.txt"), "one " + std::string(100000, 'x') + " two");
}

TEST_F(AtomicFileTest, AFailingProducerLeavesTheOldFileAndNoTemporary) {
  site::write_file_atomically(dir / "f.txt", "old");
  EXPECT_THROW(site::write_file_atomically(dir / "f.txt",
                                           [](const site::WritePiece& write) {
                                             write("new, half");
                                             throw std::runtime_error("stop");
                                           }),
               std::runtime_error);
  EXPECT_EQ(text_of(dir / "f.txt"), "old");
  std::size_t files = 0;
  for ([[maybe_unused]] const auto& e : std::filesystem::directory_iterator(dir)) ++files;
  EXPECT_EQ(files, 1u);
}

// The writer that gets its content over time: the file appears whole at
// commit(); destroyed before, it leaves the old file and no temporary one.
TEST_F(AtomicFileTest, AWriterWithoutCommitLeavesTheOldFile) {
  site::write_file_atomically(dir / "f.txt", "old");
  {
    site::AtomicFileWriter w(dir / "f.txt");
    w.write("new, ");
    EXPECT_EQ(text_of(dir / "f.txt"), "old");
  }
  EXPECT_EQ(text_of(dir / "f.txt"), "old");
  std::size_t files = 0;
  for ([[maybe_unused]] const auto& e : std::filesystem::directory_iterator(dir)) ++files;
  EXPECT_EQ(files, 1u);
  site::AtomicFileWriter w(dir / "f.txt");
  w.write("new, ");
  w.write("whole");
  w.commit();
  EXPECT_EQ(text_of(dir / "f.txt"), "new, whole");
  EXPECT_THROW(w.write("more"), std::logic_error);
  EXPECT_THROW(site::AtomicFileWriter(dir / "no-such-folder" / "f.txt"), std::system_error);
}

}  // namespace
