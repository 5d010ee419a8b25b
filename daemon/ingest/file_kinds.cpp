#include "daemon/ingest/file_kinds.h"

#include <algorithm>
#include <array>

#include "daemon/ingest/field_parsers.h"

namespace ferrum::ingest {

namespace {

// required: the file must have it. group: the kind's group rule applies
// (oil lab: at least one test column; infrared: reference_c or ambient_c;
// load series: exactly one load column).
enum class Need { required, optional, group };

struct FieldSpec {
  std::string_view name;
  Need need = Need::optional;
  bool temperature = false;  // also accepted as name with _c -> _f, in degF
};

enum class GroupRule { none, at_least_one, exactly_one };

struct KindSpec {
  FileKind kind;
  std::span<const FieldSpec> fields;
  GroupRule group;
  std::string_view group_text;  // how the group is described in messages
};

constexpr auto R = Need::required;
constexpr auto O = Need::optional;
constexpr auto G = Need::group;

constexpr FieldSpec kRegister[] = {
    {"unit_id", R},  {"site", R},        {"rated_mva", R},      {"hv_kv", R},
    {"lv_kv", R},    {"cooling", R},     {"year_built", R},     {"serial", O},
    {"phases", O},   {"vector_group", O}, {"oil_type", O},       {"paper", O},
    {"oil_volume_l", O}, {"criticality", O}, {"customers_served", O}, {"top_oil_rise_k", O},
    {"hot_spot_gradient_k", O}, {"load_loss_ratio", O}, {"oil_treated_date", O},
    // For the electrical field tests.
    {"conductor", O}, {"tap_positions", O}, {"tap_nominal", O}, {"tap_step_pct", O}, {"impedance_pct", O}, {"oltc", O},
    {"replacement_cost", O}, {"refurbishment_cost", O},
};

constexpr FieldSpec kOilLab[] = {
    {"unit_id", R},      {"sample_date", R},   {"h2_ppm", G},         {"ch4_ppm", G},
    {"c2h6_ppm", G},     {"c2h4_ppm", G},      {"c2h2_ppm", G},       {"co_ppm", G},
    {"co2_ppm", G},      {"o2_ppm", G},        {"n2_ppm", G},         {"moisture_ppm", G},
    {"oil_temp_c", G, true}, {"breakdown_kv", G}, {"acidity_mgkoh_g", G}, {"ift_mn_m", G},
    {"pf25_pct", G},     {"pf100_pct", G},     {"color", G},          {"furan_2fal_ppb", G},
    {"breakdown_method", O}, {"lab_ref", O},   {"sample_point", O},
};

constexpr FieldSpec kInfrared[] = {
    {"unit_id", R},   {"survey_date", R},          {"component", R},        {"spot_c", R, true},
    {"reference_c", G, true}, {"ambient_c", G, true}, {"load_pct", O},       {"emissivity", O},
    {"image_ref", O}, {"note", O},
};

constexpr FieldSpec kLoad[] = {
    {"unit_id", R}, {"timestamp", R},          {"load_mva", G},         {"load_pu", G},
    {"load_a", G},  {"ambient_c", O, true},    {"top_oil_c", O, true},
};

constexpr FieldSpec kInspection[] = {
    {"unit_id", R}, {"inspection_date", R}, {"item", R},
    {"rating", R},  {"note", O},            {"inspector", O},
};

// Electrical field tests: one test result per row, in its test's value
// column (daemon/ingest/electrical_rows.cpp checks which one).
constexpr FieldSpec kElectrical[] = {
    {"unit_id", R},          {"test_date", R},       {"test", R},
    {"ratio", G},            {"resistance_ohm", G},  {"power_factor_pct", G}, {"capacitance_pf", G},
    {"resistance_megohm", G}, {"current_ma", G},     {"impedance_pct", G},
    {"phase", O},            {"tap", O},             {"winding", O},          {"temp_c", O, true},
    {"insulation", O},       {"test_kv", O},         {"bushing", O},          {"minutes", O},
    {"nameplate_value", O},  {"note", O},            {"crew", O},
};

// Planners' work status (issue #16): the state of one action, matched by
// its reference "UNIT/need" (daemon/ingest/work_status_rows.cpp).
constexpr FieldSpec kWorkStatus[] = {
    {"unit_id", R}, {"action", R}, {"status", R}, {"date", R}, {"note", O},
};

constexpr std::array<KindSpec, 7> kKinds = {{
    {FileKind::units_register, kRegister, GroupRule::none, ""},
    {FileKind::oil_lab, kOilLab, GroupRule::at_least_one, "at least one test column"},
    {FileKind::infrared, kInfrared, GroupRule::at_least_one, "reference_c or ambient_c"},
    {FileKind::load_series, kLoad, GroupRule::exactly_one, "exactly one of"},
    {FileKind::inspection, kInspection, GroupRule::none, ""},
    {FileKind::electrical_tests, kElectrical, GroupRule::at_least_one,
     "at least one value column (ratio, resistance_ohm, power_factor_pct, capacitance_pf, "
     "resistance_megohm, current_ma, impedance_pct)"},
    {FileKind::work_status, kWorkStatus, GroupRule::none, ""},
}};

// Alternative-unit columns other than the automatic X_f for temperatures.
struct Alias {
  std::string_view column;
  std::string_view field;
  Conversion conversion;
  std::string_view original_unit;
};
constexpr Alias kAliases[] = {
    {"furan_2fal_ppm", "furan_2fal_ppb", Conversion::ppm_to_ppb, "ppm (mg/L)"},
    {"load_kva", "load_mva", Conversion::kva_to_mva, "kVA"},
};

std::string_view unit_of(std::string_view field) {
  if (field.ends_with("_c")) return "degC";
  if (field.ends_with("_ppb")) return "ppb (ug/L)";
  if (field.ends_with("_mva")) return "MVA";
  return "";
}

// The field of `spec` that a normalised column name fills, with its conversion.
const FieldSpec* match_field(const KindSpec& spec, std::string_view column, Conversion& conversion,
                             std::string_view& original_unit) {
  conversion = Conversion::none;
  original_unit = {};
  for (const FieldSpec& f : spec.fields) {
    if (f.name == column) return &f;
  }
  for (const FieldSpec& f : spec.fields) {
    if (f.temperature && column.size() == f.name.size() &&
        column.substr(0, column.size() - 1) == f.name.substr(0, f.name.size() - 1) &&
        column.back() == 'f') {
      conversion = Conversion::fahrenheit_to_celsius;
      original_unit = "degF";
      return &f;
    }
  }
  for (const Alias& a : kAliases) {
    if (a.column != column) continue;
    for (const FieldSpec& f : spec.fields) {
      if (f.name == a.field) {
        conversion = a.conversion;
        original_unit = a.original_unit;
        return &f;
      }
    }
  }
  return nullptr;
}

std::string join_fields(const KindSpec& spec, Need need) {
  std::string out;
  for (const FieldSpec& f : spec.fields) {
    if (f.need != need) continue;
    if (!out.empty()) out += ", ";
    out += f.name;
  }
  return out;
}

std::string needs_of(const KindSpec& spec) {
  std::string out = join_fields(spec, Need::required);
  if (spec.group == GroupRule::at_least_one && spec.kind == FileKind::oil_lab) {
    out += " and at least one test column (" + join_fields(spec, Need::group) + ")";
  } else if (spec.group == GroupRule::at_least_one) {
    out += " and " + std::string(spec.group_text);
  } else if (spec.group == GroupRule::exactly_one) {
    out += " and exactly one of " + join_fields(spec, Need::group);
  }
  return out;
}

// The result of matching a header against one kind.
struct Match {
  KindDetection detection;
  std::vector<std::string_view> missing;  // required fields not found
  int group_count = 0;
  int matched_required = 0;
  bool fits = false;
};

Match match_kind(const KindSpec& spec, std::span<const std::string> header) {
  Match m;
  KindDetection& d = m.detection;
  d.kind = spec.kind;
  for (std::size_t i = 0; i < header.size(); ++i) {
    const std::string column = normalise_column_name(header[i]);
    Conversion conversion;
    std::string_view original_unit;
    const FieldSpec* f = column.empty() ? nullptr : match_field(spec, column, conversion, original_unit);
    if (f == nullptr) {
      d.unknown_columns.push_back(static_cast<int>(i));
      continue;
    }
    const ColumnBinding& earlier = d.columns[f->name];
    if (earlier.present() && d.reason.empty()) {
      d.reason = "columns " + std::to_string(earlier.index + 1) + " (" + earlier.header_name +
                 ") and " + std::to_string(i + 1) + " (" + header[i] + ") both give " +
                 std::string(f->name) + ": keep one";
      d.reason_column = static_cast<int>(i);
      continue;
    }
    d.columns.set(f->name, ColumnBinding{static_cast<int>(i), header[i], conversion});
    if (conversion != Conversion::none) {
      d.conversions.push_back(
          {header[i], std::string(original_unit),
           std::string(f->name) + " (" + std::string(unit_of(f->name)) + ")"});
    }
    m.group_count += f->need == Need::group;
    m.matched_required += f->need == Need::required;
  }
  for (const FieldSpec& f : spec.fields) {
    if (f.need == Need::required && !d.columns[f.name].present()) m.missing.push_back(f.name);
  }
  const bool group_ok = spec.group == GroupRule::none ||
                        (spec.group == GroupRule::at_least_one && m.group_count >= 1) ||
                        (spec.group == GroupRule::exactly_one && m.group_count == 1);
  m.fits = m.missing.empty() && group_ok;
  if (m.missing.empty() && !group_ok && d.reason.empty()) {
    d.reason = std::string("a ") + describe(spec.kind) + " file needs " +
               (spec.group == GroupRule::exactly_one
                    ? "exactly one of " + join_fields(spec, Need::group) + " (found " +
                          std::to_string(m.group_count) + ")"
                    : std::string(spec.kind == FileKind::oil_lab
                                      ? "at least one test column (" + join_fields(spec, Need::group) + ")"
                                      : std::string(spec.group_text)));
  }
  return m;
}

}  // namespace

const char* to_string(FileKind kind) {
  switch (kind) {
    case FileKind::units_register: return "units_register";
    case FileKind::oil_lab: return "oil_lab";
    case FileKind::infrared: return "infrared";
    case FileKind::load_series: return "load_series";
    case FileKind::inspection: return "inspection";
    case FileKind::electrical_tests: return "electrical_tests";
    case FileKind::work_status: return "work_status";
  }
  return "unknown";
}

const char* describe(FileKind kind) {
  switch (kind) {
    case FileKind::units_register: return "units register";
    case FileKind::oil_lab: return "oil-lab results";
    case FileKind::infrared: return "infrared survey";
    case FileKind::load_series: return "load series";
    case FileKind::inspection: return "field inspection";
    case FileKind::electrical_tests: return "electrical field tests";
    case FileKind::work_status: return "work status";
  }
  return "unknown";
}

double apply(Conversion conversion, double value) {
  switch (conversion) {
    case Conversion::none: return value;
    case Conversion::fahrenheit_to_celsius: return (value - 32.0) * 5.0 / 9.0;
    case Conversion::ppm_to_ppb: return value * 1000.0;
    case Conversion::kva_to_mva: return value / 1000.0;
  }
  return value;
}

const ColumnBinding& ColumnMap::operator[](std::string_view name) const {
  static const ColumnBinding kAbsent;
  for (const auto& [field, binding] : entries_) {
    if (field == name) return binding;
  }
  return kAbsent;
}

void ColumnMap::set(std::string_view name, ColumnBinding binding) {
  for (auto& [field, b] : entries_) {
    if (field == name) {
      b = std::move(binding);
      return;
    }
  }
  entries_.emplace_back(std::string(name), std::move(binding));
}

std::string normalise_column_name(std::string_view name) { return to_snake_case(trim(name)); }

std::vector<FileKind> all_kinds() {
  std::vector<FileKind> out;
  for (const KindSpec& spec : kKinds) out.push_back(spec.kind);
  return out;
}

bool is_known_column(std::string_view name) {
  const std::string column = normalise_column_name(name);
  for (const KindSpec& spec : kKinds) {
    Conversion conversion;
    std::string_view unit;
    if (!column.empty() && match_field(spec, column, conversion, unit) != nullptr) return true;
  }
  return false;
}

std::string describe_required_columns(std::span<const FileKind> kinds) {
  std::string out;
  for (const KindSpec& spec : kKinds) {
    if (std::find(kinds.begin(), kinds.end(), spec.kind) == kinds.end()) continue;
    if (!out.empty()) out += "; ";
    out += std::string(describe(spec.kind)) + " needs " + needs_of(spec);
  }
  return out;
}

std::string describe_required_columns() {
  std::string out;
  for (const KindSpec& spec : kKinds) {
    if (!out.empty()) out += "; ";
    out += std::string(describe(spec.kind)) + " needs " + needs_of(spec);
  }
  return out;
}

KindDetection detect_kind(std::span<const std::string> header) {
  std::vector<Match> fitting;
  Match closest;
  bool have_closest = false;
  for (const KindSpec& spec : kKinds) {
    Match m = match_kind(spec, header);
    if (m.fits) {
      fitting.push_back(std::move(m));
    } else if (!have_closest || m.matched_required > closest.matched_required) {
      closest = std::move(m);
      have_closest = true;
    }
  }
  if (fitting.size() == 1) {
    KindDetection d = std::move(fitting.front().detection);
    d.recognised = d.reason.empty();  // duplicate columns reject the file
    return d;
  }
  KindDetection d;
  if (fitting.size() > 1) {
    d.reason = std::string("the header fits more than one kind of file (") +
               describe(fitting[0].detection.kind) + " and " + describe(fitting[1].detection.kind) +
               "): deliver them as separate files";
    return d;
  }
  if (!closest.detection.reason.empty() && closest.missing.empty()) {
    d.reason = closest.detection.reason;  // the kind is clear, its column group is not
    d.reason_column = closest.detection.reason_column;
    return d;
  }
  d.reason = "the header matches no kind of file";
  if (closest.matched_required >= 2) {
    d.reason += std::string(" (closest: ") + describe(closest.detection.kind) + ", missing ";
    for (std::size_t i = 0; i < closest.missing.size(); ++i) {
      d.reason += (i ? ", " : "") + std::string(closest.missing[i]);
    }
    d.reason += ")";
  }
  d.reason += ". " + describe_required_columns();
  return d;
}

}  // namespace ferrum::ingest
