#include "analytics/dga_c57104_2019.h"

#include <gtest/gtest.h>

#include <string>

#include "analytics/dga_gases.h"
#include "dga_test_sample.h"

namespace ferrum::analytics {
namespace {
using testing::gas_sample;

// All table values used here are the embedded placeholders of
// analytics/data/ieee_c57104_2019.csv: IEEE C57.104-2019 Tables 1-4 from memory
// (status 'unverified') except the cells corrected below. The tests check the logic, not the standard's numbers.

OilSample sealed(Day d, testing::Gases g) {
  OilSample s = gas_sample(d, g);
  s.o2 = LabValue::measured(1000);
  s.n2 = LabValue::measured(50000);  // O2/N2 = 0.02 <= 0.2
  return s;
}

TEST(C57104_2019Tables, EmbeddedTextParses) {
  auto r = parse_c57104_2019_tables(default_c57104_2019_tables_text());
  ASSERT_TRUE(r.tables) << r.error_line << ": " << r.error;
  // Table 1, unknown age, O2/N2 <= 0.2 / > 0.2 placeholders (from memory):
  // H2 80/40, CH4 90/20, C2H6 90/15, C2H4 50/50, C2H2 1/2, CO 900/500, CO2 9000/5000.
  const auto& low = r.tables->table1[0][0];
  const auto& high = r.tables->table1[1][0];
  const double expect_low[] = {80, 90, 90, 50, 1, 900, 9000};
  const double expect_high[] = {40, 20, 15, 50, 2, 500, 5000};
  for (std::size_t g = 0; g < 7; ++g) {
    EXPECT_EQ(*low[g], expect_low[g]) << gas_name(kAllGases[g]);
    EXPECT_EQ(*high[g], expect_high[g]) << gas_name(kAllGases[g]);
  }
  EXPECT_FALSE(r.tables->table3[0][gas_index(Gas::c2h2)]);  // "any" increase
  EXPECT_NE(default_c57104_2019_tables_text().find("status,unverified"), std::string_view::npos);
}

TEST(C57104_2019Tables, ParseErrorsNameTheLineAndColumn) {
  std::string text(default_c57104_2019_tables_text());
  std::string bad = text;
  bad.replace(bad.find("row,low,unknown,80"), 18, "row,low,unknown,xx");
  auto r = parse_c57104_2019_tables(bad);
  EXPECT_FALSE(r.tables);
  int expected_line = 1;
  for (std::size_t i = 0; i < text.find("row,low,unknown,80"); ++i) expected_line += text[i] == '\n';
  EXPECT_EQ(r.error_line, expected_line);
  EXPECT_EQ(r.error_column, 4);  // row, o2n2, age, H2
  EXPECT_NE(r.error.find("H2"), std::string::npos);

  std::string missing = text;
  missing.erase(missing.find("row,high,>30,40"), missing.find('\n', missing.find("row,high,>30,40")) + 1 - missing.find("row,high,>30,40"));
  EXPECT_NE(parse_c57104_2019_tables(missing).error.find("missing row o2n2 high, age >30"), std::string::npos);
  EXPECT_EQ(parse_c57104_2019_tables("# only\nfoo,bar\n").error_line, 2);
  EXPECT_FALSE(parse_c57104_2019_tables("").tables);
  std::string dup = text + "row,high,1,1,1,1,any,1,1\n";
  EXPECT_NE(parse_c57104_2019_tables(dup).error.find("duplicate"), std::string::npos);
}

TEST(C57104_2019Status, AgeGroupBoundaries) {
  EXPECT_EQ(c57104_2019_age_group(std::nullopt), AgeGroup::unknown);
  EXPECT_EQ(c57104_2019_age_group(9), AgeGroup::y1_9);
  EXPECT_EQ(c57104_2019_age_group(10), AgeGroup::y10_30);
  EXPECT_EQ(c57104_2019_age_group(30), AgeGroup::y10_30);
  EXPECT_EQ(c57104_2019_age_group(31), AgeGroup::over30);
}

TEST(C57104_2019Status, SingleSampleLevelsBothSidesOfTables1And2) {
  const auto& t = default_c57104_2019_tables();
  // Unknown age, O2/N2 <= 0.2: H2 Table 1 = 80, Table 2 = 200 (placeholders).
  EXPECT_EQ(c57104_2019_status({sealed(0, {.h2 = 80})}, std::nullopt, t).status, 1);
  EXPECT_EQ(c57104_2019_status({sealed(0, {.h2 = 80.1})}, std::nullopt, t).status, 2);
  EXPECT_EQ(c57104_2019_status({sealed(0, {.h2 = 200})}, std::nullopt, t).status, 2);
  auto three = c57104_2019_status({sealed(0, {.h2 = 200.1})}, std::nullopt, t);
  EXPECT_EQ(three.status, 3);
  EXPECT_NE(three.reason.find("Table 2"), std::string::npos);
  EXPECT_EQ(three.o2n2_group, "<= 0.2");
}

// Cells corrected after checking against public reproductions of the standard
// (issue 17): IEEE C57.104-2019 Table 2, O2/N2 > 0.2, age > 30: CH4 = 30;
// Table 1, O2/N2 <= 0.2, age > 30: CO = 900; Table 2, O2/N2 <= 0.2, age > 30: C2H2 = 4.
TEST(C57104_2019Tables, CorrectedCellsOver30Years) {
  const auto& t = default_c57104_2019_tables();
  const auto over30 = static_cast<std::size_t>(AgeGroup::over30);
  EXPECT_EQ(*t.table2[1][over30][gas_index(Gas::ch4)], 30);   // IEEE C57.104-2019, Table 2
  EXPECT_EQ(*t.table1[0][over30][gas_index(Gas::co)], 900);   // IEEE C57.104-2019, Table 1
  EXPECT_EQ(*t.table2[0][over30][gas_index(Gas::c2h2)], 4);   // IEEE C57.104-2019, Table 2
  // Free-breathing unit, 40 years: CH4 45 is above Table 2 (30), so status 3.
  OilSample open = gas_sample(0, {.ch4 = 45});
  open.o2 = LabValue::measured(15000);
  open.n2 = LabValue::measured(50000);  // O2/N2 = 0.3 > 0.2
  EXPECT_EQ(c57104_2019_status({open}, 40, t).status, 3);
  // Sealed unit, 40 years: CO 800 is within Table 1 (900), status 1.
  EXPECT_EQ(c57104_2019_status({sealed(0, {.co = 800})}, 40, t).status, 1);
  // Sealed unit, 40 years: C2H2 3 is above Table 1 (1) but within Table 2 (4), status 2.
  EXPECT_EQ(c57104_2019_status({sealed(0, {.c2h2 = 3})}, 40, t).status, 2);
}

TEST(C57104_2019Status, ChangeBetweenSamplesRaisesStatus) {
  const auto& t = default_c57104_2019_tables();
  // Table 3, O2/N2 <= 0.2: H2 change 40 ppm (placeholder).
  EXPECT_EQ(c57104_2019_status({sealed(0, {.h2 = 10}), sealed(90, {.h2 = 50})}, std::nullopt, t).status, 1);
  EXPECT_EQ(c57104_2019_status({sealed(0, {.h2 = 10}), sealed(90, {.h2 = 50.1})}, std::nullopt, t).status, 2);
  // Above Table 1 and changing: Status 3.
  EXPECT_EQ(c57104_2019_status({sealed(0, {.h2 = 40}), sealed(90, {.h2 = 100})}, std::nullopt, t).status, 3);
  // Acetylene: any increase is significant.
  auto arc = c57104_2019_status({sealed(0, {.c2h2 = -0.5}), sealed(90, {.c2h2 = 0.6})}, std::nullopt, t);
  EXPECT_EQ(arc.status, 2);
  EXPECT_NE(arc.reason.find("C2H2"), std::string::npos);
}

TEST(C57104_2019Status, RegressionRateUsesTable4) {
  const auto& t = default_c57104_2019_tables();
  // CH4 rising 0.05 ppm/day = 18.3 ppm/year > Table 4 (10 ppm/year placeholder); small steps.
  std::vector<OilSample> v;
  for (int i = 0; i < 5; ++i) v.push_back(sealed(i * 60, {.ch4 = 10 + 3.0 * i}));
  auto r = c57104_2019_status(v, std::nullopt, t);
  EXPECT_EQ(r.status, 2);
  EXPECT_NE(r.reason.find("ppm/year"), std::string::npos);
}

TEST(C57104_2019Status, UnknownO2N2UsesStricterRowAndNoGasIsNotApplicable) {
  const auto& t = default_c57104_2019_tables();
  // H2 50: above the > 0.2 row (40) though below the <= 0.2 row (80).
  auto r = c57104_2019_status({gas_sample(0, {.h2 = 50})}, std::nullopt, t);
  EXPECT_EQ(r.status, 2);
  EXPECT_NE(r.o2n2_group.find("unknown"), std::string::npos);
  EXPECT_FALSE(c57104_2019_status({OilSample{}}, 20, t).applicable);
}

// Issue #16: the reason names every gas that drives the status, most severe
// first, not only the first gas of the table (H2). Limits: the embedded Table 2
// row O2/N2 <= 0.2, unknown age (H2 200, C2H4 100, C2H2 2; placeholders of
// IEEE C57.104-2019 Table 2 from memory). C2H2 90 is 45 x its limit, C2H4 817
// is 8.2 x, H2 300 is 1.5 x.
TEST(C57104_2019, ReasonNamesEveryDrivingGasMostSevereFirst) {
  const auto r = c57104_2019_status({sealed(0, {.h2 = 300, .ch4 = 10, .c2h6 = 10, .c2h4 = 817, .c2h2 = 90})},
                                    std::nullopt, default_c57104_2019_tables());
  ASSERT_EQ(r.status, 3);  // IEEE C57.104-2019: a gas above Table 2 gives Status 3
  ASSERT_EQ(r.drivers.size(), 3u);
  EXPECT_EQ(r.drivers[0].gas, "C2H2");
  EXPECT_EQ(r.drivers[1].gas, "C2H4");
  EXPECT_EQ(r.drivers[2].gas, "H2");
  const auto c2h2 = r.reason.find("C2H2"), c2h4 = r.reason.find("C2H4"), h2 = r.reason.find("H2 300");
  ASSERT_NE(c2h2, std::string::npos);
  ASSERT_NE(c2h4, std::string::npos);
  ASSERT_NE(h2, std::string::npos);
  EXPECT_LT(c2h2, c2h4);
  EXPECT_LT(c2h4, h2);
  // A Status 3 gas comes before a Status 2 gas whatever its multiple: CH4 95
  // is above Table 1 (90) only; C2H4 101 above Table 2 (100).
  const auto mixed = c57104_2019_status({sealed(0, {.ch4 = 95, .c2h4 = 101})}, std::nullopt,
                                        default_c57104_2019_tables());
  ASSERT_EQ(mixed.drivers.size(), 2u);
  EXPECT_EQ(mixed.drivers[0].gas, "C2H4");
  EXPECT_EQ(mixed.drivers[0].status, 3);
  EXPECT_EQ(mixed.drivers[1].gas, "CH4");
  EXPECT_EQ(mixed.drivers[1].status, 2);
}

}  // namespace
}  // namespace ferrum::analytics
