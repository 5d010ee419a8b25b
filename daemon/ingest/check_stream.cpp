#include "daemon/ingest/check_stream.h"

#include <algorithm>

namespace ferrum::ingest {

namespace {

// Reads every record, parses it with `parser` into `row` and hands good rows
// to `deliver`.
template <class Parser, class Row, class Deliver>
void run_rows(RecordSource& reader, const KindDetection& detection, const CheckOptions& options,
              CheckSummary& summary, Deliver deliver) {
  Parser parser(detection.columns, options.parse, summary.decimal_comma, summary.problems,
                summary.warnings);
  Row row;
  for (;;) {
    const RecordStatus status = reader.next(summary.problems);
    if (status == RecordStatus::end) break;
    ++summary.rows_read;
    if (status == RecordStatus::malformed) continue;
    if (is_empty_row(reader.fields())) {
      --summary.rows_read;
      summary.warnings.add(reader.record_line(), "", "row with only empty values ignored");
      continue;
    }
    if (parser.parse(reader.fields(), reader.record_line(), row)) {
      ++summary.rows_good;
      deliver(row);
    }
  }
  parser.finish();
}

void note_unknown_columns(const RecordSource& reader, const KindDetection& d, CheckSummary& summary) {
  for (int i : d.unknown_columns) {
    const std::string& name = reader.header()[i];
    summary.warnings.add(reader.header_line(), name,
                         name.empty() ? "column without a name: ignored"
                                      : "unknown column: ignored");
  }
}

void run_kind(RecordSource& reader, const KindDetection& d, const CheckOptions& options,
              CheckSummary& summary, RowSink& sink) {
  switch (d.kind) {
    case FileKind::units_register:
      run_rows<UnitRowParser, UnitRow>(reader, d, options, summary,
                                       [&](const UnitRow& r) { sink.unit(r); });
      break;
    case FileKind::oil_lab:
      run_rows<OilRowParser, OilRow>(reader, d, options, summary,
                                     [&](const OilRow& r) { sink.oil_sample(r); });
      break;
    case FileKind::infrared:
      run_rows<InfraredRowParser, InfraredRow>(reader, d, options, summary,
                                               [&](const InfraredRow& r) { sink.infrared(r); });
      break;
    case FileKind::inspection:
      run_rows<InspectionRowParser, InspectionRow>(
          reader, d, options, summary, [&](const InspectionRow& r) { sink.inspection(r); });
      break;
    case FileKind::electrical_tests:
      run_rows<ElectricalRowParser, ElectricalRow>(
          reader, d, options, summary, [&](const ElectricalRow& r) { sink.electrical(r); });
      break;
    case FileKind::work_status:
      run_rows<WorkStatusRowParser, WorkStatusRow>(
          reader, d, options, summary, [&](const WorkStatusRow& r) { sink.work_status(r); });
      break;
    case FileKind::load_series:
      run_rows<LoadRowParser, LoadRow>(reader, d, options, summary, [&](const LoadRow& r) {
        summary.offset_assumed_rows += r.offset_assumed;
        sink.load_point(r);
      });
      break;
  }
}

}  // namespace

bool is_empty_row(std::span<const std::string_view> fields) {
  return std::all_of(fields.begin(), fields.end(), [](std::string_view f) {
    return f.find_first_not_of(" \t") == std::string_view::npos;
  });
}

std::vector<ConversionNote> stored_conversions(const KindDetection& d) {
  std::vector<ConversionNote> notes = d.conversions;
  if (d.kind != FileKind::load_series) return notes;
  // Load is stored per unit: a load_mva / load_kva / load_a column is converted.
  const ColumnBinding& mva = d.columns["load_mva"];
  const ColumnBinding& amperes = d.columns["load_a"];
  if (!mva.present() && !amperes.present()) return notes;
  notes.erase(std::remove_if(notes.begin(), notes.end(),
                             [](const ConversionNote& n) { return n.stored_as.rfind("load_mva", 0) == 0; }),
              notes.end());
  if (mva.present()) {
    notes.push_back({mva.header_name, mva.conversion == Conversion::kva_to_mva ? "kVA" : "MVA",
                     "load_pu (per unit of the register's rated_mva)"});
  } else {
    notes.push_back({amperes.header_name, "A (HV line current)",
                     "load_pu (I / I_rated, I_rated = rated_mva / (sqrt(3) hv_kv); "
                     "single-phase: rated_mva / hv_kv)"});
  }
  return notes;
}

namespace {

void check_source(RecordSource& reader, const CheckOptions& options, RowSink& sink, CheckSummary& summary) {
  if (!reader.read_header(summary.problems)) {
    summary.rejection = summary.problems.kept().empty() ? "no usable header row"
                                                        : summary.problems.kept().front().reason;
    return;
  }
  summary.header_line = reader.header_line();
  if (const auto* csv = dynamic_cast<const CsvReader*>(&reader)) summary.delimiter = csv->delimiter();
  summary.decimal_comma = uses_decimal_comma(options.decimal, reader.decimal_comma());
  summary.source_note = describe_source(reader);

  const KindDetection detection = detect_kind(reader.header(), options.columns);
  if (!detection.recognised) {
    summary.rejection = detection.reason;
    const int col = detection.reason_column;
    summary.problems.add(reader.header_line(), col >= 0 ? reader.header()[col] : std::string(),
                         col + 1, col >= 0 ? reader.header()[col] : std::string(), detection.reason);
    return;
  }
  summary.recognised = true;
  summary.kind = detection.kind;
  summary.conversions = stored_conversions(detection);
  note_unknown_columns(reader, detection, summary);
  if (!sink.begin(detection)) {
    summary.stopped_by_sink = true;
    return;
  }
  run_kind(reader, detection, options, summary, sink);
}

}  // namespace

CheckSummary check_stream(std::istream& in, const CheckOptions& options, RowSink& sink) {
  CheckSummary summary(options.max_problems_kept, options.max_distinct_warnings);
  const std::unique_ptr<RecordSource> source = open_record_source(in, {options.csv, options.workbook});
  RecordSource& reader = *source;
  summary.problems.set_locator([&reader](std::int64_t line, int column) { return reader.locate(line, column); });
  check_source(reader, options, sink, summary);
  summary.problems.set_locator(nullptr);  // the source ends here
  return summary;
}

}  // namespace ferrum::ingest
