// Duval Triangle 1 for mineral-oil transformers: fault zone from the relative
// proportions of CH4, C2H4 and C2H2.
//
// Source: M. Duval; zone vertices as tabulated by Akbari, Setayeshmehr, Borsi,
// Gockenbach, "Software Implementation of the Duval Triangle", Table II
// (checked against the published table; data in analytics/data/duval_triangle1.csv).
//
// Inputs: CH4, C2H4, C2H2 in µL/L (ppm); below-detection-limit gases count as 0.
// Output: %CH4, %C2H4, %C2H2 of their sum, the Cartesian plotting point
// (side length 1) and the zone PD, T1, T2, T3, D1, D2 or DT.
// Classification is point-in-polygon on the published vertices. A point on a
// shared boundary goes to the zone whose published limit includes it
// (PD: CH4 ≥ 98 %; T2: C2H4 ≥ 20 %; T3: C2H4 ≥ 50 %; D1/D2: C2H2 > 13 %;
// D2: C2H4 ≥ 23 %, C2H2 > 29 % above C2H4 40 %; T1/T2: C2H2 < 4 %;
// T3: C2H2 < 15 %; everything else DT).
// Validity: Triangle 1 only (mineral oil, main tank); classifies a fault,
// it does not detect one: apply only when gases are above typical levels or
// rising (see dga_fault_evidence.h). Never reuse these zones for Triangles 2–7.
#pragma once

#include <optional>
#include <string>
#include <vector>

namespace ferrum::analytics {

// A point of the triangle in percent of CH4 + C2H4 + C2H2 (sums to 100).
struct TrianglePercent {
  double ch4 = 0, c2h4 = 0, c2h2 = 0;
};

// Plot coordinates for a triangle of side 1 in the method's conventional
// orientation, by the barycentric projection x = C2H4 + CH4/2, y = (√3/2)·CH4
// with fractions: (0.5, √3/2) = 100 % CH4 (top), (1,0) = 100 % C2H4,
// (0,0) = 100 % C2H2.
struct PlotPoint {
  double x = 0, y = 0;
};
PlotPoint duval_triangle_plot_point(const TrianglePercent& p);

struct DuvalZone {
  std::string code;                       // "PD", "T1", ...
  std::string name;                       // "partial discharges", ...
  std::vector<TrianglePercent> vertices;  // published vertices, in order
};

// The seven zone polygons of the tables in force (standard_tables.h), for
// drawing and for classification; DT (the remainder) last.
const std::vector<DuvalZone>& duval_triangle1_zones();

// Closed containment (edges and vertices included) of a point in a zone.
bool duval_zone_contains(const DuvalZone& zone, const TrianglePercent& p);

// Zone code for a point given in percent. REQUIRES: components ≥ 0 summing to
// 100 (within rounding).
std::string duval_triangle1_zone(const TrianglePercent& p);

struct DuvalTriangleResult {
  bool applicable = false;
  std::string why_not;
  std::optional<TrianglePercent> percent;
  std::optional<PlotPoint> plot;
  std::string zone;       // zone code, empty when not applicable
  std::string zone_name;  // plain words
  std::string method = "Duval Triangle 1";
  std::string source = "Duval Triangle 1 zone vertices (Akbari et al., Table II; IEC 60599 / IEEE C57.104-2019 annex)";
};

// Locates a sample's point. Not applicable when any of the three gases is
// missing or negative, or when their sum is zero.
DuvalTriangleResult duval_triangle1(std::optional<double> ch4_ppm, std::optional<double> c2h4_ppm,
                                    std::optional<double> c2h2_ppm);

}  // namespace ferrum::analytics
