// Fleet ranking on risk = likelihood of failure x consequence.
//
// Likelihood: probability of failure per year from the health index with the
// exponential form in common asset-management practice (the form CNAIM and
// similar indices use, stated here as common practice, not taken from a
// standard): PoF(HI) = P100 * (P0 / P100)^((100 - HI) / 100), i.e. P100 for an
// as-new unit rising exponentially to P0 at HI 0. Calibrate P100 and P0 on the
// fleet's own failure statistics.
// Consequence (0..1): weighted mean of criticality / 5, customers served /
// reference and rated MVA / reference (each capped at 1); a component with no
// data is left out and the weights of the others renormalised. Keeping the
// consequence apart from the index until this step follows CIGRE TB 761.
//
// Ranking: descending risk; equal risk (within a relative tolerance) shares a
// rank (1, 2, 2, 4), is marked tied and is ordered by unit_id with a note.
// Units without a health index are listed after the ranked ones, by unit_id,
// with insufficient_data set, rank 0 and a note naming what is missing.
// Recommended action and year: replace / refurbish / repair / intensify
// monitoring / routine, from the condition index (without correctable
// findings) and the remaining life (thresholds in the options; index
// thresholds from the HI table of Jahromi et al. 2009, from memory). "repair"
// this year when a correctable finding (gassing fault, unsafe item, hot joint)
// capped the index below the condition: the row never says "routine" then.
#pragma once

#include <string>
#include <vector>

#include "analytics/assessment.h"

namespace ferrum::analytics {

struct RankingOptions {
  // Likelihood.
  double pof_as_new = 0.002;   // per year at HI 100 (ferrum default)
  double pof_at_zero = 0.2;    // per year at HI 0 (ferrum default)
  std::string pof_source =
      "exponential PoF(HI) = P100 (P0/P100)^((100-HI)/100), common practice; defaults are ferrum's own";
  // Consequence weights and references.
  double weight_criticality = 0.5;
  double weight_customers = 0.3;
  double weight_mva = 0.2;
  double customers_reference = 10000;  // customers at which the component reaches 1
  double mva_reference = 100;          // MVA at which the component reaches 1
  // Equal risk: |r1 - r2| <= tie_tolerance * max(r1, r2).
  double tie_tolerance = 1e-9;
  // Actions: index at or below (band edges belong to the worse band).
  double replace_below_hi = 30;
  double refurbish_below_hi = 50;
  double monitor_below_hi = 70;
  double replace_within_years = 5;     // remaining life
  double refurbish_within_years = 10;  // remaining life
  int horizon_years = 10;              // MVA-due summary
};

// Ranks every unit; never drops one. REQUIRES nothing: empty input gives an
// empty ranking with the ten-year summary at zero.
FleetRanking rank_fleet(const std::vector<UnitAssessment>& units, Day as_of, const RankingOptions& options);

// The fields of an assessment that rank_fleet reads, and only those (unit id,
// site, MVA, criticality, customers; health and condition index, band,
// confidence, missing data; remaining life and its limiting factor):
// rank_fleet gives the same ranking from them as from the whole assessments
// (tested). What a stored ranking input keeps (daemon/assess/ranking_cache).
// Kept beside rank_fleet so that the two change together.
UnitAssessment ranking_fields(const UnitAssessment& a);

// The two factors of risk, exposed for tests and reports.
double probability_of_failure(double health_index, const RankingOptions& options);
double consequence_of(const UnitInfo& unit, const RankingOptions& options);

}  // namespace ferrum::analytics
