#include "analytics/electrical/excitation_current.h"

#include <algorithm>
#include <cmath>

namespace ferrum::analytics::electrical {

ExcitationPattern check_excitation_pattern(double a_ma, double b_ma, double c_ma) {
  ExcitationPattern p;
  p.outer_difference_pct = std::fabs(a_ma - c_ma) / std::max(a_ma, c_ma) * 100.0;
  p.outer_similar = p.outer_difference_pct <= kOuterPhasesSimilarPct;
  p.middle_lowest = b_ma < a_ma && b_ma < c_ma;
  p.expected = p.outer_similar && p.middle_lowest;
  return p;
}

std::optional<double> excitation_change_pct(double now_ma, double before_ma) {
  if (before_ma <= 0) return std::nullopt;
  return (now_ma - before_ma) / before_ma * 100.0;
}

}  // namespace ferrum::analytics::electrical
