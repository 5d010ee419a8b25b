// Builds oil samples for the DGA tests. Gas values in ppm; a negative value
// means "below the detection limit" (limit = -value), NaN means not analysed.
#pragma once

#include <cmath>
#include <limits>

#include "analytics/unit_data.h"

namespace ferrum::analytics::testing {

inline constexpr double kNotAnalysed = std::numeric_limits<double>::quiet_NaN();

inline LabValue lab(double v) {
  if (std::isnan(v)) return {};
  if (v < 0) return LabValue::below(-v);
  return LabValue::measured(v);
}

struct Gases {
  double h2 = 0, ch4 = 0, c2h6 = 0, c2h4 = 0, c2h2 = 0, co = 0, co2 = 0;
};

inline OilSample gas_sample(Day date, const Gases& g) {
  OilSample s;
  s.date = date;
  s.h2 = lab(g.h2);
  s.ch4 = lab(g.ch4);
  s.c2h6 = lab(g.c2h6);
  s.c2h4 = lab(g.c2h4);
  s.c2h2 = lab(g.c2h2);
  s.co = lab(g.co);
  s.co2 = lab(g.co2);
  return s;
}

}  // namespace ferrum::analytics::testing
