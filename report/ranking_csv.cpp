// fleet_ranking_csv: the ranking as a CSV file for spreadsheets.
#include <cstdio>
#include <optional>
#include <ostream>
#include <sstream>

#include "report/csv_field.h"
#include "report/fleet_report.h"
#include "report/safety_text.h"

namespace ferrum::report {
namespace {

// Six significant figures: exact for every value the ranking carries, and
// locale-independent ("%g" ignores the locale's grouping here).
std::string number(std::optional<double> v) {
  if (!v) return "";
  char buf[32];
  std::snprintf(buf, sizeof buf, "%.6g", *v);
  return buf;
}

// Risk on the scale the PDF prints it (report::risk_text): failures per
// 1,000 unit-years times the consequence.
std::optional<double> risk_per_1000(std::optional<double> risk) {
  if (!risk) return std::nullopt;
  return *risk * 1000;
}

std::string integer(std::optional<int> v) { return v ? std::to_string(*v) : std::string(); }

// The year the budget plan funds the action (action_year itself when on
// time, so that an empty cell only ever means "no plan for it"), or "not
// funded by YEAR" (report::plan_note).
std::string plan_year(const analytics::PlanSchedule& plan) {
  using S = analytics::PlanSchedule::State;
  if (plan.state == S::later || plan.state == S::on_time) return integer(plan.year);
  if (plan.state == S::unfunded) return "not funded by " + std::to_string(plan.last_year);
  return "";
}

}  // namespace

std::string quote(const std::string& field) {
  if (field.find_first_of(",\"\r\n") == std::string::npos) return field;
  std::string out = "\"";
  for (char c : field) {
    if (c == '"') out += '"';
    out += c;
  }
  return out + "\"";
}

void write_fleet_ranking_csv(std::ostream& csv, const analytics::FleetRanking& ranking) {
  write_fleet_ranking_csv(csv, analytics::rows_of(ranking));
}

void write_fleet_ranking_csv(std::ostream& csv, const analytics::RankedRows& rows) {
  csv <<
      "rank,tied,unit_id,site,rated_mva,health_index,band,remaining_life_years,beyond_horizon,limiting_factor,"
      "probability_of_failure,failures_per_1000_unit_years,consequence,risk,recommended_action,action_year,plan_year,"
      "first_action_priority,first_action_due,first_action_overdue,first_action_reference,first_action,action_reason,"
      "insufficient_data,note\n";
  rows([&](const analytics::RankedUnit& u) {
    const std::string fields[] = {u.insufficient_data ? "" : std::to_string(u.rank), u.tied ? "yes" : "no",
                                  quote(u.unit_id), quote(u.site), number(u.rated_mva), number(u.health_index),
                                  quote(u.band), number(u.remaining_life_years), u.beyond_horizon ? "yes" : "no",
                                  quote(u.limiting_factor), number(u.probability_of_failure),
                                  number(u.failures_per_1000_unit_years), number(u.consequence), number(risk_per_1000(u.risk)),
                                  quote(u.recommended_action), integer(u.action_year), plan_year(u.budget_plan),
                                  u.first_action ? std::to_string(u.first_action->priority) : "",
                                  u.first_action ? analytics::format_day(u.first_action->due) : "",
                                  u.first_action ? (u.first_action->overdue ? "yes" : "no") : "",
                                  quote(u.first_action ? u.first_action->reference : ""),
                                  quote(u.first_action ? u.first_action->text : ""), quote(u.action_reason),
                                  u.insufficient_data ? "yes" : "no", quote(u.note)};
    bool first = true;
    for (const auto& f : fields) {
      if (!first) csv << ',';
      csv << f;
      first = false;
    }
    csv << '\n';
  });
  // The caution as a final comment line (spreadsheets show it; CSV readers
  // told to skip comments ignore it).
  csv << csv_caution_line() << '\n';
}

std::string fleet_ranking_csv(const analytics::FleetRanking& ranking) {
  std::ostringstream csv;
  write_fleet_ranking_csv(csv, ranking);
  return std::move(csv).str();
}

}  // namespace ferrum::report
