// Tests of the fleet ranking (analytics/fleet_ranking.h).
#include "analytics/fleet_ranking.h"

#include <gtest/gtest.h>

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
TEST(FleetRanking, OrderTiesAndInsufficientData) {
  std::vector<fa::UnitAssessment> fleet{unit("F", std::nullopt, 5, 10), unit("C", 60, 3, 40),
                                        unit("D", 90, 3, 40),           unit("E", std::nullopt, 1, 5),
                                        unit("B", 60, 3, 40),           unit("A", 20, 5, 80)};
  fleet[0].confidence = "2 of 7 factors (no oil_quality, paper, thermal, infrared, inspection): too few";
  fleet[0].missing = {"health index factor oil_quality: no scorable oil-quality test"};
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
    EXPECT_NE(r.units[k].note.find("insufficient data"), std::string::npos);
  }
  EXPECT_NE(r.units[5].note.find("oil_quality"), std::string::npos);
  EXPECT_EQ(r.units[0].recommended_action, "replace");
  EXPECT_EQ(*r.units[0].action_year, 2024);
  EXPECT_EQ(r.units[1].recommended_action, "intensify monitoring");
  EXPECT_EQ(r.units[3].recommended_action, "routine");
}

// Risk order follows PoF x consequence, not the index alone: a critical unit
// at HI 60 outranks a low-criticality unit at HI 50.
TEST(FleetRanking, ConsequenceChangesOrder) {
  std::vector<fa::UnitAssessment> fleet{unit("low", 50, 1, 5), unit("high", 60, 5, 100)};
  auto r = fa::rank_fleet(fleet, fleet[0].as_of, fa::RankingOptions{});
  EXPECT_EQ(r.units[0].unit_id, "high");
  EXPECT_GT(*r.units[0].risk, *r.units[1].risk);
}

TEST(FleetRanking, MvaDueByYearFromReplacementYears) {
  auto a = unit("A", 20, 5, 80);          // replace now: 2024
  auto b = unit("B", 60, 3, 40);          // life 3.5 years: replace in 2027
  b.remaining_life.years = 3.5;
  auto c = unit("C", 60, 3, 25);
  c.remaining_life.years = 3.2;           // 2027 too
  auto d = unit("D", 45, 3, 60);          // refurbish: not counted
  auto r = fa::rank_fleet({a, b, c, d}, a.as_of, fa::RankingOptions{});
  ASSERT_EQ(r.mva_due_by_year.size(), 10u);
  EXPECT_EQ(r.mva_due_by_year[0].year, 2024);
  EXPECT_DOUBLE_EQ(r.mva_due_by_year[0].mva, 80);
  EXPECT_EQ(r.mva_due_by_year[3].year, 2027);
  EXPECT_DOUBLE_EQ(r.mva_due_by_year[3].mva, 65);
  EXPECT_EQ(r.mva_due_by_year[3].units, 2);
  double total = 0;
  for (const auto& y : r.mva_due_by_year) total += y.mva;
  EXPECT_DOUBLE_EQ(total, 145);
}

TEST(FleetRanking, EmptyFleet) {
  auto r = fa::rank_fleet({}, fa::days_from_civil(2024, 1, 1), fa::RankingOptions{});
  EXPECT_TRUE(r.units.empty());
  EXPECT_EQ(r.mva_due_by_year.size(), 10u);
}

// Action thresholds at the band edges (Jahromi 2009 HI table, from memory;
// each edge belongs to the worse band): 30 replace, 30.1 refurbish, 50
// refurbish, 70 intensify monitoring, 70.1 routine.
TEST(FleetRanking, ActionThresholdsBothSides) {
  std::vector<fa::UnitAssessment> fleet{unit("a", 30, 3, 10), unit("b", 30.1, 3, 10), unit("c", 50, 3, 10),
                                        unit("d", 70, 3, 10), unit("e", 70.1, 3, 10)};
  auto r = fa::rank_fleet(fleet, fleet[0].as_of, fa::RankingOptions{});
  std::vector<std::string> got;
  for (const auto& u : r.units) got.push_back(u.unit_id + ":" + u.recommended_action);
  EXPECT_EQ(got, (std::vector<std::string>{"a:replace", "b:refurbish", "c:refurbish", "d:intensify monitoring",
                                           "e:routine"}));
}

// A correctable finding (unsafe item, hot connection) caps the index, so the
// unit ranks high on risk, but the replacement advice follows the condition
// without it: the row says "repair" this year, never "routine" (ferrum's
// reading of CIGRE TB 761 gating; common practice, no published source for
// the split).
TEST(FleetRanking, CorrectableFindingRaisesRiskNotReplacement) {
  auto capped = unit("T-UNSAFE", 30, 3, 40);
  capped.condition_index = 82;
  capped.remaining_life.years = 40;
  auto worn = unit("T-WORN", 30, 3, 40);
  worn.remaining_life.years = 40;
  const auto r = fa::rank_fleet({capped, worn}, capped.as_of, {});
  ASSERT_EQ(r.units.size(), 2u);
  EXPECT_TRUE(r.units[0].tied);  // same risk: both at index 30
  for (const auto& u : r.units) {
    if (u.unit_id == "T-UNSAFE") {
      EXPECT_EQ(u.recommended_action, "repair");
      EXPECT_EQ(u.action_year, fa::civil_from_days(capped.as_of).year);
    } else {
      EXPECT_EQ(u.recommended_action, "replace");
    }
  }
}

// The ranking from ranking_fields equals the ranking from whole assessments,
// on a fleet that uses every field rank_fleet reads and many it does not.
// (Consistency of two code paths: no engineering value, no source needed.)
TEST(FleetRanking, RankingFieldsGiveTheSameRanking) {
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
    a.actions.push_back({});
    a.dga.tdcg_ppm = 500;
  }
  fa::RankingOptions o;
  o.weight_customers = 0.5;
  const auto whole = fa::rank_fleet(fleet, fleet[0].as_of, o);
  std::vector<fa::UnitAssessment> reduced;
  for (const auto& a : fleet) reduced.push_back(fa::ranking_fields(a));
  EXPECT_TRUE(reduced[0].methods.empty());
  const auto from_fields = fa::rank_fleet(reduced, fleet[0].as_of, o);
  ASSERT_EQ(whole.units.size(), from_fields.units.size());
  for (std::size_t i = 0; i < whole.units.size(); ++i) {
    const auto &x = whole.units[i], &y = from_fields.units[i];
    EXPECT_EQ(std::tie(x.rank, x.tied, x.unit_id, x.site, x.rated_mva, x.health_index, x.band, x.remaining_life_years,
                       x.limiting_factor, x.probability_of_failure, x.consequence, x.risk, x.recommended_action,
                       x.action_year, x.insufficient_data, x.note),
              std::tie(y.rank, y.tied, y.unit_id, y.site, y.rated_mva, y.health_index, y.band, y.remaining_life_years,
                       y.limiting_factor, y.probability_of_failure, y.consequence, y.risk, y.recommended_action,
                       y.action_year, y.insufficient_data, y.note))
        << x.unit_id;
  }
  ASSERT_EQ(whole.mva_due_by_year.size(), from_fields.mva_due_by_year.size());
  for (std::size_t i = 0; i < whole.mva_due_by_year.size(); ++i)
    EXPECT_EQ(whole.mva_due_by_year[i].mva, from_fields.mva_due_by_year[i].mva);
}
