// parse_number takes a fast path for plain decimals (Clinger: an exact
// integer over an exact power of ten). It must give bit for bit the double
// std::from_chars gives (correctly rounded, C++17 [charconv.from.chars]).
#include <gtest/gtest.h>

#include <charconv>
#include <cstring>
#include <random>
#include <string>

#include "daemon/ingest/field_parsers.h"

namespace ferrum::ingest {
namespace {

double reference(const std::string& s) {
  double v = 0;
  const auto [end, ec] = std::from_chars(s.data(), s.data() + s.size(), v);
  EXPECT_TRUE(ec == std::errc() && end == s.data() + s.size()) << s;
  return v;
}

bool same_bits(double a, double b) { return std::memcmp(&a, &b, sizeof a) == 0; }

TEST(NumberFastPath, RandomPlainDecimalsMatchFromChars) {
  std::mt19937_64 rng(20261201);
  for (int i = 0; i < 200000; ++i) {
    const int int_digits = 1 + static_cast<int>(rng() % 9);
    const int frac_digits = static_cast<int>(rng() % 8);
    std::string s = rng() % 2 ? "-" : "";
    for (int d = 0; d < int_digits; ++d) s += static_cast<char>('0' + rng() % 10);
    if (frac_digits) {
      s += '.';
      for (int d = 0; d < frac_digits; ++d) s += static_cast<char>('0' + rng() % 10);
    }
    const auto p = parse_number(s, false);
    ASSERT_TRUE(p.ok()) << s;
    ASSERT_TRUE(same_bits(p.value, reference(s))) << s;
  }
}

TEST(NumberFastPath, EdgeFormsAgreeWithTheGeneralPath) {
  // 15 digits (fast path) and 16 digits (general path) on both sides of the limit.
  for (const char* s : {"999999999999999", "9999999999999999", "0.1", "0.3", "-0", "-0.0", "007.50",
                        "123456789.012345", "1.000000000000001", "2.2250738585072014"}) {
    const auto p = parse_number(s, false);
    ASSERT_TRUE(p.ok()) << s;
    EXPECT_TRUE(same_bits(p.value, reference(s))) << s;
  }
  EXPECT_DOUBLE_EQ(parse_number("12,5", true).value, 12.5);  // decimal comma in a ';' file
  EXPECT_FALSE(parse_number("12,5", false).ok());
  EXPECT_FALSE(parse_number("1.2.3", false).ok());
  EXPECT_FALSE(parse_number("-", false).ok());
  EXPECT_FALSE(parse_number("1e999", false).ok());
}

}  // namespace
}  // namespace ferrum::ingest
