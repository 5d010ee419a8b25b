#include "analytics/ieee_c57_91_clause7.h"

#include <cmath>
#include <cstdio>

#include "analytics/standard_tables.h"

namespace ferrum::analytics {
namespace {

std::string describe(const char* name, double v, const char* origin) {
  char buf[160];
  std::snprintf(buf, sizeof buf, "%s = %g (%s)", name, v, origin);
  return buf;
}

}  // namespace

ResolvedIeeeParameters resolve_ieee_parameters(const ResolvedIecParameters& iec) {
  ResolvedIeeeParameters out;
  const C5791Exponents e = standard_tables().c57_91_exponents[static_cast<std::size_t>(iec.cooling_class)];
  auto& p = out.p;
  p = {e.n, e.m, iec.p.r, iec.p.tau_o_min, iec.p.tau_w_min, iec.p.top_oil_rise_k, iec.p.hot_spot_gradient_k};
  const std::string table4 = std::string("IEEE C57.91-2011 Table 4, ") + to_string(iec.cooling_class);
  out.sources.push_back(describe("n", p.n, table4.c_str()));
  out.sources.push_back(describe("m", p.m, table4.c_str()));
  out.sources.push_back(describe("tau_TO_min", p.tau_to_min,
                                 "IEC 60076-7:2005 Table 5 τo used for IEEE τ_TO,R: no thermal-capacity data"));
  out.sources.push_back(describe("tau_w_min", p.tau_w_min, "IEC 60076-7:2005 Table 5"));
  // R and the rated rises: same origin as for the IEC model.
  for (const auto& s : iec.sources)
    if (s.rfind("R ", 0) == 0 || s.rfind("top_oil_rise_k", 0) == 0 || s.rfind("hot_spot_gradient_k", 0) == 0)
      out.sources.push_back(s);
  return out;
}

double ieee_ultimate_top_oil_rise(const IeeeThermalParameters& p, double k) {
  return p.top_oil_rise_k * std::pow((k * k * p.r + 1) / (p.r + 1), p.n);
}

double ieee_ultimate_hot_spot_rise(const IeeeThermalParameters& p, double k) {
  return p.hot_spot_gradient_k * std::pow(k, 2 * p.m);
}

IeeeThermalState ieee_steady_state(const IeeeThermalParameters& p, double k) {
  return {ieee_ultimate_top_oil_rise(p, k), ieee_ultimate_hot_spot_rise(p, k)};
}

void ieee_step(const IeeeThermalParameters& p, double k, double dt_min, IeeeThermalState& s) {
  const double u_to = ieee_ultimate_top_oil_rise(p, k);
  const double u_h = ieee_ultimate_hot_spot_rise(p, k);
  s.top_oil_rise_k = u_to + (s.top_oil_rise_k - u_to) * std::exp(-dt_min / p.tau_to_min);
  s.hot_spot_rise_k = u_h + (s.hot_spot_rise_k - u_h) * std::exp(-dt_min / p.tau_w_min);
}

}  // namespace ferrum::analytics
