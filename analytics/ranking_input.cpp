#include "analytics/ranking_input.h"

namespace ferrum::analytics {

SiteInputs site_inputs(const UnitAssessment& a) {
  SiteInputs s;
  s.peak_load_pu = a.thermal.peak_load_pu;
  s.emergency_load_pu = a.thermal.emergency_load_pu;
  s.hours_above_normal_cyclic = a.thermal.hours_above_normal_cyclic;
  s.normal_cyclic_limit_c = a.thermal.normal_cyclic_limit_c;
  s.hot_spot_from_measured_top_oil = a.thermal.hot_spot_from_measured_top_oil;
  s.paper_moisture_pct = a.oil.paper_moisture_pct;
  s.unsafe_inspection = a.unsafe_inspection;
  s.active_arcing = a.active_arcing;
  s.c57104_2008_fault_condition = a.dga.c57104_2008_fault_condition;
  return s;
}

RankingInput ranking_input(const UnitAssessment& a) {
  RankingInput r;
  r.unit_id = a.unit.unit_id;
  r.site = a.unit.site;
  r.rated_mva = a.unit.rated_mva;
  r.criticality = a.unit.criticality;
  r.customers_served = a.unit.customers_served;
  r.health_index = a.health_index;
  r.condition_index = a.condition_index;
  r.band = a.band;
  r.confidence = a.confidence;
  r.missing = a.missing;
  r.remaining_life_years = a.remaining_life.years;
  r.limiting_factor = a.remaining_life.limiting_factor;
  r.beyond_horizon = a.remaining_life.beyond_horizon;
  r.horizon_years = a.remaining_life.horizon_years;
  r.action = a.decision.action;
  r.action_year = a.decision.year;
  r.action_reason = a.decision.reason;
  r.treats_paper = a.decision.treats_paper;
  r.first_action = a.decision.first_action;
  r.site_inputs = site_inputs(a);
  return r;
}

std::vector<RankingInput> ranking_inputs(const std::vector<UnitAssessment>& units) {
  std::vector<RankingInput> out;
  out.reserve(units.size());
  for (const auto& a : units) out.push_back(ranking_input(a));
  return out;
}

}  // namespace ferrum::analytics
