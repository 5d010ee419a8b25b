// Electrical field test rows (schema/drop-files.md, "Electrical field tests").
#include <array>
#include <cctype>
#include <span>
#include <vector>
#include <string>

#include "daemon/ingest/field_parsers.h"
#include "daemon/ingest/row_parsers.h"

namespace ferrum::ingest {

namespace {

using analytics::ElectricalTestKind;

// The value columns. Ranges catch wrong units and typing errors, not
// unusual transformers.
struct ValueColumn {
  std::string_view name;
  std::string_view label;
  double min, max;
  const char* unit;
  bool min_exclusive;
};
constexpr std::array<ValueColumn, 7> kValues = {{
    {"ratio", "turns ratio", 0, 10000, "", true},
    {"resistance_ohm", "winding resistance", 0, 100000, "ohm", true},
    {"power_factor_pct", "power factor", 0, 100, "%", false},
    {"capacitance_pf", "capacitance", 0, 1e8, "pF", true},
    {"resistance_megohm", "insulation resistance", 0, 1e9, "Mohm", true},
    {"current_ma", "excitation current", 0, 1e6, "mA", false},
    {"impedance_pct", "impedance", 0, 100, "%", true},
}};

// The value columns a test takes; the first is the one it needs (bushings:
// power factor and/or capacitance, checked separately).
std::span<const std::string_view> value_columns_of(ElectricalTestKind k) {
  static constexpr std::string_view ratio[] = {"ratio"};
  static constexpr std::string_view ohm[] = {"resistance_ohm"};
  static constexpr std::string_view pf[] = {"power_factor_pct", "capacitance_pf"};
  static constexpr std::string_view megohm[] = {"resistance_megohm"};
  static constexpr std::string_view ma[] = {"current_ma"};
  static constexpr std::string_view impedance[] = {"impedance_pct"};
  switch (k) {
    case ElectricalTestKind::turns_ratio: return ratio;
    case ElectricalTestKind::winding_resistance: return ohm;
    case ElectricalTestKind::insulation_power_factor: return pf;
    case ElectricalTestKind::bushing_power_factor: return pf;
    case ElectricalTestKind::insulation_resistance: return megohm;
    case ElectricalTestKind::excitation_current: return ma;
    case ElectricalTestKind::leakage_reactance: return impedance;
  }
  return {};
}

// "a", "a or b", "a, b or c".
std::string join_or(std::span<const std::string_view> names) {
  std::string out;
  for (std::size_t i = 0; i < names.size(); ++i) {
    if (i) out += i + 1 == names.size() ? " or " : ", ";
    out += names[i];
  }
  return out;
}

std::string upper(std::string_view text) {
  std::string out(text);
  for (char& c : out) c = static_cast<char>(std::toupper(static_cast<unsigned char>(c)));
  return out;
}

bool is_bushing_name(std::string_view b) {
  // A terminal letter (H, X, Y, T) and a number 0..99: H1, X0, Y3.
  if (b.size() < 2 || b.size() > 3) return false;
  if (b[0] != 'H' && b[0] != 'X' && b[0] != 'Y' && b[0] != 'T') return false;
  for (std::size_t i = 1; i < b.size(); ++i)
    if (!std::isdigit(static_cast<unsigned char>(b[i]))) return false;
  return true;
}

}  // namespace

bool ElectricalRowParser::parse(std::span<const std::string_view> fields, std::int64_t line,
                                ElectricalRow& out) {
  out.line = line;
  out.test = analytics::ElectricalTest{};
  analytics::ElectricalTest& t = out.test;
  begin_row(fields, line);
  bool known = false;
  const analytics::UnitInfo* info = unit(column("unit_id"), known);
  out.unit_id = cell(column("unit_id"));
  const auto day = date(column("test_date"), true);
  t.date = day.value_or(0);
  if (day && !out.unit_id.empty() && options_.on_dated_row) options_.on_dated_row(out.unit_id, *day);
  const ColumnBinding& test = column("test");
  const std::string name = to_snake_case(required_text(test, "test"));
  bool test_known = false;
  if (!name.empty()) {
    if (const auto k = analytics::electrical_test_from(name)) {
      t.test = *k;
      test_known = true;
    } else {
      report(test, "test '" + std::string(cell(test)) +
                       "' is not one of turns_ratio, winding_resistance, insulation_power_factor, "
                       "bushing_power_factor, insulation_resistance, excitation_current, leakage_reactance");
    }
  }
  if (test_known) {
    parse_values(t);
    parse_context(t, info);
  }
  t.note = cell(column("note"));
  t.crew = cell(column("crew"));
  if (row_ok()) {
    duplicate_key(out.unit_id + '\x1f' + std::to_string(t.date) + '\x1f' + name + '\x1f' + t.phase + '\x1f' +
                      (t.tap ? std::to_string(*t.tap) : "") + '\x1f' + t.winding + '\x1f' + t.insulation +
                      '\x1f' + t.bushing + '\x1f' + (t.minutes ? std::to_string(*t.minutes) : "") + '\x1f' +
                      (t.test_kv ? format_number(*t.test_kv) : ""),
                  "unit_id, test_date, test, phase, tap, winding, insulation, bushing, minutes and test_kv");
  }
  return row_ok();
}

void ElectricalRowParser::parse_values(analytics::ElectricalTest& t) {
  const auto wanted = value_columns_of(t.test);
  const std::string test_name = analytics::to_string(t.test);
  std::optional<double> got[kValues.size()];
  for (std::size_t i = 0; i < kValues.size(); ++i) {
    const ValueColumn& v = kValues[i];
    const ColumnBinding& b = column(v.name);
    if (cell(b).empty()) continue;
    bool allowed = false;
    for (std::string_view w : wanted) allowed = allowed || w == v.name;
    if (!allowed) {
      report(b, std::string(v.name) + " is not a value of a " + test_name + " test (it takes " +
                    join_or(wanted) + "): one test result per row, leave it empty");
      continue;
    }
    got[i] = number(b, v.label, {v.min, v.max, v.unit, v.min_exclusive});
  }
  auto value_of = [&](std::string_view name) -> std::optional<double> {
    for (std::size_t i = 0; i < kValues.size(); ++i)
      if (kValues[i].name == name) return got[i];
    return std::nullopt;
  };
  const std::string_view first = *wanted.begin();
  if (t.test == ElectricalTestKind::bushing_power_factor) {
    t.value = value_of("power_factor_pct");
    t.capacitance_pf = value_of("capacitance_pf");
    if (cell(column("power_factor_pct")).empty() && cell(column("capacitance_pf")).empty())
      report_row("a bushing_power_factor row needs power_factor_pct, capacitance_pf or both (both are empty)");
  } else {
    t.value = value_of(first);
    if (t.test == ElectricalTestKind::insulation_power_factor) t.capacitance_pf = value_of("capacitance_pf");
    const ColumnBinding& b = column(first);
    if (cell(b).empty()) {
      if (b.present()) report(b, std::string(first) + " is missing (a " + test_name + " row needs it)");
      else report_row("a " + test_name + " row needs a " + std::string(first) + " column, which the file lacks");
    }
  }
  t.nameplate_value = number(column("nameplate_value"), "nameplate value", {0, 1e9, "", true});
}

std::string ElectricalRowParser::code(std::string_view name, std::string_view label,
                                      std::initializer_list<std::string_view> allowed, bool required) {
  const ColumnBinding& b = column(name);
  const std::string text = upper(cell(b));
  if (text.empty()) {
    if (required) {
      if (b.present()) report(b, std::string(label) + " is missing");
      else report_row(std::string(label) + " is needed: add a " + std::string(name) + " column");
    }
    return {};
  }
  if (allowed.size() == 0) return text;
  const std::vector<std::string_view> list(allowed);
  for (std::string_view a : allowed)
    if (text == a) return text;
  report(b, std::string(label) + " must be " + join_or(list));
  return {};
}

void ElectricalRowParser::parse_context(analytics::ElectricalTest& t, const analytics::UnitInfo* unit) {
  using K = ElectricalTestKind;
  const bool three_phase = unit && unit->phases == 3;
  t.phase = code("phase", "phase", {"A", "B", "C"}, t.test == K::excitation_current && three_phase);
  const ColumnBinding& tap = column("tap");
  if (const auto n = integer(tap, "tap", {1, 99, ""})) {
    if (unit && unit->tap_positions && *n > *unit->tap_positions)
      report(tap, "tap " + std::to_string(*n) + " is beyond the register's tap_positions " +
                      std::to_string(*unit->tap_positions));
    else
      t.tap = static_cast<int>(*n);
  }
  const bool needs_temperature = t.test == K::winding_resistance;
  if (needs_temperature && !column("temp_c").present())
    report_row("a winding_resistance row needs temp_c (the winding temperature, to correct the resistance)");
  else
    t.temp_c = number(column("temp_c"), "winding temperature", temperature_range(), needs_temperature);
  t.test_kv = number(column("test_kv"), "test voltage", {0, 1000, "kV", true});
  switch (t.test) {
    case K::winding_resistance:
      t.winding = code("winding", "winding", {"HV", "LV", "TV"}, true);
      break;
    case K::insulation_power_factor:
      t.insulation = code("insulation", "insulation", {"CH", "CL", "CHL"}, true);
      break;
    case K::bushing_power_factor: {
      const ColumnBinding& b = column("bushing");
      t.bushing = code("bushing", "bushing", {}, true);
      if (!t.bushing.empty() && !is_bushing_name(t.bushing)) {
        report(b, "bushing must be a terminal name such as H1, H2, X1 or Y1");
        t.bushing.clear();
      }
      t.insulation = code("insulation", "insulation", {"C1", "C2"}, false);
      if (t.insulation.empty()) t.insulation = "C1";  // the main insulation, the usual test
      break;
    }
    case K::insulation_resistance: {
      t.insulation = code("insulation", "insulation", {}, true);
      const ColumnBinding& m = column("minutes");
      if (!m.present()) {
        report_row("an insulation_resistance row needs a minutes column (1 or 10)");
      } else if (const auto n = integer(m, "minutes", {1, 10, "min"}, true)) {
        if (*n != 1 && *n != 10) report(m, "minutes must be 1 or 10 (the readings of the polarization index)");
        else t.minutes = static_cast<int>(*n);
      }
      break;
    }
    default:
      break;
  }
}

}  // namespace ferrum::ingest
