// A ranking input with every field away from its default, for the tests of
// the ranking cache and the ranking's temporary file. Plumbing: no
// engineering values.
#pragma once

#include <string>

#include "analytics/ranking_input.h"

namespace ferrum::testing {

// A row with every field away from its default.
inline ferrum::analytics::RankingInput full_row(const std::string& id) {
  ferrum::analytics::RankingInput r;
  r.unit_id = id;
  r.site = "Mill";
  r.rated_mva = 31.5;
  r.criticality = 5;
  r.customers_served = 12000;
  r.health_index = 41.5;
  r.condition_index = 55.25;
  r.band = "poor";
  r.confidence = "5 of 7 factors";
  r.missing = {"infrared survey", "inspection"};
  r.remaining_life_years = 6.5;
  r.limiting_factor = "paper";
  r.beyond_horizon = true;
  r.horizon_years = 30;
  r.action = "refurbish";
  r.action_year = 2027;
  r.action_reason = "wet paper";
  r.treats_paper = true;
  ferrum::analytics::Action f;
  f.priority = 1;
  f.due = 20500;
  f.text = "Reduce the load";
  f.reason = "hot spot";
  f.found = 20400;
  f.source = ferrum::analytics::kSourceLoad;
  f.need = "load-reduce";
  f.reference = id + "/load-reduce";
  f.outage = true;
  f.crew = ferrum::analytics::kCrewEngineering;
  f.overdue = true;
  f.status = "booked";
  f.work_date = 20510;
  f.work_note = "crew 3";
  r.first_action = f;
  auto& in = r.site_inputs;
  in.peak_load_pu = 1.05;
  in.emergency_load_pu = 1.3;
  in.hours_above_normal_cyclic = 12;
  in.normal_cyclic_limit_c = 110;
  in.hot_spot_from_measured_top_oil = true;
  in.paper_moisture_pct = 3.2;
  in.unsafe_inspection = true;
  in.active_arcing = true;
  in.c57104_2008_fault_condition = 3;
  return r;
}

}  // namespace ferrum::testing
