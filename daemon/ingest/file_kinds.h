// The seven kinds of drop file and how a header row is recognised as one.
//
// A file's kind comes from its header columns, never from its name. Column
// names are compared after trimming, lower-casing and turning spaces and
// hyphens into underscores ("Top Oil F" == "top_oil_f"), in any order.
// Some columns have alternative units, converted on import (alias table in
// schema/drop-files.md): every temperature column `X_c` may come as `X_f` in
// degrees Fahrenheit; furan_2fal_ppm (mg/kg-like ppm) for furan_2fal_ppb;
// load_kva for load_mva.
//
// Pure: no I/O. Thread-safe (the tables are constant).
#pragma once

#include <span>
#include <string>
#include <string_view>
#include <vector>

namespace ferrum::ingest {

enum class FileKind { units_register, oil_lab, infrared, load_series, inspection, electrical_tests, work_status };

// Name used in the configuration (party kinds) and receipts: "units_register",
// "oil_lab", "infrared", "load_series", "inspection", "electrical_tests",
// "work_status".
const char* to_string(FileKind kind);
// Plain name for messages: "units register", "oil-lab results", ...
const char* describe(FileKind kind);

// How a column's values are converted to the canonical field's unit.
enum class Conversion {
  none,
  fahrenheit_to_celsius,  // (F - 32) * 5/9
  ppm_to_ppb,             // x 1000
  kva_to_mva,             // / 1000
};

double apply(Conversion conversion, double value);

// Where one canonical field is found in a file.
struct ColumnBinding {
  int index = -1;                 // 0-based column; -1 when the file lacks it
  std::string header_name;        // as written in the header (trimmed)
  Conversion conversion = Conversion::none;
  bool present() const { return index >= 0; }
};

// Unit conversion applied to a whole column, kept as provenance.
struct ConversionNote {
  std::string column;         // header name as written, e.g. "top_oil_f"
  std::string original_unit;  // e.g. "degF"
  std::string stored_as;      // canonical field and unit, e.g. "top_oil_c (degC)"
};

// Canonical field name -> binding, for one recognised kind.
class ColumnMap {
 public:
  // The binding of canonical field `name` (e.g. "ambient_c"); an absent
  // binding when the file lacks it or the kind has no such field.
  const ColumnBinding& operator[](std::string_view name) const;
  void set(std::string_view name, ColumnBinding binding);
  const std::vector<std::pair<std::string, ColumnBinding>>& entries() const { return entries_; }

 private:
  std::vector<std::pair<std::string, ColumnBinding>> entries_;
};

struct KindDetection {
  bool recognised = false;
  FileKind kind = FileKind::units_register;  // valid when recognised
  ColumnMap columns;                          // canonical field -> column
  std::vector<int> unknown_columns;           // 0-based columns no field of the kind uses
  std::vector<ConversionNote> conversions;    // alias columns in use
  // When not recognised: why, in plain language; for "no kind matches" it
  // lists the columns each kind needs and what the closest kind misses.
  std::string reason;
  int reason_column = -1;                     // 0-based column the reason is about, or -1
};

KindDetection detect_kind(std::span<const std::string> header);

// The rejection text listing the columns each kind needs.
std::string describe_required_columns();
// The same for the given kinds only (e.g. those a party delivers).
std::string describe_required_columns(std::span<const FileKind> kinds);

// Every kind, in the order of the kind table.
std::vector<FileKind> all_kinds();

// True when `name` (normalised) is a column of some kind, or one of its
// alternative-unit columns (X_f, furan_2fal_ppm, load_kva): what a party's
// column map may point to.
bool is_known_column(std::string_view name);

// Canonical form of a header name: trimmed, lower case, spaces and hyphens
// as underscores.
std::string normalise_column_name(std::string_view name);

}  // namespace ferrum::ingest
