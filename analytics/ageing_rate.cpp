#include "analytics/ageing_rate.h"

#include <cmath>

namespace ferrum::analytics {

std::string ageing_rate_source(PaperType paper) {
  return paper == PaperType::kraft
             ? "relative ageing rate V = 2^((θh − 98)/6), non-upgraded paper (IEC 60076-7:2005 §6.2)"
             : "ageing acceleration factor F_AA = exp(15000/383 − 15000/(θh + 273)), thermally upgraded "
               "paper (IEEE C57.91-2011 clause 5; IEC 60076-7:2005 §6.2)";
}

AgeingSummary summarise_ageing(double period_h, double loss_of_life_h, double normal_life_h) {
  AgeingSummary s;
  s.period_h = period_h;
  s.loss_of_life_h = loss_of_life_h;
  s.normal_life_h = normal_life_h;
  s.equivalent_factor = period_h > 0 ? loss_of_life_h / period_h : 0;
  s.loss_of_life_pct = normal_life_h > 0 ? 100.0 * loss_of_life_h / normal_life_h : 0;
  return s;
}

}  // namespace ferrum::analytics
