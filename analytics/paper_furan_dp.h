// Degree of polymerization (DP) of the winding paper estimated from the
// 2-furaldehyde (2-FAL) content of the oil.
//   * Chendong (1991): log10(2FAL[ppm]) = 1.51 − 0.0035·DP
//     → DP = (1.51 − log10 2FAL) / 0.0035 (from memory; Chendong 1991, checked against a public reproduction).
//   * De Pablo (CIGRE): DP ≈ 7100 / (8.88 + 2FAL[ppm]) (from memory), for
//     comparison: the correlations disagree strongly near end of life
//     (DP 200 ↔ 6.5 ppm Chendong, 27 ppm De Pablo).
//   * Share of life used = (DP_new − DP) / (DP_new − DP_end), with new kraft
//     paper about 1000 after processing and end of life about 200 (verified,
//     public sources), clamped to 0–100 %.
// Input: 2-FAL in µg/L (ppb, as labs report it); converted to mg/kg (ppm) by
// /1000 (oil density taken as 1 kg/L, as the correlations do).
// Validity: non-upgraded kraft paper in mineral oil; furans are lost when the
// oil is replaced or regenerated, so samples taken after UnitInfo::oil_treated
// are not trustworthy for DP. Thermally upgraded paper produces less 2-FAL:
// the estimate then overstates DP (flagged).
#pragma once

#include <optional>
#include <string>

#include "analytics/calendar.h"
#include "analytics/lab_value.h"
#include "analytics/unit_data.h"

namespace ferrum::analytics {

struct PaperDpOptions {
  double dp_new = 1000;  // processed new kraft paper (S13: 800-1000 processed, 1000-1200 new)
  double dp_end = 200;   // end of life (public sources)
};

// DP from 2-FAL in ppm; nullopt for a value ≤ 0.
std::optional<double> chendong_dp(double fal_ppm);
double de_pablo_dp(double fal_ppm);
// 0..100 %.
double paper_life_used_pct(double dp, const PaperDpOptions& options = {});

struct PaperDpResult {
  bool applicable = false;
  std::optional<double> fal_ppb;
  std::optional<double> dp_chendong;
  std::optional<double> dp_de_pablo;
  std::optional<double> life_used_pct;   // from the Chendong estimate
  bool trustworthy = true;
  std::string note;                      // why not trustworthy / not applicable / clamped
  std::string method = "DP from 2-FAL, Chendong (comparison: De Pablo)";
  std::string source = "Chendong 1991; De Pablo (CIGRE); DP new 1000 / end 200 (furan literature) - correlations from memory";
};

// `sample_date` and `unit` decide trustworthiness (oil treatment, paper type).
PaperDpResult estimate_paper_dp(const LabValue& fal_ppb, Day sample_date, const UnitInfo& unit,
                                const PaperDpOptions& options = {});

}  // namespace ferrum::analytics
