#include "report/duval_plot.h"

#include <gtest/gtest.h>

#include <cmath>

namespace ferrum::report {
namespace {

// Area of a polygon in the unit triangle (shoelace).
double area(const DuvalZone& z) {
  double a = 0;
  for (size_t i = 0; i < z.vertices.size(); ++i) {
    const Point p = duval_to_cartesian(z.vertices[i]);
    const Point q = duval_to_cartesian(z.vertices[(i + 1) % z.vertices.size()]);
    a += p.x * q.y - q.x * p.y;
  }
  return std::fabs(a) / 2;
}

// Point-in-polygon by ray casting, for the label checks.
bool inside(const DuvalZone& z, const DuvalPercent& pct) {
  const Point p = duval_to_cartesian(pct);
  bool in = false;
  for (size_t i = 0, j = z.vertices.size() - 1; i < z.vertices.size(); j = i++) {
    const Point a = duval_to_cartesian(z.vertices[i]), b = duval_to_cartesian(z.vertices[j]);
    if ((a.y > p.y) != (b.y > p.y) && p.x < (b.x - a.x) * (p.y - a.y) / (b.y - a.y) + a.x) in = !in;
  }
  return in;
}

DuvalZone zone(const std::string& code) {  // by value: the zones are built from the tables in force
  for (const auto& z : duval_triangle1_zones())
    if (z.code == code) return z;
  throw std::runtime_error("no zone " + code);
}

TEST(DuvalPlot, ProjectionOfCorners) {
  // Conventional orientation of Duval Triangle 1 (IEC 60599:2015, Annex B figure):
  // 100 % CH4 at the top vertex. x = C2H4 + CH4/2, y = (√3/2)·CH4 with fractions [geometry].
  EXPECT_NEAR(duval_to_cartesian({100, 0, 0}).y, std::sqrt(3.0) / 2, 1e-12);
  EXPECT_DOUBLE_EQ(duval_to_cartesian({100, 0, 0}).x, 0.5);
  const Point ch4 = duval_to_cartesian({100, 0, 0});
  const Point c2h4 = duval_to_cartesian({0, 100, 0});
  const Point c2h2 = duval_to_cartesian({0, 0, 100});
  EXPECT_GT(ch4.y, c2h4.y);  // CH4 on top
  EXPECT_DOUBLE_EQ(c2h4.x, 1);
  EXPECT_DOUBLE_EQ(c2h4.y, 0);
  EXPECT_DOUBLE_EQ(c2h2.x, 0);
  EXPECT_DOUBLE_EQ(c2h2.y, 0);
  // Unnormalised ppm give the same point as their percentages (45/90/15 ppm = 30/60/10 %).
  const Point a = duval_to_cartesian({45, 90, 15}), b = duval_to_cartesian({30, 60, 10});
  EXPECT_NEAR(a.x, b.x, 1e-12);
  EXPECT_NEAR(a.y, b.y, 1e-12);
  const Point zero = duval_to_cartesian({0, 0, 0});
  EXPECT_EQ(zero.x, 0);
}

TEST(DuvalPlot, ZonesTileTheTriangle) {
  // The seven published polygons (Akbari et al., Table II) cover the triangle
  // without overlap: their areas add up to the whole (√3/4 for side 1).
  double total = 0;
  for (const auto& z : duval_triangle1_zones()) total += area(z);
  EXPECT_NEAR(total, std::sqrt(3.0) / 4, 1e-9);
  EXPECT_EQ(duval_triangle1_zones().size(), 7u);
}

TEST(DuvalPlot, CheckPointsFallInTheirPublishedZones) {
  // Check points computed from the published zone boundaries (Akbari et al., Table II).
  EXPECT_TRUE(inside(zone("T3"), {30, 60, 10}));
  EXPECT_TRUE(inside(zone("T1"), {90.1, 9.0, 0.9}));
  EXPECT_TRUE(inside(zone("T2"), {66.4, 33.2, 0.4}));
  EXPECT_TRUE(inside(zone("DT"), {55.6, 33.3, 11.1}));
  EXPECT_TRUE(inside(zone("D1"), {28.6, 14.3, 57.1}));
  EXPECT_TRUE(inside(zone("D2"), {20, 30, 50}));
  EXPECT_TRUE(inside(zone("PD"), {98.6, 0.7, 0.7}));
}

TEST(DuvalPlot, LabelAnchorsLieInsideTheirZones) {
  for (const auto& z : duval_triangle1_zones()) {
    if (z.code == "PD") continue;  // labelled outside with a leader line
    EXPECT_TRUE(inside(z, duval_label_anchor(z))) << z.code;
  }
}

TEST(PolygonCentroid, Square) {
  const Point c = polygon_centroid({{0, 0}, {2, 0}, {2, 2}, {0, 2}});
  EXPECT_DOUBLE_EQ(c.x, 1);
  EXPECT_DOUBLE_EQ(c.y, 1);
}

}  // namespace
}  // namespace ferrum::report
