// Oil-lab result rows.
#include "daemon/ingest/field_parsers.h"
#include "daemon/ingest/row_parsers.h"

namespace ferrum::ingest {

namespace {

using analytics::LabValue;
using analytics::OilSample;

// The test columns, what they are called in messages and their possible range.
struct TestColumn {
  std::string_view name;
  std::string_view label;
  LabValue OilSample::*member;
  double max;  // upper bound; < 0: from ValidationLimits (see range_of)
  const char* unit;
};

constexpr double kGasLimit = -1, kMoistureLimit = -2, kTemperature = -3;

constexpr TestColumn kTests[] = {
    {"h2_ppm", "hydrogen", &OilSample::h2, kGasLimit, "ppm"},
    {"ch4_ppm", "methane", &OilSample::ch4, kGasLimit, "ppm"},
    {"c2h6_ppm", "ethane", &OilSample::c2h6, kGasLimit, "ppm"},
    {"c2h4_ppm", "ethylene", &OilSample::c2h4, kGasLimit, "ppm"},
    {"c2h2_ppm", "acetylene", &OilSample::c2h2, kGasLimit, "ppm"},
    {"co_ppm", "carbon monoxide", &OilSample::co, kGasLimit, "ppm"},
    {"co2_ppm", "carbon dioxide", &OilSample::co2, kGasLimit, "ppm"},
    {"o2_ppm", "oxygen", &OilSample::o2, kGasLimit, "ppm"},
    {"n2_ppm", "nitrogen", &OilSample::n2, kGasLimit, "ppm"},
    {"moisture_ppm", "moisture", &OilSample::moisture_ppm, kMoistureLimit, "mg/kg"},
    {"oil_temp_c", "oil temperature", &OilSample::oil_temp_c, kTemperature, "°C"},
    // Breakdown above 200 kV is beyond any standard test cell.
    {"breakdown_kv", "breakdown voltage", &OilSample::breakdown_kv, 200, "kV"},
    {"acidity_mgkoh_g", "acidity", &OilSample::acidity_mgkoh_g, 50, "mg KOH/g"},
    // Water is about 72 mN/m: no oil/water interface can exceed it by much.
    {"ift_mn_m", "interfacial tension", &OilSample::ift_mn_m, 100, "mN/m"},
    {"pf25_pct", "power factor at 25 °C", &OilSample::pf25_pct, 100, "%"},
    {"pf100_pct", "power factor at 100 °C", &OilSample::pf100_pct, 100, "%"},
    {"color", "colour (ASTM D1500, 0.5 to 8)", &OilSample::color, 8, ""},
    {"furan_2fal_ppb", "2-furaldehyde", &OilSample::furan_2fal_ppb, 100000, "ppb"},
};

}  // namespace

bool OilRowParser::parse(std::span<const std::string_view> fields, std::int64_t line,
                         OilRow& out) {
  out.line = line;
  out.sample = OilSample{};
  OilSample& s = out.sample;
  s.date = begin_measurement_row(fields, line, out.unit_id, "sample_date").value_or(0);
  s.lab_ref = cell(column("lab_ref"));
  s.sample_point = to_snake_case(cell(column("sample_point")));
  if (s.sample_point.empty()) s.sample_point = "main_tank";
  parse_tests(s);
  parse_breakdown(s);
  if (row_ok()) {
    duplicate_key(out.unit_id + '\x1f' + std::to_string(s.date) + '\x1f' + s.lab_ref + '\x1f' +
                      s.sample_point,
                  "unit_id, sample_date, lab_ref and sample_point");
  }
  return row_ok();
}

void OilRowParser::parse_tests(OilSample& s) {
  const ValidationLimits& lim = options_.limits;
  bool any_text = false;  // some test cell is not empty
  for (const TestColumn& t : kTests) {
    const ColumnBinding& b = column(t.name);
    if (!b.present()) continue;
    Range r{0, t.max, t.unit};
    if (t.max == kGasLimit) r.max = lim.max_gas_ppm;
    if (t.max == kMoistureLimit) r.max = lim.max_moisture_ppm;
    if (t.max == kTemperature) r = temperature_range();
    s.*t.member = lab_value(b, t.label, r);
    any_text = any_text || !cell(b).empty();
  }
  if (!any_text) report_row("no test value in this row (every test column is empty)");
}

void OilRowParser::parse_breakdown(OilSample& s) {
  const ColumnBinding& method = column("breakdown_method");
  const std::string_view text = cell(method);
  if (!text.empty()) {
    const Parsed<std::string> m = parse_breakdown_method(text);
    if (m.ok()) s.breakdown_method = m.value; else report(method, m.error);
  } else if (s.breakdown_kv.present()) {
    warn(column("breakdown_kv"),
         "breakdown voltage without breakdown_method: its limits depend on the method");
  }
}

}  // namespace ferrum::ingest
