// Reads a spreadsheet workbook (.xlsx, Office Open XML, ECMA-376 Part 1)
// as drop-file records, with Poco's Zip and XML libraries only.
//
// Which sheet: the first worksheet whose name is a file kind's name
// (compared as column names are: "Oil lab" == "oil_lab"), else the first
// worksheet. Chart sheets are never read.
//
// Rows: the first row with a value is the header; the table spans from its
// first to its last non-empty cell. Every later row with a value is a
// record; empty rows are skipped. Lines are the sheet's row numbers and
// locate() names the cell ("row 7, cell C7").
//
// Cells become the same text a CSV would hold:
//  * shared strings (xl/sharedStrings.xml) and inline strings: their text
//    (rich-text runs joined, phonetic hints left out);
//  * numbers: shortest decimal text that reads back as the same double;
//  * numbers with a date or time format (built-in formats 14-22, 27-36,
//    45-47, 50-58, or a custom format with d, m, y, h or s outside quotes):
//    serial day numbers in the workbook's date system become ISO 8601,
//    YYYY-MM-DD, or YYYY-MM-DDThh:mm:ss when the format shows a time or the
//    value has one. 1900 system (the default): serial 1 = 1900-01-01, and
//    serial 60, the 29 February 1900 that never was, is a problem; from 61
//    on serial n is n days after 1899-12-30. 1904 system (workbookPr
//    date1904="1"): serial n is n days after 1904-01-01. date1904() says
//    which one was used (receipts name it);
//  * booleans: TRUE / FALSE; ISO 8601 date cells (t="d"): their text;
//  * empty cells: "".
// Problems (the file is then rejected whole, as for a CSV): an error value
// (#N/A, #DIV/0!, ...) or a formula without a saved value, in its cell; a
// value right of the header's last column; a second header row (the row
// below the header holds only text, and text under an empty header cell);
// merged cells anywhere on the sheet; and, for the whole file: not a ZIP
// container, a damaged one, an encrypted entry, no worksheet, a part larger
// than WorkbookOptions::max_part_bytes unpacked, or XML that does not parse.
// Nothing of this throws: every failure is one problem.
//
// Memory: the chosen sheet's cells are held as text (a workbook cannot be
// streamed from its end-of-file directory the way a CSV is); the unpacked
// size of each part is bounded.
//
// Not thread-safe. The stream must be seekable and outlive the reader.
#pragma once

#include <cstdint>
#include <istream>
#include <string>
#include <string_view>
#include <vector>

#include "daemon/ingest/record_source.h"

namespace ferrum::ingest {

struct WorkbookOptions {
  // Normalised sheet names preferred over the first worksheet, in order.
  std::vector<std::string> preferred_sheets;
  // Largest unpacked size of one part (sheet, shared strings, ...).
  std::uint64_t max_part_bytes = std::uint64_t{512} << 20;
};

// "A" for 1, "Z" for 26, "AA" for 27, ... (spreadsheet column letters).
std::string column_letters(int column);

class WorkbookReader : public RecordSource {
 public:
  WorkbookReader(std::istream& in, WorkbookOptions options = {});
  ~WorkbookReader() override;

  bool read_header(ProblemLog& problems) override;
  const std::vector<std::string>& header() const override { return header_; }
  std::int64_t header_line() const override { return header_row_; }
  RecordStatus next(ProblemLog& problems) override;
  std::span<const std::string_view> fields() const override { return views_; }
  std::int64_t record_line() const override { return record_row_; }
  std::string locate(std::int64_t line, int column_number) const override;

  const std::string& sheet_name() const { return sheet_name_; }
  bool date1904() const { return date1904_; }

  struct Cell {
    int column = 0;       // 0-based sheet column (A = 0)
    std::string text;     // as a CSV would hold it
    bool is_text = false; // a string cell (shared, inline or formula string)
    std::string problem;  // non-empty: the cell cannot be used, and why
  };
  struct Row {
    std::int64_t number = 0;  // 1-based sheet row
    std::vector<Cell> cells;  // non-empty cells, left to right
  };

 private:
  bool load(ProblemLog& problems);

  std::istream& in_;
  WorkbookOptions options_;
  std::string sheet_name_;
  bool date1904_ = false;
  std::vector<Row> rows_;
  std::size_t next_row_ = 0;
  int first_column_ = 0;  // sheet column of the header's first cell
  std::vector<std::string> header_;
  std::int64_t header_row_ = 0;
  std::int64_t record_row_ = 0;
  std::vector<std::string> values_;
  std::vector<std::string_view> views_;
};

}  // namespace ferrum::ingest
