// Row parsers: one record of a recognised drop file -> the analytics input
// types (analytics/unit_data.h), with every cell validated.
//
// One parser class per file kind, all built the same way: construct it with
// the file's ColumnMap (file_kinds.h), the options and the logs, then call
// parse() once per record in file order. parse() returns true and fills the
// row when the record is good; otherwise it logged one problem per bad cell
// (or one whole-row problem) and the row must not be used. A problem never
// stops the parser: the next record is parsed normally. Call finish() after
// the last record to flush counted warnings.
//
// What is checked (schema/drop-files.md has the contractor's version):
//  * types: numbers, ISO dates/timestamps, lab values, codes and vocabularies;
//  * physically impossible values (ValidationLimits), dates in the future;
//  * unit ids against the register (ParseOptions::lookup_unit), except in
//    the units register itself;
//  * duplicate keys within the file: units register (unit_id), oil lab
//    (unit_id, sample_date, lab_ref, sample_point), infrared (unit_id,
//    survey_date, component), inspection (unit_id, inspection_date, item),
//    electrical tests (unit_id, test_date, test and what names the reading),
//    work status (unit_id, action, status, date).
//    Load-series duplicates are left to the store: a file may hold millions.
// Alternative-unit columns are converted here (file_kinds.h, Conversion);
// load in MVA or A becomes per unit using the register's rated_mva, hv_kv
// and phases: I_rated = S / (sqrt(3) * U) for three-phase units, S / U for
// single-phase ones.
//
// LoadRowParser allocates nothing per row once warmed up (buffers reused,
// numbers via std::from_chars, last unit looked up cached), so a load series
// streams in bounded memory. The other parsers keep a key set per file.
//
// Pure: no files, no database, no clock (`now` is an option). A parser is
// not thread-safe; the UnitInfo pointers from lookup_unit must stay valid
// while the parser is used.
#pragma once

#include <cstdint>
#include <functional>
#include <initializer_list>
#include <optional>
#include <span>
#include <string>
#include <string_view>
#include <unordered_map>
#include <vector>

#include "analytics/unit_data.h"
#include "daemon/ingest/field_parsers.h"
#include "daemon/ingest/file_kinds.h"
#include "daemon/ingest/problems.h"

