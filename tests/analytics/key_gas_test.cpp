#include "analytics/key_gas.h"

#include <gtest/gtest.h>

#include "dga_test_sample.h"

namespace ferrum::analytics {
namespace {
using testing::gas_sample;

// Typical key-gas proportions of IEEE C57.104-2008 (from memory), scaled to ppm.
TEST(KeyGas, PublishedProportionsGiveTheirFault) {
  // Overheated oil: C2H4 63 %, C2H6 20 %, CH4 16 %, H2 2 %.
  auto oil = key_gas_reading(gas_sample(0, {.h2 = 20, .ch4 = 160, .c2h6 = 200, .c2h4 = 630, .co = 0}), {}, false);
  EXPECT_EQ(oil.key_gas, "C2H4");
  EXPECT_EQ(oil.reading.rfind("overheated oil", 0), 0u);
  // Overheated cellulose: CO 92 %.
  auto paper = key_gas_reading(gas_sample(0, {.h2 = 20, .ch4 = 10, .c2h6 = 5, .c2h4 = 5, .co = 920}), {}, false);
  EXPECT_EQ(paper.key_gas, "CO");
  EXPECT_EQ(paper.reading.rfind("overheated cellulose", 0), 0u);
  // Corona: H2 85 %, CH4 13 %.
  auto pd = key_gas_reading(gas_sample(0, {.h2 = 850, .ch4 = 130, .c2h6 = 10, .c2h4 = 10}), {}, false);
  EXPECT_EQ(pd.reading.rfind("partial discharge", 0), 0u);
  // Arcing: H2 60 %, C2H2 30 %.
  auto arc = key_gas_reading(gas_sample(0, {.h2 = 600, .ch4 = 50, .c2h6 = 10, .c2h4 = 40, .c2h2 = 300}), {}, false);
  EXPECT_EQ(arc.reading.rfind("arcing", 0), 0u);
  EXPECT_NEAR(arc.share_pct[4], 30, 1e-9);
}

TEST(KeyGas, ArcingShareThresholdBothSides) {
  // H2 dominant; C2H2 share 14.9 % vs 15 % (KeyGasOptions default).
  auto below = key_gas_reading(gas_sample(0, {.h2 = 851, .c2h2 = 149}), {}, false);
  EXPECT_EQ(below.reading.rfind("partial discharge", 0), 0u);
  auto at = key_gas_reading(gas_sample(0, {.h2 = 850, .c2h2 = 150}), {}, false);
  EXPECT_EQ(at.reading.rfind("arcing", 0), 0u);
}

TEST(KeyGas, LowGasesOrMissingGasGiveNoReading) {
  auto low = key_gas_reading(gas_sample(0, {.h2 = 20, .ch4 = 10, .co = 200}), {}, false);
  EXPECT_FALSE(low.applicable);
  EXPECT_NE(low.reading.find("concentrations too low"), std::string::npos);
  auto missing = key_gas_reading(gas_sample(0, {.h2 = 500, .co = testing::kNotAnalysed}), {}, false);
  EXPECT_FALSE(missing.applicable);
}

}  // namespace
}  // namespace ferrum::analytics
