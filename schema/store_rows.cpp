#include "schema/store_rows.h"

#include <charconv>
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

namespace {
constexpr const char* kResumeVersion = "resume-1";
}

std::string encode_resume(const analytics::SimulationResume& r) {
  std::string out = kResumeVersion;
  auto num = [&](auto v) {
    char buf[32];
    out += ' ';
    out.append(buf, std::to_chars(buf, buf + sizeof buf, v).ptr);  // shortest text that reads back the same
  };
  const auto& st = r.stats;
  num(static_cast<int>(r.started)), num(static_cast<int>(r.method)), num(r.last_t), num(r.last_load_pu), num(r.last_ambient_c);
  num(r.iec.top_oil_c), num(r.iec.dh1_k), num(r.iec.dh2_k), num(r.ieee.top_oil_rise_k), num(r.ieee.hot_spot_rise_k);
  num(r.ambient_c), num(r.ageing_rate);
  num(st.written), num(st.covered_h), num(st.bridged_h), num(st.unbridged_h), num(st.restarts), num(st.duplicates);
  num(st.backward_jumps), num(st.invalid_loads), num(st.ambient_from_profile), num(st.loss_of_life_h);
  num(st.expected_interval_s);
  return out;
}

std::optional<analytics::SimulationResume> decode_resume(const std::string& text) {
  const std::string head = std::string(kResumeVersion) + " ";
  if (text.compare(0, head.size(), head) != 0) return std::nullopt;
  const char* p = text.data() + head.size();
  const char* end = text.data() + text.size();
  bool ok = true;
  auto num = [&](auto& v) {
    while (p < end && *p == ' ') ++p;
    const auto r = std::from_chars(p, end, v);
    ok = ok && r.ec == std::errc();
    p = r.ptr;
  };
  analytics::SimulationResume r;
  auto& st = r.stats;
  int started = 0, method = 0;
  num(started), num(method), num(r.last_t), num(r.last_load_pu), num(r.last_ambient_c);
  num(r.iec.top_oil_c), num(r.iec.dh1_k), num(r.iec.dh2_k), num(r.ieee.top_oil_rise_k), num(r.ieee.hot_spot_rise_k);
  num(r.ambient_c), num(r.ageing_rate);
  num(st.written), num(st.covered_h), num(st.bridged_h), num(st.unbridged_h), num(st.restarts), num(st.duplicates);
  num(st.backward_jumps), num(st.invalid_loads), num(st.ambient_from_profile), num(st.loss_of_life_h);
  num(st.expected_interval_s);
  r.started = started != 0;
  r.method = method == 1 ? analytics::ThermalMethod::ieee_c57_91 : analytics::ThermalMethod::iec60076_7;
  if (!ok || p != end) return std::nullopt;
  return r;
}

}  // namespace ferrum::store