namespace ferrum::ingest {

// Limits beyond which a value is physically impossible (a problem, not a
// warning). Defaults are wide on purpose: they catch wrong units and typing
// errors, not unusual transformers.
struct ValidationLimits {
  double max_gas_ppm = 1e6;          // uL/L; 1e6 = the whole gas volume
  double max_moisture_ppm = 1000;    // mg/kg; "40 %" (400 000 mg/kg) must fail
  double max_load_pu = 5;            // a 50 pu load is a unit mistake
  double min_temperature_c = -60;    // every temperature column, after conversion
  double max_temperature_c = 250;
  int min_year_built = 1880;
  int future_tolerance_days = 1;     // clocks and time zones: a day of slack
};

// Given a unit id, the register entry, or nullptr when the unit is unknown.
using UnitLookup = std::function<const analytics::UnitInfo*(std::string_view unit_id)>;

// Inspection items accepted by default (snake_case): bushings, main_tank,
// gaskets_and_leaks, conservator_and_oil_level, breather,
// cooling_fans_and_pumps, radiators, on_load_tap_changer, control_cabinet,
// grounding, foundation, surge_arresters, ...
const std::vector<std::string>& default_inspection_items();

struct ParseOptions {
  // Current time, UTC seconds: dates after now + future_tolerance_days are
  // problems. Default 0 makes every real date "future": always set it.
  analytics::Timestamp now = 0;
  // Minutes east of UTC used for times written without an offset (default 0).
  int site_utc_offset_min = 0;
  // How the party writes dates and times besides ISO 8601 ([party.NAME] date_format).
  DateOrder date_order = DateOrder::iso;
  // Unit id -> register entry. Empty (default): ids are not checked, and a
  // load in MVA or A cannot be converted to per unit (a problem per row).
  UnitLookup lookup_unit;
  // Accepted inspection items, snake_case (default: the list above).
  std::vector<std::string> inspection_items = default_inspection_items();
  ValidationLimits limits;
  // Called for each measurement row whose unit id and date could be read, even
  // when another cell of the row has a problem: what a rejected file holds back.
  std::function<void(std::string_view unit_id, analytics::Day day)> on_dated_row;
};

struct UnitRow {
  std::int64_t line = 0;
  analytics::UnitInfo unit;  // unit.unit_id is the key
};

struct OilRow {
  std::int64_t line = 0;
  std::string unit_id;
  analytics::OilSample sample;
};

struct InfraredRow {
  std::int64_t line = 0;
  std::string unit_id;
  analytics::InfraredScan scan;
};

struct InspectionRow {
  std::int64_t line = 0;
  std::string unit_id;
  analytics::InspectionRecord record;
};

struct ElectricalRow {
  std::int64_t line = 0;
  std::string unit_id;
  analytics::ElectricalTest test;
};

struct WorkStatusRow {
  std::int64_t line = 0;
  std::string unit_id;
  analytics::WorkStatus status;  // status.reference is "UNIT/need"
};

struct LoadRow {
  std::int64_t line = 0;
  std::string unit_id;
  analytics::LoadPoint point;
  bool offset_assumed = false;  // the timestamp had no offset: the site's was used
};

// Shared machinery: cell access, typed cells with range checks, reporting.
class RowChecker {
 public:
  RowChecker(const ColumnMap& columns, const ParseOptions& options, bool decimal_comma,
             ProblemLog& problems, WarningLog& warnings);
  virtual ~RowChecker() = default;

  // 0-based column of unit_id in the file, -1 when it has none.
  int unit_column() const { return columns_["unit_id"].index; }

 protected:
  // A closed or half-open range in the field's unit; `unit` for messages.
  struct Range {
    double min;
    double max;
    const char* unit;
    bool min_exclusive = false;
  };

  void begin_row(std::span<const std::string_view> fields, std::int64_t line);
  // begin_row, then the unit_id (checked against the register, copied into
  // `unit_id`) and the required date in column `date_column`.
  std::optional<analytics::Day> begin_measurement_row(std::span<const std::string_view> fields,
                                                      std::int64_t line, std::string& unit_id,
                                                      std::string_view date_column);
  bool row_ok() const { return row_ok_; }
  std::int64_t line() const { return line_; }
  const ColumnBinding& column(std::string_view name) const { return columns_[name]; }
  // The trimmed cell, "" when the column is absent.
  std::string_view cell(const ColumnBinding& b) const;

  void report(const ColumnBinding& b, std::string reason);
  void report_row(std::string reason);
  void warn(const ColumnBinding& b, std::string_view message);

  // Empty cell: nullopt and no problem unless `required`.
  std::optional<double> number(const ColumnBinding& b, std::string_view label, const Range& r,
                               bool required = false);
  std::optional<std::int64_t> integer(const ColumnBinding& b, std::string_view label,
                                      const Range& r, bool required = false);
  analytics::LabValue lab_value(const ColumnBinding& b, std::string_view label, const Range& r);
  std::optional<analytics::Day> date(const ColumnBinding& b, bool required);
  // Non-empty text, else a "missing" problem.
  std::string_view required_text(const ColumnBinding& b, std::string_view label);
  // The unit's register entry; nullptr when unknown (a problem, unless no
  // lookup was given) or the cell is empty (a problem).
  const analytics::UnitInfo* unit(const ColumnBinding& b, bool& known);
  // True when `key` was seen before in this file (a problem is logged).
  bool duplicate_key(std::string key, std::string_view what);

  Range temperature_range() const;
  bool in_future(analytics::Day d) const;

