// What both stores (schema/sqlite/, schema/postgresql/) read and write the
// same way: the column lists of files and units, the oil tests as stored,
// a unit's register row as JSON (unit_history) and as read back, and the
// rows of the other tables as read back (read_*_row: each backend keeps its
// own query and loop, and hands each row here).
#pragma once

#include <cstdint>
#include <optional>
#include <string>
#include <vector>

#include "analytics/load_history.h"
#include "analytics/unit_data.h"
#include "schema/store.h"

#define FILE_COLUMNS \
  "id, sha256, party, original_name, kind, status, rows, problem_count, received_at, stored_as, receipt_json"
#define UNIT_COLUMNS                                                                                           \
  "unit_id, site, serial, rated_mva, hv_kv, lv_kv, cooling, year_built, phases, vector_group, oil_type, paper," \
  " oil_volume_l, criticality, customers_served, top_oil_rise_k, hot_spot_gradient_k, load_loss_ratio,"       \
  " oil_treated_day, conductor, tap_positions, tap_nominal, tap_step_pct, impedance_pct, replacement_cost, refurbishment_cost, oltc"

#define LOAD_DAY_COLUMNS                                                                                   \
  "day, first_ts, last_ts, covered_h, bridged_h, ageing_h, peak_load_pu, peak_load_ts, peak_hot_spot_c,"   \
  " peak_hot_spot_ts, peak_top_oil_c, hours_above_nameplate, hours_above_normal_cyclic,"                  \
  " hours_above_long_emergency, hours_above_short_emergency, top_oil_excess_k, top_oil_measurements,"     \
  " ambient_from_profile, growth_w, growth_x, growth_y, growth_xx, growth_xy"

