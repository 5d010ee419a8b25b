// Daily thermal summaries of a unit's load history: what the retention rule
// ([store] keep_load_points_years) keeps in place of the raw load points
// older than its limit, with the thermal model's state where the raw points
// were cut, so that the thermal assessment reads the same figures after the
// retention as before it.
//
// Not a published method: sums, peaks and counts of the computed thermal
// series (thermal_simulation.h, hot spot and top oil by IEC 60076-7 or IEEE
// C57.91) per UTC day; the indicators and limits are those of
// load_indicators.h (IEC 60076-7:2005 Table 4). The hours above each limit
// are counted against the limits in force when the day is summarised.
// Common practice, no published source.
//
// Units: timestamps UTC s, load per unit, temperatures °C, durations h.
#pragma once

#include <span>
#include <vector>

#include "analytics/calendar.h"
#include "analytics/load_indicators.h"
#include "analytics/thermal_simulation.h"

namespace ferrum::analytics {

struct LoadDay {
  Day day = 0;                           // UTC day
  Timestamp first_t = 0, last_t = 0;     // first and last computed point of the day
  double covered_h = 0, bridged_h = 0;   // Σ step_h, Σ bridged_h
  double ageing_h = 0;                   // ageing consumed: Σ ∫V dt, equivalent hours
  double peak_load_pu = 0;
  Timestamp peak_load_t = 0;             // first point of the day at the peak
  double peak_hot_spot_c = 0;
  Timestamp peak_hot_spot_t = 0;
  double peak_top_oil_c = 0;
  double hours_above_nameplate = 0;
  double hours_above_normal_cyclic = 0;  // hot spot above each IEC 60076-7 Table 4 limit
  double hours_above_long_emergency = 0;
  double hours_above_short_emergency = 0;
  double top_oil_excess_k = 0;           // Σ (measured − model) top oil
  long top_oil_measurements = 0;
  bool ambient_from_profile = false;
  GrowthSums growth;                     // of the load-growth trend, x from the day's start
};

// The summarised part of a unit's load history: days before raw_from, and
// the model after the last point summarised.
struct LoadHistory {
  Timestamp raw_from = 0;       // raw points from here on; days before it are summarised
  std::vector<LoadDay> days;    // ascending
  SimulationResume resume;
};

// One summary per UTC day that holds computed points (points sorted by time).
std::vector<LoadDay> summarise_days(std::span<const ThermalPoint> points, const LoadingLimits& limits);

// Moves the raw points before `cut` (a day's start) into `history`: runs the
// model from history.resume over them, appends their days, and sets
// raw_from. `before_cut` are the raw points with t < cut, sorted by time.
void summarise_load_before(const ThermalModel& model, const GapOptions& gaps, const LoadingLimits& limits,
                           std::span<const LoadPoint> before_cut, Timestamp cut, LoadHistory& history);

}  // namespace ferrum::analytics
