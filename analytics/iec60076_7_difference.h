// Top-oil and hot-spot temperature by the difference-equation method of
// IEC 60076-7:2005 clause 8.2 (Annex C form), plus the closed-form steady
// state and the exponential response to a load step of the same clause.
//
// Source: IEC 60076-7:2005 "Loading guide for oil-immersed power
// transformers", §8.2.3 (difference equations) and §8.2.2 (exponential
// functions). Equations written from memory (medium-high
// confidence).
//
// Inputs: K load factor (per unit of rated current ≈ rated power), θ_a
// ambient temperature °C, Dt time step in minutes. Outputs in °C and K.
// Validity: 0 <= K <= ~2 (the loading guide's emergency range); the standard
// asks for Dt <= half of the smallest time constant, which iec_max_step_min()
// gives and which callers sub-step to.
#pragma once

#include "analytics/iec60076_7_characteristics.h"

namespace ferrum::analytics {

// State of the difference equations between steps.
struct IecThermalState {
  double top_oil_c = 0;  // θ_o
  double dh1_k = 0;      // Δθ_h1, first hot-spot rise term
  double dh2_k = 0;      // Δθ_h2, second (oil-flow) term
  double hot_spot_c() const { return top_oil_c + dh1_k - dh2_k; }
};

// Ultimate (steady-state) top-oil rise over ambient at load K, K:
// Δθ_or·((1 + K²R)/(1 + R))^x.
double iec_steady_top_oil_rise(const IecThermalParameters& p, double k);
// Ultimate hot-spot to top-oil gradient, K: Δθ_hr·K^y.
double iec_steady_hot_spot_gradient(const IecThermalParameters& p, double k);

// Steady state at constant K and θ_a: the standard's recommended start.
IecThermalState iec_steady_state(const IecThermalParameters& p, double k, double ambient_c);

// Largest step the standard allows: half of the smallest of k11·τ_o,
// k22·τ_w and τ_o/k22, in minutes.
double iec_max_step_min(const IecThermalParameters& p);

// Advances the state by one step of dt_min at load k and ambient θ_a
// (the values of step n). REQUIRES: 0 < dt_min <= iec_max_step_min(p).
void iec_step(const IecThermalParameters& p, double k, double ambient_c, double dt_min, IecThermalState& s);

// The load-dependent terms of a step, computed once per load value so that
// sub-steps at the same load need no pow().
struct IecStepTargets {
  double top_oil_rise_k = 0;  // iec_steady_top_oil_rise(p, k)
  double gradient_k = 0;      // iec_steady_hot_spot_gradient(p, k)
};
IecStepTargets iec_step_targets(const IecThermalParameters& p, double k);
void iec_step(const IecThermalParameters& p, const IecStepTargets& targets, double ambient_c, double dt_min,
              IecThermalState& s);

// The step-length terms of a step: Dt/(k11·τ_o), Dt/(k22·τ_w), Dt/(τ_o/k22),
// computed once per step length so that a run of equal steps needs no
// division.
struct IecStepFactors {
  double top_oil = 0;
  double dh1 = 0;
  double dh2 = 0;
};
IecStepFactors iec_step_factors(const IecThermalParameters& p, double dt_min);
// One step with both kinds of terms given: the difference equations proper
// (inline: the thermal kernel runs it once per sub-step).
inline void iec_step(const IecThermalParameters& p, const IecStepTargets& t, const IecStepFactors& f,
                     double ambient_c, IecThermalState& s) {
  const double g = t.gradient_k;
  s.top_oil_c += f.top_oil * (t.top_oil_rise_k - (s.top_oil_c - ambient_c));
  s.dh1_k += f.dh1 * (p.k21 * g - s.dh1_k);
  s.dh2_k += f.dh2 * ((p.k21 - 1) * g - s.dh2_k);
}

// n equal steps in one go. At constant load and ambient each equation moves
// its quantity toward a fixed target, x' − T = (1 − factor)·(x − T), so n
// steps multiply the distance by (1 − factor)^n: the same numbers as n calls
// of iec_step (tested), at the cost of one.
struct IecStepDecay {
  double top_oil = 1;  // (1 − Dt/(k11·τ_o))^n
  double dh1 = 1;
  double dh2 = 1;
};
IecStepDecay iec_step_decay(const IecStepFactors& factors, int n);
inline void iec_steps(const IecThermalParameters& p, const IecStepTargets& t, const IecStepDecay& d,
                      double ambient_c, IecThermalState& s) {
  const double top_target = ambient_c + t.top_oil_rise_k;
  const double dh1_target = p.k21 * t.gradient_k, dh2_target = (p.k21 - 1) * t.gradient_k;
  s.top_oil_c = top_target + (s.top_oil_c - top_target) * d.top_oil;
  s.dh1_k = dh1_target + (s.dh1_k - dh1_target) * d.dh1;
  s.dh2_k = dh2_target + (s.dh2_k - dh2_target) * d.dh2;
}

// Hot-spot response function f2(t) of §8.2.2 for a load increase:
// k21·(1 − e^(−t/(k22·τ_w))) − (k21 − 1)·(1 − e^(−t/(τ_o/k22))).
double iec_hot_spot_step_response(const IecThermalParameters& p, double t_min);
// Top-oil response f1(t) = 1 − e^(−t/(k11·τ_o)).
double iec_top_oil_step_response(const IecThermalParameters& p, double t_min);

}  // namespace ferrum::analytics
