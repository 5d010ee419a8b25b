// Tests of the fleet ranking (analytics/fleet_ranking.h).
#include "analytics/fleet_ranking.h"

#include <gtest/gtest.h>

#include "analytics/action_plan.h"

#include <algorithm>
#include <cmath>
#include <tuple>

namespace fa = ferrum::analytics;

namespace {

fa::UnitAssessment unit(const char* id, std::optional<double> hi, int criticality, double mva) {
  fa::UnitAssessment a;
  a.as_of = fa::days_from_civil(2024, 7, 1);
  a.unit.unit_id = id;
  a.unit.site = "North";
  a.unit.criticality = criticality;
  a.unit.rated_mva = mva;
  a.health_index = hi;
  return a;
}

}  // namespace

// Exponential form P100 (P0/P100)^((100-HI)/100), common practice, ferrum
// defaults 0.002 and 0.2 per year: at HI 50 the geometric mean 0.02.
TEST(FleetRanking, ProbabilityOfFailureForm) {
  fa::RankingOptions o;
  EXPECT_NEAR(fa::probability_of_failure(100, o), 0.002, 1e-12);
  EXPECT_NEAR(fa::probability_of_failure(0, o), 0.2, 1e-12);
  EXPECT_NEAR(fa::probability_of_failure(50, o), std::sqrt(0.002 * 0.2), 1e-12);
  EXPECT_GT(fa::probability_of_failure(49, o), fa::probability_of_failure(50, o));
  EXPECT_NEAR(fa::probability_of_failure(-5, o), 0.2, 1e-12);  // clamped
}

// Consequence = weighted mean of criticality/5, customers/10 000, MVA/100:
// (0.5 x 0.6 + 0.3 x 0.5 + 0.2 x 0.5) / 1 = 0.55; without customers the other
// weights are renormalised: (0.5 x 0.6 + 0.2 x 0.5) / 0.7 = 0.5714.
TEST(FleetRanking, ConsequenceWeights) {
  fa::RankingOptions o;
  fa::UnitInfo u;
  u.criticality = 3;
  u.rated_mva = 50;
  u.customers_served = 5000;
  EXPECT_NEAR(fa::consequence_of(u, o), 0.55, 1e-12);
  u.customers_served.reset();
  EXPECT_NEAR(fa::consequence_of(u, o), 0.4 / 0.7, 1e-12);
}

// Small fleet: A failing (replace now), B and C identical (tie, listed B then
// C whatever the input order), D sound, E and F without an index (last, by id).
// A large tie group is counted, not listed: each note stays short whatever
// the group's size, and still says how many share the rank. Up to five
// others are named. Plumbing of the note's wording: no published source.
TEST(FleetRanking, LargeTieGroupsAreCountedNotListed) {
  std::vector<fa::UnitAssessment> fleet;
  for (int n = 0; n < 40; ++n) fleet.push_back(unit(("T" + std::to_string(100 + n)).c_str(), 60, 3, 40));
  for (int n = 0; n < 6; ++n) fleet.push_back(unit(("S" + std::to_string(n)).c_str(), 30, 3, 40));  // five others each
  for (auto& a : fleet) fa::finalize_actions(a);
  const auto r = fa::rank_fleet(fleet, fleet[0].as_of, fa::RankingOptions{});
  ASSERT_EQ(r.units.size(), 46u);
  for (const auto& u : r.units) {
    ASSERT_TRUE(u.tied) << u.unit_id;
    if (u.unit_id[0] == 'S') {
      EXPECT_EQ(u.rank, 1);
      for (int n = 0; n < 6; ++n) {
        const std::string other = "S" + std::to_string(n);
        EXPECT_EQ(u.note.find(other) != std::string::npos, other != u.unit_id) << u.note;
      }
    } else {
      EXPECT_EQ(u.rank, 7);
      EXPECT_EQ(u.note, "equal risk with 39 other units, all ranked 7; tied units ordered by unit_id");
    }
  }
}

