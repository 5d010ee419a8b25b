#include "analytics/fleet_ranking.h"

#include <algorithm>
#include <cmath>

namespace ferrum::analytics {

namespace {

double consequence(int criticality, std::optional<int> customers_served, double rated_mva, const RankingOptions& o) {
  double sum = 0, weights = 0;
  auto add = [&](double w, double v) {
    if (w <= 0 || !std::isfinite(v)) return;
    sum += w * std::clamp(v, 0.0, 1.0);
    weights += w;
  };
  add(o.weight_criticality, criticality / 5.0);
  if (customers_served && o.customers_reference > 0)
    add(o.weight_customers, *customers_served / o.customers_reference);
  if (rated_mva > 0 && o.mva_reference > 0) add(o.weight_mva, rated_mva / o.mva_reference);
  return weights > 0 ? sum / weights : 0;
}

RankedUnit row_of(const RankingOptions& o, RankingInput&& a) {
  RankedUnit r;
  r.unit_id = std::move(a.unit_id);
  r.site = std::move(a.site);
  r.rated_mva = a.rated_mva;
  r.health_index = a.health_index;
  r.band = std::move(a.band);
  r.remaining_life_years = a.remaining_life_years;
  r.beyond_horizon = a.beyond_horizon;
  r.horizon_years = a.horizon_years;
  r.limiting_factor = std::move(a.limiting_factor);
  r.consequence = consequence(a.criticality, a.customers_served, a.rated_mva, o);
  if (a.health_index && std::isfinite(*a.health_index)) {
    r.probability_of_failure = probability_of_failure(*a.health_index, o);
    r.failures_per_1000_unit_years = *r.probability_of_failure * 1000;
    r.risk = *r.probability_of_failure * r.consequence;
  } else {
    r.insufficient_data = true;
    r.note = a.confidence.empty() ? std::string("no health index") : a.confidence;
    for (const auto& m : a.missing) r.note += "; " + m;
  }
  // The one decision of the assessment (analytics/decision/decision.h).
  r.recommended_action = std::move(a.action);
  r.action_year = a.action_year;
  r.action_reason = std::move(a.action_reason);
  r.treats_paper = a.treats_paper;
  r.first_action = std::move(a.first_action);
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
    // A few tied units are named; a large group is counted instead: every
    // unit naming all the others made the notes grow with the square of the
    // group (a 20,000-unit fleet's ranking held 384 MB of them,
    // bench/results.md), and a list of hundreds of ids helps no reader.
    constexpr std::size_t kNamedTies = 5;
    const std::size_t others_n = j - i - 1;
    for (std::size_t k = i; k < j; ++k) {
      rows[k].rank = static_cast<int>(i) + 1;
      if (others_n == 0) continue;
      rows[k].tied = true;
      std::string others;
      if (others_n <= kNamedTies) {
        for (std::size_t m = i; m < j; ++m)
          if (m != k) others += (others.empty() ? "" : ", ") + rows[m].unit_id;
      } else {
        others = std::to_string(others_n) + " other units, all ranked " + std::to_string(i + 1);
      }
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

double consequence_of(const UnitInfo& u, const RankingOptions& o) {
  return consequence(u.criticality, u.customers_served, u.rated_mva, o);
}

FleetRanking rank_fleet(const std::vector<UnitAssessment>& units, Day as_of, const RankingOptions& o) {
  return rank_fleet(ranking_inputs(units), as_of, o);
}

FleetRanking rank_fleet(std::vector<RankingInput> units, Day as_of, const RankingOptions& o) {
  FleetRanking out;
  out.as_of = as_of;
  int this_year = civil_from_days(as_of).year;
  std::vector<RankedUnit> ranked, unranked;
  ranked.reserve(units.size());  // most units are ranked; doubling would hold up to twice the fleet
  for (auto& a : units) {
    RankedUnit r = row_of(o, std::move(a));
    (r.insufficient_data ? unranked : ranked).push_back(std::move(r));
  }
  // The rows' text has moved into the ranking; their husks (752 bytes a
  // unit) go now rather than at return, so that they and the ranking are not
  // held together through the sort.
  std::vector<RankingInput>().swap(units);
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
  for (const auto& r : out.units) {
    if (!r.remaining_life_years || r.beyond_horizon || *r.remaining_life_years > o.horizon_years) continue;
    int ends = civil_from_days(as_of + static_cast<Day>(std::lround(*r.remaining_life_years * 365.25))).year;
    out.outlook.push_back({r.unit_id, r.site, r.rated_mva, *r.remaining_life_years, ends, r.limiting_factor,
                           r.recommended_action, r.action_year});
  }
  std::stable_sort(out.outlook.begin(), out.outlook.end(), [](const auto& x, const auto& y) {
    return x.remaining_life_years < y.remaining_life_years;
  });
  out.risk_calibration = o.pof_source;
  return out;
}

}  // namespace ferrum::analytics
