// Loading indicators of one unit over a period, from the computed thermal
// series: peak and 99th-percentile load, hours above nameplate, hours with
// the hot spot above the IEC 60076-7 loading limits, peak temperatures, the
// measured-minus-model top-oil discrepancy and the yearly load growth.
//
// Source of the limits: IEC 60076-7:2005 Table 4 "current and temperature
// limits" (checked against a public reproduction): hot spot 120 °C normal cyclic,
// 140 °C long-time emergency, 160 °C short-time emergency (medium/large).
// The percentile and trend are plain statistics (no published source):
// p99 = nearest-rank over points; growth = time-weighted least-squares slope
// of load over time divided by the mean load.
//
// Units: load per unit, temperatures °C, durations h, growth %/year.
#pragma once

#include <optional>
#include <span>
#include <string>

#include "analytics/thermal_simulation.h"

namespace ferrum::analytics {

// Hot-spot limit of IEC 60076-7 Table 4 in the tables in force
// (analytics/data/iec60076_7.csv): 0 normal cyclic, 1 long-time emergency,
// 2 short-time emergency loading.
double iec60076_7_hot_spot_limit_c(int loading);

struct LoadingLimits {
  double normal_cyclic_c = iec60076_7_hot_spot_limit_c(0);    // IEC 60076-7 Table 4, normal cyclic loading
  double long_emergency_c = iec60076_7_hot_spot_limit_c(1);   // long-time emergency loading
  double short_emergency_c = iec60076_7_hot_spot_limit_c(2);  // short-time emergency loading (medium/large units)
  double nameplate_pu = 1.0;       // load counted as "above nameplate" above this
};

struct LoadIndicators {
  double period_h = 0;  // Σ step_h
  std::optional<double> peak_load_pu, p99_load_pu;
  std::optional<double> peak_hot_spot_c, peak_top_oil_c;
  double hours_above_nameplate = 0;
  double hours_above_normal_cyclic = 0;
  double hours_above_long_emergency = 0;
  double hours_above_short_emergency = 0;
  double loss_of_life_h = 0;  // Σ ageing_h, equivalent hours at the reference temperature
  double bridged_h = 0;       // Σ bridged_h
  // Mean of measured minus model top oil over points with a measurement.
  std::optional<double> top_oil_discrepancy_k;
  std::size_t top_oil_measurements = 0;
};

// Indicators over all given points. Each point stands for its step_h.
LoadIndicators load_indicators(std::span<const ThermalPoint> points, const LoadingLimits& limits);

// Sums of the time-weighted least-squares fit of load on time (weights
// step_h, x in years from an origin, y load per unit).
struct GrowthSums {
  double w = 0, x = 0, y = 0, xx = 0, xy = 0;
  void add(double weight, double x_years, double load_pu) {
    w += weight, x += weight * x_years, y += weight * load_pu;
    xx += weight * x_years * x_years, xy += weight * x_years * load_pu;
  }
  // `later` with its origin `shift_years` after this one's.
  void add_shifted(const GrowthSums& later, double shift_years);
};

struct LoadGrowth {
  std::optional<double> pct_per_year;
  double span_years = 0;
  std::string note;  // why there is no value, or what it is based on
};

// Trend over all points; needs at least min_span_days of data, since a
// shorter span mostly measures the season.
LoadGrowth load_growth(std::span<const ThermalPoint> points, double min_span_days = 365);

// The same from sums already taken (origin t0, the first point), and the
// points after them; first_t/last_t: the first and last point of it all.
LoadGrowth load_growth(const GrowthSums& earlier, Timestamp first_t, std::span<const ThermalPoint> points,
                       Timestamp last_t, std::size_t count, double min_span_days = 365);

inline constexpr double kSecondsPerYear = 365.25 * 86400;

}  // namespace ferrum::analytics