TEST(FleetRanking, OrderTiesAndInsufficientData) {
  std::vector<fa::UnitAssessment> fleet{unit("F", std::nullopt, 5, 10), unit("C", 60, 3, 40),
                                        unit("D", 90, 3, 40),           unit("E", std::nullopt, 1, 5),
                                        unit("B", 60, 3, 40),           unit("A", 20, 5, 80)};
  fleet[0].confidence = "2 of 7 factors (no oil quality, paper, thermal, infrared, inspection): too few";
  fleet[0].missing = {"health index factor oil quality: no scorable oil-quality test"};
  for (auto& a : fleet) fa::finalize_actions(a);
  auto r = fa::rank_fleet(fleet, fleet[0].as_of, fa::RankingOptions{});
  ASSERT_EQ(r.units.size(), 6u);
  std::vector<std::string> ids;
  for (const auto& u : r.units) ids.push_back(u.unit_id);
  EXPECT_EQ(ids, (std::vector<std::string>{"A", "B", "C", "D", "E", "F"}));
  EXPECT_EQ(r.units[0].rank, 1);
  EXPECT_FALSE(r.units[0].tied);
  EXPECT_EQ(r.units[1].rank, 2);
  EXPECT_EQ(r.units[2].rank, 2);
  EXPECT_TRUE(r.units[1].tied && r.units[2].tied);
  EXPECT_NE(r.units[1].note.find("C"), std::string::npos);
  EXPECT_NE(r.units[1].note.find("unit_id"), std::string::npos);
  EXPECT_EQ(r.units[3].rank, 4);  // competition ranking after a tie
  EXPECT_FALSE(r.units[3].tied);
  for (int k : {4, 5}) {
    EXPECT_TRUE(r.units[k].insufficient_data);
    EXPECT_EQ(r.units[k].rank, 0);
    EXPECT_FALSE(r.units[k].risk);
    EXPECT_EQ(r.units[k].note.find("insufficient data"), std::string::npos);  // said once, by the reader
    EXPECT_EQ(r.units[k].recommended_action, "investigate");
  }
  EXPECT_NE(r.units[5].note.find("oil quality"), std::string::npos);
  // The row copies the assessment's decision (analytics/decision/decision.h).
  EXPECT_EQ(r.units[0].recommended_action, fleet[5].decision.action);
  EXPECT_EQ(r.units[1].recommended_action, "monitor");
  EXPECT_EQ(r.units[3].recommended_action, "routine");
  EXPECT_FALSE(r.risk_calibration.empty());
}

// Risk order follows PoF x consequence, not the index alone: a critical unit
// at HI 60 outranks a low-criticality unit at HI 50.
TEST(FleetRanking, ConsequenceChangesOrder) {
  std::vector<fa::UnitAssessment> fleet{unit("low", 50, 1, 5), unit("high", 60, 5, 100)};
  auto r = fa::rank_fleet(fleet, fleet[0].as_of, fa::RankingOptions{});
  EXPECT_EQ(r.units[0].unit_id, "high");
  EXPECT_GT(*r.units[0].risk, *r.units[1].risk);
}

// Replacement years with the 24-month lead time (ferrum default): life 1 year
// -> 2026, 3.7 and 3.6 years from mid-2024 -> 2028; 8 years -> replacement
// planned for 2032; 20 years: none. The outlook lists every life ending
// within ten years (all but E), soonest first.
TEST(FleetRanking, MvaDueByYearFromReplacementYears) {
  auto a = unit("A", 40, 5, 80);
  a.remaining_life.years = 1;
  auto b = unit("B", 60, 3, 40);
  b.remaining_life.years = 3.7;
  auto c = unit("C", 60, 3, 25);
  c.remaining_life.years = 3.6;
  auto d = unit("D", 60, 3, 60);
  d.remaining_life.years = 8;
  auto e = unit("E", 60, 3, 10);
  e.remaining_life.years = 20;
  std::vector<fa::UnitAssessment> fleet{a, b, c, d, e};
  for (auto& u : fleet) fa::finalize_actions(u);
  auto r = fa::rank_fleet(fleet, a.as_of, fa::RankingOptions{});
  ASSERT_EQ(r.mva_due_by_year.size(), 10u);
  EXPECT_EQ(r.mva_due_by_year[2].year, 2026);
  EXPECT_DOUBLE_EQ(r.mva_due_by_year[2].mva, 80);
  EXPECT_DOUBLE_EQ(r.mva_due_by_year[4].mva, 65);
  EXPECT_EQ(r.mva_due_by_year[4].units, 2);
  EXPECT_DOUBLE_EQ(r.mva_due_by_year[8].mva, 60);
  EXPECT_DOUBLE_EQ(r.mva_due_by_year[0].mva, 0);  // nothing inside the lead time
  ASSERT_EQ(r.outlook.size(), 4u);
  EXPECT_EQ(r.outlook[0].unit_id, "A");
  EXPECT_EQ(r.outlook[0].life_ends_year, 2025);
  EXPECT_EQ(r.outlook[3].unit_id, "D");
}

