// Infrared survey rows.
#include "daemon/ingest/field_parsers.h"
#include "daemon/ingest/row_parsers.h"

namespace ferrum::ingest {

bool InfraredRowParser::parse(std::span<const std::string_view> fields, std::int64_t line,
                              InfraredRow& out) {
  out.line = line;
  out.scan = analytics::InfraredScan{};
  analytics::InfraredScan& s = out.scan;
  s.date = begin_measurement_row(fields, line, out.unit_id, "survey_date").value_or(0);
  s.component = required_text(column("component"), "component");
  const Range temperature = temperature_range();
  s.spot_c = number(column("spot_c"), "spot temperature", temperature, true).value_or(0);
  s.reference_c = number(column("reference_c"), "reference temperature", temperature);
  s.ambient_c = number(column("ambient_c"), "ambient temperature", temperature);
  if (cell(column("reference_c")).empty() && cell(column("ambient_c")).empty()) {
    report_row("needs a reference_c or an ambient_c temperature (both are empty)");
  }
  const double max_load_pct = options_.limits.max_load_pu * 100;
  s.load_pct = number(column("load_pct"), "load", {0, max_load_pct, "%"});
  s.emissivity = number(column("emissivity"), "emissivity", {0, 1, "", true});
  s.image_ref = cell(column("image_ref"));
  s.note = cell(column("note"));
  if (row_ok()) {
    duplicate_key(out.unit_id + '\x1f' + std::to_string(s.date) + '\x1f' + to_snake_case(s.component),
                  "unit_id, survey_date and component");
  }
  return row_ok();
}

}  // namespace ferrum::ingest
