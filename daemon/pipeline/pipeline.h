// What happens to a dropped file, start to end.
//
//  1. Refuse unread what must not be read: names that are temporary
//     (.name, name.part, name.tmp: left alone until renamed), symbolic links,
//     hard links, devices, FIFOs, sockets, folders, files over the size limit,
//     files directly in drop/ or in a folder that is not a configured party.
//  2. Claim: rename drop/PARTY/NAME to work/PARTY/NAME. Only one process can
//     win that rename, so a file is never processed twice.
//  3. Hash (SHA-256). Content already imported: a "duplicate" receipt.
//  4. One transaction: the file's record, every row, the receipt text; all
//     rows valid -> COMMIT with status accepted; any problem -> ROLLBACK,
//     then a second small transaction records the rejection.
//  5. Move work/PARTY/NAME to archive/YYYY/MM/NAME-with-hash or
//     quarantine/NAME-with-hash (rename without replace; never copy+delete).
//  6. Write the receipt files (atomically) into drop/PARTY/receipts/.
//
// Crash safety: the database commit (step 4) records where the file goes
// (files.stored_as) before the move (step 5). recover() at start-up looks at
// every file left in work/: a committed record with that content -> finish
// the move and the receipt; no record -> the import never happened, process
// it again. A file refused unread whose row was committed but which is still
// in drop/: finish its move under that row (no second row). So the rows and
// the file's place never disagree after a crash.
#pragma once

#include <sys/stat.h>

#include <atomic>
#include <chrono>
#include <filesystem>
#include <functional>
#include <optional>
#include <string>
#include <vector>

#include "daemon/config/site_config.h"
#include "daemon/pipeline/receipt.h"
#include "daemon/site/site_root.h"
#include "schema/store.h"

namespace ferrum::ingest {

struct FileOutcome {
  Receipt receipt;
  std::vector<std::string> units;      // units whose data changed
  std::vector<std::string> unsafe_items;  // "UNIT: item (date)" for unsafe inspection rows
  double seconds = 0;
};

// Injectable wall clock (UTC seconds), so tests can move time.
using Clock = std::function<std::int64_t()>;
std::int64_t system_clock_now();

class Pipeline {
 public:
  Pipeline(const site::SiteRoot& root, const config::SiteConfig& config, store::Store& store,
           Clock clock = system_clock_now);

  // True when `path` is a name the pipeline leaves alone for now (temporary
  // names, the receipts folder).
  static bool is_ignored_name(const std::string& name);

  // Processes one dropped file (a path inside drop/). Returns nullopt when
  // the file is not there any more or its name is ignored.
  std::optional<FileOutcome> process(const std::filesystem::path& dropped);

  // Finishes or redoes the files a crash left in work/ (see above).
  std::vector<FileOutcome> recover();

  // Validates a file without importing and without moving it: the receipt
  // it would get. `party` may be empty (permissions not checked).
  Receipt check(const std::filesystem::path& file, const std::string& party);
  // For `ferrum check` away from a site: do not require units to be in the
  // (empty) register.
  void set_units_must_exist(bool v) { units_must_exist_ = v; }
  // The daemon raises an alert for every unsafe inspection item at once;
  // receipts say whether the importer does (Receipt::unsafe_alerted).
  void set_raises_alerts(bool v) { raises_alerts_ = v; }
  // The daemon's stop flag: an import in progress is rolled back when it is
  // set, and the file stays in work/ (recover() imports it at the next start).
  void set_cancel_flag(const std::atomic<bool>* flag) { cancel_ = flag; }
  // Told, every 4,096 rows of a file being imported, how many of its bytes
  // were read (progress of `ingest` on a terminal, the daemon's log), and
  // (0, 0) when the file was read to its end.
  using FileProgress = std::function<void(const std::string& name, std::uint64_t done, std::uint64_t total)>;
  void set_progress(FileProgress progress) { progress_ = std::move(progress); }

  // Every file waiting in the party folders (and stray files in drop/),
  // oldest first per party.
  std::vector<std::filesystem::path> waiting_files() const;

  // Files in the sub-folders of a party folder (drop/PARTY/2026-10/lab.csv,
  // as shared-drive habits go), at most kMaxSubfolderDepth folders deep;
  // receipts/, ignored names and links to folders are not entered. They are
  // taken like files in the party folder itself, under a name that keeps
  // their sub-path ("2026-10_lab.csv"); the receipt says where they were.
  static constexpr int kMaxSubfolderDepth = 4;
  static void add_subfolder_files(const std::filesystem::path& party_dir,
                                  std::vector<std::pair<std::filesystem::file_time_type, std::filesystem::path>>& out);

 private:
  FileOutcome import_claimed(const std::filesystem::path& claimed, const std::string& party,
                             const std::string& name, const std::string& received_at,
                             const std::string& subfolder = "");
  FileOutcome refuse(const std::filesystem::path& path, const std::string& party, const std::string& name,
                     const std::string& reason, bool unread);
  // Why a dropped file (lstat `st`; `party` empty directly in drop/) is
  // refused without being opened, or empty when it may be read.
  std::string unread_refusal(const struct stat& st, const std::string& party) const;
  // Finishes the move of a file refused unread whose row was committed just
  // before a crash (see recover() in pipeline.cpp).
  std::optional<FileOutcome> finish_interrupted_refusal();
  void finish(FileOutcome& outcome, const std::filesystem::path& from);
  std::filesystem::path receipt_dir(const std::string& party) const;
  void write_receipt(const Receipt& r);
  std::filesystem::path destination(const std::string& status, const std::string& name, const std::string& sha,
                                    std::int64_t now) const;
  std::string now_text() const;

  site::SiteRoot root_;
  config::SiteConfig config_;
  store::Store& store_;
  Clock clock_;
  bool units_must_exist_ = true;
  bool raises_alerts_ = false;
  const std::atomic<bool>* cancel_ = nullptr;
  FileProgress progress_;
};

// SHA-256 of a file's content, lower-case hex. Throws std::runtime_error.
std::string sha256_of_file(const std::filesystem::path& path);

}  // namespace ferrum::ingest
