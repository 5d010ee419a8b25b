#include "analytics/plan/plan.h"

#include <algorithm>
#include <cmath>
#include <map>
#include <optional>
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

// Money is counted in whole hundredths of the currency unit, so that equal
// costs are exactly equal and the budget a decision changes at is exact.
using Cents = long long;
constexpr Cents kNoChange = std::numeric_limits<Cents>::max();
Cents to_cents(double money) { return static_cast<Cents>(std::llround(std::max(money, 0.0) * 100)); }
double from_cents(Cents c) { return static_cast<double>(c) / 100; }

// One unit over the horizon, the same for every budget: its index and risk in
// each year if it is left alone ("old") and if it has had its intervention by
// then ("after"). "After" does not depend on the year of the intervention: a
// replaced unit stays as new; a refurbished unit is its own curve shifted back
// refurbishment_years (uncapped state, risk read at most at hi_new). So an
// earlier intervention never leaves more risk in any year than a later one.
struct Track {
  const PlanUnit* unit = nullptr;
  std::string action;  // "replace" or "refurbish"; empty: not a candidate
  int first = -1;      // index of the first year as a candidate; -1: never within the horizon
  Cents cost = 0;
  std::vector<double> hi_old, risk_old, hi_after, risk_after;
};

// What every allocation shares, computed once per plan: each year's
// candidates in funding order, the groups of candidates with equal cost, and
// what funding a unit from a year on removes from the summed risk.
struct Prepared {
  std::vector<std::vector<int>> order;                  // per year: track indices, funding order
  std::vector<std::vector<std::vector<int>>> same_cost;  // per year: positions in order of equal cost, riskier first
  std::vector<std::vector<double>> gain;                // per track: sum over years >= k of (after - old); [years] = 0
  double none_total = 0;                                // fleet risk summed over the years without any intervention
};

// Candidates of a year in order of risk removed per unit of money (equal:
// riskier first, then unit_id).
Prepared prepare(const std::vector<Track>& tracks, int years) {
  Prepared p;
  p.order.resize(years);
  p.same_cost.resize(years);
  for (int k = 0; k < years; ++k) {
    struct Key {
      int i;
      double ratio, risk;
    };
    std::vector<Key> keys;
    for (std::size_t i = 0; i < tracks.size(); ++i) {
      const Track& t = tracks[i];
      if (t.first == -1 || t.first > k) continue;
      const double removed = t.risk_old[k] - t.risk_after[k];
      keys.push_back({static_cast<int>(i), t.cost > 0 ? removed / static_cast<double>(t.cost) : std::numeric_limits<double>::infinity(),
                      t.risk_old[k]});
    }
    std::sort(keys.begin(), keys.end(), [&](const Key& a, const Key& b) {
      if (a.ratio != b.ratio) return a.ratio > b.ratio;
      if (a.risk != b.risk) return a.risk > b.risk;
      return tracks[a.i].unit->unit_id < tracks[b.i].unit->unit_id;
    });
    std::map<Cents, std::vector<int>> by_cost;
    for (std::size_t j = 0; j < keys.size(); ++j) {
      p.order[k].push_back(keys[j].i);
      by_cost[tracks[keys[j].i].cost].push_back(static_cast<int>(j));
    }
    for (auto& [cost, positions] : by_cost) {
      if (positions.size() < 2) continue;
      std::stable_sort(positions.begin(), positions.end(),
                       [&](int a, int b) { return keys[a].risk > keys[b].risk; });  // ties: funding order
      p.same_cost[k].push_back(positions);
    }
  }
  for (const auto& t : tracks) {
    std::vector<double> g(years + 1, 0);
    for (int k = years - 1; k >= 0; --k) g[k] = g[k + 1] + (t.risk_after[k] - t.risk_old[k]);
    p.gain.push_back(std::move(g));
    for (int k = 0; k < years; ++k) p.none_total += t.risk_old[k];
  }
  return p;
}

