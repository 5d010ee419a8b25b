#include "daemon/assess/plan_service.h"

#include <Poco/String.h>

#include <map>

#include "daemon/assess/assessment_service.h"
#include "daemon/config/plan_config.h"

namespace ferrum::assess {
namespace {

std::optional<double> number(const std::map<std::string, std::string>& m, const std::string& key) {
  auto it = m.find(key);
  if (it == m.end() || it->second.empty()) return std::nullopt;
  return std::stod(it->second);  // checked when the configuration was loaded
}

bool class_cost_given(const config::SiteConfig& c, int cls) {
  return number(c.costs, "cost_per_mva_class" + std::to_string(cls)).has_value();
}

}  // namespace

PlanSettings plan_settings_from_config(const config::SiteConfig& config) {
  PlanSettings s;
  auto& c = s.costs;
  if (auto it = config.costs.find("currency"); it != config.costs.end()) c.currency = it->second;
  c.class1_max_kv = number(config.costs, "class1_max_kv").value_or(c.class1_max_kv);
  c.class2_max_kv = number(config.costs, "class2_max_kv").value_or(c.class2_max_kv);
  for (int i = 0; i < 3; ++i) c.cost_per_mva[i] = number(config.costs, "cost_per_mva_class" + std::to_string(i + 1)).value_or(0);
  c.fixed_replacement_cost = number(config.costs, "fixed_replacement_cost").value_or(c.fixed_replacement_cost);
  c.refurbishment_fraction = number(config.costs, "refurbishment_fraction").value_or(c.refurbishment_fraction);

  auto& o = s.options;
  if (auto b = number(config.plan, "budget_per_year")) {
    o.budget_per_year = *b;
    s.budget_configured = true;
  }
  o.horizon_years = static_cast<int>(number(config.plan, "horizon_years").value_or(o.horizon_years));
  if (auto y = number(config.plan, "start_year")) o.start_year = static_cast<int>(*y);
  if (auto it = config.plan.find("carry_over"); it != config.plan.end()) o.carry_over = Poco::toLower(it->second) == "yes";
  o.refurbishment_years = number(config.plan, "refurbishment_years").value_or(o.refurbishment_years);
  // The same ageing model as remaining life, the same PoF as the ranking.
  const auto life = options_from_config(config, nullptr).life;
  o.hi_new = life.hi_new;
  o.hi_end_of_life = life.hi_end_of_life;
  o.expected_life_years = life.expected_life_years;
  o.max_rate_multiple = life.max_rate_multiple;
  o.min_rate_multiple = life.min_rate_multiple;
  const auto ranking = ranking_options_from_config(config);
  o.pof_as_new = ranking.pof_as_new;
  o.pof_at_zero = ranking.pof_at_zero;
  return s;
}

std::vector<analytics::PlanUnit> plan_units(const analytics::FleetRanking& ranking,
                                            const std::vector<analytics::UnitInfo>& register_units) {
  std::map<std::string, const analytics::UnitInfo*> by_id;
  for (const auto& u : register_units) by_id[u.unit_id] = &u;
  std::vector<analytics::PlanUnit> out;
  for (const auto& r : ranking.units) {
    analytics::PlanUnit p;
    p.unit_id = r.unit_id;
    p.site = r.site;
    p.rated_mva = r.rated_mva;
    p.health_index = r.health_index;
    p.remaining_life_years = r.remaining_life_years;
    p.beyond_horizon = r.beyond_horizon;
    p.action = r.recommended_action;
    p.action_year = r.action_year;
    p.treats_paper = r.treats_paper;
    p.consequence = r.consequence;
    if (auto it = by_id.find(r.unit_id); it != by_id.end()) {
      p.hv_kv = it->second->hv_kv;
      p.replacement_cost = it->second->replacement_cost;
      p.refurbishment_cost = it->second->refurbishment_cost;
    }
    out.push_back(std::move(p));
  }
  return out;
}

std::vector<std::string> missing_costs(const std::vector<analytics::PlanUnit>& units, const config::SiteConfig& config) {
  const auto costs = plan_settings_from_config(config).costs;
  std::map<int, std::vector<std::string>> by_class;
  for (const auto& u : units) {
    const bool candidate = u.action == "replace" || u.action == "refurbish" || (u.remaining_life_years && !u.beyond_horizon);
    if (!u.health_index || u.replacement_cost || !candidate) continue;
    const int cls = analytics::voltage_class(u.hv_kv, costs);
    if (!class_cost_given(config, cls)) by_class[cls].push_back(u.unit_id);
  }
  std::vector<std::string> out;
  for (const auto& [cls, ids] : by_class) {
    std::string list;
    for (const auto& id : ids) list += (list.empty() ? "" : ", ") + id;
    out.push_back("costs.cost_per_mva_class" + std::to_string(cls) + " is not set and " + list +
                  (ids.size() == 1 ? " has" : " have") + " no replacement_cost in the register");
  }
  return out;
}

std::optional<analytics::FleetPlan> make_plan(const std::vector<analytics::PlanUnit>& units, analytics::Day as_of,
                                              const config::SiteConfig& config, std::optional<double> budget,
                                              std::optional<int> horizon_years, std::string* why) {
  const auto missing = missing_costs(units, config);
  if (!missing.empty()) {
    if (why) {
      why->clear();
      for (const auto& m : missing) *why += (why->empty() ? "" : "; ") + m;
    }
    return std::nullopt;
  }
  auto s = plan_settings_from_config(config);
  if (budget) s.options.budget_per_year = *budget;
  if (horizon_years) s.options.horizon_years = *horizon_years;
  return analytics::plan_fleet(units, as_of, s.costs, s.options);
}

}  // namespace ferrum::assess
