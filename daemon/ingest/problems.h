// Problems and warnings found while reading one drop file.
//
// A Problem makes the file unacceptable (the pipeline imports all or nothing);
// a Warning is worth telling the contractor but does not block the import.
// Both are plain data so the pipeline can write them into a receipt as-is.
//
// Line numbers are 1-based physical lines of the file as dropped; a record
// whose quoted field spans several lines is reported at the line where the
// record starts. Columns are reported by the name written in the header plus
// the 1-based column number; whole-row and whole-file problems have an empty
// name and number 0.
//
// Not thread-safe; one log per file being checked.
#pragma once

#include <cstddef>
#include <cstdint>
#include <functional>
#include <string>
#include <string_view>
#include <vector>

namespace ferrum::ingest {

struct Problem {
  std::int64_t line = 0;    // 1-based physical line where the record starts
  std::string column;       // column name as written in the header; "" for whole row / file
  int column_number = 0;    // 1-based; 0 for whole row / file
  std::string value;        // offending cell: at most 80 bytes, non-printable bytes escaped
  std::string reason;       // plain language, e.g. "hydrogen cannot be negative"
  // Where it is in the file's own terms when line and column do not say it
  // (a workbook: "row 7, cell C7"); "" for a CSV.
  std::string location;
};

// Keeps the first `keep` problems and counts all of them.
class ProblemLog {
 public:
  explicit ProblemLog(std::size_t keep = 100) : keep_(keep) {}

  // `raw_value` is the cell as read; it is shortened and escaped here.
  void add(std::int64_t line, std::string_view column, int column_number,
           std::string_view raw_value, std::string reason);

  const std::vector<Problem>& kept() const { return kept_; }
  std::int64_t count() const { return count_; }
  bool empty() const { return count_ == 0; }

  // Runs `hook` once, just before the first problem is logged (nullptr
  // removes it). Whoever holds rows back in a batch writes them there, so
  // that a problem found in them is logged, in line order, before the
  // problem of a later row. The hook may log problems itself.
  void before_first_problem(std::function<void()> hook) { before_first_ = std::move(hook); }

  // Fills Problem::location of every later problem from its line and
  // column number (RecordSource::locate); nullptr removes it.
  void set_locator(std::function<std::string(std::int64_t, int)> locator) { locator_ = std::move(locator); }

 private:
  std::size_t keep_;
  std::function<void()> before_first_;
  std::function<std::string(std::int64_t, int)> locator_;
  std::vector<Problem> kept_;
  std::int64_t count_ = 0;
};

// A warning is counted, not repeated: the same (column, message) pair seen on
// many rows is one entry with the first line and a count.
struct Warning {
  std::string column;        // "" when not about one column
  std::string message;       // e.g. "value below detection limit"
  std::int64_t first_line = 0;
  std::int64_t count = 0;
  std::vector<std::int64_t> lines;  // the first kMaxLines lines it was seen on, in order
  static constexpr std::size_t kMaxLines = 20;
};

class WarningLog {
 public:
  // At most `max_distinct` different warnings are kept; later new ones are
  // only counted in overflow().
  explicit WarningLog(std::size_t max_distinct = 100) : max_distinct_(max_distinct) {}

  // Records `count` occurrences, the first of them at `line`. Hot loops count
  // themselves and add once at the end.
  void add(std::int64_t line, std::string_view column, std::string_view message,
           std::int64_t count = 1);

  const std::vector<Warning>& entries() const { return entries_; }
  std::int64_t overflow() const { return overflow_; }
  std::int64_t total() const;

 private:
  std::size_t max_distinct_;
  std::vector<Warning> entries_;  // few distinct entries: a linear search is cheapest
  std::int64_t overflow_ = 0;
};

// The cell text as shown in a problem: cut to at most `max_bytes` bytes
// (never inside a UTF-8 sequence), with control characters, NUL and bytes
// that are not valid UTF-8 written as \xNN, and a trailing "..." when cut.
std::string display_value(std::string_view raw, std::size_t max_bytes = 80);

}  // namespace ferrum::ingest