namespace ferrum::store {

// Test columns of an oil sample, in the order stored.
struct OilField {
  const char* test;
  analytics::LabValue analytics::OilSample::*member;
};
inline constexpr OilField kOilFields[] = {
    {"h2_ppm", &analytics::OilSample::h2},
    {"ch4_ppm", &analytics::OilSample::ch4},
    {"c2h6_ppm", &analytics::OilSample::c2h6},
    {"c2h4_ppm", &analytics::OilSample::c2h4},
    {"c2h2_ppm", &analytics::OilSample::c2h2},
    {"co_ppm", &analytics::OilSample::co},
    {"co2_ppm", &analytics::OilSample::co2},
    {"o2_ppm", &analytics::OilSample::o2},
    {"n2_ppm", &analytics::OilSample::n2},
    {"moisture_ppm", &analytics::OilSample::moisture_ppm},
    {"oil_temp_c", &analytics::OilSample::oil_temp_c},
    {"breakdown_kv", &analytics::OilSample::breakdown_kv},
    {"acidity_mgkoh_g", &analytics::OilSample::acidity_mgkoh_g},
    {"ift_mn_m", &analytics::OilSample::ift_mn_m},
    {"pf25_pct", &analytics::OilSample::pf25_pct},
    {"pf100_pct", &analytics::OilSample::pf100_pct},
    {"color", &analytics::OilSample::color},
    {"furan_2fal_ppb", &analytics::OilSample::furan_2fal_ppb},
};

// The tables count_rows answers for (a name from outside is checked against
// these before it goes into SQL).
inline constexpr const char* kCountedTables[] = {"files", "units", "unit_history", "oil_samples", "oil_values",
                                                 "load_points", "infrared_scans", "inspections", "alerts",
                                                 "conversions", "electrical_tests", "work_status", "load_days",
                                                 "load_history"};


analytics::Rating rating_from(const std::string& s);
std::string json_escape(const std::string& s);
// The register row as JSON: equal text means an unchanged unit.
std::string unit_json(const analytics::UnitInfo& u);

// A unit read from a row of UNIT_COLUMNS; Row has text, real, i32, is_null
// and opt_real by 0-based column.
template <class Row>
analytics::UnitInfo read_unit(const Row& s) {
  analytics::UnitInfo u;
  u.unit_id = s.text(0);
  u.site = s.text(1);
  u.serial = s.text(2);
  u.rated_mva = s.real(3);
  u.hv_kv = s.real(4);
  u.lv_kv = s.real(5);
  u.cooling = s.text(6);
  u.year_built = s.i32(7);
  u.phases = s.i32(8);
  u.vector_group = s.text(9);
  u.oil = s.text(10) == "ester" ? analytics::OilType::ester : analytics::OilType::mineral;
  u.paper = s.text(11) == "upgraded" ? analytics::PaperType::upgraded : analytics::PaperType::kraft;
  u.oil_volume_l = s.opt_real(12);
  u.criticality = s.i32(13);
  if (!s.is_null(14)) u.customers_served = s.i32(14);
  u.top_oil_rise_k = s.opt_real(15);
  u.hot_spot_gradient_k = s.opt_real(16);
  u.load_loss_ratio = s.opt_real(17);
  if (!s.is_null(18)) u.oil_treated = s.i32(18);
  u.conductor = s.text(19);
  if (!s.is_null(20)) u.tap_positions = s.i32(20);
  if (!s.is_null(21)) u.tap_nominal = s.i32(21);
  u.tap_step_pct = s.opt_real(22);
  u.impedance_pct = s.opt_real(23);
  u.replacement_cost = s.opt_real(24);
  u.refurbishment_cost = s.opt_real(25);
  u.oltc = analytics::oltc_type_from(s.is_null(26) ? std::string() : s.text(26));
  return u;
}

// The row readers below take a row object as read_unit does (the SQLite
// statement's current row or a libpq result row; they also use i64 and
// real_or_nan); columns are 0-based, in the order of the SELECT named
// beside each. Each backend keeps its own query and loop.

// A file from a row of FILE_COLUMNS.
template <class Row>
FileRecord read_file_row(const Row& s) {
  FileRecord f;
  f.id = s.i64(0);
  f.sha256 = s.text(1);
  f.party = s.text(2);
  f.original_name = s.text(3);
  f.kind = s.text(4);
  f.status = s.text(5);
  f.rows = static_cast<long>(s.i64(6));
  f.problem_count = static_cast<long>(s.i64(7));
  f.received_at = s.text(8);
  f.stored_as = s.text(9);
  f.receipt_json = s.text(10);
  return f;
}

// An electrical test from a row of "test_day, test, phase, tap, winding,
// temp_c, insulation, test_kv, bushing, minutes, value, capacitance_pf,
// nameplate_value, note, crew"; none for a test this build does not know
// (written by a newer ferrum).
template <class Row>
std::optional<analytics::ElectricalTest> read_electrical_row(const Row& s) {
  const auto kind = analytics::electrical_test_from(s.text(1));
  if (!kind) return std::nullopt;
  analytics::ElectricalTest t;
  t.date = s.i32(0);
  t.test = *kind;
  t.phase = s.text(2);
  if (!s.is_null(3)) t.tap = s.i32(3);
  t.winding = s.text(4);
  t.temp_c = s.opt_real(5);
  t.insulation = s.text(6);
  t.test_kv = s.opt_real(7);
  t.bushing = s.text(8);
  if (!s.is_null(9)) t.minutes = s.i32(9);
  t.value = s.opt_real(10);
  t.capacitance_pf = s.opt_real(11);
  t.nameplate_value = s.opt_real(12);
  t.note = s.text(13);
  t.crew = s.text(14);
  return t;
}

// An infrared scan from a row of "survey_day, component, spot_c,
// reference_c, ambient_c, load_pct, emissivity, image_ref, note".
template <class Row>
analytics::InfraredScan read_infrared_row(const Row& s) {
  analytics::InfraredScan r;
  r.date = s.i32(0);
  r.component = s.text(1);
  r.spot_c = s.real(2);
  r.reference_c = s.opt_real(3);
  r.ambient_c = s.opt_real(4);
  r.load_pct = s.opt_real(5);
  r.emissivity = s.opt_real(6);
  r.image_ref = s.text(7);
  r.note = s.text(8);
  return r;
}

// An inspection from a row of "inspection_day, item, rating, note, inspector".
template <class Row>
analytics::InspectionRecord read_inspection_row(const Row& s) {
  analytics::InspectionRecord r;
  r.date = s.i32(0);
  r.item = s.text(1);
  r.rating = rating_from(s.text(2));
  r.note = s.text(3);
  r.inspector = s.text(4);
  return r;
}

// A load point from a row of "ts, load_pu, ambient_c, top_oil_c".
template <class Row>
analytics::LoadPoint read_load_point_row(const Row& s) {
  analytics::LoadPoint p;
  p.t = s.i64(0);
  p.load_pu = s.real(1);
  p.ambient_c = s.real_or_nan(2);
  p.top_oil_c = s.real_or_nan(3);
  return p;
}

// The values of a load_days row in the order of LOAD_DAY_COLUMNS, each
// handed to put(value) (a backend binds them).
template <class Put>
void put_load_day(const analytics::LoadDay& d, Put&& put) {
  put(static_cast<std::int64_t>(d.day)), put(d.first_t), put(d.last_t), put(d.covered_h), put(d.bridged_h);
  put(d.ageing_h), put(d.peak_load_pu), put(d.peak_load_t), put(d.peak_hot_spot_c), put(d.peak_hot_spot_t);
  put(d.peak_top_oil_c), put(d.hours_above_nameplate), put(d.hours_above_normal_cyclic);
  put(d.hours_above_long_emergency), put(d.hours_above_short_emergency), put(d.top_oil_excess_k);
  put(static_cast<std::int64_t>(d.top_oil_measurements)), put(static_cast<std::int64_t>(d.ambient_from_profile));
  put(d.growth.w), put(d.growth.x), put(d.growth.y), put(d.growth.xx), put(d.growth.xy);
}

// A day's summary from a row of LOAD_DAY_COLUMNS.
template <class Row>
analytics::LoadDay read_load_day_row(const Row& s) {
  analytics::LoadDay d;
  d.day = s.i32(0);
  d.first_t = s.i64(1);
  d.last_t = s.i64(2);
  d.covered_h = s.real(3);
  d.bridged_h = s.real(4);
  d.ageing_h = s.real(5);
  d.peak_load_pu = s.real(6);
  d.peak_load_t = s.i64(7);
  d.peak_hot_spot_c = s.real(8);
  d.peak_hot_spot_t = s.i64(9);
  d.peak_top_oil_c = s.real(10);
  d.hours_above_nameplate = s.real(11);
  d.hours_above_normal_cyclic = s.real(12);
  d.hours_above_long_emergency = s.real(13);
  d.hours_above_short_emergency = s.real(14);
  d.top_oil_excess_k = s.real(15);
  d.top_oil_measurements = static_cast<long>(s.i64(16));
  d.ambient_from_profile = s.i64(17) != 0;
  d.growth = {s.real(18), s.real(19), s.real(20), s.real(21), s.real(22)};
  return d;
}

// The thermal model's state where the raw points were cut (load_history.resume),
// as text that reads back the same numbers bit for bit; nullopt when the
// text is not one this build wrote.
std::string encode_resume(const analytics::SimulationResume& r);
std::optional<analytics::SimulationResume> decode_resume(const std::string& text);

// Oil samples with their values from the rows, in order, of "s.id,
// s.sample_day, s.lab_ref, s.sample_point, s.breakdown_method, v.test,
// v.state, v.value" (oil_samples LEFT JOIN oil_values, by sample): a row
// of a new sample id starts a sample in `out`; its value, if any, goes
// into the last sample. `current` is the id of the last sample (-1 before
// the first row).
template <class Row>
void read_oil_row(const Row& s, std::int64_t& current, std::vector<analytics::OilSample>& out) {
  if (s.i64(0) != current) {
    current = s.i64(0);
    analytics::OilSample o;
    o.date = s.i32(1);
    o.lab_ref = s.text(2);
    o.sample_point = s.text(3);
    o.breakdown_method = s.text(4);
    out.push_back(std::move(o));
  }
  if (s.is_null(5)) return;
  const std::string test = s.text(5);
  for (const auto& f : kOilFields) {
    if (test != f.test) continue;
    analytics::LabValue& v = out.back().*(f.member);
    v = s.i32(6) == 1 ? analytics::LabValue::measured(s.real(7)) : analytics::LabValue::below(s.real_or_nan(7));
  }
}

}  // namespace ferrum::store
