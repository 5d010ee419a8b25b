// Rate of change of one dissolved gas by ordinary least squares over the
// recent samples, as IEEE C57.104-2019 recommends for its rate check (a
// regression over 3–6 samples spanning about 4–24 months;
// from memory).
// Inputs: sample dates (days) and concentrations in µL/L (ppm; a gas below
// its detection limit counts as 0). Output: slope in ppm/day and ppm/year
// (365.25 days).
// Guards: samples closer together than `min_gap_days` are treated as repeats
// (only the later one is used); fewer than `min_samples` usable samples or a
// span shorter than `min_span_days` gives no rate, with the reason.
#pragma once

#include <optional>
#include <string>
#include <vector>

#include "analytics/calendar.h"
#include "analytics/dga_gases.h"
#include "analytics/unit_data.h"

namespace ferrum::analytics {

struct GasTrendOptions {
  int max_samples = 6;      // most recent samples used (C57.104-2019: 3-6)
  int min_samples = 3;      // fewer: no rate
  int min_gap_days = 7;     // closer samples are repeats; the later is kept
  int min_span_days = 120;  // about 4 months (C57.104-2019, from memory)
  int max_span_days = 730;  // about 24 months
};

struct TrendPoint {
  Day date = 0;
  double ppm = 0;
};

struct GasTrend {
  bool applicable = false;
  std::string why_not;
  std::optional<double> ppm_per_day;
  std::optional<double> ppm_per_year;
  int samples_used = 0;
  Day from = 0, to = 0;
  std::string method = "Least-squares rate over recent samples";
  std::string source = "IEEE C57.104-2019 rate-of-change procedure (from memory)";
};

// Points in any order; selection and guards as described above.
GasTrend least_squares_trend(std::vector<TrendPoint> points, const GasTrendOptions& options = {});

// Trend of one gas over samples (any order); samples without the gas are skipped.
GasTrend gas_trend(const std::vector<OilSample>& samples, Gas gas, const GasTrendOptions& options = {});

}  // namespace ferrum::analytics
