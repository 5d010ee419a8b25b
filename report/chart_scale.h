// Axis arithmetic for the report charts: round tick values (1-2-5 steps),
// decade ticks for log axes, calendar ticks for time axes, mapping of data
// values to page coordinates, and clipping of line segments to a plot box.
//
// Pure functions: no PDF, no I/O. pdf_chart.cpp draws with them; the tests
// check them on their own.
#pragma once

#include <optional>
#include <string>
#include <vector>

#include "analytics/calendar.h"

namespace ferrum::report {

// A tick position and the text printed beside it.
struct Tick {
  double value = 0;
  std::string label;
};

// Round tick values covering [lo, hi] with a step of 1, 2 or 5 times a power
// of ten, at most `max_ticks` of them. The returned range is widened to whole
// steps: front() <= lo and back() >= hi. lo == hi is widened around the value.
// Labels carry as many decimals as the step needs.
std::vector<Tick> nice_ticks(double lo, double hi, int max_ticks = 6);

// Step used by nice_ticks: the smallest 1/2/5 x 10^k with (hi-lo)/step <= max_ticks-1.
double nice_step(double span, int max_ticks);

// Decade ticks (…, 1, 10, 100, …) covering [lo, hi] for a log axis.
// REQUIRES lo > 0 (a non-positive lo is raised to hi/1000 or 0.1).
std::vector<Tick> decade_ticks(double lo, double hi);

// True when a series spanning [lo_positive, hi] reads better on a log axis:
// when the largest value is more than `ratio` times the smallest positive one.
bool wants_log_scale(double lo_positive, double hi, double ratio = 100.0);

// Calendar ticks for a time axis between two days: first days of a month,
// every 1, 2, 3, 6 or 12 months, or whole multiples of years, at most
// `max_ticks`. Labels are "2025-03" for month steps, "2025" for year steps.
std::vector<Tick> calendar_ticks(analytics::Day from, analytics::Day to, int max_ticks = 7);

// Maps data values to positions along an axis of length `length` starting at
// `origin` (page points). Linear or base-10 logarithmic.
struct AxisScale {
  double lo = 0, hi = 1;
  bool log = false;
  double origin = 0, length = 1;

  // Position of v; values outside [lo, hi] map outside [origin, origin+length].
  // For a log axis a non-positive value has no position: nullopt.
  std::optional<double> position(double v) const;
  bool contains(double v) const;  // lo <= v <= hi (with a small tolerance)
};

struct Point {
  double x = 0, y = 0;
};

// Plot box in page coordinates.
struct Box {
  double x = 0, y = 0, w = 0, h = 0;
  bool contains(Point p) const;
};

// Clips the segment a-b to the box (Liang–Barsky). Returns the visible part,
// or nullopt when none of it lies inside.
struct Segment {
  Point a, b;
};
std::optional<Segment> clip_segment(Point a, Point b, const Box& box);

}  // namespace ferrum::report
