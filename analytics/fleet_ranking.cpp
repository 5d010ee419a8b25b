#include "analytics/fleet_ranking.h"

#include <algorithm>
#include <cmath>
#include <stdexcept>

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

}  // namespace

RankedRows rows_of(const FleetRanking& ranking) {
  return [&ranking](const RankedUnitSink& each) {
    for (const auto& r : ranking.units) each(r);
  };
}

RankedUnit ranked_row(RankingInput&& unit, const RankingOptions& options) { return row_of(options, std::move(unit)); }

RankingOrder::RankingOrder(Day as_of, const RankingOptions& options) : as_of_(as_of), options_(options) {}

void RankingOrder::add(const RankedUnit& r) {
  if (entries_.size() >= UINT32_MAX) throw std::length_error("a fleet of more than 4 billion units");
  Entry e;
  e.row = static_cast<std::uint32_t>(entries_.size());
  e.unit_id = r.unit_id;
  e.ranked = !r.insufficient_data;
  e.risk = e.ranked ? *r.risk : 0;
  e.rated_mva = r.rated_mva;
  if (r.recommended_action == "replace" && r.action_year) {
    e.replace_year = *r.action_year;
    e.replaces = true;
  }
  if (r.remaining_life_years && !r.beyond_horizon && *r.remaining_life_years <= options_.horizon_years) {
    const int ends =
        civil_from_days(as_of_ + static_cast<Day>(std::lround(*r.remaining_life_years * 365.25))).year;
    outlook_.push_back({e.row, {r.unit_id, r.site, r.rated_mva, *r.remaining_life_years, ends, r.limiting_factor,
                                r.recommended_action, r.action_year}});
  }
  entries_.push_back(std::move(e));
}

void RankingOrder::finish() {
  // Ranked rows first, by descending risk (then unit_id), then the rows
  // without enough data, by unit_id.
  std::sort(entries_.begin(), entries_.end(), [](const Entry& x, const Entry& y) {
    if (x.ranked != y.ranked) return x.ranked;
    if (x.ranked && x.risk != y.risk) return x.risk > y.risk;
    return x.unit_id < y.unit_id;
  });
  // Competition ranks (1, 2, 2, 4) over groups of equal risk within the
  // tolerance; risks equal within it but not to the bit are still ordered
  // by unit_id.
  std::size_t i = 0;
  while (i < entries_.size() && entries_[i].ranked) {
    std::size_t j = i + 1;
    while (j < entries_.size() && entries_[j].ranked && same_risk(entries_[i].risk, entries_[j].risk, options_.tie_tolerance))
      ++j;
    std::sort(entries_.begin() + static_cast<std::ptrdiff_t>(i), entries_.begin() + static_cast<std::ptrdiff_t>(j),
              [](const Entry& x, const Entry& y) { return x.unit_id < y.unit_id; });
    for (std::size_t k = i; k < j; ++k) {
      entries_[k].group_begin = static_cast<std::uint32_t>(i);
      entries_[k].group_end = static_cast<std::uint32_t>(j);
    }
    i = j;
  }
  summary_.as_of = as_of_;
  const int this_year = civil_from_days(as_of_).year;
  for (int k = 0; k < options_.horizon_years; ++k) summary_.mva_due_by_year.push_back({this_year + k, 0, 0});
  for (const auto& e : entries_) {  // in ranking order, as the ranking's own sums
    if (!e.replaces) continue;
    const int k = e.replace_year - this_year;
    if (k < 0 || k >= options_.horizon_years) continue;
    summary_.mva_due_by_year[static_cast<std::size_t>(k)].mva += e.rated_mva;
    summary_.mva_due_by_year[static_cast<std::size_t>(k)].units += 1;
  }
  // The outlook in ranking order, then soonest end first (stable: equal
  // remaining lives keep the ranking's order).
  std::vector<std::size_t> position(entries_.size());
  for (std::size_t p = 0; p < entries_.size(); ++p) position[entries_[p].row] = p;
  std::sort(outlook_.begin(), outlook_.end(),
            [&](const auto& x, const auto& y) { return position[x.first] < position[y.first]; });
  std::stable_sort(outlook_.begin(), outlook_.end(), [](const auto& x, const auto& y) {
    return x.second.remaining_life_years < y.second.remaining_life_years;
  });
  for (auto& [row, e] : outlook_) summary_.outlook.push_back(std::move(e));
  std::vector<std::pair<std::size_t, FleetRanking::LifeEnd>>().swap(outlook_);
  summary_.risk_calibration = options_.pof_source;
  finished_ = true;
}

void RankingOrder::place(std::size_t p, RankedUnit& row) const {
  const Entry& e = entries_[p];
  if (!e.ranked) return;  // rank 0, its note says what is missing
  row.rank = static_cast<int>(e.group_begin) + 1;
  const std::size_t others_n = e.group_end - e.group_begin - 1;
  if (others_n == 0) return;
  row.tied = true;
  // A few tied units are named; a large group is counted instead: every
  // unit naming all the others made the notes grow with the square of the
  // group (a 20,000-unit fleet's ranking held 384 MB of them,
  // bench/results.md), and a list of hundreds of ids helps no reader.
  constexpr std::size_t kNamedTies = 5;
  std::string others;
  if (others_n <= kNamedTies) {
    for (std::size_t m = e.group_begin; m < e.group_end; ++m)
      if (m != p) others += (others.empty() ? "" : ", ") + entries_[m].unit_id;
  } else {
    others = std::to_string(others_n) + " other units, all ranked " + std::to_string(e.group_begin + 1);
  }
  row.note = "equal risk with " + others + "; tied units ordered by unit_id";
}

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
  RankingOrder order(as_of, o);
  order.reserve(units.size());
  std::vector<RankedUnit> rows;
  rows.reserve(units.size());
  for (auto& a : units) {
    rows.push_back(row_of(o, std::move(a)));
    order.add(rows.back());
  }
  // The rows' text has moved into the ranking; their husks (752 bytes a
  // unit) go now rather than at return, so that they and the ranking are not
  // held together through the sort.
  std::vector<RankingInput>().swap(units);
  order.finish();
  FleetRanking out = order.summary();
  out.units.reserve(rows.size());
  for (std::size_t p = 0; p < order.size(); ++p) {
    out.units.push_back(std::move(rows[order.row_at(p)]));
    order.place(p, out.units.back());
  }
  return out;
}

}  // namespace ferrum::analytics
