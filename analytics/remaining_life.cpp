#include "analytics/remaining_life.h"

#include <algorithm>
#include <cmath>
#include <cstdio>

namespace ferrum::analytics {

namespace {

std::string fmt(double v, int decimals = 2) {
  char buf[64];
  std::snprintf(buf, sizeof buf, "%.*f", decimals, v);
  return buf;
}

LifeEstimate not_applicable(const char* basis, std::string why) {
  LifeEstimate e;
  e.basis = basis;
  e.method = "not applicable: " + std::move(why);
  return e;
}

// Years to consume `amount` at `rate` per year, with the +-u range on the rate
// and everything limited to the horizon.
void fill_years(LifeEstimate& e, double amount, double rate, const RemainingLifeOptions& o) {
  auto clip = [&](double y) { return std::clamp(y, 0.0, o.horizon_years); };
  if (amount <= 0) {
    e.years = e.low_years = e.high_years = 0.0;
    return;
  }
  double u = std::clamp(o.rate_uncertainty, 0.0, 0.95);
  e.years = clip(amount / rate);
  e.low_years = clip(amount / (rate * (1 + u)));
  e.high_years = clip(amount / (rate * (1 - u)));
}

}  // namespace

std::optional<double> exponential_time_to(double from, double to, double rate) {
  if (!(from > 0) || !(to > 0) || !std::isfinite(rate) || rate == 0) return std::nullopt;
  double t = std::log(to / from) / rate;
  if (!std::isfinite(t)) return std::nullopt;
  if (t < 0) {
    // Already past the target when moving in the rate's direction.
    bool past = rate > 0 ? from >= to : from <= to;
    return past ? std::optional<double>(0.0) : std::nullopt;
  }
  return t;
}

std::optional<double> service_years(const UnitInfo& unit, Day as_of) {
  if (unit.year_built <= 0 || unit.year_built > civil_from_days(as_of).year) return std::nullopt;
  double y = years_between(days_from_civil(unit.year_built, 7, 1), as_of);
  return std::max(y, 0.0);
}

double clip_years(double y, const RemainingLifeOptions& o) { return std::clamp(y, 0.0, o.horizon_years); }

LifeEstimate paper_life(const RemainingLifeOptions& o, const UnitAssessment& a) {
  const auto& p = a.paper;
  if (!p.dp_estimate || !std::isfinite(*p.dp_estimate)) return not_applicable("paper", "no DP estimate");
  auto age = service_years(a.unit, a.as_of);
  if (!age || *age < 0.5) return not_applicable("paper", "installation year unknown or under half a year");
  double dp = *p.dp_estimate;
  double r_hist = std::max(0.0, (o.initial_dp - dp) / *age);
  std::optional<double> r_th;
  if (auto f = a.thermal.equivalent_ageing_factor; f && std::isfinite(*f) && *f >= 0 && o.dp200_life_hours > 0)
    r_th = *f * (o.initial_dp - o.end_of_life_dp) / (o.dp200_life_hours / o.hours_per_year);
  double rate = std::max(r_hist, r_th.value_or(0));
  if (!(rate > 0)) return not_applicable("paper", "no measurable paper ageing (DP at or above DP0)");
  LifeEstimate e;
  e.basis = "paper";
  fill_years(e, dp - o.end_of_life_dp, rate, o);
  // Range from the inputs: both DP correlations, and the spread between the
  // two ageing rates where both exist (else the rate +- rate_uncertainty).
  double dp_lo = dp, dp_hi = dp;
  if (p.dp_alternative && std::isfinite(*p.dp_alternative)) {
    dp_lo = std::min(dp, *p.dp_alternative);
    dp_hi = std::max(dp, *p.dp_alternative);
  }
  const double u = std::clamp(o.rate_uncertainty, 0.0, 0.95);
  // The rate: between the rate used and the DP fall fitted over the furan
  // samples where that history exists and is positive, else +-u.
  const auto slope = p.dp_fall_per_year_history;
  const bool history = slope && std::isfinite(*slope) && *slope > 0;
  const double rate_hi = history ? std::max(rate, *slope) : rate * (1 + u);
  const double rate_lo = history ? std::min(rate, *slope) : rate * (1 - u);
  e.low_years = clip_years((dp_lo - o.end_of_life_dp) / rate_hi, o);
  e.high_years = clip_years((dp_hi - o.end_of_life_dp) / rate_lo, o);
  e.range = std::string(dp_hi > dp_lo ? "DP from both correlations (Chendong, De Pablo)" : "DP from one correlation") +
            (history ? ", ageing rate between " + fmt(rate_lo, 1) + " and " + fmt(rate_hi, 1) +
                           " DP/year (since installation, and fitted over " + std::to_string(p.dp_history_samples) +
                           " furan samples)"
                     : ", ageing rate +-" + fmt(u * 100, 0) + " %");
  bool thermal_faster = r_th && *r_th > r_hist;
  e.method = "DP " + fmt(dp, 0) + " to " + fmt(o.end_of_life_dp, 0) + " at " + fmt(rate, 1) + " DP/year (" +
             (thermal_faster ? "recent thermal ageing, F_EQA x (DP0-200)/150 000 h, IEEE C57.91 Table 1"
                             : "own history since installation from DP0 " + fmt(o.initial_dp, 0)) +
             ")";
  if (!p.dp_method.empty()) e.method += "; DP from " + p.dp_method;
  if (!p.trustworthy) e.method += "; DP estimate flagged untrustworthy (oil treatment)";
  return e;
}

LifeEstimate thermal_life(const RemainingLifeOptions& o, const UnitAssessment& a) {
  const auto& t = a.thermal;
  auto f = t.equivalent_ageing_factor;
  if (!f || !std::isfinite(*f) || *f < 0) return not_applicable("thermal", "no equivalent ageing factor");
  auto age = service_years(a.unit, a.as_of);
  if (!age) return not_applicable("thermal", "installation year unknown: life consumed before the load record");
  double age_h = *age * o.hours_per_year;
  double recorded_h = std::min(std::max(t.covered_hours, 0.0), age_h);
  double consumed = t.loss_of_life_hours && std::isfinite(*t.loss_of_life_hours)
                        ? *t.loss_of_life_hours + *f * (age_h - recorded_h)
                        : *f * age_h;
  LifeEstimate e;
  e.basis = "thermal";
  double left_h = o.normal_insulation_life_hours - consumed;
  if (*f <= 0 && left_h > 0) {
    e.years = e.low_years = e.high_years = o.horizon_years;
  } else {
    fill_years(e, left_h, *f * o.hours_per_year, o);
  }
  e.range = "equivalent ageing factor +-" + fmt(std::clamp(o.rate_uncertainty, 0.0, 0.95) * 100, 0) + " %";
  e.method = "normal life " + fmt(o.normal_insulation_life_hours, 0) + " h (IEEE C57.91 Table 1) minus " +
             fmt(consumed, 0) + " h consumed, at F_EQA " + fmt(*f, 3);
  return e;
}

// The end-of-life score: 100 sum(K HIF)/sum(4 K) over the factors that only
// maintenance cannot undo (paper, thermal, age) plus the worst chronic
// inspection item (o.chronic_items) at the inspection weight. Gases, oil
// quality, infrared and other inspection items are correctable defects and
// stay out. nullopt with fewer than two such factors.
std::optional<double> end_of_life_score(const RemainingLifeOptions& o, const UnitAssessment& a, int* count) {
  double num = 0, den = 0, inspection_weight = 0;
  int n = 0;
  for (const auto& f : a.factors) {
    if (f.name == "inspection") inspection_weight = f.weight;
    if (!f.score || f.weight <= 0 || (f.name != "paper" && f.name != "thermal" && f.name != "age")) continue;
    num += f.weight * *f.score;
    den += 4 * f.weight;
    ++n;
  }
  int worst = 0;
  for (const auto& i : a.inspection)
    if (std::find(o.chronic_items.begin(), o.chronic_items.end(), i.item) != o.chronic_items.end())
      worst = std::max(worst, static_cast<int>(i.rating));
  if (worst > 0 && inspection_weight > 0) {
    num += inspection_weight * (5 - worst);
    den += 4 * inspection_weight;
    ++n;
  }
  if (count) *count = n;
  if (n < 2 || den <= 0) return std::nullopt;
  return 100 * num / den;
}

LifeEstimate age_life(const RemainingLifeOptions& o, const UnitAssessment& a) {
  auto age = service_years(a.unit, a.as_of);
  if (!age) return not_applicable("age", "installation year unknown");
  if (!(o.expected_life_years > 0)) return not_applicable("age", "no expected life");
  LifeEstimate e;
  e.basis = "age";
  e.years = clip_years(o.expected_life_years - *age, o);
  e.low_years = clip_years(o.expected_life_years - o.expected_life_spread_years - *age, o);
  e.high_years = clip_years(o.expected_life_years + o.expected_life_spread_years - *age, o);
  e.method = fmt(*age, 0) + " years in service against an expected life of " + fmt(o.expected_life_years, 0) +
             " years (ferrum default)";
  e.range = "expected life +-" + fmt(o.expected_life_spread_years, 0) + " years";
  return e;
}

LifeEstimate condition_life(const RemainingLifeOptions& o, const UnitAssessment& a) {
  if (!(o.expected_life_years > 0) || !(o.hi_end_of_life > 0) || !(o.hi_new > o.hi_end_of_life))
    return not_applicable("condition", "invalid exponential ageing options");
  // Only end-of-life evidence is aged: a gassing fault or wet oil is a
  // correctable defect with its own action, not gradual ageing.
  int n = 0;
  auto score = end_of_life_score(o, a, &n);
  if (!score) return not_applicable("condition", "fewer than two end-of-life factors (paper, thermal, age, chronic inspection items)");
  double hi = std::max(*score, 1e-6);
  double b_expected = std::log(o.hi_end_of_life / o.hi_new) / o.expected_life_years;  // < 0
  double b = b_expected;
  std::string how = "expected rate (age unknown)";
  if (auto age = service_years(a.unit, a.as_of); age && *age > 0) {
    double own = std::log(std::min(hi, o.hi_new) / o.hi_new) / *age;
    b = std::clamp(own, o.max_rate_multiple * b_expected, o.min_rate_multiple * b_expected);
    how = "own rate " + fmt(own, 4) + "/year" + (b != own ? ", limited to " + fmt(b, 4) : std::string());
  }
  LifeEstimate e;
  e.basis = "condition";
  // ln(HI_EOL/HI) is the "amount" and -B the rate.
  fill_years(e, std::log(hi / o.hi_end_of_life), -b, o);
  e.range = "ageing rate +-" + fmt(std::clamp(o.rate_uncertainty, 0.0, 0.95) * 100, 0) + " %";
  e.method = "end-of-life score (paper, thermal, age, chronic inspection items; " + std::to_string(n) +
             " factors) aged as HI(t) = HI0 e^(B t): " + fmt(hi, 1) + " to " + fmt(o.hi_end_of_life, 0) + ", B from " + how +
             "; expected life " + fmt(o.expected_life_years, 0) + " years";
  return e;
}

void estimate_remaining_life(const RemainingLifeOptions& o, UnitAssessment& a) {
  RemainingLife rl;
  rl.estimates = {paper_life(o, a), thermal_life(o, a), age_life(o, a), condition_life(o, a)};
  rl.horizon_years = o.horizon_years;
  // A trustworthy paper estimate is measured evidence: it outranks the
  // statistical expectation of age, which then is reported, not limiting.
  const bool paper_measured = rl.estimates[0].years && a.paper.trustworthy;
  if (paper_measured && rl.estimates[2].years) rl.estimates[2].method += "; not limiting: the paper DP is measured";
  const LifeEstimate* best = nullptr;
  for (const auto& e : rl.estimates) {
    if (!e.years || (paper_measured && e.basis == "age")) continue;
    if (!best || *e.years < *best->years) best = &e;
  }
  if (best) {
    rl.range_method = best->range;
    rl.years = best->years;
    rl.low_years = best->low_years;
    rl.high_years = best->high_years;
    rl.limiting_factor = best->basis;
    rl.beyond_horizon = *best->years >= o.horizon_years;
  } else {
    a.missing.push_back("remaining life: no paper, thermal, age or condition basis");
  }
  a.methods.push_back("remaining life: smallest of paper (DP to 200), thermal (IEEE C57.91 normal life), age "
                      "(expected life; not limiting where the paper DP is measured) and condition (exponential "
                      "ageing of the end-of-life score) estimates, end-of-life evidence only (correctable "
                      "defects raise risk and get actions, they do not shorten life); estimates beyond " +
                      fmt(o.horizon_years, 0) + " years reported as more than " + fmt(o.horizon_years, 0) + " years");
  if (a.thermal.equivalent_ageing_factor && a.thermal.covered_hours > 0)
    a.assumptions.push_back("thermal life consumed before the load record taken at the recorded F_EQA");
  if (a.paper.dp_estimate)
    a.assumptions.push_back("paper DP0 " + fmt(o.initial_dp, 0) + " at mid-year of manufacture");
  a.remaining_life = std::move(rl);
}

}  // namespace ferrum::analytics
