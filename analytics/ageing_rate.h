// Insulation ageing from hot-spot temperature.
//
// * IEC 60076-7:2005 §6.2 relative ageing rate V:
//   non-upgraded (kraft) paper V = 2^((θ_h − 98)/6)       (eq. 2)
//   thermally upgraded paper   V = exp(15000/383 − 15000/(θ_h + 273))  (eq. 3)
// * IEEE C57.91-2011 clause 5 ageing acceleration factor (65 °C-rise,
//   thermally upgraded insulation): F_AA = exp(15000/383 − 15000/(θ_H + 273)),
//   equivalent ageing F_EQA = Σ F_AA·Δt / Σ Δt, %LOL = F_EQA·t·100 / normal life.
// Equations from memory, checked against public reproductions. Normal
// insulation life default 180 000 h: IEEE C57.91-2011 Table 1, data in
// analytics/data/ieee_c57_91.csv (checked against a public reproduction).
//
// Inputs: θ_h hot-spot temperature in °C; durations in hours. Outputs
// dimensionless rates (1 = normal ageing at the reference temperature: 98 °C
// for kraft, 110 °C for upgraded paper) and hours.
// Validity: the relations are fitted for roughly 80..160 °C; outside that
// they are extrapolations.
#pragma once

#include <cmath>
#include <string>

#include "analytics/unit_data.h"

namespace ferrum::analytics {

// The three rates are inline: the thermal kernel evaluates one per step.
// IEC 60076-7 relative ageing rate, non-upgraded paper (1 at 98 °C).
inline double iec_ageing_rate_kraft(double hot_spot_c) { return std::exp2((hot_spot_c - 98.0) / 6.0); }
// IEC 60076-7 / IEEE C57.91 Arrhenius form for upgraded paper (1 at 110 °C).
// IEEE calls it F_AA.
inline double ageing_acceleration_factor(double hot_spot_c) {
  return std::exp(15000.0 / 383.0 - 15000.0 / (hot_spot_c + 273.0));
}
// The rate for the unit's paper type.
inline double ageing_rate(PaperType paper, double hot_spot_c) {
  return paper == PaperType::kraft ? iec_ageing_rate_kraft(hot_spot_c) : ageing_acceleration_factor(hot_spot_c);
}
// Mean rate over a span in which the hot-spot goes linearly from θ0 to θ1,
// given the rates v0, v1 at the ends: the logarithmic mean
// (v1 − v0)/ln(v1/v0). For kraft paper ln V is linear in θ, so this is the
// exact integral of IEC 60076-7 eq. 2 over a linear ramp; for upgraded paper
// ln V = 15000/383 − 15000/(θ + 273) is nearly linear over a few kelvin
// (0.5 % off over 10 K, tested).
// ln(v1/v0) comes from the temperatures, so no logarithm is evaluated.
// ferrum's integration rule (no published source; the thermal kernel uses it
// between nodes at most the standard's largest step apart).
inline double mean_ageing_rate(PaperType paper, double theta0, double v0, double theta1, double v1) {
  const double ln_ratio = paper == PaperType::kraft
                              ? (theta1 - theta0) * (0.69314718055994531 / 6.0)
                              : 15000.0 * (theta1 - theta0) / ((theta0 + 273.0) * (theta1 + 273.0));
  if (std::abs(ln_ratio) < 1e-6) return 0.5 * (v0 + v1);  // the two means agree to 1e-13 here
  return (v1 - v0) / ln_ratio;
}
// Normal insulation life (hours) of IEEE C57.91 Table 1 in the tables in force.
double c57_91_normal_life_hours();

// Name and source of the rate used for a paper type.
std::string ageing_rate_source(PaperType paper);

// Equivalent ageing over a period from accumulated ageing.
struct AgeingSummary {
  double period_h = 0;            // Σ Δt
  double loss_of_life_h = 0;      // Σ V·Δt, equivalent hours at the reference temperature
  double equivalent_factor = 0;   // F_EQA = loss_of_life_h / period_h (0 when period is 0)
  double loss_of_life_pct = 0;    // 100·loss_of_life_h / normal_life_h
  double normal_life_h = 0;
};

// REQUIRES: normal_life_h > 0.
AgeingSummary summarise_ageing(double period_h, double loss_of_life_h, double normal_life_h);

}  // namespace ferrum::analytics
