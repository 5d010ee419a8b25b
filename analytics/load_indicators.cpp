#include "analytics/load_indicators.h"

#include <algorithm>
#include <cmath>
#include <vector>

namespace ferrum::analytics {
namespace {

double nearest_rank(std::vector<double>& v, double pct) {
  const auto rank = static_cast<std::size_t>(std::ceil(pct / 100.0 * v.size()));
  const std::size_t idx = std::clamp<std::size_t>(rank, 1, v.size()) - 1;
  std::nth_element(v.begin(), v.begin() + idx, v.end());
  return v[idx];
}

void add_temperature_hours(LoadIndicators& r, const ThermalPoint& p, const LoadingLimits& lim) {
  if (p.hot_spot_c > lim.normal_cyclic_c) r.hours_above_normal_cyclic += p.step_h;
  if (p.hot_spot_c > lim.long_emergency_c) r.hours_above_long_emergency += p.step_h;
  if (p.hot_spot_c > lim.short_emergency_c) r.hours_above_short_emergency += p.step_h;
}

}  // namespace

LoadIndicators load_indicators(std::span<const ThermalPoint> points, const LoadingLimits& limits) {
  LoadIndicators r;
  if (points.empty()) return r;
  std::vector<double> loads;
  loads.reserve(points.size());
  double discrepancy = 0;
  double peak_load = -INFINITY, peak_hs = -INFINITY, peak_to = -INFINITY;
  for (const auto& p : points) {
    loads.push_back(p.load_pu);
    peak_load = std::max(peak_load, p.load_pu);
    peak_hs = std::max(peak_hs, p.hot_spot_c);
    peak_to = std::max(peak_to, p.top_oil_c);
    r.period_h += p.step_h;
    r.loss_of_life_h += p.ageing_h;
    r.bridged_h += p.bridged_h;
    if (p.load_pu > limits.nameplate_pu) r.hours_above_nameplate += p.step_h;
    add_temperature_hours(r, p, limits);
    if (std::isfinite(p.measured_top_oil_c)) {
      discrepancy += p.measured_top_oil_c - p.top_oil_c;
      ++r.top_oil_measurements;
    }
  }
  r.peak_load_pu = peak_load;
  r.peak_hot_spot_c = peak_hs;
  r.peak_top_oil_c = peak_to;
  r.p99_load_pu = nearest_rank(loads, 99);
  if (r.top_oil_measurements > 0) r.top_oil_discrepancy_k = discrepancy / r.top_oil_measurements;
  return r;
}

void GrowthSums::add_shifted(const GrowthSums& later, double a) {
  // Σw(a+u) = aΣw + Σwu; Σw(a+u)² = a²Σw + 2aΣwu + Σwu²; Σw(a+u)y = aΣwy + Σwuy.
  w += later.w;
  x += a * later.w + later.x;
  y += later.y;
  xx += a * a * later.w + 2 * a * later.x + later.xx;
  xy += a * later.y + later.xy;
}

LoadGrowth load_growth(const GrowthSums& earlier, Timestamp first_t, std::span<const ThermalPoint> points,
                       Timestamp last_t, std::size_t count, double min_span_days) {
  LoadGrowth g;
  if (count < 2) {
    g.note = "fewer than two load points";
    return g;
  }
  const Timestamp t0 = first_t;
  g.span_years = (last_t - t0) / kSecondsPerYear;
  if (g.span_years * 365.25 < min_span_days) {
    g.note = "load history shorter than " + std::to_string(static_cast<int>(min_span_days)) + " days";
    return g;
  }
  // Weighted least squares of load on time (years), weights = step_h.
  GrowthSums s = earlier;
  for (const auto& p : points) s.add(p.step_h, (p.t - t0) / kSecondsPerYear, p.load_pu);
  const double den = s.w * s.xx - s.x * s.x;
  if (s.w <= 0 || den <= 0 || s.y <= 0) {
    g.note = "load series without spread in time or load";
    return g;
  }
  const double slope = (s.w * s.xy - s.x * s.y) / den;
  g.pct_per_year = 100.0 * slope / (s.y / s.w);
  g.note = "least-squares slope of load over time, relative to the mean load";
  return g;
}

LoadGrowth load_growth(std::span<const ThermalPoint> points, double min_span_days) {
  if (points.empty()) return load_growth(GrowthSums{}, 0, points, 0, 0, min_span_days);
  return load_growth(GrowthSums{}, points.front().t, points, points.back().t, points.size(), min_span_days);
}

}  // namespace ferrum::analytics
