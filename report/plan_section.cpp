// The plan section of the fleet report ("Ten-year plan", or as long as the
// configured horizon).
#include <cmath>

#include "report/page_flow.h"
#include "report/pdf_chart.h"
#include "report/plan_report.h"
#include "report/report_format.h"

namespace ferrum::report {
namespace {

std::string risk_number(double r) { return fmt_number(r, r < 10 ? 2 : 1); }

std::string years_text(const analytics::FleetPlan& p) {
  return std::to_string(p.start_year) + "–" + std::to_string(p.start_year + p.horizon_years - 1);
}

void risk_chart(PageFlow& flow, const analytics::FleetPlan& p) {
  LineChart chart;
  chart.time_axis = false;
  chart.y_label = "Fleet risk, failures per 1,000 unit-years × consequence";
  ChartSeries with{"with the plan (" + money_text(p.budget_per_year, p.currency) + " a year)", {}, palette::accent,
                   Dash::solid, Marker::circle, 1.2};
  ChartSeries none{"without any plan", {}, palette::ink, Dash::dashed, Marker::cross};
  ChartSeries unlimited{"unlimited budget", {}, palette::muted, Dash::dotted, Marker::square};
  for (const auto& y : p.years) {
    with.points.push_back({static_cast<double>(y.year), y.risk_with_plan});
    none.points.push_back({static_cast<double>(y.year), y.risk_without_plan});
    unlimited.points.push_back({static_cast<double>(y.year), y.risk_unlimited});
  }
  chart.series = {none, with, unlimited};
  chart.y_min = 0;
  chart.x_min = p.start_year - 0.5;
  chart.x_max = p.start_year + p.horizon_years - 0.5;
  const double h = 165;
  flow.ensure(h + 10);
  const double top = flow.take(h);
  draw_line_chart(flow.page(), flow.doc(), Box{flow.x(), top - h, flow.width(), h}, chart);
  flow.space(6);
}

}  // namespace

std::string money_text(double amount, const std::string& currency) {
  if (std::isinf(amount)) return "unlimited";
  std::string digits = std::to_string(static_cast<long long>(std::llround(amount)));
  std::string out;
  const bool negative = !digits.empty() && digits[0] == '-';
  if (negative) digits.erase(0, 1);
  for (std::size_t i = 0; i < digits.size(); ++i) {
    if (i > 0 && (digits.size() - i) % 3 == 0) out += ',';
    out += digits[i];
  }
  return (negative ? "-" : "") + out + (currency.empty() ? "" : " " + currency);
}

void plan_section(PageFlow& flow, const PlanSection& s) {
  if (!s.configured) return;
  flow.section(analytics::plan_title(s.plan ? s.plan->horizon_years : s.horizon_years), 120);
  if (!s.plan) {
    flow.paragraph("No plan: " + s.unavailable + ". The site's administrator sets the missing costs in the site's "
                   "configuration (costs section; README, 'The ten-year plan').",
                   type::body, FontFace::regular, palette::muted);
    return;
  }
  const auto& p = *s.plan;
  flow.paragraph("Budget " + money_text(p.budget_per_year, p.currency) + " a year, " + years_text(p) +
                     (p.carry_over ? ", unspent money carried over" : ", unspent money not carried over") + ". Spent over the plan " +
                     money_text(p.total_spent, p.currency) + ". Fleet risk summed over the years: " +
                     risk_number(p.total_risk_with_plan) + " with the plan, " + risk_number(p.total_risk_without_plan) +
                     " without any plan, " + risk_number(p.total_risk_unlimited) + " with an unlimited budget.",
                 type::body);
  if (p.allocation_budget < p.budget_per_year)
    flow.paragraph("The units are funded as a budget of " + money_text(p.allocation_budget, p.currency) +
                       " a year would fund them: that leaves less risk summed over the years than funding in strict "
                       "order within the full budget, so a larger budget is never worse than a smaller one.",
                   type::small);
  Table t;
  t.font_size = 7.2;
  t.columns = {{"Year", 0.45},
               {"Funded: unit, action, cost, MVA", 2.6},
               {"Spent", 0.85, Align::right},
               {"Deferred: unit (risk)", 1.6},
               {"Risk, plan", 0.6, Align::right},
               {"No plan", 0.6, Align::right},
               {"Unlimited", 0.65, Align::right}};
  for (const auto& y : p.years) {
    std::string funded, deferred;
    for (const auto& f : y.funded)
      funded += (funded.empty() ? "" : "; ") + f.unit_id + " " + f.action + " " + money_text(f.cost, "") + ", " +
                fmt_mva(f.rated_mva, "MVA");
    for (const auto& d : y.deferred) deferred += (deferred.empty() ? "" : "; ") + d.unit_id + " (" + risk_number(d.risk) + ")";
    t.rows.push_back({std::to_string(y.year), funded.empty() ? kNoValue : funded, money_text(y.spent, ""),
                      deferred.empty() ? kNoValue : deferred, risk_number(y.risk_with_plan), risk_number(y.risk_without_plan),
                      risk_number(y.risk_unlimited)});
  }
  flow.table(t);
  if (!p.unfunded.empty()) {
    std::string list;
    for (const auto& id : p.unfunded) list += (list.empty() ? "" : ", ") + id;
    flow.paragraph("Still waiting at the end of the plan: " + list + ".", type::small);
  }
  for (const auto& n : p.not_planned) flow.paragraph("Not planned: " + n + ".", type::small, FontFace::regular, palette::muted);
  risk_chart(flow, p);
  flow.subsection("Method and assumptions");
  std::vector<std::string> items = p.method;
  for (const auto& a : p.assumptions) items.push_back("assumed: " + a);
  items.push_back("risk is for comparing plans and units, not a forecast of failures: the probability of failure is "
                  "ferrum's default calibration unless the site's configuration sets it from the fleet's own statistics");
  flow.bullets(items, type::small);
}

}  // namespace ferrum::report