  ColumnMap columns_;
  const ParseOptions& options_;
  bool decimal_comma_;
  ProblemLog& problems_;
  WarningLog& warnings_;

 private:
  bool check_range(const ColumnBinding& b, std::string_view label, double v, const Range& r);

  std::span<const std::string_view> fields_;
  std::int64_t line_ = 0;
  bool row_ok_ = true;
  std::unordered_map<std::string, std::int64_t> keys_;  // key -> first line
};

class UnitRowParser : public RowChecker {
 public:
  using RowChecker::RowChecker;
  bool parse(std::span<const std::string_view> fields, std::int64_t line, UnitRow& out);
  void finish() {}

 private:
  void parse_ratings(analytics::UnitInfo& u);
  void parse_construction(analytics::UnitInfo& u);
  void parse_thermal(analytics::UnitInfo& u);
  void parse_electrical(analytics::UnitInfo& u);
};

class OilRowParser : public RowChecker {
 public:
  using RowChecker::RowChecker;
  bool parse(std::span<const std::string_view> fields, std::int64_t line, OilRow& out);
  void finish() {}

 private:
  void parse_tests(analytics::OilSample& s);
  void parse_breakdown(analytics::OilSample& s);
};

class InfraredRowParser : public RowChecker {
 public:
  using RowChecker::RowChecker;
  bool parse(std::span<const std::string_view> fields, std::int64_t line, InfraredRow& out);
  void finish() {}
};

class InspectionRowParser : public RowChecker {
 public:
  using RowChecker::RowChecker;
  bool parse(std::span<const std::string_view> fields, std::int64_t line, InspectionRow& out);
  void finish() {}
};

// Electrical field tests: each row holds exactly the value column its
// `test` needs (a value in another test's column is a problem), and the
// descriptive columns that test uses (schema/drop-files.md, "Electrical
// field tests"). Taps are checked against the register's tap_positions.
class ElectricalRowParser : public RowChecker {
 public:
  using RowChecker::RowChecker;
  bool parse(std::span<const std::string_view> fields, std::int64_t line, ElectricalRow& out);
  void finish() {}

 private:
  void parse_values(analytics::ElectricalTest& t);
  void parse_context(analytics::ElectricalTest& t, const analytics::UnitInfo* unit);
  std::string code(std::string_view column, std::string_view label,
                   std::initializer_list<std::string_view> allowed, bool required);
};

// Planners' work status (issue #16): unit_id, action ("UNIT/need" as in
// analytics::action_reference, or the need alone), status (booked, done or
// cancelled), date, note. A booking date may lie ahead; a completion or
// cancellation date may not. The reference's unit must be the row's unit.
// Whether the reference matches an action the unit has is not a problem of
// the file: the receipt says so (import_bridge.cpp).
class WorkStatusRowParser : public RowChecker {
 public:
  using RowChecker::RowChecker;
  bool parse(std::span<const std::string_view> fields, std::int64_t line, WorkStatusRow& out);
  void finish() {}
};

class LoadRowParser : public RowChecker {
 public:
  LoadRowParser(const ColumnMap& columns, const ParseOptions& options, bool decimal_comma,
                ProblemLog& problems, WarningLog& warnings);
  bool parse(std::span<const std::string_view> fields, std::int64_t line, LoadRow& out);
  void finish();

 private:
  const analytics::UnitInfo* cached_unit(std::string_view id, bool& known);
  std::optional<double> per_unit(const analytics::UnitInfo* info);

  const ColumnBinding &unit_id_, &timestamp_, &mva_, &pu_, &amperes_, &ambient_, &top_oil_;
  std::string cached_id_;
  const analytics::UnitInfo* cached_info_ = nullptr;
  bool cached_known_ = false, cache_valid_ = false;
  std::int64_t assumed_offsets_ = 0, first_assumed_line_ = 0;
  std::int64_t reversed_ = 0, first_reversed_line_ = 0;
};

}  // namespace ferrum::ingest
