// The budgeted plan (analytics/plan) as a fleet-report section and as CSV.
// Lays out what the analytics produced and computes nothing.
#pragma once

#include <optional>
#include <string>
#include <vector>

#include "analytics/plan/plan.h"

namespace ferrum::report {

class PageFlow;

// What the fleet report shows of the plan: the plan, or why there is none
// (costs missing). The section is left out when `configured` is false.
struct PlanSection {
  bool configured = false;
  std::optional<analytics::FleetPlan> plan;
  std::string unavailable;  // why there is no plan, when configured
  int horizon_years = 10;   // [plan] horizon_years: the heading when there is no plan
};

// "Ten-year plan" (the heading follows the horizon, analytics::plan_title): budget, method and assumptions, a table per year (units
// funded with action, cost and MVA; spent; fleet risk with the plan, without
// any plan and with an unlimited budget; deferred units), and a chart of the
// fleet's risk by year for the three cases.
void plan_section(PageFlow& flow, const PlanSection& section);

// Money with thousands separators and the currency label: "1,200,000 EUR";
// "unlimited" for infinity.
std::string money_text(double amount, const std::string& currency);

// The plans (one per budget) as CSV: one row per year ("year": spent and the
// three fleet risks) and one per unit funded or deferred that year; the
// caution line last. Pure.
std::string plan_csv(const std::vector<analytics::FleetPlan>& plans);

}  // namespace ferrum::report
