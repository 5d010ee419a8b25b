#include "analytics/duval_triangle1.h"

#include <algorithm>
#include <cmath>

#include "analytics/standard_tables.h"

namespace ferrum::analytics {
namespace {

// Containment tolerance, in percentage points: points this close to an edge
// count as on it, so that rounding of the percentages cannot drop a boundary
// point out of every zone.
constexpr double kEdgeTolerance = 1e-9;

// Polygons are tested in the (C2H4, C2H2) plane: an affine image of the
// triangle, so containment is the same as in barycentric coordinates.
double cross(const TrianglePercent& a, const TrianglePercent& b, const TrianglePercent& p) {
  return (b.c2h4 - a.c2h4) * (p.c2h2 - a.c2h2) - (b.c2h2 - a.c2h2) * (p.c2h4 - a.c2h4);
}

bool on_segment(const TrianglePercent& a, const TrianglePercent& b, const TrianglePercent& p) {
  const double len = std::hypot(b.c2h4 - a.c2h4, b.c2h2 - a.c2h2);
  if (std::fabs(cross(a, b, p)) > kEdgeTolerance * std::max(len, 1.0)) return false;
  return p.c2h4 >= std::min(a.c2h4, b.c2h4) - kEdgeTolerance &&
         p.c2h4 <= std::max(a.c2h4, b.c2h4) + kEdgeTolerance &&
         p.c2h2 >= std::min(a.c2h2, b.c2h2) - kEdgeTolerance &&
         p.c2h2 <= std::max(a.c2h2, b.c2h2) + kEdgeTolerance;
}

// Closed containment: interior (even-odd crossing rule) or on an edge.
bool contains(const std::vector<TrianglePercent>& poly, const TrianglePercent& p) {
  bool inside = false;
  for (std::size_t i = 0, j = poly.size() - 1; i < poly.size(); j = i++) {
    const TrianglePercent &a = poly[j], &b = poly[i];
    if (on_segment(a, b, p)) return true;
    if ((a.c2h2 > p.c2h2) != (b.c2h2 > p.c2h2)) {
      const double x = a.c2h4 + (p.c2h2 - a.c2h2) * (b.c2h4 - a.c2h4) / (b.c2h2 - a.c2h2);
      if (p.c2h4 < x) inside = !inside;
    }
  }
  return inside;
}

// The published limits of each zone, with their strict / non-strict sides
// (Duval Triangle 1 as published). Used only to decide which zone owns a point lying on a
// boundary shared by several polygons: no single zone priority works,
// because e.g. T3 owns its C2H4 = 50 % edge against DT while DT owns the
// C2H2 = 15 % edge against T3.
bool owns_boundary_point(const std::string& code, const TrianglePercent& p) {
  if (code == "PD") return p.ch4 >= 98;
  if (code == "T1") return p.c2h4 < 20 && p.c2h2 < 4;
  if (code == "T2") return p.c2h4 >= 20 && p.c2h4 < 50 && p.c2h2 < 4;
  if (code == "T3") return p.c2h4 >= 50 && p.c2h2 < 15;
  if (code == "D1") return p.c2h4 < 23 && p.c2h2 > 13;
  if (code == "D2") return p.c2h2 > 13 && p.c2h4 >= 23 && (p.c2h4 < 40 || p.c2h2 > 29);
  return true;  // DT: everything the others leave
}

}  // namespace

PlotPoint duval_triangle_plot_point(const TrianglePercent& p) {
  return {(p.c2h4 + p.ch4 / 2) / 100.0, std::sqrt(3.0) / 2 * p.ch4 / 100.0};
}

bool duval_zone_contains(const DuvalZone& zone, const TrianglePercent& p) {
  return contains(zone.vertices, p);
}

const std::vector<DuvalZone>& duval_triangle1_zones() { return standard_tables().duval_zones; }

std::string duval_triangle1_zone(const TrianglePercent& p) {
  std::vector<const DuvalZone*> candidates;
  for (const DuvalZone& z : duval_triangle1_zones())
    if (contains(z.vertices, p)) candidates.push_back(&z);
  if (candidates.size() == 1) return candidates.front()->code;
  // On a shared boundary (or, by rounding, just outside every polygon).
  for (const DuvalZone* z : candidates)
    if (owns_boundary_point(z->code, p)) return z->code;
  for (const DuvalZone& z : duval_triangle1_zones())
    if (owns_boundary_point(z.code, p)) return z.code;
  return "DT";
}

DuvalTriangleResult duval_triangle1(std::optional<double> ch4, std::optional<double> c2h4,
                                    std::optional<double> c2h2) {
  DuvalTriangleResult r;
  if (!ch4 || !c2h4 || !c2h2) {
    r.why_not = "no diagnosis: CH4, C2H4 and C2H2 are all needed";
    return r;
  }
  if (*ch4 < 0 || *c2h4 < 0 || *c2h2 < 0 || !std::isfinite(*ch4 + *c2h4 + *c2h2)) {
    r.why_not = "no diagnosis: invalid gas values";
    return r;
  }
  const double sum = *ch4 + *c2h4 + *c2h2;
  if (sum <= 0) {
    r.why_not = "no diagnosis: CH4, C2H4 and C2H2 all below detection";
    return r;
  }
  TrianglePercent p{100 * *ch4 / sum, 100 * *c2h4 / sum, 100 * *c2h2 / sum};
  r.applicable = true;
  r.percent = p;
  r.plot = duval_triangle_plot_point(p);
  r.zone = duval_triangle1_zone(p);
  for (const DuvalZone& z : duval_triangle1_zones())
    if (z.code == r.zone) r.zone_name = z.name;
  return r;
}

}  // namespace ferrum::analytics
