#include "analytics/dga_co2_co_ratio.h"

#include <gtest/gtest.h>

#include "dga_test_sample.h"

namespace ferrum::analytics {
namespace {
using testing::gas_sample;

// Bands: < 3 paper involved, 3-10 normal (IEC 60599 / CIGRE), > 10 possible overheating;
// US Bureau of Reclamation FIST 3-30 uses 11.
TEST(Co2CoRatio, BandsAndBoundaries) {
  EXPECT_EQ(co2_co_reading(gas_sample(0, {.co = 1000, .co2 = 2990})).band, "<3");
  EXPECT_EQ(co2_co_reading(gas_sample(0, {.co = 1000, .co2 = 3000})).band, "3-10");
  EXPECT_EQ(co2_co_reading(gas_sample(0, {.co = 1000, .co2 = 10000})).band, "3-10");
  EXPECT_EQ(co2_co_reading(gas_sample(0, {.co = 1000, .co2 = 10010})).band, ">10");
  Co2CoOptions reclamation;
  reclamation.upper = 11;
  EXPECT_EQ(co2_co_reading(gas_sample(0, {.co = 1000, .co2 = 10500}), reclamation).band, "3-11");
  auto low = co2_co_reading(gas_sample(0, {.co = 1000, .co2 = 2000}));
  EXPECT_NEAR(*low.ratio, 2.0, 1e-12);
  EXPECT_NE(low.reading.find("paper involved"), std::string::npos);
}

TEST(Co2CoRatio, BackgroundGuardBothSides) {
  // C57.104-2008 Table 1 Condition 1: CO 350, CO2 2500.
  EXPECT_FALSE(co2_co_reading(gas_sample(0, {.co = 350, .co2 = 2500})).applicable);
  EXPECT_TRUE(co2_co_reading(gas_sample(0, {.co = 351, .co2 = 2500})).applicable);
  EXPECT_TRUE(co2_co_reading(gas_sample(0, {.co = 100, .co2 = 2501})).applicable);
}

TEST(Co2CoRatio, OutsideValidity) {
  EXPECT_FALSE(co2_co_reading(gas_sample(0, {.co = -5, .co2 = 3000})).ratio);
  EXPECT_FALSE(co2_co_reading(gas_sample(0, {.co = 400, .co2 = testing::kNotAnalysed})).applicable);
}

}  // namespace
}  // namespace ferrum::analytics
