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
  // Overheated cellulose: CO 92 %, with H2 above its typical value so that the
  // IEC 60599 precondition holds.
  auto paper = key_gas_reading(gas_sample(0, {.h2 = 200, .ch4 = 100, .c2h6 = 50, .c2h4 = 50, .co = 9200}), {}, false);
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

// Issue #16: "overheated cellulose" where the other methods decline. The key
// gas is applied only when IEC 60599's precondition holds (a fault gas above
// its typical value, or rising): CO alone, however dominant, is not enough.
TEST(KeyGas, CarbonMonoxideAloneDoesNotPassThePrecondition) {
  // IEC 60599 Annex A typical values, set B in force (lower end): H2 60, CH4 40, C2H6 50, C2H4 60, C2H2 3.
  auto co = key_gas_reading(gas_sample(0, {.h2 = 20, .ch4 = 10, .c2h6 = 5, .c2h4 = 5, .co = 920}), {}, false);
  EXPECT_FALSE(co.applicable);
  EXPECT_NE(co.reading.find("concentrations too low"), std::string::npos);
  // The same proportions with the gases rising pass it (IEC 60599: a significant increase).
  auto rising = key_gas_reading(gas_sample(0, {.h2 = 20, .ch4 = 10, .c2h6 = 5, .c2h4 = 5, .co = 920}), {}, true);
  EXPECT_TRUE(rising.applicable);
  EXPECT_EQ(rising.fault_family, "C");
}

// Families compared with the zone codes of IEC 60599 Table 1 / Duval Triangle 1.
TEST(KeyGas, AgreementWithTheZoneCodes) {
  EXPECT_TRUE(key_gas_agrees("PD", "PD"));
  EXPECT_FALSE(key_gas_agrees("PD", "D2"));  // the "corona beside D2" of issue #16
  EXPECT_TRUE(key_gas_agrees("D", "D1"));
  EXPECT_TRUE(key_gas_agrees("D", "D2"));
  EXPECT_TRUE(key_gas_agrees("T", "T3"));
  EXPECT_TRUE(key_gas_agrees("T", "DT"));
  EXPECT_TRUE(key_gas_agrees("D", "DT"));
  EXPECT_FALSE(key_gas_agrees("T", "D1"));
  EXPECT_FALSE(key_gas_agrees("C", "T1"));  // cellulose has no zone in either method
  EXPECT_FALSE(key_gas_agrees("", "PD"));
}

}  // namespace
}  // namespace ferrum::analytics
