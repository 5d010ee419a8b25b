#include "analytics/paper_furan_dp.h"

#include <gtest/gtest.h>

namespace ferrum::analytics {
namespace {

// Chendong check values, computed by hand from the correlation (from memory; verify):
// 0.1 ppm -> 717, 1 ppm -> 431, 5 ppm -> 232, DP 200 <-> 6.46 ppm.
TEST(PaperFuranDp, ChendongCheckValues) {
  EXPECT_NEAR(*chendong_dp(0.1), 717.1, 0.5);
  EXPECT_NEAR(*chendong_dp(1.0), 431.4, 0.5);
  EXPECT_NEAR(*chendong_dp(5.0), 231.7, 0.5);
  EXPECT_NEAR(*chendong_dp(6.46), 200, 0.5);
  EXPECT_FALSE(chendong_dp(0));
}

// De Pablo check values (computed; correlation from memory): 0 -> 800, 1 -> 719,
// DP 200 <-> 26.6 ppm.
TEST(PaperFuranDp, DePabloCheckValues) {
  EXPECT_NEAR(de_pablo_dp(0), 799.5, 0.5);
  EXPECT_NEAR(de_pablo_dp(1), 718.6, 0.5);
  EXPECT_NEAR(de_pablo_dp(26.6), 200, 0.5);
}

TEST(PaperFuranDp, InputIsPpbConvertedToPpm) {
  UnitInfo unit;
  auto r = estimate_paper_dp(LabValue::measured(1000), 100, unit);  // 1000 ppb = 1 ppm
  ASSERT_TRUE(r.applicable);
  EXPECT_NEAR(*r.dp_chendong, 431.4, 0.5);
  EXPECT_NEAR(*r.dp_de_pablo, 718.6, 0.5);
  // Life used with DP new 1000 / end 200 (public sources): (1000 - 431.4) / 800 = 71.1 %.
  EXPECT_NEAR(*r.life_used_pct, 71.1, 0.1);
  EXPECT_TRUE(r.trustworthy);
}

TEST(PaperFuranDp, LifeUsedClampsAtBothEnds) {
  EXPECT_DOUBLE_EQ(paper_life_used_pct(1000), 0);
  EXPECT_DOUBLE_EQ(paper_life_used_pct(1100), 0);
  EXPECT_DOUBLE_EQ(paper_life_used_pct(200), 100);
  EXPECT_DOUBLE_EQ(paper_life_used_pct(150), 100);
  EXPECT_DOUBLE_EQ(paper_life_used_pct(600), 50);
}

TEST(PaperFuranDp, OilTreatmentMakesLaterSamplesUntrustworthy) {
  UnitInfo unit;
  unit.oil_treated = 1000;
  EXPECT_TRUE(estimate_paper_dp(LabValue::measured(500), 999, unit).trustworthy);
  auto after = estimate_paper_dp(LabValue::measured(500), 1000, unit);
  EXPECT_FALSE(after.trustworthy);
  EXPECT_NE(after.note.find("furans were reset"), std::string::npos);
}

TEST(PaperFuranDp, BelowDetectionAndMissingGiveNoEstimate) {
  UnitInfo unit;
  auto below = estimate_paper_dp(LabValue::below(50), 0, unit);
  EXPECT_FALSE(below.applicable);
  EXPECT_FALSE(below.dp_chendong);
  EXPECT_NE(below.note.find("DP above about"), std::string::npos);
  EXPECT_FALSE(estimate_paper_dp(LabValue{}, 0, unit).applicable);
  unit.paper = PaperType::upgraded;
  EXPECT_FALSE(estimate_paper_dp(LabValue::measured(500), 0, unit).trustworthy);
}

}  // namespace
}  // namespace ferrum::analytics