// Risk for people: failures per 1,000 unit-years, never zero (ferrum's own
// calibration, 2 at HI 100).
TEST(FleetRanking, FailuresPerThousandUnitYears) {
  auto a = unit("A", 100, 1, 5);
  fa::finalize_actions(a);
  auto r = fa::rank_fleet({a}, a.as_of, fa::RankingOptions{});
  EXPECT_NEAR(*r.units[0].failures_per_1000_unit_years, 2.0, 1e-9);
}

TEST(FleetRanking, EmptyFleet) {
  auto r = fa::rank_fleet(std::vector<fa::RankingInput>{}, fa::days_from_civil(2024, 1, 1), fa::RankingOptions{});
  EXPECT_TRUE(r.units.empty());
  EXPECT_EQ(r.mva_due_by_year.size(), 10u);
}

// The ranking from the compact ranking inputs equals the ranking from whole
// assessments, on a fleet that uses every field rank_fleet reads and many it
// does not, and each row carries its own assessment's fields.
// (Consistency of two code paths: no engineering value, no source needed.)
TEST(FleetRanking, RankingInputsGiveTheSameRanking) {
  std::vector<fa::UnitAssessment> fleet{unit("A", 20, 5, 80), unit("B", 62, 3, 40), unit("C", std::nullopt, 2, 10),
                                        unit("D", 45, 4, 25), unit("E", 88, 1, 5)};
  fleet[0].remaining_life.years = 1.5;
  fleet[0].remaining_life.limiting_factor = "paper";
  fleet[1].condition_index = 80;  // capped by a correctable finding
  fleet[1].band = "serviceable";
  fleet[1].unit.customers_served = 12000;
  fleet[2].confidence = "2 of 7 factors: too few";
  fleet[2].missing = {"oil sample", "inspection"};
  fleet[3].remaining_life.years = 7;
  fleet[3].remaining_life.limiting_factor = "thermal";
  fleet[3].unit.site = "South";
  for (auto& a : fleet) {  // fields the ranking does not read
    a.methods = {"a method"};
    a.dga.tdcg_ppm = 500;
    fa::finalize_actions(a);
  }
  fleet[1].decision.action = "refurbish";  // drying out the paper: the ten-year plan reads it (plan.h)
  fleet[1].decision.treats_paper = true;
  fa::RankingOptions o;
  o.weight_customers = 0.5;
  const auto whole = fa::rank_fleet(fleet, fleet[0].as_of, o);
  const auto from_fields = fa::rank_fleet(fa::ranking_inputs(fleet), fleet[0].as_of, o);
  ASSERT_EQ(whole.units.size(), from_fields.units.size());
  for (std::size_t i = 0; i < whole.units.size(); ++i) {
    const auto &x = whole.units[i], &y = from_fields.units[i];
    EXPECT_EQ(std::tie(x.rank, x.tied, x.unit_id, x.site, x.rated_mva, x.health_index, x.band, x.remaining_life_years,
                       x.limiting_factor, x.probability_of_failure, x.consequence, x.risk, x.recommended_action,
                       x.action_year, x.insufficient_data, x.note, x.beyond_horizon, x.action_reason,
                       x.treats_paper, x.first_action ? x.first_action->text : ""),
              std::tie(y.rank, y.tied, y.unit_id, y.site, y.rated_mva, y.health_index, y.band, y.remaining_life_years,
                       y.limiting_factor, y.probability_of_failure, y.consequence, y.risk, y.recommended_action,
                       y.action_year, y.insufficient_data, y.note, y.beyond_horizon, y.action_reason,
                       y.treats_paper, y.first_action ? y.first_action->text : ""))
        << x.unit_id;
    const auto& a = *std::find_if(fleet.begin(), fleet.end(), [&](auto& u) { return u.unit.unit_id == y.unit_id; });
    EXPECT_EQ(std::tie(y.site, y.rated_mva, y.health_index, y.band, y.remaining_life_years, y.limiting_factor,
                       y.recommended_action, y.action_year, y.action_reason, y.treats_paper),
              std::tie(a.unit.site, a.unit.rated_mva, a.health_index, a.band, a.remaining_life.years,
                       a.remaining_life.limiting_factor, a.decision.action, a.decision.year, a.decision.reason,
                       a.decision.treats_paper))
        << y.unit_id;
    EXPECT_EQ(y.consequence, fa::consequence_of(a.unit, o)) << y.unit_id;
    ASSERT_EQ(bool(y.first_action), bool(a.decision.first_action)) << y.unit_id;
    if (y.first_action) {
      EXPECT_EQ(y.first_action->reference, a.decision.first_action->reference);
    }
  }
  ASSERT_EQ(whole.mva_due_by_year.size(), from_fields.mva_due_by_year.size());
  for (std::size_t i = 0; i < whole.mva_due_by_year.size(); ++i)
    EXPECT_EQ(whole.mva_due_by_year[i].mva, from_fields.mva_due_by_year[i].mva);
}

