// Crash-safe output: every file ferrum writes (receipts, reports, status) is
// written to a temporary name in the same folder, flushed and fsync'ed,
// renamed over the final name, and the folder fsync'ed. A reader never sees a
// half-written file; after a power loss either the old or the new one exists.
#pragma once

#include <filesystem>
#include <functional>
#include <string_view>

namespace ferrum::site {

// Throws std::system_error on failure (the temporary file is removed).
void write_file_atomically(const std::filesystem::path& path, std::string_view content);

// The same with the content given piece by piece: `produce` calls `write`
// with each piece in turn, so that a large file is never held whole. An
// exception from `produce` removes the temporary file and is rethrown.
using WritePiece = std::function<void(std::string_view)>;
void write_file_atomically(const std::filesystem::path& path, const std::function<void(const WritePiece& write)>& produce);

// The same for a writer that has the content in pieces over time (the
// ranking cache, written as the units are assessed): write() appends,
// commit() flushes, renames into place and syncs the folder. Destroyed
// without commit(), the temporary file is removed and `path` is untouched.
// Throws std::system_error on failure.
class AtomicFileWriter {
 public:
  explicit AtomicFileWriter(std::filesystem::path path);
  ~AtomicFileWriter();
  AtomicFileWriter(const AtomicFileWriter&) = delete;
  AtomicFileWriter& operator=(const AtomicFileWriter&) = delete;
  void write(std::string_view content);
  void commit();

 private:
  std::filesystem::path path_, tmp_;
  int fd_ = -1;
};

// fsync of a folder, so that a rename in it survives a power loss.
void sync_directory(const std::filesystem::path& dir);

// Moves a file without ever overwriting: rename(2) with RENAME_NOREPLACE.
// Returns false (and leaves both names alone) when `to` exists. Throws
// std::system_error on other failures.
bool move_no_replace(const std::filesystem::path& from, const std::filesystem::path& to);

}  // namespace ferrum::site
