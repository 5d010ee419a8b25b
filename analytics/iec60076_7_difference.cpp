#include "analytics/iec60076_7_difference.h"

#include <algorithm>
#include <cmath>

namespace ferrum::analytics {

double iec_steady_top_oil_rise(const IecThermalParameters& p, double k) {
  return p.top_oil_rise_k * std::pow((1 + k * k * p.r) / (1 + p.r), p.x);
}

double iec_steady_hot_spot_gradient(const IecThermalParameters& p, double k) {
  return p.hot_spot_gradient_k * std::pow(k, p.y);
}

IecThermalState iec_steady_state(const IecThermalParameters& p, double k, double ambient_c) {
  const double g = iec_steady_hot_spot_gradient(p, k);
  // At rest the two hot-spot terms sit at k21·g and (k21 − 1)·g, whose
  // difference is the steady gradient.
  return {ambient_c + iec_steady_top_oil_rise(p, k), p.k21 * g, (p.k21 - 1) * g};
}

double iec_max_step_min(const IecThermalParameters& p) {
  return 0.5 * std::min({p.k11 * p.tau_o_min, p.k22 * p.tau_w_min, p.tau_o_min / p.k22});
}

IecStepTargets iec_step_targets(const IecThermalParameters& p, double k) {
  return {iec_steady_top_oil_rise(p, k), iec_steady_hot_spot_gradient(p, k)};
}

void iec_step(const IecThermalParameters& p, const IecStepTargets& t, double ambient_c, double dt_min,
              IecThermalState& s) {
  const double g = t.gradient_k;
  s.top_oil_c += dt_min / (p.k11 * p.tau_o_min) * (t.top_oil_rise_k - (s.top_oil_c - ambient_c));
  s.dh1_k += dt_min / (p.k22 * p.tau_w_min) * (p.k21 * g - s.dh1_k);
  s.dh2_k += dt_min / (p.tau_o_min / p.k22) * ((p.k21 - 1) * g - s.dh2_k);
}

void iec_step(const IecThermalParameters& p, double k, double ambient_c, double dt_min, IecThermalState& s) {
  iec_step(p, iec_step_targets(p, k), ambient_c, dt_min, s);
}

double iec_hot_spot_step_response(const IecThermalParameters& p, double t_min) {
  return p.k21 * (1 - std::exp(-t_min / (p.k22 * p.tau_w_min))) -
         (p.k21 - 1) * (1 - std::exp(-t_min / (p.tau_o_min / p.k22)));
}

double iec_top_oil_step_response(const IecThermalParameters& p, double t_min) {
  return 1 - std::exp(-t_min / (p.k11 * p.tau_o_min));
}

}  // namespace ferrum::analytics
