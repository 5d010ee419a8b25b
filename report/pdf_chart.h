// Generic vector charts drawn with libharu: line charts over time or numbers
// (linear or log y axis, limit lines, shaded limit bands, legend) and simple
// bar charts. Axis arithmetic lives in chart_scale.h; this file only draws.
// Every series differs by dash and marker as well as by shade, so charts
// read in black and white.
#pragma once

#include <optional>
#include <string>
#include <vector>

#include "report/chart_scale.h"
#include "report/pdf_document.h"
#include "report/pdf_draw.h"

namespace ferrum::report {

struct ChartSeries {
  std::string label;
  std::vector<Point> points;  // data coordinates; x in days when the chart is a time chart
  Color color = palette::ink;
  Dash dash = Dash::solid;
  Marker marker = Marker::none;
  double line_width = 0.9;
  bool draw_line = true;
};

// Horizontal line at a y value, labelled at the right end inside the plot.
struct LimitLine {
  double value = 0;
  std::string label;
  Dash dash = Dash::dashed;
  Color color = palette::muted;
};

// Shaded horizontal band between two y values (e.g. above a limit).
struct ShadedBand {
  double from = 0, to = 0;
  Color color = palette::faint;
};

struct LineChart {
  std::string y_label;        // axis title with unit, e.g. "°C"
  bool time_axis = true;      // x values are analytics::Day
  bool log_y = false;         // decade axis; non-positive values are skipped
  std::optional<double> y_min, y_max;  // forced range (else from data and limits)
  std::optional<double> x_min, x_max;
  std::vector<ChartSeries> series;
  std::vector<LimitLine> limits;
  std::vector<ShadedBand> bands;
  int max_y_ticks = 6;
};

// Data range the chart will show on y (after widening to round ticks).
std::vector<Tick> chart_y_ticks(const LineChart& chart);

// Draws the chart in `box` (box.y is the bottom); legend below the plot.
// Points outside the axis ranges are clipped; lines are cut at the plot edge.
void draw_line_chart(HPDF_Page page, const PdfDocument& doc, const Box& box, const LineChart& chart);

struct BarChart {
  std::vector<std::string> categories;
  std::vector<double> values;
  std::vector<std::string> bar_labels;  // printed above each bar (optional)
  std::string y_label;
  Color color = palette::accent;
  bool counts = false;  // values are counts: no fractional ticks
};
void draw_bar_chart(HPDF_Page page, const PdfDocument& doc, const Box& box, const BarChart& chart);

}  // namespace ferrum::report
