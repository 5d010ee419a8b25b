#include "analytics/gas_trend.h"

#include <algorithm>

namespace ferrum::analytics {
namespace {

// Walks back from the latest point, dropping repeats and stopping at the
// sample or span limit. Returns the kept points, oldest first.
std::vector<TrendPoint> select_recent(std::vector<TrendPoint> points, const GasTrendOptions& o) {
  std::sort(points.begin(), points.end(), [](const TrendPoint& a, const TrendPoint& b) { return a.date < b.date; });
  std::vector<TrendPoint> kept;
  for (auto it = points.rbegin(); it != points.rend(); ++it) {
    if (static_cast<int>(kept.size()) >= o.max_samples) break;
    if (!kept.empty() && kept.front().date - it->date > o.max_span_days) break;
    if (!kept.empty() && kept.back().date - it->date < o.min_gap_days) continue;
    kept.push_back(*it);
  }
  std::reverse(kept.begin(), kept.end());
  return kept;
}

}  // namespace

GasTrend least_squares_trend(std::vector<TrendPoint> points, const GasTrendOptions& o) {
  GasTrend t;
  const std::vector<TrendPoint> kept = select_recent(std::move(points), o);
  t.samples_used = static_cast<int>(kept.size());
  if (t.samples_used < o.min_samples) {
    t.why_not = "too few samples for a rate (" + std::to_string(t.samples_used) + " usable, " +
                std::to_string(o.min_samples) + " needed)";
    return t;
  }
  t.from = kept.front().date;
  t.to = kept.back().date;
  if (t.to - t.from < o.min_span_days) {
    t.why_not = "samples too close together for a rate (span " + std::to_string(t.to - t.from) +
                " days, " + std::to_string(o.min_span_days) + " needed)";
    return t;
  }
  // Centre the dates to keep the sums well conditioned.
  double mean_x = 0, mean_y = 0;
  for (const TrendPoint& p : kept) {
    mean_x += p.date;
    mean_y += p.ppm;
  }
  mean_x /= kept.size();
  mean_y /= kept.size();
  double sxy = 0, sxx = 0;
  for (const TrendPoint& p : kept) {
    sxy += (p.date - mean_x) * (p.ppm - mean_y);
    sxx += (p.date - mean_x) * (p.date - mean_x);
  }
  t.applicable = true;
  t.ppm_per_day = sxy / sxx;
  t.ppm_per_year = *t.ppm_per_day * 365.25;
  return t;
}

GasTrend gas_trend(const std::vector<OilSample>& samples, Gas gas, const GasTrendOptions& o) {
  std::vector<TrendPoint> points;
  for (const OilSample& s : samples)
    if (auto v = gas_ppm_or_zero(s, gas)) points.push_back({s.date, *v});
  return least_squares_trend(std::move(points), o);
}

}  // namespace ferrum::analytics
