// Load-series rows: the hot path of large files. Nothing here allocates per
// row once the first row has sized the buffers.
#include <cmath>
#include <limits>

#include "daemon/ingest/field_parsers.h"
#include "daemon/ingest/row_parsers.h"

namespace ferrum::ingest {

namespace {

constexpr double kNaN = std::numeric_limits<double>::quiet_NaN();
constexpr double kHuge = std::numeric_limits<double>::max();

std::string offset_text(int minutes) {
  const int m = minutes < 0 ? -minutes : minutes;
  char buf[16];
  std::snprintf(buf, sizeof buf, "%c%02d:%02d", minutes < 0 ? '-' : '+', m / 60, m % 60);
  return buf;
}

// Rated HV line current in A. Three-phase: I = S / (sqrt(3) U); single-phase:
// I = S / U (S in VA, U line-to-line in V) -- the standard power relations.
double rated_current_a(const analytics::UnitInfo& u) {
  const double s = u.rated_mva * 1e6, v = u.hv_kv * 1e3;
  return u.phases == 1 ? s / v : s / (std::sqrt(3.0) * v);
}

}  // namespace

LoadRowParser::LoadRowParser(const ColumnMap& columns, const ParseOptions& options,
                             bool decimal_comma, ProblemLog& problems, WarningLog& warnings)
    : RowChecker(columns, options, decimal_comma, problems, warnings),
      unit_id_(column("unit_id")),
      timestamp_(column("timestamp")),
      mva_(column("load_mva")),
      pu_(column("load_pu")),
      amperes_(column("load_a")),
      ambient_(column("ambient_c")),
      top_oil_(column("top_oil_c")) {}

const analytics::UnitInfo* LoadRowParser::cached_unit(std::string_view id, bool& known) {
  if (!cache_valid_ || id != cached_id_) {
    cached_id_.assign(id);
    cached_info_ = options_.lookup_unit ? options_.lookup_unit(id) : nullptr;
    cached_known_ = !options_.lookup_unit || cached_info_ != nullptr;
    cache_valid_ = true;
  }
  known = cached_known_;
  return cached_info_;
}

std::optional<double> LoadRowParser::per_unit(const analytics::UnitInfo* info) {
  const ColumnBinding& b = pu_.present() ? pu_ : mva_.present() ? mva_ : amperes_;
  auto raw = number(b, "load", {-kHuge, kHuge, ""}, true);
  if (!raw) return std::nullopt;
  if (*raw < 0) {  // reverse power flow heats the windings just the same
    if (reversed_++ == 0) first_reversed_line_ = line();
    *raw = -*raw;
  }
  double pu = *raw;
  if (&b != &pu_) {
    if (info == nullptr) {
      report(b, "cannot convert " + b.header_name + " to per unit without the unit's register data");
      return std::nullopt;
    }
    if (info->rated_mva <= 0 || info->hv_kv <= 0) {
      report(b, "cannot convert to per unit: the register has no rated_mva or hv_kv for this unit");
      return std::nullopt;
    }
    pu = &b == &mva_ ? *raw / info->rated_mva : *raw / rated_current_a(*info);
  }
  const double max = options_.limits.max_load_pu;
  if (pu > max) {
    report(b, "load of " + format_number(pu) + " per unit is not possible (more than " +
                  format_number(max) + " per unit): check the column's unit");
    return std::nullopt;
  }
  return pu;
}

bool LoadRowParser::parse(std::span<const std::string_view> fields, std::int64_t line,
                          LoadRow& out) {
  begin_row(fields, line);
  const std::string_view id = cell(unit_id_);
  bool known = false;
  const analytics::UnitInfo* info = nullptr;
  if (id.empty()) {
    report(unit_id_, "unit_id is missing");
  } else {
    info = cached_unit(id, known);
    if (!known) report(unit_id_, "unit " + std::string(id) + " is not in the units register");
  }
  TimeValue when;
  const std::string_view ts = cell(timestamp_);
  const Parsed<TimeValue> t = parse_timestamp(ts, options_.site_utc_offset_min, options_.date_order);
  if (ts.empty()) {
    report(timestamp_, "timestamp is missing");
  } else if (!t.ok()) {
    report(timestamp_, t.error);
  } else if (t.value.utc > options_.now + options_.limits.future_tolerance_days * 86400LL) {
    report(timestamp_, "time " + std::string(ts) + " is in the future");
  } else {
    when = t.value;
  }
  const auto pu = known ? per_unit(info) : std::nullopt;
  const auto ambient = number(ambient_, "ambient temperature", temperature_range());
  const auto top_oil = number(top_oil_, "top-oil temperature", temperature_range());
  if (!row_ok()) return false;

  if (when.offset_assumed && assumed_offsets_++ == 0) first_assumed_line_ = line;
  out.line = line;
  out.unit_id.assign(id);
  out.point.t = when.utc;
  out.point.load_pu = *pu;
  out.point.ambient_c = ambient.value_or(kNaN);
  out.point.top_oil_c = top_oil.value_or(kNaN);
  out.offset_assumed = when.offset_assumed;
  return true;
}

void LoadRowParser::finish() {
  warnings_.add(first_assumed_line_, timestamp_.header_name,
                "time without UTC offset: site offset " +
                    offset_text(options_.site_utc_offset_min) + " assumed",
                assumed_offsets_);
  const ColumnBinding& load = pu_.present() ? pu_ : mva_.present() ? mva_ : amperes_;
  warnings_.add(first_reversed_line_, load.header_name,
                "negative load taken as reverse power flow: its magnitude was used", reversed_);
}

}  // namespace ferrum::ingest
