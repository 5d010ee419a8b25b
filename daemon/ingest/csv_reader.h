// Streaming reader for drop files: CSV per RFC 4180, UTF-8.
//
// What it accepts (schema/drop-files.md is the contractor-facing version):
//  * an optional UTF-8 byte-order mark; a UTF-16 mark rejects the file;
//  * before the header: blank lines and lines starting with '#' (comments);
//  * one header row; the delimiter is detected from it: ';' when it has more
//    semicolons than commas outside quotes (such files may also use a decimal
//    comma, see decimal_comma()), else ','; unless a "sep=X" line (X one of
//    , ; | or tab) before the header names it;
//  * records ending in LF, CRLF or a lone CR; quoted fields may hold the
//    delimiter, doubled quotes and line breaks; spaces around a quoted field
//    are ignored; blank lines between records are skipped.
//
// Damaged input never throws, crashes or hangs. Each malformed record gets
// one Problem (see problems.h) and reading goes on with the next record:
// a quote inside an unquoted field, text after a closing quote, a NUL byte,
// invalid UTF-8, more or fewer fields than the header, a record longer than
// CsvOptions::max_record_bytes (the rest of that physical line is skipped
// without buffering it). A quote left open at the end of the input is
// reported at the line where its record starts, and ends the reading.
//
// Memory: one record at a time, in a buffer reused across records; the
// fields are views into it, valid until the next call to next().
// Not thread-safe. The istream must outlive the reader.
#pragma once

#include <array>
#include <cstddef>
#include <cstdint>
#include <istream>
#include <span>
#include <string>
#include <string_view>
#include <vector>

#include "daemon/ingest/problems.h"
#include "daemon/ingest/record_source.h"

namespace ferrum::ingest {

struct CsvOptions {
  // A record (all its physical lines) longer than this is a problem and is
  // skipped. Default 1 MiB: far above any real row, small enough that a
  // 2 GB line without line breaks cannot exhaust memory.
  std::size_t max_record_bytes = std::size_t{1} << 20;
  // Bytes read from the stream at a time. Default 64 KiB.
  std::size_t chunk_bytes = std::size_t{64} << 10;
};

class CsvReader : public RecordSource {
 public:
  explicit CsvReader(std::istream& in, CsvOptions options = {});

  CsvReader(const CsvReader&) = delete;
  CsvReader& operator=(const CsvReader&) = delete;

  // Skips the byte-order mark, comments and blank lines, detects the
  // delimiter and reads the header row. Returns false, after logging one
  // problem (at the header's line, or line 1 for an empty file), when there
  // is no usable header: empty file, UTF-16, NUL bytes, invalid UTF-8,
  // unbalanced quotes, or a header longer than max_record_bytes.
  // REQUIRES: called once, before next().
  bool read_header(ProblemLog& problems) override;

  // Header names, trimmed of surrounding spaces, as written (case kept).
  const std::vector<std::string>& header() const override { return header_; }
  std::int64_t header_line() const override { return header_line_; }
  char delimiter() const { return delimiter_; }
  // True when a "sep=X" line before the header named the delimiter.
  bool delimiter_declared() const { return declared_delimiter_ != 0; }
  // True for semicolon-delimited files, where numbers may use a decimal comma.
  bool decimal_comma() const override { return delimiter_ == ';'; }
  char declared_delimiter() const override { return declared_delimiter_; }

  // Reads the next record. On `malformed` one problem was logged to
  // `problems` and the reader is positioned at the following record.
  // REQUIRES: read_header() returned true.
  RecordStatus next(ProblemLog& problems) override;

  // The fields of the last record read with `ok`, unquoted and unescaped but
  // not trimmed. Views are valid until the next call to next().
  std::span<const std::string_view> fields() const override { return views_; }
  // 1-based physical line where the last record started.
  std::int64_t record_line() const override { return record_line_; }

 private:
  // Bytes of the stream with a small push-back area in front (used to
  // re-read the header line once its delimiter is known).
  class ByteSource {
   public:
    ByteSource(std::istream& in, std::size_t chunk) : in_(in), chunk_(chunk) {}
    static constexpr int kEnd = -1;
    int get() {
      if (back_pos_ < back_.size()) return static_cast<unsigned char>(back_[back_pos_++]);
      if (pos_ == end_ && !refill()) return kEnd;
      return static_cast<unsigned char>(buf_[pos_++]);
    }
    int peek() {
      if (back_pos_ < back_.size()) return static_cast<unsigned char>(back_[back_pos_]);
      if (pos_ == end_ && !refill()) return kEnd;
      return static_cast<unsigned char>(buf_[pos_]);
    }
    // Bytes that get() would return next without refilling: empty while
    // pushed-back bytes are pending or the chunk is used up.
    std::string_view buffered() const {
      if (back_pos_ < back_.size()) return {};
      return std::string_view(buf_.data() + pos_, end_ - pos_);
    }
    // Consumes n bytes of buffered().
    void skip(std::size_t n) { pos_ += n; }
    // The next get() returns these bytes first, then what was pending.
    void push_back(std::string bytes) {
      back_ = std::move(bytes) + back_.substr(back_pos_);
      back_pos_ = 0;
    }

   private:
    bool refill();
    std::istream& in_;
    std::size_t chunk_;
    std::vector<char> buf_;
    std::size_t pos_ = 0, end_ = 0;
    std::string back_;
    std::size_t back_pos_ = 0;
  };

  // Result of scanning one record into buf_/spans_.
  struct Scan {
    bool at_end = false;        // input ended before any byte of a record
    bool failed = false;        // a problem was found (first one kept below)
    int problem_field = 0;      // 0-based field of the problem
    std::string problem_reason;
    bool blank = false;         // the record is an empty line
  };

  Scan scan_record();
  std::size_t copy_plain_run();
  void fail(Scan& scan, std::string reason);
  void skip_rest_of_line();
  bool skip_byte_order_mark(ProblemLog& problems);
  bool read_header_line(std::string& line, ProblemLog& problems, bool& at_end);
  void build_views();
  bool check_utf8(ProblemLog& problems);
  void log_record_problem(ProblemLog& problems, int field, std::string reason);

  ByteSource src_;
  CsvOptions options_;
  char delimiter_ = ',';
  char declared_delimiter_ = 0;  // from a "sep=X" line, 0 when none
  std::vector<std::string> header_;
  std::int64_t header_line_ = 0;
  std::int64_t line_ = 1;          // physical line of the next byte
  std::int64_t record_line_ = 0;
  bool finished_ = false;          // an unterminated quote consumed the input
  std::string buf_;                // bytes of the current record's fields
  std::vector<std::size_t> ends_;  // end offset in buf_ of each field
  std::vector<std::string_view> views_;
  // Bytes that end a run of plain field bytes (delimiter, line ends, quote,
  // NUL): everything else is copied in bulk by copy_plain_run().
  std::array<bool, 256> special_{};
};

}  // namespace ferrum::ingest
