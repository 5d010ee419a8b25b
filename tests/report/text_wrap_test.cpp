#include "report/text_wrap.h"

#include <gtest/gtest.h>

namespace ferrum::report {
namespace {

// Monospace measure: every code point 1 unit wide (UTF-8 aware).
double mono(std::string_view s) {
  double n = 0;
  for (unsigned char c : s)
    if ((c & 0xC0) != 0x80) n += 1;
  return n;
}

TEST(WrapText, BreaksAtSpacesWithinWidth) {
  const auto lines = wrap_text("Resample oil for DGA within two weeks", 12, mono);
  EXPECT_EQ(lines, (std::vector<std::string>{"Resample oil", "for DGA", "within two", "weeks"}));
  for (const auto& l : lines) EXPECT_LE(mono(l), 12);
}

TEST(WrapText, ExactFitStaysOnOneLine) {
  EXPECT_EQ(wrap_text("abc def", 7, mono), (std::vector<std::string>{"abc def"}));
  EXPECT_EQ(wrap_text("abc def", 6, mono), (std::vector<std::string>{"abc", "def"}));
}

TEST(WrapText, LongWordIsCutBetweenCodePoints) {
  const auto lines = wrap_text("µµµµµµµ", 3, mono);  // 2-byte code points
  EXPECT_EQ(lines, (std::vector<std::string>{"µµµ", "µµµ", "µ"}));
}

TEST(WrapText, NewlinesAndEmptyInput) {
  EXPECT_TRUE(wrap_text("", 10, mono).empty());
  EXPECT_EQ(wrap_text("a\n\nb", 10, mono), (std::vector<std::string>{"a", "", "b"}));
  EXPECT_EQ(wrap_text("  spaced   out  ", 20, mono), (std::vector<std::string>{"spaced out"}));
}

}  // namespace
}  // namespace ferrum::report

namespace ferrum::report {
namespace {

TEST(WrapText, FirstLineExtraNarrowsOnlyTheFirstLine) {
  // A bold lead-in 3 units wider than measured: "aaa bbb" (7) no longer fits in 8.
  EXPECT_EQ(wrap_text("aaa bbb ccc ddd", 8, mono, 3), (std::vector<std::string>{"aaa", "bbb ccc", "ddd"}));
  EXPECT_EQ(wrap_text("aaa bbb ccc ddd", 8, mono, 0), (std::vector<std::string>{"aaa bbb", "ccc ddd"}));
}

}  // namespace
}  // namespace ferrum::report
