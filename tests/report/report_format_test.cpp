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

}  // namespace
}  // namespace ferrum::report
