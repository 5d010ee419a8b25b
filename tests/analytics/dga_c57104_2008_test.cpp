#include "analytics/dga_c57104_2008.h"

#include <gtest/gtest.h>

#include "dga_test_sample.h"

namespace ferrum::analytics {
namespace {
using testing::gas_sample;
using testing::Gases;

// Every bound below is from IEEE C57.104-2008 Table 1 (checked against a public reproduction).
struct Bound {
  Gas gas;
  double c1, c2, c3;  // upper bound of Conditions 1, 2, 3
};
constexpr Bound kTable1[] = {
    {Gas::h2, 100, 700, 1800},  {Gas::ch4, 120, 400, 1000}, {Gas::c2h6, 65, 100, 150},
    {Gas::c2h4, 50, 100, 200},  {Gas::c2h2, 1, 9, 35},      {Gas::co, 350, 570, 1400},
    {Gas::co2, 2500, 4000, 10000},
};

TEST(C57104_2008, EachGasBoundaryOnBothSides) {
  for (const Bound& b : kTable1) {
    SCOPED_TRACE(gas_name(b.gas));
    EXPECT_EQ(c57104_2008_gas_condition(b.gas, 0), 1);
    EXPECT_EQ(c57104_2008_gas_condition(b.gas, b.c1), 1);
    EXPECT_EQ(c57104_2008_gas_condition(b.gas, b.c1 + 0.5), 2);
    EXPECT_EQ(c57104_2008_gas_condition(b.gas, b.c2), 2);
    EXPECT_EQ(c57104_2008_gas_condition(b.gas, b.c2 + 0.5), 3);
    EXPECT_EQ(c57104_2008_gas_condition(b.gas, b.c3), 3);
    EXPECT_EQ(c57104_2008_gas_condition(b.gas, b.c3 + 0.5), 4);
  }
}

TEST(C57104_2008, TdcgBoundariesTable1) {
  // IEEE C57.104-2008 Table 1, TDCG column: 720 / 1920 / 4630.
  EXPECT_EQ(c57104_2008_tdcg_condition(720), 1);
  EXPECT_EQ(c57104_2008_tdcg_condition(721), 2);
  EXPECT_EQ(c57104_2008_tdcg_condition(1920), 2);
  EXPECT_EQ(c57104_2008_tdcg_condition(1921), 3);
  EXPECT_EQ(c57104_2008_tdcg_condition(4630), 3);
  EXPECT_EQ(c57104_2008_tdcg_condition(4631), 4);
}

TEST(C57104_2008, TdcgExcludesCo2AndCountsBelowLimitAsZero) {
  // IEEE C57.104-2008: TDCG = H2 + CH4 + C2H2 + C2H4 + C2H6 + CO (no CO2).
  auto s = gas_sample(0, {.h2 = 50, .ch4 = 40, .c2h6 = 30, .c2h4 = 20, .c2h2 = -0.5, .co = 300,
                          .co2 = 3000});
  ASSERT_TRUE(tdcg_ppm(s));
  EXPECT_DOUBLE_EQ(*tdcg_ppm(s), 440);
  s.co = {};  // not analysed: TDCG undefined
  EXPECT_FALSE(tdcg_ppm(s));
}

TEST(C57104_2008, UnitConditionIsHighestOfGasesAndTotal) {
  // Acetylene 12 ppm reaches Condition 3 (Table 1: 10-35) while TDCG stays in 1.
  auto s = gas_sample(0, {.h2 = 20, .ch4 = 10, .c2h6 = 5, .c2h4 = 10, .c2h2 = 12, .co = 200,
                          .co2 = 1500});
  auto r = classify_c57104_2008(s);
  ASSERT_TRUE(r.applicable);
  EXPECT_EQ(*r.tdcg_condition, 1);
  EXPECT_EQ(*r.gas_condition[gas_index(Gas::c2h2)], 3);
  EXPECT_EQ(*r.condition, 3);
  EXPECT_NE(r.deciding.find("C2H2"), std::string::npos);
  // TDCG 1000 ppm (Condition 2) with every gas in Condition 1 except H2 (Cond. 2).
  auto t = gas_sample(0, {.h2 = 300, .ch4 = 100, .c2h6 = 60, .c2h4 = 40, .c2h2 = 0, .co = 340,
                          .co2 = 2000});
  auto q = classify_c57104_2008(t);
  EXPECT_EQ(*q.tdcg_ppm, 840);
  EXPECT_EQ(*q.condition, 2);
}

TEST(C57104_2008, NoGasAnalysedIsNotApplicable) {
  OilSample s;
  auto r = classify_c57104_2008(s);
  EXPECT_FALSE(r.applicable);
  EXPECT_FALSE(r.condition);
  EXPECT_FALSE(r.why_not.empty());
}

TEST(C57104_2008, TdcgRateNeedsTwoSamplesADayApart) {
  auto a = gas_sample(100, {.h2 = 100, .co = 300});
  auto b = gas_sample(130, {.h2 = 400, .co = 300});
  ASSERT_TRUE(tdcg_rate_ppm_per_day(a, b));
  EXPECT_DOUBLE_EQ(*tdcg_rate_ppm_per_day(a, b), 10.0);  // (S_T - S_O)/days, Table 3 note
  b.date = 100;
  EXPECT_FALSE(tdcg_rate_ppm_per_day(a, b));
}

// Table 3 intervals (IEEE C57.104-2008 Table 3; intervals from memory; verify).
TEST(C57104_2008, Table3IntervalsEachConditionAndRateBand) {
  struct Row { int condition; double rate; const char* interval; };
  const Row rows[] = {
      {4, 30.5, "daily"},   {4, 30, "daily"},     {4, 10, "daily"},      {4, 9.9, "weekly"},
      {3, 31, "weekly"},    {3, 10, "weekly"},    {3, 9.9, "monthly"},
      {2, 31, "monthly"},   {2, 10, "monthly"},   {2, 9.9, "quarterly"},
      {1, 30.1, "monthly"}, {1, 30, "quarterly"}, {1, 10, "quarterly"},  {1, 9.99, "annual"},
  };
  for (const Row& row : rows) {
    SCOPED_TRACE(::testing::Message() << row.condition << " @ " << row.rate);
    auto p = c57104_2008_table3(row.condition, row.rate, 132);
    ASSERT_TRUE(p.applicable);
    EXPECT_EQ(p.interval, row.interval);
  }
}

TEST(C57104_2008, Table3ActionsAndEhvInterval) {
  EXPECT_NE(c57104_2008_table3(4, 31, 132).action.find("removal from service"), std::string::npos);
  EXPECT_NE(c57104_2008_table3(1, 5, 132).action.find("normal operation"), std::string::npos);
  // Condition 1, <10 ppm/day: 6-monthly for EHV units (Table 3 from memory).
  EXPECT_EQ(c57104_2008_table3(1, 5, 345).interval, "6-monthly");
  EXPECT_EQ(c57104_2008_table3(1, 5, 344).interval, "annual");
}

// IEEE C57.104-2008 Table 3: the operating-procedure cells span the ">30" and
// "10-30 ppm/day" rows (checked against a public reproduction, issue 17).
TEST(C57104_2008, Table3ProcedureCellsSpanTheTwoFastRows) {
  const auto c4 = c57104_2008_table3(4, 20, 132).action;  // IEEE C57.104-2008, Table 3
  EXPECT_NE(c4.find("Consider removal from service"), std::string::npos) << c4;
  EXPECT_NE(c4.find("advise the manufacturer"), std::string::npos) << c4;
  EXPECT_EQ(c4.find("plan an outage"), std::string::npos) << c4;
  const auto c1 = c57104_2008_table3(1, 20, 132).action;  // IEEE C57.104-2008, Table 3
  EXPECT_NE(c1.find("Exercise caution"), std::string::npos) << c1;
  EXPECT_NE(c1.find("determine load dependence"), std::string::npos) << c1;
  EXPECT_EQ(c1.find("normal operation"), std::string::npos) << c1;
  // Below 10 ppm/day the slower procedures stay.
  EXPECT_NE(c57104_2008_table3(1, 9, 132).action.find("normal operation"), std::string::npos);
  EXPECT_NE(c57104_2008_table3(4, 9, 132).action.find("plan an outage"), std::string::npos);
}

TEST(C57104_2008, Table3UnknownRateAndInvalidCondition) {
  auto p = c57104_2008_table3(3, std::nullopt, 132);
  EXPECT_EQ(p.rate_band, "unknown");
  EXPECT_EQ(p.interval, "monthly");
  EXPECT_NE(p.action.find("rate unknown"), std::string::npos);
  EXPECT_FALSE(c57104_2008_table3(0, 5, 132).applicable);
  EXPECT_FALSE(c57104_2008_table3(5, 5, 132).applicable);
}

}  // namespace
}  // namespace ferrum::analytics
