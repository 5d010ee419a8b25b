// Water in the oil-paper insulation of mineral-oil transformers.
//   * Solubility of water in mineral oil: log10 Ws(ppm) = A − B/T, T in K,
//     A = 7.0895, B = 1567 (Oommen-type fit for new oil; constants from
//     memory). The fit reproduces the published solubility
//     table (checked against a public reproduction: 22 / 55 / 121 / 242 / 446 / 772 ppm at 0 / 20 / 40
//     / 60 / 80 / 100 °C) within about 1 %. Aged oil dissolves more water:
//     A and B are options.
//   * Relative saturation RS (%) = 100 · W_oil / Ws(T_sample).
//   * Water in paper at equilibrium, Fessler et al. (1987):
//     W_paper = 2.173e-7 · p_v^0.6685 · exp(4725.6 / T), with
//     p_v = RS · p_sat(T) the water vapour partial pressure. Constants from
//     memory, low confidence. Units as implemented: p_v in atm and W_paper as
//     a mass fraction (×100 for %); with p_v in Pa the relation gives
//     impossible values (> 50 % at 60 °C, 10 % RS), so that reading was
//     rejected. p_sat(T) from the Magnus form of Alduchov & Eskridge (1996):
//     610.94 · exp(17.625·t / (t + 243.04)) Pa.
// Inputs: water mg/kg (ppm), sampling oil temperature °C. Validity: 0–100 °C;
// equilibrium estimates are only meaningful for a warm, steadily loaded unit
// (oil and paper rarely are in equilibrium; cold samples overstate the
// paper's water). Prefer RS trends or dielectric-response results.
#pragma once

#include <optional>
#include <string>
#include <vector>

#include "analytics/lab_value.h"

namespace ferrum::analytics {

struct MoistureOptions {
  double solubility_a = 7.0895;  // log10 Ws = A − B/T (new mineral oil)
  double solubility_b = 1567.0;  // K
  // Below this sampling temperature (°C) oil and paper are taken to be far
  // from equilibrium and no paper-water estimate is given. Default 40 °C.
  double cold_sample_c = 40.0;
};

// Water solubility of mineral oil at temp_c, ppm (mg/kg).
double water_solubility_ppm(double temp_c, const MoistureOptions& options = {});
// Saturation vapour pressure of water at temp_c, Pa (Magnus form).
double water_saturation_pressure_pa(double temp_c);
// Fessler equilibrium water content of paper, % by mass, from RS (%) and temp_c.
double fessler_paper_moisture_pct(double relative_saturation_pct, double temp_c);

struct MoistureResult {
  std::optional<double> water_ppm;
  std::optional<double> temperature_c;
  std::optional<double> solubility_ppm;
  std::optional<double> relative_saturation_pct;
  std::optional<double> paper_moisture_pct;
  bool equilibrium_doubtful = false;
  std::vector<std::string> notes;  // missing temperature, cold sample, ...
  std::string method =
      "Water solubility log10 Ws = A - B/T; relative saturation; paper water by Fessler equilibrium";
  std::string source = "Oommen-type solubility fit (from memory, matches published table); Fessler et al. 1987 (from memory)";
};

MoistureResult assess_moisture(const LabValue& water_ppm, const LabValue& oil_temp_c,
                               const MoistureOptions& options = {});

}  // namespace ferrum::analytics
