// The manager's plan: which units to replace or refurbish in which year under
// a yearly budget, and how much risk the fleet carries meanwhile.
//
// Method (risk-based prioritisation of interventions and ageing of the
// health index are common practice in asset management: CIGRE TB 761 (2019)
// keeps condition and consequence apart and ranks on risk; the DNO Common
// Network Asset Indices Methodology (CNAIM, Ofgem, v2.1) ages a health score
// exponentially and turns it into a probability of failure. Both from memory;
// verify):
//  * Risk of a unit in a year = PoF(HI) x 1,000 x consequence, "failures per
//    1,000 unit-years x consequence", with PoF and consequence exactly as in
//    the fleet ranking (analytics/fleet_ranking.h).
//  * Ageing: HI(t) = HI0 e^(B t), the exponential form the "condition"
//    remaining-life estimate uses (analytics/remaining_life.h). The unit's
//    rate B is the one that brings its index to the end-of-life index
//    (hi_end_of_life, 30) at the end of its remaining life, limited like the
//    condition estimate to between min_rate_multiple and max_rate_multiple
//    times the expected rate ln(HI_EOL/100) / expected_life_years. Without a
//    remaining life within the life horizon, or already at or below the
//    end-of-life index, the expected rate (resp. the fastest allowed rate).
//  * Candidates: a unit whose recommended action is replace, or refurbish by
//    drying out the paper (Decision::treats_paper), is a candidate from the
//    year of that action (never before the plan's first year). An oil
//    treatment alone restores the oil, not the paper, so it earns no years on
//    the ageing curve: it is maintenance, like a repair. Any other unit whose remaining life ends within the horizon is a
//    replacement candidate from the year its life ends. A candidate stays one
//    until funded. Units without a health index have no risk and are listed
//    as not planned.
//  * Each year, interventions happen at the start of the year. The candidates
//    are ordered by the risk they remove that year per unit of money
//    ((risk now - risk after) / cost; equal ratios: riskier first, then
//    unit_id) and funded in that order while money remains; a candidate that
//    does not fit is deferred and the next, cheaper one may still be funded.
//    Then, among candidates of exactly equal cost, the riskier ones (risk that
//    year) take the funded places: the spending and every other decision stay
//    the same. Unspent money is lost unless carry_over. Deferred units keep
//    ageing. Money is counted in hundredths of the currency unit.
//  * A replaced unit is as new (HI hi_new, PoF pof_as_new) for the rest of the
//    horizon (CNAIM keeps PoF flat until a new asset is about 87 % through its
//    expected life; from memory, verify); a refurbished unit goes back
//    refurbishment_years along its own ageing curve (at most to hi_new) and
//    keeps its rate. One intervention per unit within the horizon. Both make a
//    unit's state after its intervention independent of the year it was
//    funded, so an earlier intervention never leaves more risk in any year.
//  * A larger budget never leaves more total risk. The greedy allocation alone
//    does not ensure it (a larger budget may fund one dear unit that crowds out
//    several cheaper ones, or spend early what a smaller budget carries over).
//    The allocation changes only at the budgets where some deferred candidate
//    starts to fit (exact in hundredths); the plan for budget B takes, of the
//    allocations of all budgets from 0 to B (found by stepping from one such
//    budget to the next), the one leaving the least fleet risk summed over the
//    years (B's own on a tie). Any of them is affordable within B. So for
//    B1 < B2 the allocations B2 chooses among include all those of B1.
//    Cost: one allocation (linear in units x years, the order of each year
//    sorted once) per budget at which a decision flips, the years before the
//    first changed one reused; stops early once an allocation leaves no more
//    than the unlimited budget. Measured once: well under a second for 1,000
//    units over 10 years; about 20 s for 1,000 units over 50 years with
//    carry-over (the worst case tried).
//  * The fleet's risk each year is computed three times: with the plan, with
//    no intervention at all, and with an unlimited budget.
// Guaranteed for every fleet (tests/analytics/plan_test.cpp, randomized):
//  1. spending in a year never exceeds that year's budget (with carry_over:
//     the budget plus what earlier years left);
//  2. in the year a unit is funded, no candidate of that year with the same
//     cost and a higher risk that year is deferred (so of two units with equal
//     cost that are candidates together, the one riskier in the year the
//     other is funded is never funded later);
//  3. for budgets B1 < B2 the plan of B2 leaves no more fleet risk summed over
//     the horizon than that of B1; the unlimited budget leaves the least, and
//     no plan the most (in every year, too, for these two);
//  4. with an unlimited budget every candidate is funded in its first year.
// Costs: replacement = cost per MVA of the unit's HV class x rated MVA + a
// fixed cost per replacement; refurbishment = a fraction of that replacement
// cost. A unit's own costs (register columns) override both. The currency is
// a label, never converted.
// Pure: no I/O, no clock; as_of is an argument.
#pragma once

#include <limits>
#include <optional>
#include <string>
#include <vector>

#include "analytics/assessment.h"
#include "analytics/calendar.h"