// Who is funded in which year under one budget.
struct Outcome {
  std::vector<int> funded_in;                      // per track: year index, -1 never
  std::vector<std::vector<int>> funded, deferred;  // per year: track indices, funded in funding order
  std::vector<Cents> spent;                        // per year
  std::vector<Cents> year_next;                    // per year: smallest budget increase that changes a decision
  double total = 0;                                // fleet risk summed over the years
  Cents next = kNoChange;                          // smallest of year_next
  int next_year = 0;                               // the first year whose decisions change at budget + next
};

// The yearly allocation under a budget of `budget` cents a year (unlimited:
// every candidate is funded). The candidates of the year are taken in funding
// order; each is funded if it fits in the money left, else deferred, and the
// next, cheaper one may still fit. Then, among candidates of equal cost, the
// riskier ones take the funded places (the spending is unchanged).
// With `from_budget` (a smaller budget), `out` holds that budget's
// allocation, whose decisions before out.next_year stay the same up to
// from_budget + out.next: only the years from there on are allocated again.
void allocate_into(Outcome& out, const std::vector<Track>& tracks, const Prepared& prep, int years, Cents budget,
                   bool unlimited, bool carry_over, Cents all_costs, std::optional<Cents> from_budget) {
  int start = 0;
  if (from_budget) {
    start = out.next_year;
    for (auto& y : out.funded_in)
      if (y >= start) y = -1;
    for (int k = 0; k < start; ++k)
      if (out.year_next[k] != kNoChange) out.year_next[k] -= budget - *from_budget;
  } else {
    out.funded_in.assign(tracks.size(), -1);
    out.funded.resize(years);
    out.deferred.resize(years);
    out.spent.assign(years, 0);
    out.year_next.assign(years, kNoChange);
  }
  // Money carried into the first year allocated (more than all_costs funds
  // everything, so it is kept at that: no overflow).
  Cents leftover = 0;
  if (carry_over && !unlimited)
    for (int k = 0; k < start; ++k) leftover = std::min(leftover + budget - out.spent[k], all_costs);
  std::vector<char> fund;
  for (int k = start; k < years; ++k) {
    out.funded[k].clear();
    out.deferred[k].clear();
    out.spent[k] = 0;
    out.year_next[k] = kNoChange;
    const auto& order = prep.order[k];
    const Cents available = std::min(budget + (carry_over ? leftover : 0), all_costs);
    Cents remaining = available;
    fund.assign(order.size(), 0);
    for (std::size_t j = 0; j < order.size(); ++j) {
      const int i = order[j];
      if (out.funded_in[i] != -1) continue;
      const Cents cost = tracks[i].cost;
      if (unlimited || cost <= remaining) {
        fund[j] = 1;
        remaining -= unlimited ? 0 : cost;
      } else {
        // With carry-over the money of year k grows by k + 1 times a budget increase.
        const Cents per = carry_over ? k + 1 : 1;
        out.year_next[k] = std::min(out.year_next[k], (cost - remaining + per - 1) / per);
      }
    }
    // Equal cost: the riskier takes the place. Same costs in the same places,
    // so every other decision of the year is the same.
    for (const auto& group : prep.same_cost[k]) {
      std::size_t funded = 0;
      for (int j : group) funded += fund[j];
      std::size_t r = 0;
      for (int j : group)
        if (out.funded_in[order[j]] == -1) fund[j] = r++ < funded ? 1 : 0;
    }
    for (std::size_t j = 0; j < order.size(); ++j) {
      const int i = order[j];
      if (out.funded_in[i] != -1) continue;
      if (fund[j]) {
        out.funded[k].push_back(i);
        out.spent[k] += tracks[i].cost;
      } else {
        out.deferred[k].push_back(i);
      }
    }
    for (int i : out.funded[k]) out.funded_in[i] = k;
    leftover = unlimited ? 0 : available - out.spent[k];
  }
  out.next = kNoChange;
  for (int k = 0; k < years; ++k)
    if (out.year_next[k] < out.next) {
      out.next = out.year_next[k];
      out.next_year = k;
    }
  out.total = prep.none_total;
  for (std::size_t i = 0; i < tracks.size(); ++i)
    if (out.funded_in[i] != -1) out.total += prep.gain[i][out.funded_in[i]];
}

