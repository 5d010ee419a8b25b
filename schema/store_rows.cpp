#include "schema/store_rows.h"

#include <cstdio>
#include <sstream>

namespace ferrum::store {

analytics::Rating rating_from(const std::string& s) {
  using analytics::Rating;
  if (s == "fair") return Rating::fair;
  if (s == "poor") return Rating::poor;
  if (s == "very_poor") return Rating::very_poor;
  if (s == "unsafe") return Rating::unsafe;
  return Rating::good;
}

std::string json_escape(const std::string& s) {
  std::string out;
  for (char c : s) {
    if (c == '"' || c == '\\') { out += '\\'; out += c; }
    else if (static_cast<unsigned char>(c) < 0x20) { char b[8]; std::snprintf(b, sizeof b, "\\u%04x", c); out += b; }
    else out += c;
  }
  return out;
}

std::string unit_json(const analytics::UnitInfo& u) {
  std::ostringstream o;
  o.precision(10);
  auto opt = [&](const auto& v) -> std::string {
    if (!v) return "null";
    std::ostringstream t;
    t.precision(10);
    t << *v;
    return t.str();
  };
  o << "{\"unit_id\":\"" << json_escape(u.unit_id) << "\",\"site\":\"" << json_escape(u.site)
    << "\",\"serial\":\"" << json_escape(u.serial) << "\",\"rated_mva\":" << u.rated_mva
    << ",\"hv_kv\":" << u.hv_kv << ",\"lv_kv\":" << u.lv_kv << ",\"cooling\":\"" << json_escape(u.cooling)
    << "\",\"year_built\":" << u.year_built << ",\"phases\":" << u.phases << ",\"vector_group\":\""
    << json_escape(u.vector_group) << "\",\"oil_type\":\"" << analytics::to_string(u.oil)
    << "\",\"paper\":\"" << analytics::to_string(u.paper) << "\",\"oil_volume_l\":" << opt(u.oil_volume_l)
    << ",\"criticality\":" << u.criticality << ",\"customers_served\":" << opt(u.customers_served)
    << ",\"top_oil_rise_k\":" << opt(u.top_oil_rise_k) << ",\"hot_spot_gradient_k\":"
    << opt(u.hot_spot_gradient_k) << ",\"load_loss_ratio\":" << opt(u.load_loss_ratio)
    << ",\"oil_treated_day\":" << opt(u.oil_treated) << ",\"conductor\":\"" << json_escape(u.conductor)
    << "\",\"tap_positions\":" << opt(u.tap_positions) << ",\"tap_nominal\":" << opt(u.tap_nominal)
    << ",\"tap_step_pct\":" << opt(u.tap_step_pct) << ",\"impedance_pct\":" << opt(u.impedance_pct);
  if (u.replacement_cost || u.refurbishment_cost)  // migration 005; absent in older history rows
    o << ",\"replacement_cost\":" << opt(u.replacement_cost) << ",\"refurbishment_cost\":" << opt(u.refurbishment_cost);
  if (u.oltc != analytics::OltcType::unknown)  // migration 007; absent in older history rows
    o << ",\"oltc\":\"" << analytics::to_string(u.oltc) << "\"";
  o << "}";
  return o.str();
}

}  // namespace ferrum::store
