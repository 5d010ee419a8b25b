// plan: the budgeted ten-year plan of replacements and refurbishments.
#include <iomanip>
#include <iostream>
#include <sstream>

#include "analytics/fleet_ranking.h"
#include "daemon/app/commands_impl.h"
#include "daemon/app/fleet_inputs.h"
#include "daemon/app/site_context.h"
#include "daemon/assess/assessment_json.h"
#include "daemon/assess/assessment_service.h"
#include "daemon/assess/plan_json.h"
#include "daemon/assess/plan_service.h"
#include "daemon/config/plan_config.h"
#include "report/plan_report.h"
#include "report/report_format.h"
#include "report/safety_text.h"

namespace ferrum::app {
namespace {

std::string risk(double r) { return report::fmt_number(r, r < 10 ? 2 : 1); }

std::string funded_text(const analytics::PlanYear& y) {
  std::string out;
  for (const auto& f : y.funded)
    out += (out.empty() ? "" : "; ") + f.unit_id + " " + f.action + " " + report::money_text(f.cost, "") + " " +
           report::fmt_mva(f.rated_mva, "MVA");
  return out.empty() ? "-" : out;
}

std::string header_text(const analytics::FleetPlan& p) {
  return report::money_text(p.budget_per_year, p.currency) + " a year, " + std::to_string(p.start_year) + "-" +
         std::to_string(p.start_year + p.horizon_years - 1) +
         (p.carry_over ? ", unspent money carried over" : ", unspent money not carried over");
}

void print_notes(const analytics::FleetPlan& p) {
  auto list = [](const std::vector<std::string>& v) {
    std::string s;
    for (const auto& x : v) s += (s.empty() ? "" : ", ") + x;
    return s;
  };
  if (p.allocation_budget < p.budget_per_year)
    std::cout << "funded as a budget of " << report::money_text(p.allocation_budget, p.currency)
              << " a year would fund them: that leaves less total risk than funding in strict order within "
              << report::money_text(p.budget_per_year, p.currency) << "\n";
  if (!p.unfunded.empty()) std::cout << "still waiting at the end of the plan: " << list(p.unfunded) << "\n";
  for (const auto& n : p.not_planned) std::cout << "not planned: " << n << "\n";
}

void print_one(const analytics::FleetPlan& p) {
  std::cout << "Plan as of " << analytics::format_day(p.as_of) << ": budget " << header_text(p) << "\n"
            << "fleet risk: failures per 1,000 unit-years x consequence, summed over the units\n\n"
            << std::left << std::setw(6) << "year" << std::setw(14) << "spent" << std::setw(10) << "risk" << std::setw(10)
            << "no plan" << std::setw(11) << "unlimited" << "funded (action, cost, MVA)\n";
  for (const auto& y : p.years) {
    std::cout << std::left << std::setw(6) << y.year << std::setw(14) << report::money_text(y.spent, "") << std::setw(10)
              << risk(y.risk_with_plan) << std::setw(10) << risk(y.risk_without_plan) << std::setw(11)
              << risk(y.risk_unlimited) << funded_text(y) << "\n";
    if (!y.deferred.empty()) {
      std::cout << "      deferred:";
      for (const auto& d : y.deferred)
        std::cout << " " << d.unit_id << " (" << d.action << " " << report::money_text(d.cost, "") << ", risk " << risk(d.risk) << ")";
      std::cout << "\n";
    }
  }
  std::cout << "\ntotal spent " << report::money_text(p.total_spent, p.currency) << "; fleet risk summed over the years: "
            << risk(p.total_risk_with_plan) << " with the plan, " << risk(p.total_risk_without_plan) << " without any plan, "
            << risk(p.total_risk_unlimited) << " with an unlimited budget\n";
  print_notes(p);
  for (const auto& m : p.method) std::cout << "method: " << m << "\n";
  for (const auto& a : p.assumptions) std::cout << "assumed: " << a << "\n";
}

// Budgets side by side: per year, each budget's spending, risk and units funded.
void print_compared(const std::vector<analytics::FleetPlan>& plans) {
  std::cout << "Plans compared as of " << analytics::format_day(plans[0].as_of) << ":\n";
  for (std::size_t i = 0; i < plans.size(); ++i)
    std::cout << "  " << static_cast<char>('A' + i) << ": budget " << header_text(plans[i]) << "\n";
  std::cout << "fleet risk: failures per 1,000 unit-years x consequence, summed over the units\n\n" << std::left << std::setw(6) << "year";
  for (std::size_t i = 0; i < plans.size(); ++i) {
    const std::string l(1, static_cast<char>('A' + i));
    std::cout << std::setw(14) << l + " spent" << std::setw(9) << l + " risk";
  }
  std::cout << std::setw(10) << "no plan" << std::setw(11) << "unlimited" << "funded\n";
  for (std::size_t k = 0; k < plans[0].years.size(); ++k) {
    std::cout << std::left << std::setw(6) << plans[0].years[k].year;
    for (const auto& p : plans)
      std::cout << std::setw(14) << report::money_text(p.years[k].spent, "") << std::setw(9) << risk(p.years[k].risk_with_plan);
    std::cout << std::setw(10) << risk(plans[0].years[k].risk_without_plan) << std::setw(11)
              << risk(plans[0].years[k].risk_unlimited);
    for (std::size_t i = 0; i < plans.size(); ++i)
      std::cout << (i ? " | " : "") << static_cast<char>('A' + i) << ": " << funded_text(plans[i].years[k]);
    std::cout << "\n";
  }
  std::cout << "\n";
  for (std::size_t i = 0; i < plans.size(); ++i) {
    const auto& p = plans[i];
    std::cout << static_cast<char>('A' + i) << ": spent " << report::money_text(p.total_spent, p.currency)
              << ", fleet risk summed over the years " << risk(p.total_risk_with_plan);
    if (i > 0) {
      const double d = p.total_risk_with_plan - plans[0].total_risk_with_plan;
      std::cout << " (" << (d >= 0 ? "+" : "") << risk(d) << " against A)";
    }
    std::cout << "\n";
    print_notes(p);
  }
  std::cout << "without any plan " << risk(plans[0].total_risk_without_plan) << ", with an unlimited budget "
            << risk(plans[0].total_risk_unlimited) << "\n";
  for (const auto& m : plans[0].method) std::cout << "method: " << m << "\n";
  for (const auto& a : plans[0].assumptions) std::cout << "assumed: " << a << "\n";
}

std::vector<std::optional<double>> budgets_from(const Invocation& inv, bool configured) {
  std::vector<std::optional<double>> out;
  if (!inv.has("budget")) {
    if (!configured) throw UsageError("no budget: give --budget N or set [plan] budget_per_year in ferrum.ini");
    return {std::nullopt};
  }
  std::istringstream in(inv.get("budget"));
  std::string part;
  while (std::getline(in, part, '\n')) {
    std::size_t pos = 0;
    double v = -1;
    try {
      v = std::stod(part, &pos);
    } catch (const std::exception&) {
      pos = 0;
    }
    if (pos == 0 || pos != part.size() || !(v >= 0) || !std::isfinite(v))
      throw UsageError("--budget: '" + part + "' is not an amount of money (a number, 0 or more)");
    out.push_back(v);
  }
  if (out.size() > 3) throw UsageError("--budget: at most three budgets side by side");
  return out;
}

}  // namespace

int cmd_plan(const Invocation& inv) {
  if (inv.has("json") && inv.has("csv")) throw UsageError("--json or --csv, not both");
  std::optional<int> horizon;
  if (inv.has("horizon")) {
    const std::string h = inv.get("horizon");
    if (h.empty() || h.find_first_not_of("0123456789") != std::string::npos || h.size() > 2 || std::stoi(h) < 1 || std::stoi(h) > 50)
      throw UsageError("--horizon: '" + h + "' must be a whole number of years from 1 to 50");
    horizon = std::stoi(h);
  }
  auto site = open_site(inv, Access::read);
  const auto budgets = budgets_from(inv, config::plan_configured(site->config));
  const analytics::Day as_of = today(inv, site->config);
  auto units = fleet_ranking_inputs(inv, *site, as_of);
  const auto ranking = analytics::rank_fleet(std::move(units), as_of, assess::ranking_options_from_config(site->config));
  const auto plan_units = assess::plan_units(ranking, site->store->units());
  std::vector<analytics::FleetPlan> plans;
  for (const auto& b : budgets) {
    std::string why;
    auto p = assess::make_plan(plan_units, as_of, site->config, b, horizon, &why);
    if (!p) throw std::runtime_error("no plan: " + why);
    plans.push_back(std::move(*p));
  }
  if (inv.has("json")) {
    Poco::JSON::Object::Ptr doc = new Poco::JSON::Object;
    Poco::JSON::Array::Ptr list = new Poco::JSON::Array;
    for (const auto& p : plans) list->add(assess::to_json(p));
    doc->set("plans", list);
    doc->set("caution", report::one_line_caution());
    std::cout << assess::stringify(doc) << "\n";
    return kOk;
  }
  if (inv.has("csv")) {
    std::cout << report::plan_csv(plans);
    return kOk;
  }
  if (plans.size() == 1) print_one(plans[0]);
  else print_compared(plans);
  std::cout << "\n" << report::one_line_caution() << "\n";
  return kOk;
}

}  // namespace ferrum::app