Outcome allocate(const std::vector<Track>& tracks, const Prepared& prep, int years, Cents budget, bool unlimited,
                 bool carry_over, Cents all_costs) {
  Outcome out;
  allocate_into(out, tracks, prep, years, budget, unlimited, carry_over, all_costs, std::nullopt);
  return out;
}

// Fleet risk in year k under an outcome.
double year_risk(const std::vector<Track>& tracks, const Outcome& o, int k) {
  double r = 0;
  for (std::size_t i = 0; i < tracks.size(); ++i)
    r += (o.funded_in[i] != -1 && o.funded_in[i] <= k) ? tracks[i].risk_after[k] : tracks[i].risk_old[k];
  return r;
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

std::string plan_title(int horizon_years) {
  static const char* const words[] = {"One",   "Two",   "Three", "Four",   "Five",   "Six",    "Seven",
                                      "Eight", "Nine",  "Ten",   "Eleven", "Twelve", "Thirteen", "Fourteen",
                                      "Fifteen", "Sixteen", "Seventeen", "Eighteen", "Nineteen", "Twenty"};
  if (horizon_years >= 1 && horizon_years <= 20) return std::string(words[horizon_years - 1]) + "-year plan";
  return std::to_string(horizon_years) + "-year plan";
}

FleetPlan plan_fleet(const std::vector<PlanUnit>& units, Day as_of, const CostOptions& costs, const PlanOptions& in) {
  PlanOptions o = in;
  const int as_of_year = civil_from_days(as_of).year;
  if (!o.start_year) o.start_year = as_of_year;
  o.horizon_years = std::max(o.horizon_years, 1);
  const int years = o.horizon_years;
  const int end_year = *o.start_year + years;  // exclusive

  FleetPlan plan;
  plan.as_of = as_of;
  plan.currency = costs.currency;
  plan.budget_per_year = o.budget_per_year;
  plan.allocation_budget = o.budget_per_year;
  plan.carry_over = o.carry_over;
  plan.start_year = *o.start_year;
  plan.horizon_years = years;

  std::vector<Track> tracks;
  Cents all_costs = 0;  // every candidate's cost: a budget this large funds each in its first year
  for (const auto& u : units) {
    if (!u.health_index) {
      plan.not_planned.push_back(u.unit_id + ": no health index, so no risk to plan on");
      continue;
    }
    Track t;
    t.unit = &u;
    int from = 0;
    if (u.action == "replace" || (u.action == "refurbish" && u.treats_paper)) {
      t.action = u.action;
      from = std::max(*o.start_year, u.action_year.value_or(*o.start_year));
    } else if (u.remaining_life_years && !u.beyond_horizon) {
      const int ends = as_of_year + static_cast<int>(std::floor(std::max(*u.remaining_life_years, 0.0)));
      if (ends < end_year) {
        t.action = "replace";
        from = std::max(*o.start_year, ends);
      }
    }
    if (t.action.empty() && u.action == "refurbish")
      plan.not_planned.push_back(u.unit_id + ": its refurbishment treats the oil only, which is maintenance, not an "
                                             "intervention of this plan (its risk is counted as it is)");
    if (!t.action.empty() && from < end_year) {
      t.first = from - *o.start_year;
      t.cost = to_cents(t.action == "replace" ? replacement_cost(u, costs) : refurbishment_cost(u, costs));
      all_costs += t.cost;
    }
    const double rate = ageing_rate(u, o);
    for (int k = 0; k < years; ++k) {
      const double hi = *u.health_index * std::exp(rate * (*o.start_year + k - as_of_year));
      const double after = t.action == "replace" ? o.hi_new : hi * std::exp(-rate * o.refurbishment_years);
      t.hi_old.push_back(hi);
      t.risk_old.push_back(plan_risk(hi, u.consequence, o));
      t.hi_after.push_back(after);
      t.risk_after.push_back(plan_risk(after, u.consequence, o));
    }
    tracks.push_back(std::move(t));
  }

  const Prepared prep = prepare(tracks, years);
  const Outcome unlimited = allocate(tracks, prep, years, 0, true, o.carry_over, all_costs);
  const bool finite = std::isfinite(o.budget_per_year);
  // A budget at least all_costs funds every candidate in its first year.
  const Cents budget = finite ? static_cast<Cents>(std::floor(std::min(std::max(o.budget_per_year, 0.0) * 100,
                                                                      static_cast<double>(all_costs))))
                              : all_costs;
  Outcome chosen = finite ? allocate(tracks, prep, years, budget, false, o.carry_over, all_costs) : unlimited;
  Cents chosen_budget = budget;
  if (finite && chosen.total > unlimited.total) {
    // A larger budget never leaves more total risk: the allocation changes
    // only at the budgets where some candidate starts to fit, so every
    // allocation a smaller budget makes is one of those met on the way up
    // from 0. Each is affordable within this budget; the one leaving the least
    // total risk is kept (this budget's own on a tie).
    Outcome smaller = allocate(tracks, prep, years, 0, false, o.carry_over, all_costs);
    for (Cents b = 0;;) {
      if (smaller.total < chosen.total) {
        chosen = smaller;
        chosen_budget = b;
      }
      if (!(chosen.total > unlimited.total) || smaller.next == kNoChange || smaller.next >= budget - b) break;
      const Cents step = smaller.next;
      allocate_into(smaller, tracks, prep, years, b + step, false, o.carry_over, all_costs, b);
      b += step;
    }
  }
  if (chosen_budget != budget) plan.allocation_budget = from_cents(chosen_budget);

  // Money available each year under the plan's own budget.
  const bool exact = finite && o.budget_per_year * 100 <= 1e17;  // config allows at most 1e15
  const Cents full = exact ? static_cast<Cents>(std::floor(o.budget_per_year * 100)) : 0;
  Cents leftover = 0;
  for (int k = 0; k < years; ++k) {
    PlanYear py;
    py.year = *o.start_year + k;
    const Cents available = full + (o.carry_over ? leftover : 0);
    py.budget = !finite ? std::numeric_limits<double>::infinity() : exact ? from_cents(available) : o.budget_per_year;
    leftover = available - chosen.spent[k];
    py.spent = from_cents(chosen.spent[k]);
    for (int i : chosen.funded[k]) {
      const Track& t = tracks[i];
      py.funded.push_back({t.unit->unit_id, t.unit->site, t.action, from_cents(t.cost), t.unit->rated_mva, t.risk_old[k],
                           t.risk_after[k], k - t.first, std::min(t.hi_old[k], o.hi_new), std::min(t.hi_after[k], o.hi_new)});
    }
    for (int i : chosen.deferred[k]) {
      const Track& t = tracks[i];
      py.deferred.push_back({t.unit->unit_id, t.unit->site, t.action, from_cents(t.cost), t.risk_old[k]});
    }
    for (const auto& t : tracks) py.risk_without_plan += t.risk_old[k];
    py.risk_with_plan = year_risk(tracks, chosen, k);
    py.risk_unlimited = year_risk(tracks, unlimited, k);
    plan.total_spent += py.spent;
    plan.total_risk_with_plan += py.risk_with_plan;
    plan.total_risk_without_plan += py.risk_without_plan;
    plan.total_risk_unlimited += py.risk_unlimited;
    plan.years.push_back(std::move(py));
  }
  plan.total_risk_with_plan = chosen.total;  // the sums the allocations compared
  plan.total_risk_unlimited = unlimited.total;
  for (std::size_t i = 0; i < tracks.size(); ++i)
    if (tracks[i].first != -1 && chosen.funded_in[i] == -1) plan.unfunded.push_back(tracks[i].unit->unit_id);

  plan.method = {
      "risk = probability of failure from the health index (as in the fleet ranking) x 1,000 x consequence: failures "
      "per 1,000 unit-years x consequence; risk-based prioritisation as in CIGRE TB 761 (2019) (from memory; verify)",
      "candidates: units whose recommended action is replace, or refurbish by drying out the paper, from the year of "
      "that action (for a replacement, the year it can be in service after the procurement lead time), and any other "
      "unit whose remaining life ends within the horizon, from the year it ends (as a replacement); repairs, "
      "investigations, monitoring and oil treatments (drying or reclaiming the oil, which restore the oil and not "
      "the paper) are maintenance, not in the plan, and their units' risk is counted as it is",
      "each year the candidates are funded in order of the risk they remove that year per unit of money until the "
      "year's budget is spent; a candidate that does not fit waits and a cheaper one may still be funded; of two "
      "candidates with the same cost the riskier is funded first" +
          std::string(o.carry_over ? "; unspent money carries over" : "; unspent money does not carry over"),
      "a larger budget never leaves more total risk: when the allocation of a smaller budget leaves less risk summed "
      "over the years (funding one dear unit first can crowd out several cheaper ones), the plan follows that "
      "allocation, which the larger budget also affords",
      "ageing: HI(t) = HI0 e^(B t), the exponential ageing of the remaining-life condition estimate (CNAIM-style "
      "ageing curve, from memory; verify), B bringing the index to " + num(o.hi_end_of_life, 0) +
          " at the end of the unit's remaining life, limited to " + num(o.min_rate_multiple, 1) + "-" +
          num(o.max_rate_multiple, 1) + " x the expected rate (expected life " + num(o.expected_life_years, 0) +
          " years); a deferred unit keeps ageing, so its risk rises year by year",
  };
  if (plan.allocation_budget < plan.budget_per_year)
    plan.method.push_back("this budget follows the allocation of " + num(plan.allocation_budget, 0) + " " + costs.currency +
                          " a year, which leaves less total risk than funding in strict order within the full budget");
  plan.assumptions = {
      "a replaced unit starts again at index " + num(o.hi_new, 0) +
          " and stays as new for the rest of the horizon (probability of failure as new; CNAIM keeps the probability "
          "of failure flat until the health score reaches 4, which a new asset does after about 87 % of its expected "
          "life, from memory; verify)",
      "a refurbished unit goes back " + num(o.refurbishment_years, 0) +
          " years along its own ageing curve (ferrum default, common practice, no published source) and keeps its rate",
      "interventions take effect at the start of the year they are funded; one intervention per unit within the horizon; "
      "so an intervention funded earlier never leaves more risk in any year than the same one funded later",
      "costs are today's, without inflation or discounting, counted to 1/100 of the currency; the currency is a "
      "label, never converted",
      "the consequence of a unit does not change over the horizon",
  };
  return plan;
}

namespace {

// The plan's interventions by unit, for looking up a fleet's units in one pass.
struct PlanIndex {
  std::map<std::string, std::pair<int, std::string>> funded;  // unit -> (year, action)
  std::vector<std::string> unfunded;                          // sorted
  explicit PlanIndex(const FleetPlan& plan) : unfunded(plan.unfunded) {
    for (const auto& y : plan.years)
      for (const auto& f : y.funded) funded.emplace(f.unit_id, std::make_pair(y.year, f.action));
    std::sort(unfunded.begin(), unfunded.end());
  }
};

PlanSchedule schedule_in(const FleetPlan& plan, const PlanIndex& index, const std::string& unit_id,
                         const std::string& action, bool treats_paper, std::optional<int> action_year) {
  PlanSchedule s;
  // Only the actions the plan funds (plan.h): an oil treatment is maintenance.
  if (action != "replace" && !(action == "refurbish" && treats_paper)) return s;
  s.last_year = plan.start_year + plan.horizon_years - 1;
  // Its first year as a candidate (plan.h: never before the plan's first year).
  const int first = std::max(plan.start_year, action_year.value_or(plan.start_year));
  auto it = index.funded.find(unit_id);
  if (it != index.funded.end() && it->second.second == action) {
    s.year = it->second.first;
    s.state = *s.year > first ? PlanSchedule::State::later : PlanSchedule::State::on_time;
  } else if (std::binary_search(index.unfunded.begin(), index.unfunded.end(), unit_id)) {
    s.state = PlanSchedule::State::unfunded;
  }
  return s;
}

}  // namespace

void apply_plan(FleetRanking& ranking, const FleetPlan& plan) {
  const PlanIndex index(plan);  // one pass over the plan, not one per unit
  for (auto& u : ranking.units)
    u.budget_plan = schedule_in(plan, index, u.unit_id, u.recommended_action, u.treats_paper, u.action_year);
}

}  // namespace ferrum::analytics
