// Remaining-life estimate of one transformer, in years, from three separate
// end-of-life bases reported side by side; the smallest central estimate is the answer and
// its basis is the limiting factor.
//
//  * "paper": degree of polymerisation (DP) now versus the end-of-life DP 200
//    (end-of-life DP checked in public sources). The DP drop per
//    year is the unit's own history, (DP0 - DP_now) / age with DP0 = 1000 at
//    installation, or the drop that its recent thermal ageing alone would give,
//    F_EQA * (DP0 - 200) / (150 000 h) per hour, whichever is faster (IEEE
//    C57.91-2011 Table 1 "retained DP 200" life, from memory). Linear in DP,
//    which is conservative against the reciprocal Emsley kinetics.
//  * "thermal": normal insulation life (IEEE C57.91-2011 Table 1, 180 000 h,
//    from memory; configurable) minus the life already consumed, at the
//    recent equivalent ageing factor F_EQA. Life consumed before the load
//    record is taken at the same F_EQA (stated in the assumptions).
//  * "condition": exponential health-index ageing, HI(t) = HI0 e^(B (t - t0))
//    (CNAIM-style ageing curve). The unit's own rate B = ln(HI/100) / age is limited to
//    between half and twice the expected rate ln(HI_EOL/100) / L_expected (the
//    upper limit as in CNAIM v2.1 section 6.1.8, from memory; the lower limit
//    is ferrum's, so that a pristine index still ages). End of life is the top
//    of the worst band, HI 30. The weighted score before the worst-indicator
//    cap is aged: the cap gates one severe finding, which has its own action,
//    and is not gradual ageing.
//
// Correctable defects (an active gassing fault, a hot joint, wet oil, an unsafe
// item) never shorten remaining life: no published method maps a gas level to
// years of life, and a repaired fault leaves the paper as it was. They raise the
// probability of failure and produce their own actions (action_plan.h).
// Estimates beyond the horizon are reported as the horizon, flagged
// beyond_horizon ("more than N years").
//
// Ranges: each estimate's low/high come from its ageing rate raised/lowered by
// rate_uncertainty (default 30 %), except the gas rules, which carry their own.
// Inputs: a UnitAssessment with paper, thermal, dga and health_index filled.
#pragma once

#include <optional>
#include <string>
#include <vector>

#include "analytics/ageing_rate.h"
#include "analytics/assessment.h"

namespace ferrum::analytics {

struct RemainingLifeOptions {
  // Paper.
  double initial_dp = 1000;          // DP0 at installation (new kraft ~1000)
  double end_of_life_dp = 200;       // checked in public sources
  double dp200_life_hours = 150000;  // IEEE C57.91-2011 Table 1, retained DP 200 (from memory)
  // Thermal.
  double normal_insulation_life_hours = c57_91_normal_life_hours();  // IEEE C57.91-2011 Table 1
  double hours_per_year = 8766;                  // 365.25 d
  // Condition (exponential HI ageing).
  double hi_new = 100;
  double hi_end_of_life = 30;        // top of the worst band of the health index
  double expected_life_years = 60;   // ferrum default; CNAIM uses asset-specific lives
  double max_rate_multiple = 2.0;    // unit rate <= 2x expected (CNAIM, from memory)
  double min_rate_multiple = 0.5;    // unit rate >= 0.5x expected (ferrum)
  // Range and horizon.
  double rate_uncertainty = 0.3;     // +-30 % on the ageing rate
  double horizon_years = 40;         // [ranking] life_horizon_years; longer estimates are reported as this
};

// Fills a.remaining_life (every estimate, the smallest central one as the
// answer with its basis as limiting_factor); appends to a.methods,
// a.assumptions and a.missing. Bad or missing input leaves a basis out with the
// reason in its method text.
void estimate_remaining_life(const RemainingLifeOptions& options, UnitAssessment& a);

// The single estimates, exposed for tests; nullopt years with the reason in
// `method` when not applicable.
LifeEstimate paper_life(const RemainingLifeOptions& o, const UnitAssessment& a);
LifeEstimate thermal_life(const RemainingLifeOptions& o, const UnitAssessment& a);
LifeEstimate condition_life(const RemainingLifeOptions& o, const UnitAssessment& a);

// Time for an exponentially growing (rate > 0) or decaying (rate < 0)
// quantity to go from `from` to `to`: ln(to/from)/rate. 0 when already past
// the target in the direction of travel; nullopt for a zero or non-finite rate
// or non-positive values.
std::optional<double> exponential_time_to(double from, double to, double rate_per_year);

// Age in years at as_of, counted from mid-year of year_built; nullopt if unknown.
std::optional<double> service_years(const UnitInfo& unit, Day as_of);

}  // namespace ferrum::analytics
