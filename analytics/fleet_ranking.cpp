#include "analytics/fleet_ranking.h"

#include <algorithm>
#include <cmath>

namespace ferrum::analytics {

namespace {

struct Recommendation {
  std::string action;
  int year = 0;
};

Recommendation recommend(const RankingOptions& o, const UnitAssessment& a, int this_year) {
  // Replacement advice reads the condition without correctable findings: a
  // stolen earth conductor calls for making safe, not for a new transformer.
  std::optional<double> hi = a.condition_index ? a.condition_index : a.health_index;
  std::optional<double> life = a.remaining_life.years;
  if ((hi && *hi <= o.replace_below_hi) || (life && *life < o.replace_within_years)) {
    // Replace by the year the limit is reached; a failing index means now.
    int in = life && !(hi && *hi <= o.replace_below_hi) ? static_cast<int>(std::floor(*life)) : 0;
    return {"replace", this_year + std::max(in, 0)};
  }
  // A correctable finding (gassing fault, unsafe item, hot joint) capped the
  // index below the condition: the row says so instead of "routine".
  if (a.health_index && a.condition_index && *a.health_index < *a.condition_index) return {"repair", this_year};
  if ((hi && *hi <= o.refurbish_below_hi) || (life && *life < o.refurbish_within_years))
    return {"refurbish", this_year + 1};
  if (!hi || *hi <= o.monitor_below_hi) return {"intensify monitoring", this_year};
  return {"routine", this_year + 1};
}

RankedUnit row_of(const RankingOptions& o, const UnitAssessment& a, int this_year) {
  RankedUnit r;
  r.unit_id = a.unit.unit_id;
  r.site = a.unit.site;
  r.rated_mva = a.unit.rated_mva;
  r.health_index = a.health_index;
  r.band = a.band;
  r.remaining_life_years = a.remaining_life.years;
  r.limiting_factor = a.remaining_life.limiting_factor;
  r.consequence = consequence_of(a.unit, o);
  if (a.health_index && std::isfinite(*a.health_index)) {
    r.probability_of_failure = probability_of_failure(*a.health_index, o);
    r.risk = *r.probability_of_failure * r.consequence;
  } else {
    r.insufficient_data = true;
    r.note = "insufficient data: " + (a.confidence.empty() ? std::string("no health index") : a.confidence);
    for (const auto& m : a.missing) r.note += "; " + m;
  }
  auto rec = recommend(o, a, this_year);
  r.recommended_action = rec.action;
  r.action_year = rec.year;
  return r;
}

bool same_risk(double x, double y, double tol) { return std::fabs(x - y) <= tol * std::max(x, y); }

// Competition ranks over rows sorted by risk; ties marked and noted.
void assign_ranks(std::vector<RankedUnit>& rows, double tol) {
  std::size_t i = 0;
  while (i < rows.size()) {
    std::size_t j = i + 1;
    while (j < rows.size() && same_risk(*rows[i].risk, *rows[j].risk, tol)) ++j;
    // Risks equal within the tolerance but not to the bit: still by unit_id.
    std::sort(rows.begin() + i, rows.begin() + j,
              [](const RankedUnit& x, const RankedUnit& y) { return x.unit_id < y.unit_id; });
    for (std::size_t k = i; k < j; ++k) {
      rows[k].rank = static_cast<int>(i) + 1;
      if (j - i < 2) continue;
      rows[k].tied = true;
      std::string others;
      for (std::size_t m = i; m < j; ++m)
        if (m != k) others += (others.empty() ? "" : ", ") + rows[m].unit_id;
      rows[k].note = "equal risk with " + others + "; tied units ordered by unit_id";
    }
    i = j;
  }
}

}  // namespace

double probability_of_failure(double hi, const RankingOptions& o) {
  double h = std::clamp(hi, 0.0, 100.0);
  double p = o.pof_as_new * std::pow(o.pof_at_zero / o.pof_as_new, (100.0 - h) / 100.0);
  return std::clamp(p, 0.0, 1.0);
}

UnitAssessment ranking_fields(const UnitAssessment& a) {
  UnitAssessment r;
  r.unit.unit_id = a.unit.unit_id;
  r.unit.site = a.unit.site;
  r.unit.rated_mva = a.unit.rated_mva;
  r.unit.criticality = a.unit.criticality;
  r.unit.customers_served = a.unit.customers_served;
  r.health_index = a.health_index;
  r.condition_index = a.condition_index;
  r.band = a.band;
  r.confidence = a.confidence;
  r.missing = a.missing;
  r.remaining_life.years = a.remaining_life.years;
  r.remaining_life.limiting_factor = a.remaining_life.limiting_factor;
  return r;
}

double consequence_of(const UnitInfo& u, const RankingOptions& o) {
  double sum = 0, weights = 0;
  auto add = [&](double w, double v) {
    if (w <= 0 || !std::isfinite(v)) return;
    sum += w * std::clamp(v, 0.0, 1.0);
    weights += w;
  };
  add(o.weight_criticality, u.criticality / 5.0);
  if (u.customers_served && o.customers_reference > 0)
    add(o.weight_customers, *u.customers_served / o.customers_reference);
  if (u.rated_mva > 0 && o.mva_reference > 0) add(o.weight_mva, u.rated_mva / o.mva_reference);
  return weights > 0 ? sum / weights : 0;
}

FleetRanking rank_fleet(const std::vector<UnitAssessment>& units, Day as_of, const RankingOptions& o) {
  FleetRanking out;
  out.as_of = as_of;
  int this_year = civil_from_days(as_of).year;
  std::vector<RankedUnit> ranked, unranked;
  for (const auto& a : units) {
    RankedUnit r = row_of(o, a, this_year);
    (r.insufficient_data ? unranked : ranked).push_back(std::move(r));
  }
  std::sort(ranked.begin(), ranked.end(), [](const RankedUnit& x, const RankedUnit& y) {
    if (*x.risk != *y.risk) return *x.risk > *y.risk;
    return x.unit_id < y.unit_id;
  });
  assign_ranks(ranked, o.tie_tolerance);
  std::sort(unranked.begin(), unranked.end(),
            [](const RankedUnit& x, const RankedUnit& y) { return x.unit_id < y.unit_id; });
  out.units = std::move(ranked);
  out.units.insert(out.units.end(), unranked.begin(), unranked.end());

  for (int k = 0; k < o.horizon_years; ++k) out.mva_due_by_year.push_back({this_year + k, 0, 0});
  for (const auto& r : out.units) {
    if (r.recommended_action != "replace" || !r.action_year) continue;
    int k = *r.action_year - this_year;
    if (k < 0 || k >= o.horizon_years) continue;
    out.mva_due_by_year[k].mva += r.rated_mva;
    out.mva_due_by_year[k].units += 1;
  }
  return out;
}

}  // namespace ferrum::analytics
