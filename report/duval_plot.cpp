#include "report/duval_plot.h"

#include <algorithm>
#include <cmath>

#include "analytics/duval_triangle1.h"
#include "report/pdf_draw.h"
#include "report/report_format.h"

namespace ferrum::report {
namespace {
constexpr double kSqrt3Half = 0.8660254037844386;
HPDF_REAL r(double v) { return static_cast<HPDF_REAL>(v); }

// Fill per zone: alternating tints so that neighbours differ in B&W.
Color zone_fill(const std::string& code) {
  if (code == "PD") return Color::gray(0.80f);
  if (code == "T1") return Color::gray(0.95f);
  if (code == "T2") return Color::gray(0.87f);
  if (code == "T3") return Color::gray(0.78f);
  if (code == "D1") return Color::gray(0.90f);
  if (code == "D2") return Color::gray(0.82f);
  return Color::gray(0.97f);  // DT
}
}  // namespace

std::vector<DuvalZone> duval_triangle1_zones() {
  // The zones of the analytics, from the tables in force
  // (analytics/data/duval_triangle1.csv).
  std::vector<DuvalZone> zones;
  for (const analytics::DuvalZone& z : analytics::duval_triangle1_zones()) {
    DuvalZone d{z.code, {}};
    for (const auto& v : z.vertices) d.vertices.push_back({v.ch4, v.c2h4, v.c2h2});
    zones.push_back(std::move(d));
  }
  return zones;
}

Point duval_to_cartesian(const DuvalPercent& pct) {
  const double total = pct[0] + pct[1] + pct[2];
  if (!(total > 0)) return {0, 0};
  // Conventional orientation of the published method: 100 % CH4 at the top
  // vertex, 100 % C2H4 bottom right, 100 % C2H2 bottom left.
  const double ch4 = pct[0] / total, c2h4 = pct[1] / total;
  return {c2h4 + ch4 / 2, kSqrt3Half * ch4};
}

Point polygon_centroid(const std::vector<Point>& poly) {
  double a = 0, cx = 0, cy = 0;
  for (size_t i = 0; i < poly.size(); ++i) {
    const Point& p = poly[i];
    const Point& q = poly[(i + 1) % poly.size()];
    const double cross = p.x * q.y - q.x * p.y;
    a += cross;
    cx += (p.x + q.x) * cross;
    cy += (p.y + q.y) * cross;
  }
  if (std::fabs(a) < 1e-12) {
    Point m;
    for (const auto& p : poly) m = {m.x + p.x / poly.size(), m.y + p.y / poly.size()};
    return m;
  }
  return {cx / (3 * a), cy / (3 * a)};
}

DuvalPercent duval_label_anchor(const DuvalZone& zone) {
  // DT is a bent strip whose centroid lies in T2; PD is too small for text
  // (its label goes beside the corner, see draw_duval_triangle).
  if (zone.code == "DT") return {60, 32, 8};
  if (zone.code == "PD") return {100, 0, 0};
  std::vector<Point> pts;
  for (const auto& v : zone.vertices) pts.push_back(duval_to_cartesian(v));
  const Point c = polygon_centroid(pts);
  // Back from Cartesian to percentages.
  const double ch4 = c.y / kSqrt3Half;
  const double c2h4 = c.x - ch4 / 2;
  return {100 * ch4, 100 * c2h4, 100 * (1 - ch4 - c2h4)};
}

void draw_duval_triangle(HPDF_Page page, const PdfDocument& doc, const Box& box,
                         const std::vector<DuvalZone>& zones,
                         const std::vector<analytics::DuvalPoint>& samples) {
  FontRef regular = doc.font(FontFace::regular);
  FontRef bold = doc.font(FontFace::bold);
  // Side length: fit the width (minus corner labels) and the height.
  const double side = std::min(box.w - 40, (box.h - 30) / kSqrt3Half);
  const double ox = box.x + (box.w - side) / 2;
  const double oy = box.y + 14;
  auto to_page = [&](const DuvalPercent& pct) {
    const Point p = duval_to_cartesian(pct);
    return Point{ox + p.x * side, oy + p.y * side};
  };

  for (const auto& z : zones) {
    if (z.vertices.size() < 3) continue;
    set_fill(page, zone_fill(z.code));
    set_stroke(page, palette::white);
    set_dash(page, Dash::solid);
    HPDF_Page_SetLineWidth(page, 0.9f);
    const Point first = to_page(z.vertices.front());
    HPDF_Page_MoveTo(page, r(first.x), r(first.y));
    for (size_t i = 1; i < z.vertices.size(); ++i) {
      const Point p = to_page(z.vertices[i]);
      HPDF_Page_LineTo(page, r(p.x), r(p.y));
    }
    HPDF_Page_ClosePath(page);
    HPDF_Page_FillStroke(page);
  }
  // Outline and corner names.
  const Point a = to_page({100, 0, 0}), b = to_page({0, 100, 0}), c = to_page({0, 0, 100});
  set_stroke(page, palette::muted);
  HPDF_Page_SetLineWidth(page, 0.7f);
  HPDF_Page_MoveTo(page, r(a.x), r(a.y));
  HPDF_Page_LineTo(page, r(b.x), r(b.y));
  HPDF_Page_LineTo(page, r(c.x), r(c.y));
  HPDF_Page_ClosePath(page);
  HPDF_Page_Stroke(page);
  // Corner names: CH4 above the top vertex, the others below the base.
  draw_text(page, regular, 6.6, a.x, a.y + 5, "100 % CH₄", palette::muted, Align::center);
  draw_text(page, regular, 6.6, b.x, b.y - 10, "100 % C₂H₄", palette::muted, Align::center);
  draw_text(page, regular, 6.6, c.x, c.y - 10, "100 % C₂H₂", palette::muted, Align::center);

  for (const auto& z : zones) {
    const Point p = to_page(duval_label_anchor(z));
    if (z.code == "PD") {
      draw_line(page, p.x + 1, p.y - 1, p.x + 14, p.y - 1, palette::muted, 0.5);
      draw_text(page, bold, 7, p.x + 16, p.y - 3.5, "PD", palette::ink);
      continue;
    }
    double top_c2h2 = 0;
    for (const auto& v : z.vertices) top_c2h2 = std::max(top_c2h2, v[2]);
    if (top_c2h2 * side / 100 < 12) {
      // A strip along the right edge (C2H2 near 0) too thin for text:
      // label to the right of the edge, level with the zone's middle.
      const auto anchor = duval_label_anchor(z);
      const Point e = to_page({anchor[0], 100 - anchor[0], 0});
      draw_line(page, e.x, e.y, e.x + 4, e.y, palette::muted, 0.5);
      draw_text(page, bold, 7, e.x + 6, e.y - 2.5, z.code, palette::ink);
      continue;
    }
    draw_text(page, bold, 7.5, p.x, p.y - 2.5, z.code, palette::ink, Align::center);
  }

  // Samples: rings joined in date order, the latest filled and dated.
  std::vector<Point> pts;
  for (const auto& s : samples) pts.push_back(to_page({s.pct_ch4, s.pct_c2h4, s.pct_c2h2}));
  for (size_t i = 1; i < pts.size(); ++i)
    draw_line(page, pts[i - 1].x, pts[i - 1].y, pts[i].x, pts[i].y, palette::ink, 0.5, Dash::dotted);
  for (size_t i = 0; i + 1 < pts.size(); ++i) draw_marker(page, Marker::ring, pts[i].x, pts[i].y, 4, palette::ink);
  if (!pts.empty()) {
    const Point& p = pts.back();
    draw_marker(page, Marker::circle, p.x, p.y, 6, palette::accent);
    HPDF_Page_SetLineWidth(page, 0.8f);
    set_stroke(page, palette::ink);
    HPDF_Page_Circle(page, r(p.x), r(p.y), 3.4f);
    HPDF_Page_Stroke(page);
    const std::string label = analytics::format_day(samples.back().date);
    const double w = text_width(page, regular, 6.4, label);
    const double lx = std::min(p.x + 6, box.x + box.w - w);
    fill_rect(page, lx - 1, p.y + 3, w + 2, 7.5, palette::white);
    draw_text(page, regular, 6.4, lx, p.y + 4.5, label, palette::ink);
  }
}

}  // namespace ferrum::report
