#include "bench/fleet_model.h"

#include <algorithm>
#include <cmath>
#include <cstdio>
#include <numbers>

namespace ferrum::bench {

using analytics::LabValue;

namespace {

// Stream numbers: one per purpose, so that adding a stream changes nothing else.
enum Stream : std::uint64_t { kInfo, kOil, kInfrared, kInspection, kLoad };

constexpr double kTwoPi = 2 * std::numbers::pi;

struct Rating {
  double mva, hv, lv;
  const char* cooling;
};
constexpr Rating kRatings[] = {{10, 33, 11, "ONAN"}, {20, 66, 11, "ONAF"}, {40, 132, 33, "ONAF"},
                               {63, 132, 33, "OFAF"}, {100, 220, 66, "ODAF"}};

// One unit in twenty develops a thermal fault in its last five years, one in
// fifty an arcing one: enough for every DGA path to run.
enum class Fault { none, thermal, arcing };
Fault fault_of(int n) {
  if (n % 50 == 7) return Fault::arcing;
  if (n % 20 == 3) return Fault::thermal;
  return Fault::none;
}

double clamp0(double v) { return v < 0 ? 0 : v; }

// Seasonal ambient, °C, at a UTC time: yearly mean 12 °C, ±9 °C seasonal
// (coldest mid-January), ±4 °C daily (warmest mid-afternoon).
double ambient_at(analytics::Timestamp t) {
  const double day = static_cast<double>(t) / 86400.0;
  const double season = -std::cos(kTwoPi * (day - 15) / 365.25);
  const double daily = -std::cos(kTwoPi * (day - std::floor(day) - 0.125));
  return 12 + 9 * season + 4 * daily;
}

}  // namespace

std::string unit_id(int n) {
  char buf[16];
  std::snprintf(buf, sizeof buf, "U%05d", n);
  return buf;
}

std::string site_of(int n) {
  char buf[16];
  std::snprintf(buf, sizeof buf, "S%03d", (n - 1) / 25 + 1);
  return buf;
}

analytics::UnitInfo unit_info(int n) {
  Random r(n, kInfo);
  const Rating& k = kRatings[n % 5];
  analytics::UnitInfo u;
  u.unit_id = unit_id(n);
  u.site = site_of(n);
  u.serial = "SN" + std::to_string(100000 + n);
  u.rated_mva = k.mva;
  u.hv_kv = k.hv;
  u.lv_kv = k.lv;
  u.cooling = k.cooling;
  u.year_built = 1965 + static_cast<int>(r.uniform() * 55);
  u.vector_group = "Dyn11";
  u.paper = n % 4 == 0 ? analytics::PaperType::upgraded : analytics::PaperType::kraft;
  u.oil_volume_l = 4000 + k.mva * 300;
  u.criticality = 1 + n % 5;
  u.customers_served = static_cast<int>(k.mva * 800);
  return u;
}

std::vector<analytics::OilSample> oil_history(int n, const FleetShape& shape) {
  Random r(n, kOil);
  const Fault fault = fault_of(n);
  const double wet = r.between(5, 15);    // moisture at the start, mg/kg
  const double aged = r.between(0.3, 1);  // how fast this unit's oil ages
  std::vector<analytics::OilSample> out;
  const int first_year = shape.last_year - shape.oil_years + 1;
  for (int y = first_year; y <= shape.last_year; ++y) {
    for (int q = 0; q < 4; ++q) {
      analytics::OilSample s;
      s.date = analytics::days_from_civil(y, 2 + 3 * q, 15);
      const double age = y - first_year + q / 4.0;                // years of history
      const double late = std::max(0.0, age - (shape.oil_years - 5));  // years into a fault
      const double noise = 1 + 0.1 * r.normal();
      double h2 = 20 + 2 * age, ch4 = 8 + 1.5 * age, c2h6 = 5 + age, c2h4 = 3 + 0.8 * age, c2h2 = 0.0;
      if (fault == Fault::thermal) {
        ch4 += 30 * late;
        c2h6 += 10 * late;
        c2h4 += 45 * late;
      } else if (fault == Fault::arcing) {
        h2 += 60 * late;
        c2h2 += 8 * late;
        c2h4 += 12 * late;
      }
      char ref[32];
      std::snprintf(ref, sizeof ref, "L%05d-%d%d", n, y, q + 1);
      s.lab_ref = ref;
      s.sample_point = "main_tank";
      s.h2 = LabValue::measured(std::round(h2 * noise));
      s.ch4 = LabValue::measured(std::round(ch4 * noise));
      s.c2h6 = LabValue::measured(std::round(c2h6 * noise));
      s.c2h4 = LabValue::measured(std::round(c2h4 * noise));
      s.c2h2 = c2h2 < 0.5 ? LabValue::below(0.5) : LabValue::measured(std::round(c2h2 * noise * 10) / 10);
      s.co = LabValue::measured(std::round((150 + 25 * age) * noise));
      s.co2 = LabValue::measured(std::round((1500 + 180 * age) * noise));
      s.o2 = LabValue::measured(std::round(clamp0(12000 + 800 * r.normal())));
      s.n2 = LabValue::measured(std::round(clamp0(55000 + 3000 * r.normal())));
      s.moisture_ppm = LabValue::measured(std::round((wet + 0.4 * age * aged) * noise * 10) / 10);
      s.oil_temp_c = LabValue::measured(std::round(r.between(25, 55)));
      s.breakdown_kv = LabValue::measured(std::round(clamp0(65 - 1.2 * age * aged + 4 * r.normal())));
      s.breakdown_method = "IEC 60156";
      s.acidity_mgkoh_g = LabValue::measured(std::round((0.02 + 0.006 * age * aged) * noise * 1000) / 1000);
      s.ift_mn_m = LabValue::measured(std::round(clamp0(42 - 0.7 * age * aged + r.normal())));
      s.pf25_pct = LabValue::measured(std::round((0.05 + 0.01 * age * aged) * noise * 1000) / 1000);
      s.color = LabValue::measured(std::round(std::min(8.0, 0.5 + 0.1 * age * aged) * 10) / 10);
      s.furan_2fal_ppb = LabValue::measured(std::round((40 + 25 * age * aged) * noise));
      out.push_back(std::move(s));
    }
  }
  return out;
}

std::vector<analytics::InfraredScan> infrared_history(int n, const FleetShape& shape) {
  static const char* kComponents[] = {"HV bushing A", "LV connection", "tap changer cabinet"};
  Random r(n, kInfrared);
  std::vector<analytics::InfraredScan> out;
  for (int y = shape.last_year - shape.oil_years + 1; y <= shape.last_year; ++y) {
    const double ambient = r.between(5, 25), load = r.between(40, 95);
    for (int c = 0; c < 3; ++c) {
      analytics::InfraredScan s;
      s.date = analytics::days_from_civil(y, 7, 10);
      s.component = kComponents[c];
      const double reference = ambient + r.between(8, 20);
      const double hot = (n % 40 == 11 && c == 1 && y >= shape.last_year - 2) ? r.between(15, 45) : r.between(0, 4);
      s.reference_c = std::round(reference * 10) / 10;
      s.spot_c = std::round((reference + hot) * 10) / 10;
      s.ambient_c = std::round(ambient * 10) / 10;
      s.load_pct = std::round(load);
      out.push_back(std::move(s));
    }
  }
  return out;
}

std::vector<analytics::InspectionRecord> inspection_history(int n, const FleetShape& shape) {
  static const char* kItems[] = {"bushings", "main_tank", "gaskets_and_leaks", "cooling_fans_and_pumps",
                                 "on_load_tap_changer"};
  Random r(n, kInspection);
  std::vector<analytics::InspectionRecord> out;
  for (int y = shape.last_year - shape.oil_years + 1; y <= shape.last_year; ++y) {
    for (const char* item : kItems) {
      analytics::InspectionRecord rec;
      rec.date = analytics::days_from_civil(y, 9, 20);
      rec.item = item;
      const double u = r.uniform();
      rec.rating = u < 0.7 ? analytics::Rating::good : u < 0.93 ? analytics::Rating::fair
                 : u < 0.995 ? analytics::Rating::poor : analytics::Rating::very_poor;
      rec.inspector = "field team " + std::to_string(1 + n % 7);
      out.push_back(std::move(rec));
    }
  }
  return out;
}

std::vector<analytics::LoadPoint> load_series(int n, analytics::Timestamp start, int count, int step_s) {
  Random r(n, kLoad);
  const double base = r.between(0.45, 0.8), swing = r.between(0.1, 0.3);
  const double rise = 45 + 10 * r.uniform();  // top-oil rise at rated load, K
  std::vector<analytics::LoadPoint> out;
  out.reserve(static_cast<std::size_t>(count));
  for (int i = 0; i < count; ++i) {
    analytics::LoadPoint p;
    p.t = start + static_cast<analytics::Timestamp>(i) * step_s;
    const double hour = static_cast<double>(p.t % 86400) / 3600.0;
    const double daily = std::sin(kTwoPi * (hour - 8) / 24);  // evening peak
    p.load_pu = std::round(std::max(0.05, base + swing * daily + 0.03 * r.normal()) * 1000) / 1000;
    p.ambient_c = std::round(ambient_at(p.t) * 10) / 10;
    p.top_oil_c = std::round((p.ambient_c + rise * (0.2 + 0.8 * p.load_pu * p.load_pu)) * 10) / 10;
    out.push_back(p);
  }
  return out;
}

analytics::UnitData unit_data(int n, const FleetShape& shape) {
  analytics::UnitData d;
  d.info = unit_info(n);
  d.oil_samples = oil_history(n, shape);
  d.infrared = infrared_history(n, shape);
  d.inspections = inspection_history(n, shape);
  d.load = load_series(n, shape.load_start, shape.load_hours, 3600);
  return d;
}

}  // namespace ferrum::bench
