#include "daemon/config/plan_config.h"

#include <Poco/Format.h>
#include <Poco/String.h>

#include "daemon/config/site_config.h"

namespace ferrum::config {

const std::vector<PlanKey>& plan_keys() {
  static const std::vector<PlanKey> k = {
      {"costs", "currency", "", "Costs of the ten-year plan (ferrum plan, fleet report). The currency is a label\n"
                                 "printed beside amounts; ferrum never converts it.", PlanKey::label, 0, 0},
      {"costs", "class1_max_kv", "72.5", "HV voltage classes (kV line-to-line): class 1 up to class1_max_kv, class 2 up to\n"
                                         "class2_max_kv, class 3 above. A bound belongs to the lower class.", PlanKey::number, 0, 2000},
      {"costs", "class2_max_kv", "170", "", PlanKey::number, 0, 2000},
      {"costs", "cost_per_mva_class1", "", "Replacement cost per rated MVA of each class (empty: not configured; units of\n"
                                           "that class then need their own replacement_cost in the register).", PlanKey::number, 0, 1e12},
      {"costs", "cost_per_mva_class2", "", "", PlanKey::number, 0, 1e12},
      {"costs", "cost_per_mva_class3", "", "", PlanKey::number, 0, 1e12},
      {"costs", "fixed_replacement_cost", "0", "Fixed cost added to every replacement (civil works, outage).", PlanKey::number, 0, 1e12},
      {"costs", "refurbishment_fraction", "0.25", "Refurbishment cost as a fraction of the unit's replacement cost (ferrum default).",
       PlanKey::number, 0, 1},
      {"plan", "budget_per_year", "", "Money per year for replacements and refurbishments. Empty: no plan in the fleet\n"
                                      "report; ferrum plan then needs --budget.", PlanKey::number, 0, 1e15},
      {"plan", "horizon_years", "10", "Years the plan covers.", PlanKey::whole, 1, 50},
      {"plan", "start_year", "", "First year of the plan (empty: the year of the assessment day).", PlanKey::whole, 1900, 2200},
      {"plan", "carry_over", "no", "yes: money not spent in a year adds to the next year's budget.", PlanKey::yes_no, 0, 0},
      {"plan", "refurbishment_years", "10", "Years a refurbishment takes a unit back along its ageing curve (ferrum default).",
       PlanKey::number, 0, 60},
  };
  return k;
}

void check_plan_key(const PlanKey& key, const std::string& value) {
  const std::string name = std::string(key.section) + "." + key.name;
  if (value.empty() || key.kind == PlanKey::label) return;
  if (key.kind == PlanKey::yes_no) {
    const std::string v = Poco::toLower(value);
    if (v != "yes" && v != "no") throw ConfigError(name + ": '" + value + "' must be yes or no");
    return;
  }
  std::size_t pos = 0;
  double v = 0;
  try {
    v = std::stod(value, &pos);
  } catch (const std::exception&) {
    pos = 0;
  }
  if (pos == 0 || pos != value.size() || !(v >= key.lo && v <= key.hi) ||
      (key.kind == PlanKey::whole && v != static_cast<double>(static_cast<long long>(v))))
    throw ConfigError(name + ": '" + value + "' must be a " + (key.kind == PlanKey::whole ? "whole number" : "number") +
                      " from " + Poco::format("%g", key.lo) + " to " + Poco::format("%g", key.hi));
}

bool plan_configured(const SiteConfig& c) {
  auto it = c.plan.find("budget_per_year");
  return it != c.plan.end() && !it->second.empty();
}

}  // namespace ferrum::config
