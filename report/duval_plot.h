// Drawing of Duval Triangle 1 (mineral oil, transformer main tank) with the
// unit's recent samples.
//
// Zone polygons: published vertices of Triangle 1 as (%CH4, %C2H4, %C2H2),
// from Akbari, Setayeshmehr, Borsi, Gockenbach, "Software implementation of
// the Duval Triangle", Table II, read from the analytics' table
// (analytics/data/duval_triangle1.csv). Zone codes are
// the method's own: PD T1 T2 T3 D1 D2 DT. The zone of each sample comes from
// the assessment; this file only plots.
//
// Projection (side length 1, fractions): x = C2H4 + C2H2/2, y = (√3/2)·C2H2,
// so 100 % CH4 is the bottom-left corner, 100 % C2H4 the bottom-right and
// 100 % C2H2 the top.
#pragma once

#include <array>
#include <string>
#include <vector>

#include "analytics/assessment.h"
#include "report/chart_scale.h"
#include "report/pdf_document.h"

namespace ferrum::report {

// Gas shares in percent: CH4, C2H4, C2H2.
using DuvalPercent = std::array<double, 3>;

struct DuvalZone {
  std::string code;
  std::vector<DuvalPercent> vertices;
};

// The zones of analytics::duval_triangle1_zones() (the tables in force).
std::vector<DuvalZone> duval_triangle1_zones();

// Point in the unit triangle for percentages that need not sum to 100
// (they are normalised first). Zero total gives the CH4 corner.
Point duval_to_cartesian(const DuvalPercent& pct);

// Area-weighted centroid of a simple polygon (shoelace formula).
Point polygon_centroid(const std::vector<Point>& polygon);

// Where the zone code is printed, in percentages (the centroid, except for
// zones whose centroid falls outside them or that are too small to hold text).
DuvalPercent duval_label_anchor(const DuvalZone& zone);

// Draws the triangle filling the width of `box` (box.y is the bottom), zones
// from `zones`, and `samples` (oldest first) as markers joined in date order;
// the latest is emphasised and dated.
void draw_duval_triangle(HPDF_Page page, const PdfDocument& doc, const Box& box,
                         const std::vector<DuvalZone>& zones,
                         const std::vector<analytics::DuvalPoint>& samples);

}  // namespace ferrum::report
