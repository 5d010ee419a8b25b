#include "report/assessment_changes.h"

#include <gtest/gtest.h>

#include "tests/report/report_fixtures.h"

namespace ferrum::report {
namespace {

bool has(const std::vector<std::string>& lines, const std::string& part) {
  for (const auto& l : lines)
    if (l.find(part) != std::string::npos) return true;
  return false;
}

TEST(AssessmentChanges, NoPreviousReport) {
  const auto lines = describe_changes(fixtures::filled_unit(), nullptr);
  ASSERT_EQ(lines.size(), 1u);
  EXPECT_TRUE(has(lines, "nothing to compare"));
}

TEST(AssessmentChanges, WorseIndexNewDataAndConditionChanges) {
  const auto cur = fixtures::filled_unit();
  const auto prev = fixtures::previous_of_filled();
  const auto lines = describe_changes(cur, &prev);
  EXPECT_EQ(lines.front(), "Health index worse by 5 points: 58 (previous report 2026-05-31: 63).");
  EXPECT_TRUE(has(lines, "condition changed from 1 to 2"));
  EXPECT_TRUE(has(lines, "moved from T2 to DT"));
  EXPECT_TRUE(has(lines, "Active-arcing gas signature is new"));
  EXPECT_TRUE(has(lines, "Inspection: radiators worse, fair → poor."));
  EXPECT_TRUE(has(lines, "2 new infrared finding(s)."));
  EXPECT_TRUE(has(lines, "New oil data up to 2026-10-13 (previously 2026-04-13)."));
  EXPECT_TRUE(has(lines, "New action: Repair the radiator 3 header gasket."));
  EXPECT_FALSE(has(lines, "New load data"));  // same latest load date in both
}

TEST(AssessmentChanges, BetterAndUnchangedCompareAsPrinted) {
  auto cur = fixtures::filled_unit();
  auto prev = cur;
  prev.health_index = 57.8;  // prints 58 like the current 57.6
  EXPECT_EQ(describe_changes(cur, &prev).front(), "Health index unchanged at 58 (previous report 2026-11-30: 58).");
  prev.health_index = 50.2;
  prev.band = "poor";
  const auto lines = describe_changes(cur, &prev);
  EXPECT_EQ(lines.front(), "Health index better by 8 points: 58 (previous report 2026-11-30: 50).");
  EXPECT_TRUE(has(lines, "Condition band changed from poor to fair."));
}

TEST(AssessmentChanges, IdenticalAssessmentsSayNoChangeBeyondIndex) {
  const auto cur = fixtures::empty_unit();
  const auto lines = describe_changes(cur, &cur);
  ASSERT_EQ(lines.size(), 1u);
  EXPECT_TRUE(has(lines, "No change since the previous report"));
}

}  // namespace
}  // namespace ferrum::report
