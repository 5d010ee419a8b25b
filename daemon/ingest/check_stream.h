// The whole parse of one drop file: record source (CSV or .xlsx workbook,
// open_source.h) -> the party's column map -> kind detection -> row parser, streaming good rows to a sink as they are read so the pipeline can
// insert them inside its transaction without holding the file in memory.
//
// The outcome is a CheckSummary: the kind, row counts, the first problems
// and the total problem count, and the warnings. A file is acceptable only
// when it was recognised and has no problem; whether rows already handed to
// the sink are kept is the caller's decision (the pipeline rolls back).
//
// Pure: reads only the given stream; no files, no database, no clock.
#pragma once

#include <cstddef>
#include <cstdint>
#include <istream>
#include <span>
#include <string>
#include <vector>

#include "daemon/ingest/csv_reader.h"
#include "daemon/ingest/header_map.h"
#include "daemon/ingest/open_source.h"
#include "daemon/ingest/file_kinds.h"
#include "daemon/ingest/problems.h"
#include "daemon/ingest/row_parsers.h"

namespace ferrum::ingest {

// Receives the good rows of one file, in file order. Rows with a problem are
// never passed on. References are valid only during the call.
class RowSink {
 public:
  virtual ~RowSink() = default;
  // Called once the kind is known, before any row. Returning false stops
  // the check (e.g. the party may not deliver this kind); the summary then
  // says stopped_by_sink and no row is read.
  virtual bool begin(const KindDetection& /*detection*/) { return true; }
  virtual void unit(const UnitRow& /*row*/) {}
  virtual void oil_sample(const OilRow& /*row*/) {}
  virtual void infrared(const InfraredRow& /*row*/) {}
  virtual void inspection(const InspectionRow& /*row*/) {}
  virtual void load_point(const LoadRow& /*row*/) {}
  virtual void electrical(const ElectricalRow& /*row*/) {}
  virtual void work_status(const WorkStatusRow& /*row*/) {}
};

struct CheckOptions {
  ParseOptions parse;                     // now, site offset, unit lookup, limits
  CsvOptions csv;                         // record length limit, read size
  WorkbookOptions workbook;               // preferred sheets, unpacked size limit
  HeaderMap columns;                      // the party's column map; empty: ferrum's names only
  DecimalMark decimal = DecimalMark::automatic;  // the party's decimal separator
  std::size_t max_problems_kept = 100;    // all are counted; this many are kept
  std::size_t max_distinct_warnings = 100;
};

struct CheckSummary {
  explicit CheckSummary(std::size_t keep_problems = 100, std::size_t distinct_warnings = 100)
      : problems(keep_problems), warnings(distinct_warnings) {}

  bool recognised = false;
  FileKind kind = FileKind::units_register;  // valid when recognised
  // Whole-file reason when the file was not read row by row (no header,
  // unknown kind); it is also the first problem.
  std::string rejection;
  bool stopped_by_sink = false;
  std::int64_t header_line = 0;
  char delimiter = ',';
  bool decimal_comma = false;
  std::string source_note;      // what was read when not a plain CSV (open_source.h, describe_source)
  std::int64_t rows_read = 0;   // data records, malformed ones included; blank lines not
  std::int64_t rows_good = 0;   // rows handed to the sink
  std::int64_t offset_assumed_rows = 0;  // load rows whose time had no UTC offset
  ProblemLog problems;
  WarningLog warnings;
  std::vector<ConversionNote> conversions;  // unit conversions applied, for provenance

  bool acceptable() const { return recognised && !stopped_by_sink && problems.empty(); }
};

CheckSummary check_stream(std::istream& in, const CheckOptions& options, RowSink& sink);

// True for a record whose values are all empty or blank: such rows are
// skipped with a warning, never a problem (drop-file contract).
bool is_empty_row(std::span<const std::string_view> fields);

// The unit conversions of a recognised file's columns, for provenance: the
// alias columns of the detection and, for a load series, the load column that
// is stored per unit of the register's rating (load_mva, load_kva, load_a).
std::vector<ConversionNote> stored_conversions(const KindDetection& detection);

}  // namespace ferrum::ingest
