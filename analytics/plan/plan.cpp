#include "analytics/plan/plan.h"

#include <algorithm>
#include <cmath>
#include <sstream>

namespace ferrum::analytics {
namespace {

std::string num(double v, int decimals) {
  std::ostringstream o;
  o.setf(std::ios::fixed);
  o.precision(decimals);
  o << v;
  return o.str();
}

double expected_rate(const PlanOptions& o) { return std::log(o.hi_end_of_life / o.hi_new) / o.expected_life_years; }

// One unit's state in one simulation.
struct Sim {
  const PlanUnit* unit = nullptr;
  double hi0 = 0;          // index at t0
  double t0 = 0;           // years after as_of
  double rate = 0;         // B
  int candidate_from = 0;  // first year as a candidate; 0: never
  std::string action;      // "replace" or "refurbish"
  bool done = false;
  double hi_at(double t) const { return hi0 * std::exp(rate * (t - t0)); }
};

struct Run {
  std::vector<PlanYear> years;
  std::vector<std::string> unfunded;
};

// One pass over the horizon with a yearly budget (infinity: unlimited; 0: none).
Run simulate(std::vector<Sim> sims, int as_of_year, const CostOptions& costs, const PlanOptions& o, double budget) {
  Run run;
  double leftover = 0;
  for (int k = 0; k < o.horizon_years; ++k) {
    PlanYear py;
    py.year = *o.start_year + k;
    const double t = py.year - as_of_year;
    py.budget = budget + (o.carry_over ? leftover : 0);
    struct Option {
      Sim* sim;
      double cost, hi_now, risk_now, hi_after, risk_after, ratio;
    };
    std::vector<Option> options;
    for (auto& s : sims) {
      if (s.done || s.candidate_from == 0 || s.candidate_from > py.year) continue;
      Option op{&s, 0, s.hi_at(t), 0, 0, 0, 0};
      const double hi = op.hi_now;
      op.risk_now = plan_risk(hi, s.unit->consequence, o);
      const bool replace = s.action == "replace";
      op.cost = replace ? replacement_cost(*s.unit, costs) : refurbishment_cost(*s.unit, costs);
      // Not capped here: the risk reads the index capped at 100, and an uncapped
      // state keeps the unit on its own curve (refurbishing earlier is never worse).
      op.hi_after = replace ? o.hi_new : hi * std::exp(-s.rate * o.refurbishment_years);
      op.risk_after = plan_risk(op.hi_after, s.unit->consequence, o);
      op.ratio = op.cost > 0 ? (op.risk_now - op.risk_after) / op.cost : std::numeric_limits<double>::infinity();
      options.push_back(op);
    }
    std::sort(options.begin(), options.end(), [](const Option& a, const Option& b) {
      if (a.ratio != b.ratio) return a.ratio > b.ratio;
      if (a.risk_now != b.risk_now) return a.risk_now > b.risk_now;
      return a.sim->unit->unit_id < b.sim->unit->unit_id;
    });
    double remaining = py.budget;
    for (auto& op : options) {
      Sim& s = *op.sim;
      if (op.cost <= remaining) {
        remaining -= op.cost;
        py.spent += op.cost;
        py.funded.push_back({s.unit->unit_id, s.unit->site, s.action, op.cost, s.unit->rated_mva, op.risk_now,
                             op.risk_after, py.year - s.candidate_from, std::min(op.hi_now, o.hi_new), std::min(op.hi_after, o.hi_new)});
        if (s.action == "replace") s.rate = expected_rate(o);
        s.hi0 = op.hi_after;
        s.t0 = t;
        s.done = true;
      } else {
        py.deferred.push_back({s.unit->unit_id, s.unit->site, s.action, op.cost, op.risk_now});
      }
    }
    leftover = py.budget - py.spent;
    for (const auto& s : sims)
      if (s.unit->health_index) py.risk_with_plan += plan_risk(s.hi_at(t), s.unit->consequence, o);
    run.years.push_back(std::move(py));
  }
  for (const auto& s : sims)
    if (!s.done && s.candidate_from != 0 && s.candidate_from < *o.start_year + o.horizon_years)
      run.unfunded.push_back(s.unit->unit_id);
  return run;
}

}  // namespace

int voltage_class(double hv_kv, const CostOptions& c) {
  if (hv_kv <= c.class1_max_kv) return 1;
  if (hv_kv <= c.class2_max_kv) return 2;
  return 3;
}

double replacement_cost(const PlanUnit& u, const CostOptions& c) {
  if (u.replacement_cost) return *u.replacement_cost;
  return c.cost_per_mva[voltage_class(u.hv_kv, c) - 1] * std::max(u.rated_mva, 0.0) + c.fixed_replacement_cost;
}

double refurbishment_cost(const PlanUnit& u, const CostOptions& c) {
  if (u.refurbishment_cost) return *u.refurbishment_cost;
  return c.refurbishment_fraction * replacement_cost(u, c);
}

double plan_risk(double hi, double consequence, const PlanOptions& o) {
  const double h = std::clamp(hi, 0.0, 100.0);
  return o.pof_as_new * std::pow(o.pof_at_zero / o.pof_as_new, (100 - h) / 100) * 1000 * consequence;
}

double ageing_rate(const PlanUnit& u, const PlanOptions& o) {
  const double expected = expected_rate(o);  // < 0
  const double fastest = o.max_rate_multiple * expected, slowest = o.min_rate_multiple * expected;
  if (!u.health_index) return expected;
  if (*u.health_index <= o.hi_end_of_life) return fastest;
  if (!u.remaining_life_years || u.beyond_horizon) return expected;
  if (*u.remaining_life_years <= 0) return fastest;
  const double own = std::log(o.hi_end_of_life / *u.health_index) / *u.remaining_life_years;
  return std::clamp(own, fastest, slowest);
}

FleetPlan plan_fleet(const std::vector<PlanUnit>& units, Day as_of, const CostOptions& costs, const PlanOptions& in) {
  PlanOptions o = in;
  const int as_of_year = civil_from_days(as_of).year;
  if (!o.start_year) o.start_year = as_of_year;
  o.horizon_years = std::max(o.horizon_years, 1);
  const int end_year = *o.start_year + o.horizon_years;  // exclusive

  FleetPlan plan;
  plan.as_of = as_of;
  plan.currency = costs.currency;
  plan.budget_per_year = o.budget_per_year;
  plan.carry_over = o.carry_over;
  plan.start_year = *o.start_year;
  plan.horizon_years = o.horizon_years;

  std::vector<Sim> sims;
  for (const auto& u : units) {
    if (!u.health_index) {
      plan.not_planned.push_back(u.unit_id + ": no health index, so no risk to plan on");
      continue;
    }
    Sim s;
    s.unit = &u;
    s.hi0 = *u.health_index;
    s.rate = ageing_rate(u, o);
    if (u.action == "replace" || u.action == "refurbish") {
      s.action = u.action;
      s.candidate_from = std::max(*o.start_year, u.action_year.value_or(*o.start_year));
    } else if (u.remaining_life_years && !u.beyond_horizon) {
      const int ends = as_of_year + static_cast<int>(std::floor(std::max(*u.remaining_life_years, 0.0)));
      if (ends < end_year) {
        s.action = "replace";
        s.candidate_from = std::max(*o.start_year, ends);
      }
    }
    if (s.candidate_from >= end_year) s.candidate_from = 0;  // due after the horizon
    sims.push_back(s);
  }

  Run with = simulate(sims, as_of_year, costs, o, o.budget_per_year);
  const Run unlimited = simulate(sims, as_of_year, costs, o, std::numeric_limits<double>::infinity());
  for (std::size_t k = 0; k < with.years.size(); ++k) {
    // "Without any plan": no intervention at all, every unit ages.
    double none_risk = 0;
    for (const auto& s : sims) none_risk += plan_risk(s.hi_at(with.years[k].year - as_of_year), s.unit->consequence, o);
    with.years[k].risk_without_plan = none_risk;
    with.years[k].risk_unlimited = unlimited.years[k].risk_with_plan;
    plan.total_spent += with.years[k].spent;
    plan.total_risk_with_plan += with.years[k].risk_with_plan;
    plan.total_risk_without_plan += none_risk;
    plan.total_risk_unlimited += with.years[k].risk_unlimited;
  }
  plan.years = std::move(with.years);
  plan.unfunded = std::move(with.unfunded);

  plan.method = {
      "risk = probability of failure from the health index (as in the fleet ranking) x 1,000 x consequence: failures "
      "per 1,000 unit-years x consequence; risk-based prioritisation as in CIGRE TB 761 (2019) (from memory; verify)",
      "candidates: units whose recommended action is replace or refurbish, from the year of that action, and units "
      "whose remaining life ends within the horizon, from the year it ends (as replacements)",
      "each year the candidates are funded in order of the risk they remove that year per unit of money until the "
      "year's budget is spent; a candidate that does not fit waits and a cheaper one may still be funded" +
          std::string(o.carry_over ? "; unspent money carries over" : "; unspent money does not carry over"),
      "ageing: HI(t) = HI0 e^(B t), the exponential ageing of the remaining-life condition estimate (CNAIM-style "
      "ageing curve, from memory; verify), B bringing the index to " + num(o.hi_end_of_life, 0) +
          " at the end of the unit's remaining life, limited to " + num(o.min_rate_multiple, 1) + "-" +
          num(o.max_rate_multiple, 1) + " x the expected rate (expected life " + num(o.expected_life_years, 0) +
          " years)",
  };
  plan.assumptions = {
      "a replaced unit starts again at index " + num(o.hi_new, 0) + " and ages at the expected rate",
      "a refurbished unit goes back " + num(o.refurbishment_years, 0) +
          " years along its own ageing curve (ferrum default, common practice, no published source) and keeps its rate",
      "interventions take effect at the start of the year they are funded; one intervention per unit within the horizon",
      "costs are today's, without inflation or discounting; the currency is a label, never converted",
      "the consequence of a unit does not change over the horizon",
  };
  return plan;
}

}  // namespace ferrum::analytics
