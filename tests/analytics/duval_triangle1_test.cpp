#include "analytics/duval_triangle1.h"

#include <gtest/gtest.h>

#include <cmath>
#include <random>

namespace ferrum::analytics {
namespace {

// Source of every check in this file: Duval Triangle 1 zone vertices as
// tabulated by Akbari, Setayeshmehr, Borsi, Gockenbach, "Software
// Implementation of the Duval Triangle", Table II (the same polygons as IEEE
// C57.104-2019 Annex, from memory); the check points are computed from those
// boundaries.
// Independent reference: the zone inequalities of those vertices, written as
// plain comparisons.
std::string reference_zone(const TrianglePercent& p) {
  if (p.ch4 >= 98) return "PD";
  if (p.c2h2 < 4 && p.c2h4 < 20) return "T1";
  if (p.c2h2 < 4 && p.c2h4 >= 20 && p.c2h4 < 50) return "T2";
  if (p.c2h4 >= 50 && p.c2h2 < 15) return "T3";
  if (p.c2h4 < 23 && p.c2h2 > 13) return "D1";
  if (p.c2h2 > 13 && p.c2h4 >= 23 && p.c2h4 < 40) return "D2";
  if (p.c2h2 > 29 && p.c2h4 >= 40) return "D2";
  return "DT";
}

TrianglePercent from_c2h4_c2h2(double c2h4, double c2h2) { return {100 - c2h4 - c2h2, c2h4, c2h2}; }

// Check values computed from the published boundaries (Akbari et al., Table II).
TEST(DuvalTriangle1, CheckValuesFromDomainTable) {
  struct Case { double ch4, c2h4, c2h2; const char* zone; };
  const Case cases[] = {
      {45, 90, 15, "T3"}, {100, 10, 1, "T1"}, {300, 150, 2, "T2"}, {50, 30, 10, "DT"},
      {10, 5, 20, "D1"},  {20, 30, 50, "D2"}, {980, 10, 10, "PD"},
      // Akbari et al., Table II: 180/280/5 ppm is T3 (C2H4 ≥ 50 %), although one web FAQ puts it in T2.
      {180, 280, 5, "T3"},
  };
  for (const Case& c : cases) {
    SCOPED_TRACE(c.zone);
    auto r = duval_triangle1(c.ch4, c.c2h4, c.c2h2);
    ASSERT_TRUE(r.applicable);
    EXPECT_EQ(r.zone, c.zone);
  }
  auto r = duval_triangle1(45, 90, 15);
  EXPECT_NEAR(r.percent->ch4, 30, 1e-9);
  EXPECT_NEAR(r.percent->c2h4, 60, 1e-9);
  EXPECT_NEAR(r.percent->c2h2, 10, 1e-9);
}

TEST(DuvalTriangle1, PlotPointIsBarycentricProjection) {
  // Barycentric projection in the conventional orientation of Duval Triangle 1
  // (100 % CH4 at the top vertex; geometry, computed): x = C2H4 + CH4/2, y = (√3/2)·CH4.
  auto corner = [](double a, double b, double c) { return duval_triangle_plot_point({a, b, c}); };
  EXPECT_NEAR(corner(100, 0, 0).x, 0.5, 1e-12);
  EXPECT_NEAR(corner(100, 0, 0).y, std::sqrt(3.0) / 2, 1e-12);
  EXPECT_NEAR(corner(0, 100, 0).x, 1, 1e-12);
  EXPECT_NEAR(corner(0, 0, 100).x, 0, 1e-12);
  EXPECT_NEAR(corner(0, 0, 100).y, 0, 1e-12);
  auto r = duval_triangle1(45, 90, 15);  // 30 / 60 / 10 %
  EXPECT_NEAR(r.plot->x, 0.75, 1e-12);
  EXPECT_NEAR(r.plot->y, std::sqrt(3.0) / 2 * 0.30, 1e-12);
}

TEST(DuvalTriangle1, EveryVertexFollowsThePublishedInequalities) {
  for (const DuvalZone& z : duval_triangle1_zones())
    for (const TrianglePercent& v : z.vertices) {
      SCOPED_TRACE(::testing::Message() << z.code << " vertex " << v.ch4 << "/" << v.c2h4 << "/" << v.c2h2);
      EXPECT_NEAR(v.ch4 + v.c2h4 + v.c2h2, 100, 1e-9);  // vertices transcribed consistently
      EXPECT_TRUE(duval_zone_contains(z, v));
      EXPECT_EQ(duval_triangle1_zone(v), reference_zone(v));
    }
}

TEST(DuvalTriangle1, EveryEdgeAndBothSidesOfIt) {
  const double eps = 1e-6;
  for (const DuvalZone& z : duval_triangle1_zones()) {
    const auto& vs = z.vertices;
    for (std::size_t i = 0; i < vs.size(); ++i) {
      const TrianglePercent& a = vs[i];
      const TrianglePercent& b = vs[(i + 1) % vs.size()];
      for (double t : {0.25, 0.5, 0.75}) {
        const double e = a.c2h4 + t * (b.c2h4 - a.c2h4), c = a.c2h2 + t * (b.c2h2 - a.c2h2);
        const TrianglePercent on = from_c2h4_c2h2(e, c);
        SCOPED_TRACE(::testing::Message() << z.code << " edge point " << on.ch4 << "/" << e << "/" << c);
        EXPECT_EQ(duval_triangle1_zone(on), reference_zone(on));
        // Step off the edge on both sides (normal in the C2H4/C2H2 plane).
        const double dx = b.c2h4 - a.c2h4, dy = b.c2h2 - a.c2h2, len = std::hypot(dx, dy);
        for (double side : {-1.0, 1.0}) {
          const TrianglePercent off = from_c2h4_c2h2(e - side * eps * dy / len, c + side * eps * dx / len);
          if (off.ch4 < 0 || off.c2h4 < 0 || off.c2h2 < 0) continue;  // outside the triangle
          EXPECT_EQ(duval_triangle1_zone(off), reference_zone(off));
        }
      }
    }
  }
}

TEST(DuvalTriangle1, NamedBoundariesEachSide) {
  // Zone inequalities of Akbari et al., Table II, one step either side of every threshold.
  EXPECT_EQ(duval_triangle1_zone({98, 1, 1}), "PD");
  EXPECT_EQ(duval_triangle1_zone({97.9, 1.1, 1}), "T1");
  EXPECT_EQ(duval_triangle1_zone({79.9, 19.9, 0.2}), "T1");
  EXPECT_EQ(duval_triangle1_zone({79.8, 20, 0.2}), "T2");
  EXPECT_EQ(duval_triangle1_zone({50.1, 49.9, 0}), "T2");
  EXPECT_EQ(duval_triangle1_zone({50, 50, 0}), "T3");
  EXPECT_EQ(duval_triangle1_zone({60, 36.1, 3.9}), "T2");
  EXPECT_EQ(duval_triangle1_zone({60, 36, 4}), "DT");
  EXPECT_EQ(duval_triangle1_zone({20, 65.1, 14.9}), "T3");
  EXPECT_EQ(duval_triangle1_zone({20, 65, 15}), "DT");
  EXPECT_EQ(duval_triangle1_zone({77, 10, 13}), "DT");
  EXPECT_EQ(duval_triangle1_zone({76.9, 10, 13.1}), "D1");
  EXPECT_EQ(duval_triangle1_zone({56.9, 22.9, 20.2}), "D1");
  EXPECT_EQ(duval_triangle1_zone({56.8, 23, 20.2}), "D2");
  EXPECT_EQ(duval_triangle1_zone({30.1, 39.9, 30}), "D2");
  EXPECT_EQ(duval_triangle1_zone({35, 40, 25}), "DT");
  EXPECT_EQ(duval_triangle1_zone({10, 61, 29}), "DT");
  EXPECT_EQ(duval_triangle1_zone({10, 60.9, 29.1}), "D2");
}

TEST(DuvalTriangle1, RandomPointsFallInExactlyOneZone) {
  std::mt19937_64 rng(20240611);  // fixed seed
  std::uniform_real_distribution<double> u(0.0, 1.0);
  for (int i = 0; i < 100000; ++i) {
    double a = u(rng), b = u(rng);
    if (a + b > 1) { a = 1 - a; b = 1 - b; }  // uniform in the triangle
    const TrianglePercent p = from_c2h4_c2h2(100 * a, 100 * b);
    int containing = 0;
    std::string which;
    for (const DuvalZone& z : duval_triangle1_zones())
      if (duval_zone_contains(z, p)) { ++containing; which = z.code; }
    ASSERT_EQ(containing, 1) << p.ch4 << "/" << p.c2h4 << "/" << p.c2h2;
    ASSERT_EQ(duval_triangle1_zone(p), which);
    ASSERT_EQ(which, reference_zone(p));
  }
}

TEST(DuvalTriangle1, OutsideValidity) {
  EXPECT_FALSE(duval_triangle1(0, 0, 0).applicable);
  EXPECT_FALSE(duval_triangle1(std::nullopt, 5, 5).applicable);
  EXPECT_FALSE(duval_triangle1(-1, 5, 5).applicable);
  EXPECT_FALSE(duval_triangle1(0, 0, 0).why_not.empty());
}

}  // namespace
}  // namespace ferrum::analytics
