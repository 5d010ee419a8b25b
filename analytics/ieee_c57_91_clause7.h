// Top-oil and hot-spot temperature by the exponential method of IEEE
// C57.91-2011 clause 7 ("top-oil rise / hot-spot rise" model).
//
// Source: IEEE Std C57.91-2011, clause 7.2, equations for the ultimate and
// transient top-oil rise and hot-spot gradient; exponents n/m by cooling
// mode from its Table 4 (all from memory).
//   Δθ_TO,U = Δθ_TO,R·[(K²R + 1)/(R + 1)]^n
//   Δθ_TO(t) = (Δθ_TO,U − Δθ_TO,i)(1 − e^(−t/τ_TO)) + Δθ_TO,i
//   Δθ_H,U  = Δθ_H,R·K^(2m), same response with τ_w
//   θ_H = θ_A + Δθ_TO + Δθ_H
// The load is held constant over each step, so the exponential is exact at
// any step length. Simplifications, stated: τ_TO is the rated value (the
// clause's correction of τ_TO for n ≠ 1 is not applied), and without the
// unit's masses and oil volume the rated τ_TO and τ_w are taken from the
// IEC 60076-7 Table 5 column of the same cooling class.
//
// Inputs: K per unit load, θ_A ambient °C, dt minutes. Outputs °C / K.
// Validity: 0 <= K <= ~2.
#pragma once

#include <string>
#include <vector>

#include "analytics/iec60076_7_characteristics.h"

namespace ferrum::analytics {

struct IeeeThermalParameters {
  double n = 0.9;                  // oil exponent
  double m = 0.8;                  // winding exponent (the gradient goes with K^(2m))
  double r = 6;                    // load loss / no-load loss at rated load
  double tau_to_min = 150;         // rated top-oil time constant, min
  double tau_w_min = 7;            // winding time constant, min
  double top_oil_rise_k = 52;      // Δθ_TO,R, K
  double hot_spot_gradient_k = 26; // Δθ_H,R, K
};

struct IeeeThermalState {
  double top_oil_rise_k = 0;  // Δθ_TO
  double hot_spot_rise_k = 0; // Δθ_H (over top oil)
};

struct ResolvedIeeeParameters {
  IeeeThermalParameters p;
  std::vector<std::string> sources;
};

// n/m for the cooling class (C57.91-2011 Table 4, data in
// analytics/data/ieee_c57_91.csv: ONAN 0.8/0.8, ONAF and OF 0.9/0.8, OD
// 1.0/1.0; for OFAF sources give n = 0.8 or 0.9, ferrum takes 0.9 from
// C57.91-2011 Table 4); rises, R and time
// constants from the resolved IEC parameters (register data or IEC table).
ResolvedIeeeParameters resolve_ieee_parameters(const ResolvedIecParameters& iec);

double ieee_ultimate_top_oil_rise(const IeeeThermalParameters& p, double k);
double ieee_ultimate_hot_spot_rise(const IeeeThermalParameters& p, double k);
IeeeThermalState ieee_steady_state(const IeeeThermalParameters& p, double k);

// Advances by dt_min at constant k. REQUIRES: dt_min >= 0.
void ieee_step(const IeeeThermalParameters& p, double k, double dt_min, IeeeThermalState& s);

}  // namespace ferrum::analytics
