// plan_csv: the budgeted plan as CSV for spreadsheets.
#include <cmath>
#include <cstdio>

#include "report/csv_field.h"
#include "report/plan_report.h"
#include "report/safety_text.h"

namespace ferrum::report {
namespace {

std::string num(double v) {
  if (std::isinf(v)) return "unlimited";
  char buf[32];
  std::snprintf(buf, sizeof buf, "%.10g", v);
  return buf;
}

}  // namespace

std::string plan_csv(const std::vector<analytics::FleetPlan>& plans) {
  std::string csv =
      "budget_per_year,currency,allocation_budget,year,row,unit_id,site,action,cost,rated_mva,risk,risk_after,deferred_years,budget,spent,"
      "risk_with_plan,risk_without_plan,risk_unlimited\n";
  for (const auto& p : plans) {
    const std::string head = num(p.budget_per_year) + "," + quote(p.currency) + "," + num(p.allocation_budget) + ",";
    for (const auto& y : p.years) {
      const std::string year = std::to_string(y.year) + ",";
      csv += head + year + "year,,,,,,,,," + num(y.budget) + "," + num(y.spent) + "," + num(y.risk_with_plan) + "," +
             num(y.risk_without_plan) + "," + num(y.risk_unlimited) + "\n";
      for (const auto& f : y.funded)
        csv += head + year + "funded," + quote(f.unit_id) + "," + quote(f.site) + "," + f.action + "," + num(f.cost) + "," +
               num(f.rated_mva) + "," + num(f.risk_before) + "," + num(f.risk_after) + "," + std::to_string(f.deferred_years) +
               ",,,,,\n";
      for (const auto& d : y.deferred)
        csv += head + year + "deferred," + quote(d.unit_id) + "," + quote(d.site) + "," + d.action + "," + num(d.cost) +
               ",," + num(d.risk) + ",,,,,,,\n";
    }
  }
  return csv + csv_caution_line() + "\n";
}

}  // namespace ferrum::report
