// Chooses the record source (record_source.h) for a dropped file from its
// first bytes, never from its name: a ZIP container is read as an .xlsx
// workbook; an OLE compound file (an old binary .xls, or an .xlsx saved with
// a password, which is stored the same way) is refused with "save it as
// .xlsx or CSV"; anything else is read as CSV text.
#pragma once

#include <istream>
#include <memory>

#include "daemon/ingest/csv_reader.h"
#include "daemon/ingest/record_source.h"
#include "daemon/ingest/workbook_reader.h"

namespace ferrum::ingest {

struct SourceOptions {
  CsvOptions csv;
  WorkbookOptions workbook;
  // The dropped file's name, only to explain a refusal: a file named .xlsx
  // or .xls whose content is no workbook is refused instead of being read
  // as text. "" when unknown.
  std::string file_name;
};

// REQUIRES: `in` is seekable (a file or a string stream) and outlives the source.
std::unique_ptr<RecordSource> open_record_source(std::istream& in, const SourceOptions& options);

// A sentence for the receipt about what was read: the worksheet and date
// system of a workbook; "" for a CSV.
std::string describe_source(const RecordSource& source);

// Normalised names of every file kind, for WorkbookOptions::preferred_sheets.
std::vector<std::string> kind_sheet_names();

}  // namespace ferrum::ingest
