#include "report/decision_text.h"

#include <cstdio>

#include "report/report_format.h"

namespace ferrum::report {

std::string limiting_factor_words(const std::string& basis) {
  if (basis == "paper") return "paper ageing";
  if (basis == "thermal") return "thermal life consumed";
  if (basis == "age") return "age";
  if (basis == "condition") return "end-of-life condition";
  return basis;
}

std::string life_text(std::optional<double> years, bool beyond_horizon, double horizon_years, int decimals) {
  if (!years) return kNoValue;
  if (beyond_horizon) return "more than " + fmt_number(horizon_years, 0) + " years";
  return fmt_number(years, decimals, "years");
}

std::string action_text(const std::string& action, std::optional<int> year) {
  if (action.empty()) return kNoValue;
  return action + (year ? " " + std::to_string(*year) : "");
}

std::string plan_note(const analytics::PlanSchedule& plan) {
  using S = analytics::PlanSchedule::State;
  if (plan.state == S::later && plan.year) return "budget plan: " + std::to_string(*plan.year);
  if (plan.state == S::unfunded) return "budget plan: not funded by " + std::to_string(plan.last_year);
  return "";
}

std::string action_text(const std::string& action, std::optional<int> year, const analytics::PlanSchedule& plan) {
  const std::string note = plan_note(plan);
  return action_text(action, year) + (note.empty() ? "" : " (" + note + ")");
}

std::string first_action_text(const std::optional<analytics::Action>& a) {
  if (!a) return "";
  return "P" + std::to_string(a->priority) + " by " + fmt_day(a->due) + ": " + a->text;
}

std::string risk_text(std::optional<double> risk) {
  if (!risk) return kNoValue;
  const double per_1000 = *risk * 1000;
  return fmt_number(per_1000, per_1000 < 1 ? 2 : 1);
}

}  // namespace ferrum::report
