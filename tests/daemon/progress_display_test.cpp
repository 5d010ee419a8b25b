// The progress line of long commands (daemon/app/progress_display.h).
// Plumbing: no engineering value is checked here, so no published source applies.
#include "daemon/app/progress_display.h"

#include <gtest/gtest.h>

namespace ferrum::app {
namespace {

TEST(ProgressLine, DoneTotalPercentRateAndTimeLeft) {
  // 12 of 48 MB in 3 s: 4 MB/s, 36 MB left = 9 s.
  EXPECT_EQ(progress_line("load.csv", 12, 48, "MB", 3), "load.csv: 12/48 MB (25 %), 4 MB/s, 9 s left");
  EXPECT_EQ(progress_line("assessing", 2500, 5000, "units", 50), "assessing: 2500/5000 units (50 %), 50 units/s, 50 s left");
  EXPECT_EQ(progress_line("assessing", 100, 5000, "units", 10), "assessing: 100/5000 units (2 %), 10 units/s, 8 min left");
}

TEST(ProgressLine, EndAndStartHaveNoTimeLeft) {
  EXPECT_EQ(progress_line("unit reports", 40, 40, "units", 8), "unit reports: 40/40 units (100 %), 5 units/s");
  EXPECT_EQ(progress_line("load.csv", 0, 34, "MB", 0), "load.csv: 0/34 MB (0 %)");
  EXPECT_EQ(progress_line("load.csv", 1.5, 0, "MB", 0.5), "load.csv: 1.5 MB, 3 MB/s");
}

}  // namespace
}  // namespace ferrum::app
