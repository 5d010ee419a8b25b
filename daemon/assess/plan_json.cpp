#include "daemon/assess/plan_json.h"

#include <Poco/JSON/Array.h>

#include <cmath>

namespace ferrum::assess {
namespace {

using Poco::JSON::Array;
using Poco::JSON::Object;
using Poco::Dynamic::Var;

// Six decimals at most (no floating-point noise); infinity (unlimited) is null.
Var amount(double v) {
  if (!std::isfinite(v)) return Var();
  return std::round(v * 1e6) / 1e6;
}

Array::Ptr texts(const std::vector<std::string>& v) {
  Array::Ptr a = new Array;
  for (const auto& s : v) a->add(s);
  return a;
}

}  // namespace

Object::Ptr to_json(const analytics::FleetPlan& p) {
  Object::Ptr o = new Object;
  o->set("as_of", analytics::format_day(p.as_of));
  o->set("currency", p.currency);
  o->set("budget_per_year", amount(p.budget_per_year));
  o->set("allocation_budget", amount(p.allocation_budget));  // budget_per_year unless a smaller allocation leaves less risk
  o->set("carry_over", p.carry_over);
  o->set("start_year", p.start_year);
  o->set("horizon_years", p.horizon_years);
  o->set("risk_unit", "failures per 1,000 unit-years x consequence");
  Array::Ptr years = new Array;
  for (const auto& y : p.years) {
    Object::Ptr j = new Object;
    j->set("year", y.year);
    j->set("budget", amount(y.budget));
    j->set("spent", amount(y.spent));
    Array::Ptr funded = new Array;
    for (const auto& f : y.funded) {
      Object::Ptr u = new Object;
      u->set("unit_id", f.unit_id);
      u->set("site", f.site);
      u->set("action", f.action);
      u->set("cost", amount(f.cost));
      u->set("rated_mva", amount(f.rated_mva));
      u->set("risk_before", amount(f.risk_before));
      u->set("risk_after", amount(f.risk_after));
      u->set("health_index_before", amount(f.hi_before));
      u->set("health_index_after", amount(f.hi_after));
      u->set("deferred_years", f.deferred_years);
      funded->add(u);
    }
    j->set("funded", funded);
    Array::Ptr deferred = new Array;
    for (const auto& d : y.deferred) {
      Object::Ptr u = new Object;
      u->set("unit_id", d.unit_id);
      u->set("site", d.site);
      u->set("action", d.action);
      u->set("cost", amount(d.cost));
      u->set("risk", amount(d.risk));
      deferred->add(u);
    }
    j->set("deferred", deferred);
    j->set("risk_with_plan", amount(y.risk_with_plan));
    j->set("risk_without_plan", amount(y.risk_without_plan));
    j->set("risk_unlimited", amount(y.risk_unlimited));
    years->add(j);
  }
  o->set("years", years);
  o->set("total_spent", amount(p.total_spent));
  o->set("total_risk_with_plan", amount(p.total_risk_with_plan));
  o->set("total_risk_without_plan", amount(p.total_risk_without_plan));
  o->set("total_risk_unlimited", amount(p.total_risk_unlimited));
  o->set("unfunded", texts(p.unfunded));
  o->set("not_planned", texts(p.not_planned));
  o->set("method", texts(p.method));
  o->set("assumptions", texts(p.assumptions));
  return o;
}

}  // namespace ferrum::assess
