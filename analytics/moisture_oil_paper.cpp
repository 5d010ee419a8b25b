#include "analytics/moisture_oil_paper.h"

#include <cmath>
#include <cstdio>

namespace ferrum::analytics {
namespace {
constexpr double kKelvin = 273.15;
constexpr double kPaPerAtm = 101325.0;
}  // namespace

double water_solubility_ppm(double temp_c, const MoistureOptions& o) {
  return std::pow(10.0, o.solubility_a - o.solubility_b / (temp_c + kKelvin));
}

double water_saturation_pressure_pa(double temp_c) {
  return 610.94 * std::exp(17.625 * temp_c / (temp_c + 243.04));
}

double fessler_paper_moisture_pct(double rs_pct, double temp_c) {
  const double pv_atm = rs_pct / 100.0 * water_saturation_pressure_pa(temp_c) / kPaPerAtm;
  return 100.0 * 2.173e-7 * std::pow(pv_atm, 0.6685) * std::exp(4725.6 / (temp_c + kKelvin));
}

MoistureResult assess_moisture(const LabValue& water, const LabValue& temp, const MoistureOptions& o) {
  MoistureResult r;
  if (!water.is_measured() || !(water.value >= 0)) {
    r.notes.push_back(water.is_below_limit() ? "water below the detection limit: saturation not computed"
                                             : "no water content measured");
    return r;
  }
  r.water_ppm = water.value;
  if (!temp.is_measured() || !std::isfinite(temp.value)) {
    r.notes.push_back("sampling temperature missing: relative saturation and paper water cannot be computed");
    return r;
  }
  r.temperature_c = temp.value;
  if (temp.value < 0 || temp.value > 100) {
    r.notes.push_back("sampling temperature outside 0-100 °C: outside the solubility relation's range");
    return r;
  }
  r.solubility_ppm = water_solubility_ppm(temp.value, o);
  r.relative_saturation_pct = 100.0 * water.value / *r.solubility_ppm;
  if (*r.relative_saturation_pct > 100)
    r.notes.push_back("oil above saturation: free water possible, or sample contaminated");
  if (temp.value < o.cold_sample_c) {
    // No paper-water figure from a cold sample: Fessler's relation then gives
    // values well above the usual equilibrium curves (7.8 % at 20 °C and 30 %
    // relative saturation), and oil and paper are rarely near equilibrium.
    r.equilibrium_doubtful = true;
    char buf[240];
    std::snprintf(buf, sizeof buf,
                  "cold sample (%.1f °C < %.0f °C): no paper water estimate, because oil and paper are "
                  "far from equilibrium and the equilibrium relation overstates it; a sample taken at "
                  "%.0f °C or more from a steadily loaded unit allows one",
                  temp.value, o.cold_sample_c, o.cold_sample_c);
    r.notes.push_back(buf);
    return r;
  }
  r.paper_moisture_pct = fessler_paper_moisture_pct(std::min(*r.relative_saturation_pct, 100.0), temp.value);
  return r;
}

}  // namespace ferrum::analytics
