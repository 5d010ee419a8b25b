// The words every report and console line uses for the one decision of a
// unit (analytics/decision/decision.h), its remaining life and its most
// urgent action, so that the unit report, the fleet report, the CSV and the
// console say the same thing.
#pragma once

#include <optional>
#include <string>

#include "analytics/assessment.h"

namespace ferrum::report {

// "paper ageing", "thermal life consumed", "age", "end-of-life condition"; "" for "".
std::string limiting_factor_words(const std::string& basis);
// "more than 40 years", "12.5 years", "—" when unknown; `decimals` for the number.
std::string life_text(std::optional<double> years, bool beyond_horizon, double horizon_years, int decimals = 1);
// "replace 2028", "repair 2026".
std::string action_text(const std::string& action, std::optional<int> year);
// Where the fleet's budget plan puts the action when that is not the
// decision's year: "budget plan: 2029", "budget plan: not funded by 2035";
// "" when the plan keeps the year or there is no plan.
std::string plan_note(const analytics::PlanSchedule& plan);
// action_text with the plan's note: "replace 2028 (budget plan: 2029)".
std::string action_text(const std::string& action, std::optional<int> year, const analytics::PlanSchedule& plan);
// "P1 by 2026-11-30: Make safe or take out of service: grounding"; "" when none.
std::string first_action_text(const std::optional<analytics::Action>& a);
// Risk as printed: expected failures per 1,000 unit-years times the
// consequence, one decimal (two below 1), never a column of zeros.
std::string risk_text(std::optional<double> risk);

}  // namespace ferrum::report
