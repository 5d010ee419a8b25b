// The edge between the site and the budgeted plan (analytics/plan): options
// from ferrum.ini [costs] and [plan], and the plan's units from the fleet
// ranking and the register.
#pragma once

#include <optional>
#include <string>
#include <vector>

#include "analytics/assessment.h"
#include "analytics/plan/plan.h"
#include "daemon/config/site_config.h"

namespace ferrum::assess {

struct PlanSettings {
  analytics::CostOptions costs;
  analytics::PlanOptions options;  // budget_per_year: [plan] budget_per_year, else unlimited
  bool budget_configured = false;
};

// [costs], [plan], and the ageing model and PoF of [ranking] (the same keys
// remaining life and the ranking read).
PlanSettings plan_settings_from_config(const config::SiteConfig& config);

// One PlanUnit per ranked unit; rated MVA, HV kV and the unit's own costs from
// the register (`register_units`, matched by unit_id).
std::vector<analytics::PlanUnit> plan_units(const analytics::FleetRanking& ranking,
                                            const std::vector<analytics::UnitInfo>& register_units);

// Units that would need a replacement or refurbishment cost the configuration
// does not give (their HV class has no cost_per_mva and they have no own
// cost), in words; empty when every candidate can be costed.
std::vector<std::string> missing_costs(const std::vector<analytics::PlanUnit>& units, const config::SiteConfig& config);

// The plan for a given budget and horizon (nullopt: the configured ones), or nullopt with
// `why` filled when costs are missing.
std::optional<analytics::FleetPlan> make_plan(const std::vector<analytics::PlanUnit>& units, analytics::Day as_of,
                                              const config::SiteConfig& config, std::optional<double> budget,
                                              std::optional<int> horizon_years, std::string* why);

}  // namespace ferrum::assess
