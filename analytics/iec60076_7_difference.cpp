#include "analytics/iec60076_7_difference.h"

#include <algorithm>
#include <cmath>

namespace ferrum::analytics {

namespace {
// b^e for b > 0 as exp(e·ln b): the two powers per step were the larger
// part of the thermal kernel (profiled, bench/results.md §3), and exp and
// log together take about half the time of std::pow here, within a few ulp
// of it. b = 1 gives exactly 1, so the rated steady state stays exact.
double positive_power(double b, double e) {
  if (!(b > 0) || !std::isfinite(b)) return std::pow(b, e);
  return std::exp(e * std::log(b));
}
}  // namespace

double iec_steady_top_oil_rise(const IecThermalParameters& p, double k) {
  return p.top_oil_rise_k * positive_power((1 + k * k * p.r) / (1 + p.r), p.x);
}

double iec_steady_hot_spot_gradient(const IecThermalParameters& p, double k) {
  return p.hot_spot_gradient_k * positive_power(k, p.y);
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

IecStepFactors iec_step_factors(const IecThermalParameters& p, double dt_min) {
  return {dt_min / (p.k11 * p.tau_o_min), dt_min / (p.k22 * p.tau_w_min), dt_min / (p.tau_o_min / p.k22)};
}

IecStepDecay iec_step_decay(const IecStepFactors& f, int n) {
  return {std::pow(1 - f.top_oil, n), std::pow(1 - f.dh1, n), std::pow(1 - f.dh2, n)};
}

void iec_step(const IecThermalParameters& p, const IecStepTargets& t, double ambient_c, double dt_min,
              IecThermalState& s) {
  iec_step(p, t, iec_step_factors(p, dt_min), ambient_c, s);
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
