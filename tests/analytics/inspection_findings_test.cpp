// Inspection review; rules are ferrum's own (inspection_findings.h): common
// practice, no published source (rating scale of the drop contract, 365-day
// default interval as common utility practice).
#include "analytics/inspection_findings.h"

#include <gtest/gtest.h>

namespace ferrum::analytics {
namespace {

InspectionRecord rec(Day d, const char* item, Rating r) {
  InspectionRecord x;
  x.date = d;
  x.item = item;
  x.rating = r;
  return x;
}

TEST(InspectionFindings, LatestRatingPreviousAndWorse) {
  const std::vector<InspectionRecord> v = {rec(100, "bushings", Rating::good), rec(400, "bushings", Rating::poor),
                                           rec(100, "tank", Rating::fair), rec(400, "tank", Rating::good)};
  const auto r = review_inspections(v, 500, {});
  ASSERT_EQ(r.findings.size(), 2u);
  // Worst first, a lower rating than the previous one is "worse": common
  // practice, no published source.
  EXPECT_EQ(r.findings[0].item, "bushings");
  EXPECT_EQ(r.findings[0].rating, Rating::poor);
  EXPECT_EQ(*r.findings[0].previous, Rating::good);
  EXPECT_TRUE(r.findings[0].worse);
  EXPECT_FALSE(r.findings[1].worse);
  EXPECT_EQ(r.worse_items, std::vector<std::string>{"bushings"});
  EXPECT_EQ(*r.latest, 400);
}

// Overdue strictly after the interval: 365 days is not overdue, 366 is (a
// yearly visual inspection: common utility practice, no published source).
TEST(InspectionFindings, OverdueBothSidesOfInterval) {
  const std::vector<InspectionRecord> v = {rec(100, "fans", Rating::good)};
  EXPECT_TRUE(review_inspections(v, 465, {}).overdue_items.empty());
  EXPECT_EQ(review_inspections(v, 466, {}).overdue_items.size(), 1u);
  InspectionOptions o;
  o.interval_days = 180;
  EXPECT_EQ(review_inspections(v, 281, o).overdue_items.size(), 1u);
}

// An unsafe item leads the list; records after the as-of day are not yet
// known (common practice, no published source).
TEST(InspectionFindings, UnsafeItemsFirstAndFutureRecordsIgnored) {
  const std::vector<InspectionRecord> v = {rec(100, "fans", Rating::fair), rec(120, "oil_level", Rating::unsafe),
                                           rec(900, "fans", Rating::unsafe)};
  const auto r = review_inspections(v, 200, {});
  EXPECT_EQ(r.unsafe_items, std::vector<std::string>{"oil_level"});
  EXPECT_EQ(r.findings[0].item, "oil_level");
  EXPECT_EQ(r.findings[1].rating, Rating::fair);
}

// Two ratings of one item on one day: the worse counts (common practice, no
// published source).
TEST(InspectionFindings, SameDayWorstCountsAndNoRecords) {
  const std::vector<InspectionRecord> v = {rec(100, "fans", Rating::good), rec(100, "fans", Rating::very_poor)};
  EXPECT_EQ(review_inspections(v, 200, {}).findings[0].rating, Rating::very_poor);
  EXPECT_FALSE(review_inspections(v, 200, {}).findings[0].previous);
  const auto none = review_inspections({}, 200, {});
  EXPECT_TRUE(none.findings.empty());
  EXPECT_FALSE(none.latest);
}

}  // namespace
}  // namespace ferrum::analytics
