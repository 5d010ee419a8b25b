// Property: one bad row inserted anywhere in a valid file yields a problem at
// exactly that row's line, and no problem elsewhere. Fixed seed: repeatable.
#include <gtest/gtest.h>

#include <algorithm>
#include <random>
#include <string>
#include <vector>

#include "analytics/calendar.h"
#include "tests/ingest/ingest_test_support.h"

namespace ferrum::ingest {
namespace {

using namespace ferrum::ingest::testing;

std::string good_row(int i) {
  const std::string day = analytics::format_day(analytics::days_from_civil(2020, 1, 1) + i);
  return "T1," + day + ",L-" + std::to_string(i) + "," + std::to_string(5 + i % 7) + ",<0.5,12";
}

// Rows broken in different ways; `i` keeps their keys unique.
std::string bad_row(int kind, int i) {
  const std::string day = analytics::format_day(analytics::days_from_civil(2024, 1, 1) + i);
  switch (kind) {
    case 0: return "T1," + day + ",B,-5,1,12";               // negative gas
    case 1: return "T1," + day + ",B,5,1";                   // ragged
    case 2: return "T1," + day + ",B,5,1,12,extra";          // ragged
    case 3: return "T9," + day + ",B,5,1,12";                // unknown unit
    case 4: return "T1,2030-01-01,B,5,1,12";                 // future
    case 5: return "T1," + day + ",B,5\"x,1,12";             // stray quote
    case 6: return "T1," + day + ",B,5,1,\xff";              // invalid UTF-8
    case 7: return "T1," + day + std::string(",B,5\0,1,12", 11);  // NUL byte
    default: return "T1," + day + ",B,,,";                   // no test value
  }
}

TEST(Property, OneBadRowIsReportedAtItsOwnLine) {
  std::mt19937 rng(20260314);
  const std::string header = "# generated\nunit_id,sample_date,lab_ref,h2_ppm,c2h2_ppm,moisture_ppm\n";
  constexpr int kHeaderLines = 2;
  for (int trial = 0; trial < 200; ++trial) {
    const int rows = 1 + static_cast<int>(rng() % 60);
    const int at = static_cast<int>(rng() % (rows + 1));  // 0..rows: insert before row `at`
    const int kind = static_cast<int>(rng() % 9);
    std::string text = header;
    for (int i = 0; i < rows; ++i) {
      if (i == at) text += bad_row(kind, trial) + "\n";
      text += good_row(i) + "\n";
    }
    if (at == rows) text += bad_row(kind, trial) + "\n";
    const std::int64_t bad_line = kHeaderLines + at + 1;
    const auto c = check_text(text);
    SCOPED_TRACE("trial " + std::to_string(trial) + " kind " + std::to_string(kind));
    ASSERT_GE(c.summary.problems.count(), 1) << text;
    for (const Problem& p : c.summary.problems.kept()) EXPECT_EQ(p.line, bad_line) << p.reason;
    EXPECT_EQ(c.summary.rows_good, rows);
  }
}

// Random bytes drawn mostly from CSV's special characters: never a crash or a
// hang, every kept problem has a line inside the input, and rows are counted.
TEST(Property, RandomInputNeverCrashes) {
  std::mt19937 rng(4180);
  const std::string alphabet = std::string("\",;\r\n #<ND.-0123456789abcTZ:\xEF\xBB\xBF\xC3\xFF") + '\0';
  const std::string header = "unit_id,timestamp,load_pu,ambient_f\n";
  for (int trial = 0; trial < 500; ++trial) {
    std::string text = trial % 2 ? header : std::string();
    const int n = static_cast<int>(rng() % 400);
    for (int i = 0; i < n; ++i) text += alphabet[rng() % alphabet.size()];
    const auto c = check_text(text);
    const auto lines = 1 + std::count(text.begin(), text.end(), '\n') + std::count(text.begin(), text.end(), '\r');
    for (const Problem& p : c.summary.problems.kept()) {
      EXPECT_GE(p.line, 1);
      EXPECT_LE(p.line, lines) << p.reason;
      EXPECT_LE(p.value.size(), 83u);
    }
    EXPECT_LE(c.summary.rows_good, c.summary.rows_read);
  }
}

}  // namespace
}  // namespace ferrum::ingest
