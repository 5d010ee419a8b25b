// The health-index graphic of the unit report: a horizontal ruler 0–100 cut
// into the five condition bands, band names underneath, a filled marker at
// the unit's index and a hollow one at the previous report's index.
//
// Band limits: HI → condition table of Jahromi et al., "An approach to power
// transformer asset management using health index", IEEE Electrical
// Insulation Magazine 25(2), 2009 (from
// memory; verify): 0–30 very poor, 30–50 poor, 50–70 fair, 70–85 good, 85–100 very
// good. The ruler only draws them; the band itself comes from the assessment.
#pragma once

#include <optional>
#include <string>
#include <vector>

#include "report/chart_scale.h"
#include "report/pdf_document.h"

namespace ferrum::report {

struct BandSegment {
  double from = 0, to = 0;
  std::string name;
};

const std::vector<BandSegment>& health_index_bands();

// Height the ruler needs for a given width (markers, labels, band names).
double health_ruler_height();

// Draws the ruler in `box` (box.y is the bottom). Absent `hi`: the ruler is
// drawn without a marker and says "no index".
void draw_health_ruler(HPDF_Page page, const PdfDocument& doc, const Box& box, std::optional<double> hi,
                       std::optional<double> previous_hi);

}  // namespace ferrum::report
