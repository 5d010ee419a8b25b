#include "analytics/ageing_rate.h"

#include <cmath>

namespace ferrum::analytics {

double iec_ageing_rate_kraft(double hot_spot_c) { return std::exp2((hot_spot_c - 98.0) / 6.0); }

double ageing_acceleration_factor(double hot_spot_c) {
  return std::exp(15000.0 / 383.0 - 15000.0 / (hot_spot_c + 273.0));
}

double ageing_rate(PaperType paper, double hot_spot_c) {
  return paper == PaperType::kraft ? iec_ageing_rate_kraft(hot_spot_c) : ageing_acceleration_factor(hot_spot_c);
}

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
