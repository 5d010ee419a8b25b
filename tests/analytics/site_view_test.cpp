// Site view: load against installed capacity and N-1 with the largest unit
// out (analytics/site_view.h). The N-1 criterion and the sum of unit peaks
// are common planning practice, no published source; the capability of each
// unit is its long-time emergency load (IEC 60076-7:2005 Table 4, 140 °C),
// given here directly as the thermal part would have computed it.
#include "analytics/site_view.h"

#include <gtest/gtest.h>

#include <tuple>

namespace ferrum::analytics {
namespace {

UnitAssessment unit(const std::string& id, const std::string& site, double mva, std::optional<double> peak_pu,
                    std::optional<double> emergency_pu = 1.3) {
  UnitAssessment a;
  a.unit.unit_id = id;
  a.unit.site = site;
  a.unit.rated_mva = mva;
  a.thermal.peak_load_pu = peak_pu;
  if (peak_pu) a.thermal.emergency_load_pu = emergency_pu;
  return a;
}

Action load_reduce() {
  Action x;
  x.priority = 3;
  x.text = "Reduce the load or transfer load to other units";
  x.reason = "model hot spot above 120 °C";
  return x;
}

// Two 40 MVA units at half load: with one out, the other carries 1.3 × 40 =
// 52 MVA against a 40 MVA peak (N-1, common practice; 1.3 p.u. stands for the
// IEC 60076-7 long-time emergency capability).
TEST(SiteView, NMinusOnePassesWhenTheOthersCarryThePeak) {
  const std::vector<UnitAssessment> fleet = {unit("T1", "North", 40, 0.5), unit("T2", "North", 40, 0.45),
                                             unit("T9", "South", 10, 0.2)};
  const auto sites = site_view(fleet, {});
  ASSERT_EQ(sites.size(), 2u);
  const auto& s = sites[0];
  EXPECT_EQ(s.site, "North");
  EXPECT_DOUBLE_EQ(s.installed_mva, 80);
  EXPECT_DOUBLE_EQ(*s.peak_load_mva, 38);  // 20 + 18: sum of the units' peaks
  EXPECT_EQ(s.n1_unit_out, "T1");          // equal ratings and capacity left: the higher peak goes out
  EXPECT_DOUBLE_EQ(*s.n1_capacity_mva, 52);
  EXPECT_DOUBLE_EQ(*s.n1_margin_mva, 14);
  ASSERT_TRUE(s.n1_ok);
  EXPECT_TRUE(*s.n1_ok);
  EXPECT_FALSE(s.flagged());
  EXPECT_NE(s.n1_text.find("N-1 passes"), std::string::npos);
  // A site of one unit cannot carry its load with that unit out (N-1, common practice).
  EXPECT_TRUE(sites[1].flagged());
}

// N-1 is the loss of any one unit (common planning practice, no published
// source): of two equal 60 MVA units, losing the one that can take load leaves
// less than losing the one that cannot. Peaks: T1 30, T2 36, T3 10 (76 MVA).
// T2 (unhealthy: active arcing) carries only its own peak 36; T1 can carry
// 1.3 × 60 = 78, T3 (20 MVA) 26. Out T1: 36 + 26 = 62, short by 14; out T2:
// 78 + 26 = 104, a margin of 28. Taking out the more loaded unit of equal
// rating (the rule before) said N-1 passes.
TEST(SiteView, NMinusOneTakesTheWorstSingleOutage) {
  std::vector<UnitAssessment> fleet = {unit("T1", "West", 60, 0.5), unit("T2", "West", 60, 0.6),
                                       unit("T3", "West", 20, 0.5)};
  fleet[1].active_arcing = true;
  const auto s = site_view(fleet, {}).at(0);
  EXPECT_EQ(s.n1_unit_out, "T1");
  EXPECT_DOUBLE_EQ(*s.peak_load_mva, 76);
  EXPECT_DOUBLE_EQ(*s.n1_capacity_mva, 62);
  EXPECT_DOUBLE_EQ(*s.n1_margin_mva, -14);
  EXPECT_TRUE(s.flagged());
}

// 40 + 20 MVA at 0.8 p.u.: 48 MVA of peak; with the 40 MVA unit out the
// 20 MVA unit carries 1.3 × 20 = 26 MVA: short by 22 MVA (N-1 fails).
TEST(SiteView, NMinusOneFailsAndIsFlagged) {
  const std::vector<UnitAssessment> fleet = {unit("T1", "East", 40, 0.8), unit("T2", "East", 20, 0.8)};
  const auto s = site_view(fleet, {}).at(0);
  EXPECT_EQ(s.n1_unit_out, "T1");
  EXPECT_DOUBLE_EQ(*s.peak_load_mva, 48);
  EXPECT_DOUBLE_EQ(*s.n1_capacity_mva, 26);
  EXPECT_DOUBLE_EQ(*s.n1_margin_mva, -22);
  EXPECT_TRUE(s.flagged());
  EXPECT_NE(s.n1_text.find("short by 22.0 MVA"), std::string::npos);
  EXPECT_NE(site_line(s).find("60 MVA installed"), std::string::npos);
}

// A wet unit (water in paper 3.1 % > 2.5 %, [analysis] site_wet_paper_pct;
// common practice) takes no transferred load: it counts with its own peak
// only, so a site that passes with it fails without it, and no load-transfer
// advice names it.
TEST(SiteView, WetTargetTakesNoLoad) {
  std::vector<UnitAssessment> fleet = {unit("T1", "West", 40, 0.6), unit("T2", "West", 40, 0.3)};
  EXPECT_TRUE(*site_view(fleet, {}).at(0).n1_ok);  // 36 MVA peak, 52 MVA capability
  EXPECT_NE(transfer_advice(site_view(fleet, {}).at(0), "T1").find("transfer load to T2"), std::string::npos);
  fleet[1].oil.paper_moisture_pct = 3.1;
  const auto sites = site_view(fleet, {});
  const auto& s = sites.at(0);
  EXPECT_TRUE(s.units[1].wet);
  EXPECT_FALSE(s.units[1].can_take_load());
  EXPECT_DOUBLE_EQ(*s.n1_capacity_mva, 12);  // T2 carries its own 12 MVA, no more
  EXPECT_TRUE(s.flagged());
  EXPECT_TRUE(transfer_targets(s, "T1").empty());
  const std::string advice = transfer_advice(s, "T1");
  EXPECT_EQ(advice.find("transfer load to"), std::string::npos);
  EXPECT_NE(advice.find("no other unit at West can take load"), std::string::npos);
  EXPECT_NE(advice.find("wet paper (3.1 % water"), std::string::npos);
  // The threshold is the site's setting: 3.5 % makes 3.1 % acceptable.
  SiteViewOptions o;
  o.wet_paper_pct = 3.5;
  EXPECT_TRUE(site_view(fleet, o).at(0).units[1].can_take_load());
}

// A constrained unit (hot spot above the 120 °C normal cyclic limit of
// IEC 60076-7 Table 4 in the window) or an unhealthy one (unsafe inspection
// item) is never a transfer target; a healthy neighbour with room is named
// with its spare capacity at nameplate (rated − peak).
TEST(SiteView, ConstrainedOrUnhealthyTargetExcluded) {
  std::vector<UnitAssessment> fleet = {unit("T1", "Mill", 20, 1.1), unit("T2", "Mill", 20, 0.5),
                                       unit("T3", "Mill", 20, 0.4), unit("T4", "Mill", 7.5, 0.2)};
  fleet[0].thermal.hours_above_normal_cyclic = 30;
  fleet[0].actions.push_back(load_reduce());
  fleet[1].thermal.hours_above_normal_cyclic = 2;  // constrained
  fleet[2].unsafe_inspection = true;               // unhealthy
  const auto sites = site_view(fleet, {});
  const auto& s = sites.at(0);
  EXPECT_TRUE(s.units[1].constrained);
  EXPECT_TRUE(s.units[2].unhealthy);
  const auto targets = transfer_targets(s, "T1");
  ASSERT_EQ(targets.size(), 1u);
  EXPECT_EQ(targets[0]->unit_id, "T4");
  EXPECT_DOUBLE_EQ(*targets[0]->spare_mva, 6);  // 7.5 − 1.5 MVA
  apply_site_view(fleet, sites);
  EXPECT_EQ(fleet[0].actions[0].text, "Reduce the load or transfer load to T4 (6.0 MVA spare at nameplate)");
  EXPECT_NE(fleet[0].site_summary.find("Site Mill: 4 units, 67.5 MVA installed"), std::string::npos);
  // With T4 unhealthy too, the advice says there is no target and why.
  fleet[3].decision.action = "replace";
  apply_site_view(fleet, site_view(fleet, {}));
  EXPECT_EQ(fleet[0].actions[0].text.rfind("Reduce the load: no other unit at Mill can take load", 0), 0u);
  EXPECT_NE(fleet[0].actions[0].text.find("T2: loading limited"), std::string::npos);
  EXPECT_NE(fleet[0].actions[0].text.find("T4: work pending (decision: replace)"), std::string::npos);
}

// A unit whose C57.104-2008 condition comes from CO2 alone (paper ageing)
// still takes load; a fault-gas condition 3 (Table 1 without CO and CO2) does
// not (IEEE C57.104-2008, Table 1; the rule itself is common practice, no
// published source).
TEST(SiteView, CarbonOxidesAloneDoNotBarATarget) {
  std::vector<UnitAssessment> fleet = {unit("T1", "Mill", 20, 0.9), unit("T2", "Mill", 20, 0.4)};
  fleet[1].dga.c57104_2008_condition = 3;        // CO2 above its Condition 3 limit
  fleet[1].dga.c57104_2008_fault_condition = 1;  // the fault gases are low
  EXPECT_FALSE(site_view(fleet, {}).at(0).units[1].unhealthy);
  fleet[1].dga.c57104_2008_fault_condition = 3;
  EXPECT_TRUE(site_view(fleet, {}).at(0).units[1].unhealthy);
}

// Without load data for a unit the site's peak is unknown: N-1 is not
// assessed rather than guessed (absent data is absent).
TEST(SiteView, MissingLoadLeavesNMinusOneUnknown) {
  const std::vector<UnitAssessment> fleet = {unit("T1", "Hill", 40, 0.5), unit("T2", "Hill", 40, std::nullopt)};
  const auto s = site_view(fleet, {}).at(0);
  EXPECT_FALSE(s.peak_load_mva);
  EXPECT_FALSE(s.n1_ok);
  EXPECT_FALSE(s.flagged());
  EXPECT_EQ(s.without_load, std::vector<std::string>{"T2"});
  EXPECT_NE(s.n1_text.find("not assessed"), std::string::npos);
}

// The site view from the compact ranking inputs (what `rank` and the ranking
// cache hold) equals the one from the whole assessments, with every input
// that bars a unit from taking load in use, and rewrites the first action the
// same way. (Consistency of two code paths: no engineering value.)
TEST(SiteView, RankingInputsGiveTheSameView) {
  std::vector<UnitAssessment> fleet = {unit("T1", "Mill", 20, 1.1), unit("T2", "Mill", 20, 0.5),
                                       unit("T3", "Mill", 20, 0.4), unit("T4", "Mill", 7.5, 0.2),
                                       unit("T5", "Mill", 10, 0.3), unit("T6", "Mill", 10, 0.3),
                                       unit("T7", "Mill", 10, std::nullopt), unit("T8", "Mill", 12, 0.1),
                                       unit("T9", "Dale", 40, 0.5)};
  fleet[0].thermal.hours_above_normal_cyclic = 30;
  fleet[0].thermal.normal_cyclic_limit_c = 110;
  fleet[0].decision.first_action = load_reduce();
  fleet[1].thermal.hot_spot_from_measured_top_oil = true;
  fleet[2].unsafe_inspection = true;
  fleet[3].oil.paper_moisture_pct = 3.1;
  fleet[4].active_arcing = true;
  fleet[5].dga.c57104_2008_fault_condition = 4;
  fleet[6].decision.action = "refurbish";
  fleet[8].decision.first_action = load_reduce();
  auto rows = ranking_inputs(fleet);
  const auto whole = site_view(fleet, {});
  const auto compact = site_view(rows, {});
  ASSERT_EQ(whole.size(), compact.size());
  for (std::size_t i = 0; i < whole.size(); ++i) {
    EXPECT_EQ(site_line(whole[i]), site_line(compact[i]));
    ASSERT_EQ(whole[i].units.size(), compact[i].units.size());
    for (std::size_t k = 0; k < whole[i].units.size(); ++k) {
      const auto &x = whole[i].units[k], &y = compact[i].units[k];
      EXPECT_EQ(std::tie(x.unit_id, x.rated_mva, x.peak_load_mva, x.emergency_mva, x.limits, x.spare_mva),
                std::tie(y.unit_id, y.rated_mva, y.peak_load_mva, y.emergency_mva, y.limits, y.spare_mva))
          << x.unit_id;
    }
  }
  EXPECT_EQ(whole[0].units[7].limits, std::vector<std::string>{});  // T8 can take load: a target of T1
  apply_site_view(fleet, whole);
  apply_site_view(rows, compact);
  for (std::size_t k = 0; k < fleet.size(); ++k) {
    ASSERT_EQ(bool(fleet[k].decision.first_action), bool(rows[k].first_action));
    if (rows[k].first_action) {
      EXPECT_EQ(fleet[k].decision.first_action->text, rows[k].first_action->text);
    }
  }
  EXPECT_EQ(rows[0].first_action->text, "Reduce the load or transfer load to T8 (10.8 MVA spare at nameplate)");
  EXPECT_EQ(rows[8].first_action->text.rfind("Reduce the load: no other unit at Dale can take load", 0), 0u);
}

}  // namespace
}  // namespace ferrum::analytics
