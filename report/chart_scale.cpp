#include "report/chart_scale.h"

#include <algorithm>
#include <cmath>
#include <cstdio>

namespace ferrum::report {
namespace {

// Decimals needed to print multiples of `step` exactly (0 for steps >= 1).
int decimals_for(double step) {
  int d = 0;
  while (d < 6 && std::fabs(step * std::pow(10.0, d) - std::round(step * std::pow(10.0, d))) > 1e-6) ++d;
  return d;
}

std::string fixed(double v, int decimals) {
  char buf[48];
  if (std::fabs(v) < 1e-12) v = 0;  // no "-0"
  std::snprintf(buf, sizeof buf, "%.*f", decimals, v);
  return buf;
}

std::string decade_label(double v) {
  if (v >= 1) return fixed(v, 0);
  return fixed(v, static_cast<int>(std::round(-std::log10(v))));
}

}  // namespace

double nice_step(double span, int max_ticks) {
  const int intervals = std::max(1, max_ticks - 1);
  if (!(span > 0) || !std::isfinite(span)) return 1.0;
  const double raw = span / intervals;
  double magnitude = std::pow(10.0, std::floor(std::log10(raw)));
  for (;;) {
    for (double m : {1.0, 2.0, 5.0}) {
      const double step = m * magnitude;
      // Ticks land on multiples of the step, so the covered span can grow by
      // up to one step at each end: check the widened count.
      if (step * intervals >= span * (1 - 1e-9)) return step;
    }
    magnitude *= 10;
  }
}

std::vector<Tick> nice_ticks(double lo, double hi, int max_ticks) {
  if (!std::isfinite(lo) || !std::isfinite(hi)) return {};
  if (lo > hi) std::swap(lo, hi);
  if (hi - lo < 1e-12) {
    const double pad = std::fabs(lo) > 0 ? std::fabs(lo) * 0.1 : 1.0;
    lo -= pad;
    hi += pad;
  }
  max_ticks = std::max(2, max_ticks);
  double step = nice_step(hi - lo, max_ticks);
  double first = std::floor(lo / step + 1e-9) * step;
  double last = std::ceil(hi / step - 1e-9) * step;
  // Widening to whole steps can add one interval: take the next step if so.
  while ((last - first) / step > max_ticks - 1 + 1e-9) {
    step = nice_step(step * 1.01 * (max_ticks - 1), max_ticks);
    first = std::floor(lo / step + 1e-9) * step;
    last = std::ceil(hi / step - 1e-9) * step;
  }
  const int decimals = decimals_for(step);
  std::vector<Tick> ticks;
  const int n = static_cast<int>(std::llround((last - first) / step));
  for (int i = 0; i <= n; ++i) {
    const double v = first + i * step;
    ticks.push_back({v, fixed(v, decimals)});
  }
  return ticks;
}

std::vector<Tick> decade_ticks(double lo, double hi) {
  if (!std::isfinite(hi) || hi <= 0) hi = 1;
  if (!(lo > 0)) lo = std::max(hi / 1000, 0.1);
  if (lo > hi) std::swap(lo, hi);
  int first = static_cast<int>(std::floor(std::log10(lo) + 1e-9));
  int last = static_cast<int>(std::ceil(std::log10(hi) - 1e-9));
  if (last == first) ++last;
  std::vector<Tick> ticks;
  for (int e = first; e <= last; ++e) {
    const double v = std::pow(10.0, e);
    ticks.push_back({v, decade_label(v)});
  }
  return ticks;
}

bool wants_log_scale(double lo_positive, double hi, double ratio) {
  return lo_positive > 0 && hi > 0 && hi / lo_positive > ratio;
}

std::vector<Tick> calendar_ticks(analytics::Day from, analytics::Day to, int max_ticks) {
  using analytics::civil_from_days;
  using analytics::days_from_civil;
  if (to < from) std::swap(from, to);
  max_ticks = std::max(2, max_ticks);
  const auto a = civil_from_days(from);
  const auto b = civil_from_days(to);
  const int months_span = (b.year - a.year) * 12 + (b.month - a.month) + 1;
  const int month_steps[] = {1, 2, 3, 6, 12, 24, 60, 120, 240, 600};
  int step = 1200;
  for (int s : month_steps) {
    if (months_span / s + 1 <= max_ticks) {
      step = s;
      break;
    }
  }
  // First tick: the first month boundary at or after `from` that is a whole
  // multiple of the step (counted from January of year 0).
  long m = static_cast<long>(a.year) * 12 + (a.month - 1);
  if (a.day != 1) ++m;
  m = ((m + step - 1) / step) * step;
  std::vector<Tick> ticks;
  for (;; m += step) {
    const int year = static_cast<int>(m / 12);
    const int month = static_cast<int>(m % 12) + 1;
    const analytics::Day d = days_from_civil(year, month, 1);
    if (d > to) break;
    char buf[16];
    if (step >= 12)
      std::snprintf(buf, sizeof buf, "%d", year);
    else
      std::snprintf(buf, sizeof buf, "%d-%02d", year, month);
    ticks.push_back({static_cast<double>(d), buf});
  }
  return ticks;
}

std::optional<double> AxisScale::position(double v) const {
  if (log) {
    if (!(v > 0) || !(lo > 0) || !(hi > lo)) return std::nullopt;
    return origin + length * (std::log10(v) - std::log10(lo)) / (std::log10(hi) - std::log10(lo));
  }
  if (!(hi > lo)) return origin + length / 2;
  return origin + length * (v - lo) / (hi - lo);
}

bool AxisScale::contains(double v) const {
  const double tol = (hi - lo) * 1e-9;
  return v >= lo - tol && v <= hi + tol;
}

bool Box::contains(Point p) const {
  const double e = 1e-6;
  return p.x >= x - e && p.x <= x + w + e && p.y >= y - e && p.y <= y + h + e;
}

std::optional<Segment> clip_segment(Point a, Point b, const Box& box) {
  const double dx = b.x - a.x, dy = b.y - a.y;
  double t0 = 0, t1 = 1;
  const double p[4] = {-dx, dx, -dy, dy};
  const double q[4] = {a.x - box.x, box.x + box.w - a.x, a.y - box.y, box.y + box.h - a.y};
  for (int i = 0; i < 4; ++i) {
    if (p[i] == 0) {
      if (q[i] < 0) return std::nullopt;  // parallel and outside
      continue;
    }
    const double r = q[i] / p[i];
    if (p[i] < 0) {
      if (r > t1) return std::nullopt;
      t0 = std::max(t0, r);
    } else {
      if (r < t0) return std::nullopt;
      t1 = std::min(t1, r);
    }
  }
  return Segment{{a.x + t0 * dx, a.y + t0 * dy}, {a.x + t1 * dx, a.y + t1 * dy}};
}

}  // namespace ferrum::report
