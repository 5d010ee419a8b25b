#include "analytics/load_history.h"

#include <cmath>

namespace ferrum::analytics {

std::vector<LoadDay> summarise_days(std::span<const ThermalPoint> points, const LoadingLimits& limits) {
  std::vector<LoadDay> out;
  for (const auto& p : points) {
    const Day d = day_of(p.t);
    if (out.empty() || out.back().day != d) {
      LoadDay day;
      day.day = d;
      day.first_t = p.t;
      day.peak_load_pu = p.load_pu;
      day.peak_load_t = p.t;
      day.peak_hot_spot_c = p.hot_spot_c;
      day.peak_hot_spot_t = p.t;
      day.peak_top_oil_c = p.top_oil_c;
      out.push_back(day);
    }
    LoadDay& day = out.back();
    day.last_t = p.t;
    day.covered_h += p.step_h;
    day.bridged_h += p.bridged_h;
    day.ageing_h += p.ageing_h;
    if (p.load_pu > day.peak_load_pu) day.peak_load_pu = p.load_pu, day.peak_load_t = p.t;
    if (p.hot_spot_c > day.peak_hot_spot_c) day.peak_hot_spot_c = p.hot_spot_c, day.peak_hot_spot_t = p.t;
    if (p.top_oil_c > day.peak_top_oil_c) day.peak_top_oil_c = p.top_oil_c;
    if (p.load_pu > limits.nameplate_pu) day.hours_above_nameplate += p.step_h;
    if (p.hot_spot_c > limits.normal_cyclic_c) day.hours_above_normal_cyclic += p.step_h;
    if (p.hot_spot_c > limits.long_emergency_c) day.hours_above_long_emergency += p.step_h;
    if (p.hot_spot_c > limits.short_emergency_c) day.hours_above_short_emergency += p.step_h;
    if (std::isfinite(p.measured_top_oil_c)) {
      day.top_oil_excess_k += p.measured_top_oil_c - p.top_oil_c;
      ++day.top_oil_measurements;
    }
    day.ambient_from_profile = day.ambient_from_profile || p.ambient_from_profile;
    day.growth.add(p.step_h, (p.t - start_of(d)) / kSecondsPerYear, p.load_pu);
  }
  return out;
}

void summarise_load_before(const ThermalModel& model, const GapOptions& gaps, const LoadingLimits& limits,
                           std::span<const LoadPoint> before_cut, Timestamp cut, LoadHistory& history) {
  std::vector<ThermalPoint> points(before_cut.size());
  const auto st = simulate_thermal(model, before_cut, gaps, points, history.resume);
  points.resize(st.written);
  for (auto& d : summarise_days(points, limits)) {
    if (!history.days.empty() && history.days.back().day >= d.day) continue;  // summarised before (not expected)
    history.days.push_back(d);
  }
  if (cut > history.raw_from) history.raw_from = cut;
}

}  // namespace ferrum::analytics
