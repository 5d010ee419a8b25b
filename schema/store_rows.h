// What both stores (schema/sqlite/, schema/postgresql/) read and write the
// same way: the column lists of files and units, the oil tests as stored,
// a unit's register row as JSON (unit_history) and as read back.
#pragma once

#include <string>

#include "analytics/unit_data.h"

#define FILE_COLUMNS \
  "id, sha256, party, original_name, kind, status, rows, problem_count, received_at, stored_as, receipt_json"
#define UNIT_COLUMNS                                                                                           \
  "unit_id, site, serial, rated_mva, hv_kv, lv_kv, cooling, year_built, phases, vector_group, oil_type, paper," \
  " oil_volume_l, criticality, customers_served, top_oil_rise_k, hot_spot_gradient_k, load_loss_ratio,"       \
  " oil_treated_day, conductor, tap_positions, tap_nominal, tap_step_pct, impedance_pct, replacement_cost, refurbishment_cost"

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
  return u;
}

}  // namespace ferrum::store
