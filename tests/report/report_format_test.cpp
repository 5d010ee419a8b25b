// Number formats shared by the PDF reports.
#include <gtest/gtest.h>

#include "report/report_format.h"

namespace ferrum::report {
namespace {

// Gas values print as the laboratory reports them (IEEE C57.104-2008 Table 1
// lists whole ppm from 10 up; detection limits such as 0.5 ppm C2H2 keep
// their decimal), so the gas table agrees with texts that quote the value.
TEST(FmtPpm, LargeValuesStayWhole) {
  EXPECT_EQ(fmt_ppm(1308.0), "1308");
  EXPECT_EQ(fmt_ppm(2066.0), "2066");
  EXPECT_EQ(fmt_ppm(14830.0), "14830");
}

TEST(FmtPpm, DecimalsBelowTenAndBelowOne) {
  EXPECT_EQ(fmt_ppm(10.0), "10");
  EXPECT_EQ(fmt_ppm(9.94), "9.9");
  EXPECT_EQ(fmt_ppm(1.0), "1.0");
  EXPECT_EQ(fmt_ppm(0.5), "0.50");
  EXPECT_EQ(fmt_ppm(std::nullopt), kNoValue);
}

// A rating prints as written on the nameplate: 7.5 MVA is 7.5, never 8
// (issue #16, "numbers printed two ways"; common practice, no published source).
TEST(FmtMva, RatingKeepsItsDigits) {
  EXPECT_EQ(fmt_mva(7.5), "7.5");
  EXPECT_EQ(fmt_mva(40.0), "40");
  EXPECT_EQ(fmt_mva(31.5, "MVA"), "31.5 MVA");
  EXPECT_EQ(fmt_mva(0.315), "0.315");
  EXPECT_EQ(fmt_mva(67.5), "67.5");
  EXPECT_EQ(fmt_mva(0.0), kNoValue);
  EXPECT_EQ(fmt_mva(std::nullopt), kNoValue);
}

// The equivalent ageing factor prints to three significant figures on every
// page, so 0.00123 is neither "0.00" nor "0.001" (common practice, no
// published source).
TEST(FmtAgeingFactor, ThreeSignificantFigures) {
  EXPECT_EQ(fmt_ageing_factor(0.001234), "0.00123");
  EXPECT_EQ(fmt_ageing_factor(0.85), "0.850");
  EXPECT_EQ(fmt_ageing_factor(1.25), "1.25");
  EXPECT_EQ(fmt_ageing_factor(12.345), "12.3");
  EXPECT_EQ(fmt_ageing_factor(150.4), "150");
  EXPECT_EQ(fmt_ageing_factor(0.09996), "0.100");  // rounding into the next decade
  EXPECT_EQ(fmt_ageing_factor(0.0), "0");
  EXPECT_EQ(fmt_ageing_factor(std::nullopt), kNoValue);
}

// A list's "Why" cell: the first clause, cut at a word with an ellipsis
// (plumbing: no published source applies).
// The printed index never reads as the neighbouring band: band edges belong
// to the worse band (HealthIndexOptions, after Jahromi et al. 2009's table,
// from memory), so just above an edge it keeps a decimal. Formatting only:
// no published source applies to the printing.
TEST(ReportFormat, HealthIndexNeverPrintsIntoTheNextBand) {
  EXPECT_EQ(fmt_health_index(57.6), "58");
  EXPECT_EQ(fmt_health_index(84.8), "85");   // serviceable, and 85 is serviceable
  EXPECT_EQ(fmt_health_index(85.3), "85.3"); // sound: "85" would say serviceable
  EXPECT_EQ(fmt_health_index(30.0), "30");   // the cap at the top of the worst band
  EXPECT_EQ(fmt_health_index(std::nullopt), fmt_number(std::nullopt, 0));
}

TEST(ReportFormat, ShortReasonKeepsTheFirstClauseAndCutsAtAWord) {
  // A clause left out is marked, so that nobody takes the first for the whole.
  EXPECT_EQ(short_reason("acetylene rose; confirm first"), "acetylene rose…");
  EXPECT_EQ(short_reason("paper at end of life. Replace it."), "paper at end of life…");
  EXPECT_EQ(short_reason("paper at end of life."), "paper at end of life");
  EXPECT_EQ(short_reason("one two three four", 12), "one two…");
  EXPECT_EQ(short_reason(""), "");
}

}  // namespace
}  // namespace ferrum::report
