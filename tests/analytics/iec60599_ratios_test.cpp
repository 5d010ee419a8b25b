#include "analytics/iec60599_ratios.h"

#include <gtest/gtest.h>

#include "dga_test_sample.h"

namespace ferrum::analytics {
namespace {
using testing::gas_sample;

std::optional<std::string> fault(double r1, double r2, double r5) {
  return iec60599_classify({r1, r2, r5}).fault;
}

// Row values: IEC 60599 Table 1 (checked against a public reproduction; verify against the standard).
TEST(Iec60599Ratios, OnePointInsideEveryRow) {
  EXPECT_EQ(fault(5, 0.05, 0.1), "PD");   // C2H2/C2H4 NS, CH4/H2 < 0.1, C2H4/C2H6 < 0.2
  EXPECT_EQ(fault(1.5, 0.3, 1.5), "D1");  // > 1, 0.1-0.5, > 1
  EXPECT_EQ(fault(1.0, 0.8, 3), "D2");    // 0.6-2.5, 0.1-1, > 2
  EXPECT_EQ(fault(0.5, 2, 0.5), "T1");    // NS, > 1, < 1
  EXPECT_EQ(fault(0.05, 2, 2), "T2");     // < 0.1, > 1, 1-4
  EXPECT_EQ(fault(0.1, 2, 5), "T3");      // < 0.2, > 1, > 4
}

TEST(Iec60599Ratios, BoundariesEachSide) {
  // PD: CH4/H2 < 0.1 and C2H4/C2H6 < 0.2.
  EXPECT_EQ(fault(0, 0.099, 0.1), "PD");
  EXPECT_NE(fault(0, 0.1, 0.1), "PD");
  EXPECT_NE(fault(0, 0.05, 0.2), "PD");
  // D1: C2H2/C2H4 > 1, CH4/H2 0.1-0.5 inclusive, C2H4/C2H6 > 1.
  EXPECT_EQ(fault(1.01, 0.1, 1.5), "D1");
  EXPECT_EQ(fault(1.01, 0.5, 1.5), "D1");
  EXPECT_EQ(fault(1.0, 0.3, 1.5), std::nullopt);
  EXPECT_EQ(fault(1.5, 0.51, 1.5), std::nullopt);
  EXPECT_EQ(fault(1.5, 0.3, 1.0), std::nullopt);
  // D2: 0.6-2.5, 0.1-1, > 2.
  EXPECT_EQ(fault(0.6, 1.0, 2.01), "D2");
  EXPECT_EQ(fault(0.59, 0.8, 3), std::nullopt);
  EXPECT_EQ(fault(2.5, 0.8, 3), "D2");
  EXPECT_EQ(fault(2.51, 0.8, 3), std::nullopt);
  EXPECT_EQ(fault(1.0, 0.8, 2.0), std::nullopt);
  EXPECT_EQ(fault(1.0, 1.01, 3), std::nullopt);
  // T1 / T2 split at C2H4/C2H6 = 1; T2 / T3 at 4; CH4/H2 must exceed 1.
  EXPECT_EQ(fault(0.05, 2, 0.99), "T1");
  EXPECT_EQ(fault(0.05, 2, 1.0), "T2");
  EXPECT_EQ(fault(0.05, 2, 4.0), "T2");
  EXPECT_EQ(fault(0.05, 2, 4.01), "T3");
  EXPECT_EQ(fault(0.05, 1.0, 0.5), std::nullopt);
  // T2 needs C2H2/C2H4 < 0.1, T3 < 0.2.
  EXPECT_EQ(fault(0.1, 2, 2), std::nullopt);
  EXPECT_EQ(fault(0.19, 2, 5), "T3");
  EXPECT_EQ(fault(0.2, 2, 5), std::nullopt);
}

TEST(Iec60599Ratios, D1D2OverlapReportsD2AndNamesBoth) {
  auto r = iec60599_classify({1.5, 0.3, 3});
  EXPECT_EQ(r.fault, "D2");
  EXPECT_EQ(r.matches.size(), 2u);
}

TEST(Iec60599Ratios, FromSampleThermalFault) {
  // H2 100, CH4 300, C2H6 50, C2H4 250, C2H2 5 -> 0.02 / 3 / 5 -> T3.
  auto s = gas_sample(0, {.h2 = 100, .ch4 = 300, .c2h6 = 50, .c2h4 = 250, .c2h2 = 5});
  auto r = iec60599_ratios(s, {}, false);
  ASSERT_TRUE(r.applicable);
  EXPECT_EQ(r.fault, "T3");
  EXPECT_NEAR(*r.ratios.c2h4_c2h6, 5.0, 1e-12);
}

TEST(Iec60599Ratios, BelowDetectionNumeratorCountsZeroDenominatorUndefined) {
  auto s = gas_sample(0, {.h2 = 100, .ch4 = 300, .c2h6 = 50, .c2h4 = 250, .c2h2 = -0.5});
  auto r = iec60599_ratios(s, {}, false);
  EXPECT_EQ(r.fault, "T3");
  EXPECT_DOUBLE_EQ(*r.ratios.c2h2_c2h4, 0.0);
  s.c2h6 = LabValue::below(1);
  auto q = iec60599_ratios(s, {}, false);
  EXPECT_FALSE(q.applicable);
  EXPECT_FALSE(q.fault);
}

TEST(Iec60599Ratios, LowConcentrationsGiveNoDiagnosis) {
  // Every gas at or below the IEC 60599 Annex A typical lower bounds (from memory):
  // ratios not applied.
  auto s = gas_sample(0, {.h2 = 60, .ch4 = 40, .c2h6 = 10, .c2h4 = 20, .c2h2 = 0});
  auto r = iec60599_ratios(s, {}, false);
  EXPECT_FALSE(r.applicable);
  EXPECT_NE(r.reading.find("concentrations too low"), std::string::npos);
  // One step above a typical value (H2 60 -> 60.1) enables the method.
  s.h2 = LabValue::measured(60.1);
  EXPECT_TRUE(iec60599_ratios(s, {}, false).applicable);
  // Rising gases enable it too.
  s.h2 = LabValue::measured(60);
  EXPECT_TRUE(iec60599_ratios(s, {}, true).applicable);
}

}  // namespace
}  // namespace ferrum::analytics
