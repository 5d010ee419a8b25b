// The compact input of the whole-fleet steps: per unit only what the fleet
// ranking (fleet_ranking.h), the ten-year plan (plan/plan.h, through the
// ranking) and the site view (site_view.h) read of its assessment, a few
// hundred bytes against an assessment's kilobytes, so that `assess`, `rank`
// and `plan` over the fleet hold one of these per unit and never a whole
// assessment (bench/results.md, "Peak memory"). What the ranking cache
// stores (daemon/assess/ranking_cache.h). Not a method: no source applies.
//
// A field that one of those steps comes to read must be added here, to
// ranking_input(), to the cache and to the ranking's temporary file
// (daemon/assess/spilled_ranking.cpp), or a ranking from these rows differs
// from one made from the whole assessments.
#pragma once

#include <optional>
#include <string>
#include <vector>

#include "analytics/assessment.h"

namespace ferrum::analytics {

// What the site view reads of a unit beside its id, site, rating and
// decision (site_view.h says why each counts).
struct SiteInputs {
  std::optional<double> peak_load_pu;               // ThermalSummary
  std::optional<double> emergency_load_pu;          // ThermalSummary
  std::optional<double> hours_above_normal_cyclic;  // ThermalSummary
  double normal_cyclic_limit_c = 120;               // ThermalSummary, °C
  bool hot_spot_from_measured_top_oil = false;      // ThermalSummary
  std::optional<double> paper_moisture_pct;         // OilSummary, %
  bool unsafe_inspection = false;                   // UnitAssessment
  bool active_arcing = false;                       // UnitAssessment
  std::optional<int> c57104_2008_fault_condition;   // DgaSummary
};

struct RankingInput {
  // UnitInfo
  std::string unit_id, site;
  double rated_mva = 0;
  int criticality = 3;
  std::optional<int> customers_served;
  // The index and what it lacks
  std::optional<double> health_index, condition_index;
  std::string band;
  std::string confidence;
  std::vector<std::string> missing;
  // RemainingLife
  std::optional<double> remaining_life_years;
  std::string limiting_factor;
  bool beyond_horizon = false;
  double horizon_years = 40;
  // Decision
  std::string action;
  std::optional<int> action_year;
  std::string action_reason;
  bool treats_paper = false;
  std::optional<Action> first_action;
  SiteInputs site_inputs;
};

SiteInputs site_inputs(const UnitAssessment& a);
RankingInput ranking_input(const UnitAssessment& a);
std::vector<RankingInput> ranking_inputs(const std::vector<UnitAssessment>& units);

}  // namespace ferrum::analytics
