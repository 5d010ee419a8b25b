// An earth stolen at one unit prompts a check of the other units' earths at
// the site (issue #16). The rule and its 7-day due date are ferrum's own
// (analytics/site_earth_check.h): common practice, no published source.
#include "analytics/site_earth_check.h"

#include <gtest/gtest.h>

#include "analytics/action_plan.h"

namespace ferrum::analytics {
namespace {

const Day kFound = days_from_civil(2026, 10, 14);
const Day kAsOf = days_from_civil(2026, 12, 1);

InspectionRecord grounding(Day d, Rating r, std::string note) {
  InspectionRecord x;
  x.date = d;
  x.item = "grounding";
  x.rating = r;
  x.note = std::move(note);
  return x;
}

UnitData sibling_of_stolen_earth() {
  UnitData d;
  d.info.unit_id = "TKQ-T1";
  d.info.site = "Tarkeq";
  d.site_inspections.push_back({"TKQ-T2", grounding(kFound, Rating::unsafe, "tank earth conductor cut and removed (theft)")});
  return d;
}

// Common practice, no published source: copper theft rarely stops at one
// conductor, so the other units' earths at the site are checked.
TEST(SiteEarthCheck, StolenEarthAtAnotherUnitIsAnActionAnchoredOnTheFinding) {
  UnitAssessment a;
  add_site_earth_check(sibling_of_stolen_earth(), kAsOf, {}, a);
  ASSERT_EQ(a.actions.size(), 1u);
  const Action& x = a.actions[0];
  EXPECT_EQ(x.need, "site-earth-check");
  EXPECT_EQ(x.found, kFound);  // the inspection date, not the report date
  EXPECT_EQ(x.due, kFound + 7);
  EXPECT_EQ(x.source, kSourceInspection);
  EXPECT_EQ(x.crew, kCrewMaintenance);
  EXPECT_NE(x.text.find("TKQ-T2"), std::string::npos);
  EXPECT_NE(x.reason.find("theft"), std::string::npos);
}

TEST(SiteEarthCheck, OwnEarthInspectedSinceClosesTheCheck) {
  UnitData d = sibling_of_stolen_earth();
  d.inspections.push_back(grounding(kFound + 3, Rating::good, ""));
  UnitAssessment a;
  add_site_earth_check(d, kAsOf, {}, a);
  EXPECT_TRUE(a.actions.empty());
}

TEST(SiteEarthCheck, OrdinaryEarthFindingsAndLaterFindingsAreNoCause) {
  UnitData d;
  d.info.unit_id = "TKQ-T1";
  d.site_inspections.push_back({"TKQ-T2", grounding(kFound, Rating::poor, "surface corrosion on earth clamps")});
  d.site_inspections.push_back({"TKQ-T3", grounding(kAsOf + 1, Rating::unsafe, "earth missing")});  // after as_of
  UnitAssessment a;
  add_site_earth_check(d, kAsOf, {}, a);
  EXPECT_TRUE(a.actions.empty());
  EXPECT_TRUE(earth_missing(grounding(kFound, Rating::poor, "earth strap stolen")));
  EXPECT_FALSE(earth_missing(grounding(kFound, Rating::fair, "earth strap stolen, replaced the same day")));
}

}  // namespace
}  // namespace ferrum::analytics