namespace ferrum::analytics {

struct CostOptions {
  std::string currency;                   // label only
  // HV voltage classes: class 1 up to class1_max_kv, class 2 up to
  // class2_max_kv, class 3 above (kV line-to-line).
  double class1_max_kv = 72.5;
  double class2_max_kv = 170;
  double cost_per_mva[3] = {0, 0, 0};     // replacement cost per rated MVA of each class
  double refurbishment_fraction = 0.25;   // refurbishment cost / replacement cost (ferrum default)
  double fixed_replacement_cost = 0;      // civil works, outage, per replacement
};

struct PlanOptions {
  double budget_per_year = std::numeric_limits<double>::infinity();  // infinity: unlimited
  int horizon_years = 10;
  std::optional<int> start_year;          // default: the year of as_of
  bool carry_over = false;                // unspent money adds to next year's budget
  // A refurbishment takes the unit back this many years along its own ageing
  // curve (at most to hi_new): HI' = HI e^(-B years). ferrum default, common
  // practice (life extension of a dry-out or overhaul), no published source.
  double refurbishment_years = 10;
  // The ageing model of remaining life (RemainingLifeOptions) and the PoF of
  // the ranking (RankingOptions): daemon/assess fills them from the same keys.
  double hi_new = 100;
  double hi_end_of_life = 30;
  double expected_life_years = 60;
  double max_rate_multiple = 2.0;
  double min_rate_multiple = 0.5;
  double pof_as_new = 0.002;
  double pof_at_zero = 0.2;
};

// What the plan needs of one assessed unit (from the fleet ranking).
struct PlanUnit {
  std::string unit_id, site;
  double rated_mva = 0;
  double hv_kv = 0;
  std::optional<double> health_index;
  std::optional<double> remaining_life_years;
  bool beyond_horizon = false;            // remaining life more than the life horizon
  std::string action;                     // Decision::action
  bool treats_paper = false;              // Decision::treats_paper: a refurbishment that dries out the paper
  std::optional<int> action_year;
  double consequence = 0;                 // 0..1, from the ranking
  std::optional<double> replacement_cost;    // the unit's own, overrides the classes
  std::optional<double> refurbishment_cost;  // the unit's own, overrides the fraction
};

struct PlannedIntervention {
  std::string unit_id, site, action;      // action: "replace" or "refurbish"
  double cost = 0, rated_mva = 0;
  double risk_before = 0, risk_after = 0; // that year, failures per 1,000 unit-years x consequence
  int deferred_years = 0;                 // years it waited as a candidate
  double hi_before = 0, hi_after = 0;     // index that year before and after (at most hi_new)
};

struct DeferredUnit {
  std::string unit_id, site, action;
  double cost = 0, risk = 0;              // risk that year
};

struct PlanYear {
  int year = 0;
  double budget = 0;                      // available this year (with carry-over); infinity if unlimited
  double spent = 0;
  std::vector<PlannedIntervention> funded;
  std::vector<DeferredUnit> deferred;
  double risk_with_plan = 0, risk_without_plan = 0, risk_unlimited = 0;  // fleet totals that year
};

struct FleetPlan {
  Day as_of = 0;
  std::string currency;
  double budget_per_year = 0;             // infinity if unlimited
  // The budget whose yearly allocation the plan follows: budget_per_year, or
  // a smaller one whose allocation leaves less total risk (see above).
  double allocation_budget = 0;
  bool carry_over = false;
  int start_year = 0, horizon_years = 0;
  std::vector<PlanYear> years;
  double total_spent = 0;
  double total_risk_with_plan = 0, total_risk_without_plan = 0, total_risk_unlimited = 0;  // summed over the years
  std::vector<std::string> not_planned;   // "T-9: no health index"
  std::vector<std::string> unfunded;      // candidates still waiting at the end of the horizon
  std::vector<std::string> method, assumptions;
};

// Replacement cost of a unit: its own, else class cost per MVA x MVA + fixed.
double replacement_cost(const PlanUnit& u, const CostOptions& costs);
// Refurbishment cost: its own, else fraction x replacement cost.
double refurbishment_cost(const PlanUnit& u, const CostOptions& costs);
// HV class 1..3 of a voltage.
int voltage_class(double hv_kv, const CostOptions& costs);
// Yearly exponential ageing rate B (< 0) of the unit's index (see above).
double ageing_rate(const PlanUnit& u, const PlanOptions& o);
// Risk of an index: PoF(HI) x 1,000 x consequence.
double plan_risk(double health_index, double consequence, const PlanOptions& o);

// "Ten-year plan", "Five-year plan", "25-year plan": the plan's heading.
std::string plan_title(int horizon_years);

// The plan. Never drops a unit: those without an index are in not_planned.
FleetPlan plan_fleet(const std::vector<PlanUnit>& units, Day as_of, const CostOptions& costs, const PlanOptions& options);

// Sets every ranked unit's budget_plan from `plan` (made from this ranking):
// for a unit whose action is replace, or refurbish by drying out the paper (the
// actions the plan funds), on time when the plan funds
// it in the first year it was a candidate (the later of the action's year and
// the plan's first year), later when funded after that, unfunded when still
// waiting at the end of the plan; State::none otherwise. So the ranking never
// shows an action year the plan does not keep without the plan's year beside it.
void apply_plan(FleetRanking& ranking, const FleetPlan& plan);

}  // namespace ferrum::analytics
