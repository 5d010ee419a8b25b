#include <limits>

#include "daemon/ingest/field_parsers.h"
#include "daemon/ingest/row_parsers.h"

namespace ferrum::ingest {

using analytics::Day;
using analytics::LabValue;

const std::vector<std::string>& default_inspection_items() {
  static const std::vector<std::string> items = {
      "bushings",           "main_tank",           "gaskets_and_leaks",
      "conservator_and_oil_level", "breather",     "cooling_fans_and_pumps",
      "radiators",          "on_load_tap_changer", "off_circuit_tap_changer",
      "control_cabinet",    "grounding",           "foundation",
      "surge_arresters",    "buchholz_relay",      "pressure_relief_device",
      "temperature_indicators", "connectors_and_clamps", "paint_and_corrosion",
      "fire_protection",
  };
  return items;
}

RowChecker::RowChecker(const ColumnMap& columns, const ParseOptions& options, bool decimal_comma,
                       ProblemLog& problems, WarningLog& warnings)
    : columns_(columns),
      options_(options),
      decimal_comma_(decimal_comma),
      problems_(problems),
      warnings_(warnings) {}

void RowChecker::begin_row(std::span<const std::string_view> fields, std::int64_t line) {
  fields_ = fields;
  line_ = line;
  row_ok_ = true;
}

std::optional<Day> RowChecker::begin_measurement_row(std::span<const std::string_view> fields,
                                                     std::int64_t line, std::string& unit_id,
                                                     std::string_view date_column) {
  begin_row(fields, line);
  bool known = false;
  unit(column("unit_id"), known);
  unit_id = cell(column("unit_id"));
  const auto day = date(column(date_column), true);
  if (day && !unit_id.empty() && options_.on_dated_row) options_.on_dated_row(unit_id, *day);
  return day;
}

std::string_view RowChecker::cell(const ColumnBinding& b) const {
  if (!b.present() || static_cast<std::size_t>(b.index) >= fields_.size()) return {};
  return trim(fields_[b.index]);
}

void RowChecker::report(const ColumnBinding& b, std::string reason) {
  row_ok_ = false;
  problems_.add(line_, b.header_name, b.index + 1, cell(b), std::move(reason));
}

void RowChecker::report_row(std::string reason) {
  row_ok_ = false;
  problems_.add(line_, "", 0, "", std::move(reason));
}

void RowChecker::warn(const ColumnBinding& b, std::string_view message) {
  warnings_.add(line_, b.header_name, message);
}

bool RowChecker::check_range(const ColumnBinding& b, std::string_view label, double v,
                             const Range& r) {
  if (!(v < r.min || (r.min_exclusive && v <= r.min) || v > r.max)) return true;  // the hot path: in range
  const std::string unit = *r.unit ? std::string(" ") + r.unit : std::string();
  std::string why;
  if (v < r.min || (r.min_exclusive && v <= r.min)) {
    if (r.min == 0) {
      why = std::string(label) + (r.min_exclusive ? " must be above 0" : " cannot be negative");
    } else {
      why = std::string(label) + " " + format_number(v) + unit + " is below the possible minimum of " +
            format_number(r.min) + unit;
    }
  } else if (v > r.max) {
    why = std::string(label) + " " + format_number(v) + unit + " is not possible (more than " +
          format_number(r.max) + unit + ")";
  } else {
    return true;
  }
  if (b.conversion != Conversion::none) why += " after unit conversion";
  report(b, std::move(why));
  return false;
}

std::optional<double> RowChecker::number(const ColumnBinding& b, std::string_view label,
                                         const Range& r, bool required) {
  const std::string_view text = cell(b);
  if (text.empty()) {
    if (required) report(b, std::string(label) + " is missing");
    return std::nullopt;
  }
  const Parsed<double> p = parse_number(text, decimal_comma_);
  if (!p.ok()) {
    report(b, std::string(label) + ": " + p.error);
    return std::nullopt;
  }
  const double v = apply(b.conversion, p.value);
  if (!check_range(b, label, v, r)) return std::nullopt;
  return v;
}

std::optional<std::int64_t> RowChecker::integer(const ColumnBinding& b, std::string_view label,
                                                const Range& r, bool required) {
  const std::string_view text = cell(b);
  if (text.empty()) {
    if (required) report(b, std::string(label) + " is missing");
    return std::nullopt;
  }
  const Parsed<std::int64_t> p = parse_integer(text);
  if (!p.ok()) {
    report(b, std::string(label) + ": " + p.error);
    return std::nullopt;
  }
  if (!check_range(b, label, static_cast<double>(p.value), r)) return std::nullopt;
  return p.value;
}

LabValue RowChecker::lab_value(const ColumnBinding& b, std::string_view label, const Range& r) {
  const Parsed<LabValue> p = parse_lab_value(cell(b), decimal_comma_);
  if (!p.ok()) {
    report(b, std::string(label) + ": " + p.error);
    return {};
  }
  LabValue v = p.value;
  if (v.is_measured()) {
    v.value = apply(b.conversion, v.value);
    if (!check_range(b, label, v.value, r)) return {};
  } else if (v.is_below_limit()) {
    if (!std::isnan(v.value)) v.value = apply(b.conversion, v.value);
    warn(b, "value below detection limit");
  }
  return v;
}

bool RowChecker::in_future(Day d) const {
  return d > analytics::day_of(options_.now) + options_.limits.future_tolerance_days;
}

std::optional<Day> RowChecker::date(const ColumnBinding& b, bool required) {
  const std::string_view text = cell(b);
  if (text.empty()) {
    if (required) report(b, b.header_name + " is missing");
    return std::nullopt;
  }
  const Parsed<Day> p = parse_date(text, options_.date_order);
  if (!p.ok()) {
    report(b, p.error);
    return std::nullopt;
  }
  if (in_future(p.value)) {
    report(b, "date " + std::string(text) + " is in the future");
    return std::nullopt;
  }
  return p.value;
}

std::string_view RowChecker::required_text(const ColumnBinding& b, std::string_view label) {
  const std::string_view text = cell(b);
  if (text.empty()) report(b, std::string(label) + " is missing");
  return text;
}

const analytics::UnitInfo* RowChecker::unit(const ColumnBinding& b, bool& known) {
  known = false;
  const std::string_view id = required_text(b, "unit_id");
  if (id.empty()) return nullptr;
  if (!options_.lookup_unit) {
    known = true;  // not checked
    return nullptr;
  }
  const analytics::UnitInfo* info = options_.lookup_unit(id);
  if (info == nullptr) {
    report(b, "unit " + std::string(id) + " is not in the units register");
    return nullptr;
  }
  known = true;
  return info;
}

bool RowChecker::duplicate_key(std::string key, std::string_view what) {
  const auto [it, inserted] = keys_.emplace(std::move(key), line_);
  if (inserted) return false;
  report_row("duplicate row: same " + std::string(what) + " as line " + std::to_string(it->second));
  return true;
}

RowChecker::Range RowChecker::temperature_range() const {
  return {options_.limits.min_temperature_c, options_.limits.max_temperature_c, "°C"};
}

}  // namespace ferrum::ingest
