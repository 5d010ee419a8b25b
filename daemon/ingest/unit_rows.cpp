// Units register rows.
#include "daemon/ingest/field_parsers.h"
#include "daemon/ingest/row_parsers.h"

namespace ferrum::ingest {

bool UnitRowParser::parse(std::span<const std::string_view> fields, std::int64_t line,
                          UnitRow& out) {
  begin_row(fields, line);
  out.line = line;
  out.unit = analytics::UnitInfo{};
  analytics::UnitInfo& u = out.unit;
  u.unit_id = required_text(column("unit_id"), "unit_id");
  u.site = required_text(column("site"), "site");
  u.serial = cell(column("serial"));
  parse_ratings(u);
  parse_construction(u);
  parse_thermal(u);
  if (row_ok()) duplicate_key(u.unit_id, "unit_id");
  return row_ok();
}

void UnitRowParser::parse_ratings(analytics::UnitInfo& u) {
  // Upper bounds are far above the largest units built (about 1500 MVA, 1200 kV).
  const auto mva = number(column("rated_mva"), "rated power", {0, 5000, "MVA", true}, true);
  const auto hv = number(column("hv_kv"), "HV voltage", {0, 1500, "kV", true}, true);
  const auto lv = number(column("lv_kv"), "LV voltage", {0, 1500, "kV", true}, true);
  u.rated_mva = mva.value_or(0);
  u.hv_kv = hv.value_or(0);
  u.lv_kv = lv.value_or(0);
  if (hv && lv && *hv <= *lv) {
    warn(column("lv_kv"), "hv_kv is not above lv_kv (step-up unit, or columns swapped?)");
  }
  const ColumnBinding& phases = column("phases");
  if (const auto p = integer(phases, "phases", {1, 3, ""})) {
    if (*p == 2) report(phases, "phases must be 1 or 3");
    u.phases = static_cast<int>(*p);
  }
  u.criticality = static_cast<int>(
      integer(column("criticality"), "criticality", {1, 5, "(1 lowest, 5 highest)"}).value_or(3));
  if (const auto c = integer(column("customers_served"), "customers served", {0, 1e9, ""})) {
    u.customers_served = static_cast<int>(*c);
  }
}

void UnitRowParser::parse_construction(analytics::UnitInfo& u) {
  const ColumnBinding& cooling = column("cooling");
  if (!required_text(cooling, "cooling").empty()) {
    const Parsed<std::string> c = parse_cooling(cell(cooling));
    if (c.ok()) u.cooling = c.value; else report(cooling, c.error);
  }
  const ColumnBinding& year = column("year_built");
  const int this_year = analytics::civil_from_days(analytics::day_of(options_.now)).year;
  if (const auto y = integer(year, "year_built", {-1e9, 1e9, ""}, true)) {
    if (*y > this_year) {
      report(year, "year_built " + std::to_string(*y) + " is in the future");
    } else if (*y < options_.limits.min_year_built) {
      report(year, "year_built " + std::to_string(*y) + " is before " +
                       std::to_string(options_.limits.min_year_built) + ": not plausible");
    } else {
      u.year_built = static_cast<int>(*y);
    }
  }
  const ColumnBinding& vg = column("vector_group");
  if (!cell(vg).empty()) {
    const Parsed<std::string> g = parse_vector_group(cell(vg));
    if (g.ok()) u.vector_group = g.value; else report(vg, g.error);
  }
  const ColumnBinding& oil = column("oil_type");
  if (const std::string o = to_snake_case(cell(oil)); !o.empty()) {
    if (o == "mineral") u.oil = analytics::OilType::mineral;
    else if (o.find("ester") != std::string::npos) u.oil = analytics::OilType::ester;
    else report(oil, "oil_type must be mineral or ester");
  }
  const ColumnBinding& paper = column("paper");
  if (const std::string p = to_snake_case(cell(paper)); !p.empty()) {
    if (p == "kraft") u.paper = analytics::PaperType::kraft;
    else if (p == "upgraded" || p == "thermally_upgraded" || p == "tuk") u.paper = analytics::PaperType::upgraded;
    else report(paper, "paper must be kraft or upgraded");
  }
  const ColumnBinding& oltc = column("oltc");
  if (const std::string t = to_snake_case(cell(oltc)); !t.empty()) {
    u.oltc = analytics::oltc_type_from(t);
    if (u.oltc == analytics::OltcType::unknown) report(oltc, "oltc must be none, sealed or communicating");
  }
  u.oil_volume_l = number(column("oil_volume_l"), "oil volume", {0, 1e6, "L", true});
  u.oil_treated = date(column("oil_treated_date"), false);
}

void UnitRowParser::parse_thermal(analytics::UnitInfo& u) {
  u.top_oil_rise_k = number(column("top_oil_rise_k"), "top-oil rise", {0, 150, "K", true});
  u.hot_spot_gradient_k =
      number(column("hot_spot_gradient_k"), "hot-spot gradient", {0, 100, "K", true});
  u.load_loss_ratio = number(column("load_loss_ratio"), "load loss ratio", {0, 100, "", true});
  parse_electrical(u);
  // The unit's own costs for the plan (analytics/plan), in the site's currency.
  u.replacement_cost = number(column("replacement_cost"), "replacement cost", {0, 1e12, "", false});
  u.refurbishment_cost = number(column("refurbishment_cost"), "refurbishment cost", {0, 1e12, "", false});
}

// Register columns read by the electrical field tests.
void UnitRowParser::parse_electrical(analytics::UnitInfo& u) {
  const ColumnBinding& conductor = column("conductor");
  if (const std::string c = to_snake_case(cell(conductor)); !c.empty()) {
    if (c == "cu" || c == "copper") u.conductor = "cu";
    else if (c == "al" || c == "aluminium" || c == "aluminum") u.conductor = "al";
    else report(conductor, "conductor must be cu or al");
  }
  const auto positions = integer(column("tap_positions"), "tap positions", {1, 99, ""});
  if (positions) u.tap_positions = static_cast<int>(*positions);
  const ColumnBinding& nominal = column("tap_nominal");
  if (const auto n = integer(nominal, "nominal tap", {1, 99, ""})) {
    if (positions && *n > *positions)
      report(nominal, "nominal tap " + std::to_string(*n) + " is beyond tap_positions " + std::to_string(*positions));
    else
      u.tap_nominal = static_cast<int>(*n);
  }
  u.tap_step_pct = number(column("tap_step_pct"), "tap step", {0, 10, "%", true});
  u.impedance_pct = number(column("impedance_pct"), "impedance", {0, 100, "%", true});
}

}  // namespace ferrum::ingest
