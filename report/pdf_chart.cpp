#include "report/pdf_chart.h"

#include <algorithm>
#include <cmath>
#include <limits>

#include "report/text_wrap.h"

namespace ferrum::report {
namespace {

constexpr double kLeft = 36;     // room for y tick labels
constexpr double kRight = 6;
constexpr double kTop = 16;      // room for the y-axis title above the plot
constexpr double kBottom = 14;   // room for x tick labels
constexpr double kLegendRow = 11;
constexpr double kTickSize = 6.3;

struct Range {
  double lo = std::numeric_limits<double>::infinity();
  double hi = -std::numeric_limits<double>::infinity();
  void add(double v) {
    if (!std::isfinite(v)) return;
    lo = std::min(lo, v);
    hi = std::max(hi, v);
  }
  bool empty() const { return lo > hi; }
};

Range y_data_range(const LineChart& chart) {
  Range r;
  for (const auto& s : chart.series)
    for (const auto& p : s.points)
      if (!chart.log_y || p.y > 0) r.add(p.y);
  for (const auto& l : chart.limits) r.add(l.value);
  if (chart.y_min) r.add(*chart.y_min);
  if (chart.y_max) r.add(*chart.y_max);
  return r;
}

Range x_data_range(const LineChart& chart) {
  Range r;
  for (const auto& s : chart.series)
    for (const auto& p : s.points) r.add(p.x);
  if (chart.x_min) r.add(*chart.x_min);
  if (chart.x_max) r.add(*chart.x_max);
  if (r.empty()) r = {0, 1};
  if (r.hi - r.lo < 1) r.hi = r.lo + 1;
  return r;
}

int legend_rows(const LineChart& chart, double width, HPDF_Page page, FontRef font) {
  double x = 0;
  int rows = chart.series.empty() ? 0 : 1;
  for (const auto& s : chart.series) {
    const double w = 24 + text_width(page, font, 6.8, s.label) + 12;
    if (x + w > width && x > 0) {
      ++rows;
      x = 0;
    }
    x += w;
  }
  return rows;
}

void draw_legend(HPDF_Page page, FontRef font, double x0, double top, double width, const LineChart& chart) {
  double x = x0, y = top - 8;
  for (const auto& s : chart.series) {
    const double w = 24 + text_width(page, font, 6.8, s.label) + 12;
    if (x + w > x0 + width && x > x0) {
      x = x0;
      y -= kLegendRow;
    }
    if (s.draw_line) draw_line(page, x, y + 2.5, x + 20, y + 2.5, s.color, s.line_width, s.dash);
    draw_marker(page, s.marker, x + 10, y + 2.5, 4, s.color);
    draw_text(page, font, 6.8, x + 24, y, s.label, palette::ink);
    x += w;
  }
}

}  // namespace

std::vector<Tick> chart_y_ticks(const LineChart& chart) {
  Range r = y_data_range(chart);
  if (r.empty()) r = {0, 1};
  if (chart.log_y) return decade_ticks(r.lo, r.hi);
  if (!chart.y_min && r.lo > 0 && r.lo < r.hi * 0.35) r.lo = 0;  // anchor at zero when close to it
  return nice_ticks(r.lo, r.hi, chart.max_y_ticks);
}

void draw_line_chart(HPDF_Page page, const PdfDocument& doc, const Box& box, const LineChart& chart) {
  FontRef regular = doc.font(FontFace::regular);
  const int rows = legend_rows(chart, box.w - kLeft, page, regular);
  const Box plot{box.x + kLeft, box.y + kBottom + rows * kLegendRow + 4, box.w - kLeft - kRight,
                 box.h - kTop - kBottom - rows * kLegendRow - 4};
  const auto yt = chart_y_ticks(chart);
  const AxisScale ys{yt.front().value, yt.back().value, chart.log_y, plot.y, plot.h};
  const Range xr = x_data_range(chart);
  std::vector<Tick> xt = chart.time_axis
                             ? calendar_ticks(static_cast<analytics::Day>(std::floor(xr.lo)),
                                              static_cast<analytics::Day>(std::ceil(xr.hi)), 7)
                             : nice_ticks(xr.lo, xr.hi, 7);
  const double x_lo = chart.time_axis ? xr.lo : std::min(xr.lo, xt.front().value);
  const double x_hi = chart.time_axis ? xr.hi : std::max(xr.hi, xt.back().value);
  const AxisScale xs{x_lo, x_hi, false, plot.x, plot.w};

  // Shaded bands first, then grid, limits, series on top.
  for (const auto& b : chart.bands) {
    const auto y0 = ys.position(std::max(b.from, ys.lo));
    const auto y1 = ys.position(std::min(b.to, ys.hi));
    if (y0 && y1 && *y1 > *y0) fill_rect(page, plot.x, *y0, plot.w, *y1 - *y0, b.color);
  }
  for (const auto& t : yt) {
    const double y = *ys.position(t.value);
    draw_line(page, plot.x, y, plot.x + plot.w, y, Color::gray(0.86f), 0.35);
    draw_text(page, regular, kTickSize, plot.x - 3, y - 2.2, t.label, palette::muted, Align::right);
  }
  for (const auto& t : xt) {
    if (!xs.contains(t.value)) continue;
    const double x = *xs.position(t.value);
    draw_line(page, x, plot.y - 2.5, x, plot.y, palette::muted, 0.4);
    draw_text(page, regular, kTickSize, x, plot.y - 9, t.label, palette::muted, Align::center);
  }
  draw_line(page, plot.x, plot.y, plot.x + plot.w, plot.y, palette::muted, 0.6);
  draw_line(page, plot.x, plot.y, plot.x, plot.y + plot.h, palette::muted, 0.6);
  draw_text(page, regular, 6.6, box.x, box.y + box.h - 7, chart.y_label + (chart.log_y ? " (log scale)" : ""),
            palette::muted);

  for (const auto& l : chart.limits) {
    if (!ys.contains(l.value)) continue;
    const double y = *ys.position(l.value);
    draw_line(page, plot.x, y, plot.x + plot.w, y, l.color, 0.8, l.dash);
    const double tw = text_width(page, regular, 6.2, l.label);
    fill_rect(page, plot.x + plot.w - tw - 4, y + 1, tw + 3, 7.2, palette::white);
    draw_text(page, regular, 6.2, plot.x + plot.w - 2, y + 2.2, l.label, palette::ink, Align::right);
  }

  for (const auto& s : chart.series) {
    std::vector<std::optional<Point>> pts;
    for (const auto& p : s.points) {
      const auto px = xs.position(p.x);
      const auto py = ys.position(p.y);
      pts.push_back(px && py ? std::optional<Point>(Point{*px, *py}) : std::nullopt);
    }
    if (s.draw_line) {
      // One path per run of segments that join (a gap or a clipped end
      // starts the next): a year of points is then a few kilobytes of page
      // content, not one stroked path per segment.
      std::vector<std::pair<double, double>> run;
      const auto flush = [&] {
        draw_polyline(page, run, s.color, s.line_width, s.dash);
        run.clear();
      };
      for (size_t i = 1; i < pts.size(); ++i) {
        const auto seg = pts[i - 1] && pts[i] ? clip_segment(*pts[i - 1], *pts[i], plot) : std::nullopt;
        if (!seg) {
          flush();
          continue;
        }
        const bool joins = !run.empty() && std::abs(run.back().first - seg->a.x) < 1e-6 &&
                           std::abs(run.back().second - seg->a.y) < 1e-6;
        if (!joins) {
          flush();
          run.emplace_back(seg->a.x, seg->a.y);
        }
        run.emplace_back(seg->b.x, seg->b.y);
      }
      flush();
    }
    for (const auto& p : pts)
      if (p && plot.contains(*p)) draw_marker(page, s.marker, p->x, p->y, 3.6, s.color);
  }
  draw_legend(page, regular, plot.x, box.y + rows * kLegendRow + 2, plot.w, chart);
}

void draw_bar_chart(HPDF_Page page, const PdfDocument& doc, const Box& box, const BarChart& chart) {
  FontRef regular = doc.font(FontFace::regular);
  const Box plot{box.x + kLeft, box.y + kBottom + 8, box.w - kLeft - kRight, box.h - kTop - kBottom - 8};
  double hi = 0;
  for (double v : chart.values) hi = std::max(hi, v);
  // Counts need whole-number ticks: a range of at least four keeps the step >= 1.
  if (chart.counts) hi = std::max(hi, 4.0);
  const auto yt = nice_ticks(0, hi > 0 ? hi : 1, 5);
  const AxisScale ys{0, yt.back().value, false, plot.y, plot.h};
  for (const auto& t : yt) {
    const double y = *ys.position(t.value);
    draw_line(page, plot.x, y, plot.x + plot.w, y, Color::gray(0.86f), 0.35);
    draw_text(page, regular, kTickSize, plot.x - 3, y - 2.2, t.label, palette::muted, Align::right);
  }
  const size_t n = chart.categories.size();
  const double slot = n ? plot.w / static_cast<double>(n) : plot.w;
  for (size_t i = 0; i < n; ++i) {
    const double v = i < chart.values.size() ? chart.values[i] : 0;
    const double x = plot.x + slot * static_cast<double>(i);
    const double top = *ys.position(std::max(0.0, v));
    if (top > plot.y) fill_rect(page, x + slot * 0.18, plot.y, slot * 0.64, top - plot.y, chart.color);
    // Category names wrap onto a second line rather than run into their neighbours.
    const auto lines = wrap_text(chart.categories[i], slot - 2,
                                 [&](std::string_view s) { return text_width(page, regular, kTickSize, s); });
    for (size_t k = 0; k < lines.size() && k < 2; ++k)
      draw_text(page, regular, kTickSize, x + slot / 2, plot.y - 9 - 7.5 * static_cast<double>(k), lines[k],
                palette::muted, Align::center);
    if (i < chart.bar_labels.size())
      draw_text(page, regular, 6.2, x + slot / 2, top + 2.5, chart.bar_labels[i], palette::ink, Align::center);
  }
  draw_line(page, plot.x, plot.y, plot.x + plot.w, plot.y, palette::muted, 0.6);
  draw_text(page, regular, 6.6, box.x, box.y + box.h - 7, chart.y_label, palette::muted);
}

}  // namespace ferrum::report
