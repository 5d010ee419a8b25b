// A rejected file holding newer results than the store (issue #16, What to
// build 4). The rule is ferrum's own (analytics/held_back.h): common practice,
// no published source; what it checks is plumbing of dates, not an engineering value.
#include "analytics/held_back.h"

#include <gtest/gtest.h>

namespace ferrum::analytics {
namespace {

TEST(HeldBack, OnlyResultsNewerThanTheStoredOnesAreHeldBack) {
  UnitData d;
  OilSample s;
  s.date = days_from_civil(2026, 10, 6);
  d.oil_samples.push_back(s);
  d.held_back.push_back({"oil", days_from_civil(2026, 11, 12), "2026-11-20", "lab/oil-nov.csv"});
  d.held_back.push_back({"infrared", days_from_civil(2026, 1, 5), "2026-02-01", "ir/survey.csv"});  // none stored
  d.held_back.push_back({"inspection", days_from_civil(2026, 1, 5), "2026-02-01", "field/x.csv"});
  InspectionRecord r;
  r.date = days_from_civil(2026, 3, 1);  // a newer inspection was accepted since
  d.inspections.push_back(r);
  const auto held = newer_held_back(d);
  ASSERT_EQ(held.size(), 2u);
  EXPECT_EQ(held[0].kind, "oil");
  EXPECT_EQ(held[1].kind, "infrared");
  EXPECT_EQ(held_back_text(held[0]),
            "a file rejected on 2026-11-20 (lab/oil-nov.csv) holds a newer oil sample (2026-11-12): ask the lab to "
            "correct it and drop it again");
}

TEST(HeldBack, ASampleOfTheSameDateAcceptedSinceClearsIt) {
  UnitData d;
  OilSample s;
  s.date = days_from_civil(2026, 11, 12);
  d.oil_samples.push_back(s);
  d.held_back.push_back({"oil", days_from_civil(2026, 11, 12), "2026-11-20", "lab/oil-nov.csv"});
  EXPECT_TRUE(newer_held_back(d).empty());
}

}  // namespace
}  // namespace ferrum::analytics
