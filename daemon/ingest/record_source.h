// Where the records of a drop file come from: a CSV text (csv_reader.h) or a
// spreadsheet workbook (workbook_reader.h). Both give a header row and then
// one record at a time as text fields, so kind detection, the row parsers,
// the all-or-nothing import and the receipts are the same for both.
//
// Lines: a CSV's physical line where the record starts; a workbook's row
// number. Columns: 1-based within the header. locate() turns a (line,
// column) pair into the words a contractor finds it by ("row 7, cell C7").
//
// Not thread-safe; one source per file being read.
#pragma once

#include <cstddef>
#include <cstdint>
#include <span>
#include <string>
#include <string_view>
#include <vector>

#include "daemon/ingest/problems.h"

namespace ferrum::ingest {

enum class RecordStatus {
  ok,         // fields() holds a well-formed record with as many fields as the header
  malformed,  // one problem was logged for this record; fields() is empty
  end,        // no more records
};

class RecordSource {
 public:
  virtual ~RecordSource() = default;

  // Reads up to and including the header row. Returns false after logging
  // one problem when there is no usable header (or the file cannot be read
  // at all). REQUIRES: called once, before next().
  virtual bool read_header(ProblemLog& problems) = 0;
  // Header names, trimmed of surrounding spaces, as written (case kept).
  virtual const std::vector<std::string>& header() const = 0;
  virtual std::int64_t header_line() const = 0;
  // Reads the next record; on `malformed` one problem was logged.
  virtual RecordStatus next(ProblemLog& problems) = 0;
  // Fields of the last `ok` record; valid until the next call to next().
  virtual std::span<const std::string_view> fields() const = 0;
  virtual std::int64_t record_line() const = 0;

  // Header name of the 0-based column `index`, or "" past the header.
  std::string_view column_name(std::size_t index) const {
    return index < header().size() ? std::string_view(header()[index]) : std::string_view();
  }
  // True when numbers in text may use a decimal comma by the file's own
  // convention (a semicolon-delimited CSV); a party's `decimal` setting may
  // override it.
  virtual bool decimal_comma() const { return false; }
  // The delimiter a "sep=X" first line named, 0 when none (or not a CSV).
  virtual char declared_delimiter() const { return 0; }
  // Where a problem is, in the file's own terms: "" means "line N, column
  // NAME (k)" as for a CSV; a workbook says "row 7, cell C7".
  virtual std::string locate(std::int64_t /*line*/, int /*column_number*/) const { return {}; }
};

}  // namespace ferrum::ingest