// RankingOrder with the rows kept by the caller and fetched one at a time,
// in whatever order the caller stored them, gives rank_fleet's ranking: the
// same rows in the same places, the same ranks, ties, notes and summaries.
// (Consistency of two ways to drive one ranking: no engineering value, no
// source needed.)
TEST(FleetRanking, OrderWithRowsKeptElsewhereGivesTheSameRanking) {
  std::vector<fa::UnitAssessment> fleet;
  for (int n = 0; n < 9; ++n) fleet.push_back(unit(("T" + std::to_string(n)).c_str(), 60, 3, 40));  // 8 others
  for (const char* id : {"Q", "P", "R"}) fleet.push_back(unit(id, 35, 4, 40));                       // 2 others
  fleet.push_back(unit("Z", std::nullopt, 2, 10));
  fleet.push_back(unit("Y", std::nullopt, 5, 80));
  fleet.push_back(unit("A", 15, 5, 80));
  fleet[9].remaining_life.years = 3.0;   // equal lives: the outlook keeps the ranking's order
  fleet[10].remaining_life.years = 3.0;
  fleet[14].remaining_life.years = 1.0;  // A
  fleet[0].remaining_life.years = 9.5;
  for (auto& a : fleet) fa::finalize_actions(a);
  fa::RankingOptions o;
  const fa::Day as_of = fleet[0].as_of;
  const auto whole = fa::rank_fleet(fleet, as_of, o);

  // The caller's store: rows by number, reversed, so that position and number differ.
  const auto inputs = fa::ranking_inputs(fleet);
  fa::RankingOrder order(as_of, o);
  std::vector<fa::RankedUnit> kept(inputs.size());
  for (std::size_t k = 0; k < inputs.size(); ++k) {
    auto copy = inputs[k];
    const auto row = fa::ranked_row(std::move(copy), o);
    order.add(row);
    kept[inputs.size() - 1 - k] = row;
  }
  order.finish();
  const auto summary = order.summary();
  EXPECT_TRUE(summary.units.empty());
  ASSERT_EQ(order.size(), whole.units.size());
  for (std::size_t p = 0; p < order.size(); ++p) {
    fa::RankedUnit y = kept[inputs.size() - 1 - order.row_at(p)];
    order.place(p, y);
    const auto& x = whole.units[p];
    EXPECT_EQ(std::tie(x.rank, x.tied, x.unit_id, x.risk, x.note, x.insufficient_data, x.recommended_action),
              std::tie(y.rank, y.tied, y.unit_id, y.risk, y.note, y.insufficient_data, y.recommended_action))
        << p;
  }
  EXPECT_EQ(whole.units[0].unit_id, "A");
  EXPECT_EQ(whole.units[1].note, "equal risk with Q, R; tied units ordered by unit_id");  // P, Q, R by id
  ASSERT_EQ(summary.outlook.size(), whole.outlook.size());
  ASSERT_EQ(summary.outlook.size(), 4u);
  for (std::size_t i = 0; i < summary.outlook.size(); ++i) {
    EXPECT_EQ(summary.outlook[i].unit_id, whole.outlook[i].unit_id);
    EXPECT_EQ(summary.outlook[i].life_ends_year, whole.outlook[i].life_ends_year);
  }
  EXPECT_EQ(whole.outlook[0].unit_id, "A");
  EXPECT_EQ(whole.outlook[1].unit_id, "P");  // 3.0 years each: in ranking order, P before Q
  EXPECT_EQ(whole.outlook[2].unit_id, "Q");
  ASSERT_EQ(summary.mva_due_by_year.size(), whole.mva_due_by_year.size());
  for (std::size_t i = 0; i < summary.mva_due_by_year.size(); ++i) {
    EXPECT_EQ(summary.mva_due_by_year[i].mva, whole.mva_due_by_year[i].mva);
    EXPECT_EQ(summary.mva_due_by_year[i].units, whole.mva_due_by_year[i].units);
  }
  EXPECT_EQ(summary.risk_calibration, whole.risk_calibration);
}
