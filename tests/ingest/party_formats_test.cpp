// A party's date format, decimal separator and column map (field_parsers.h,
// header_map.h).
#include <gtest/gtest.h>

#include <sstream>

#include "daemon/ingest/field_parsers.h"
#include "daemon/ingest/header_map.h"
#include "tests/ingest/ingest_test_support.h"

namespace ferrum::ingest {
namespace {

using analytics::days_from_civil;

TEST(DateFormat, NamesAndTimeParts) {
  DateOrder o;
  bool t = true;
  ASSERT_TRUE(parse_date_format("DD/MM/YYYY", o, t));
  EXPECT_EQ(o, DateOrder::dmy_slash);
  EXPECT_FALSE(t);
  ASSERT_TRUE(parse_date_format(" mm/dd/yyyy hh:mm:ss", o, t));
  EXPECT_EQ(o, DateOrder::mdy_slash);
  EXPECT_TRUE(t);
  ASSERT_TRUE(parse_date_format("DD.MM.YYYY HH:MM", o, t));
  EXPECT_EQ(o, DateOrder::dmy_dot);
  ASSERT_TRUE(parse_date_format("YYYY-MM-DD", o, t));
  EXPECT_EQ(o, DateOrder::iso);
  EXPECT_FALSE(parse_date_format("DD/MM/YY", o, t));
  EXPECT_FALSE(parse_date_format("YYYY/MM/DD", o, t));
  EXPECT_FALSE(parse_date_format("DD/MM/YYYY HH", o, t));
}

TEST(DateFormat, RegionalDatesAndIsoAlwaysAccepted) {
  const auto day = [](int y, int m, int d) { return days_from_civil(y, m, d); };
  EXPECT_EQ(parse_date("05/10/2026", DateOrder::dmy_slash).value, day(2026, 10, 5));
  EXPECT_EQ(parse_date("05/10/2026", DateOrder::mdy_slash).value, day(2026, 5, 10));
  EXPECT_EQ(parse_date("5.10.2026", DateOrder::dmy_dot).value, day(2026, 10, 5));
  EXPECT_EQ(parse_date("2026-10-05", DateOrder::dmy_slash).value, day(2026, 10, 5));  // ISO 8601 always
  EXPECT_EQ(parse_date("05/10/2026 14:30", DateOrder::dmy_slash).value, day(2026, 10, 5));  // time ignored
  // Not fitting: the message names the expected format.
  const Parsed<analytics::Day> us = parse_date("13/31/2026", DateOrder::dmy_slash);
  EXPECT_FALSE(us.ok());
  EXPECT_NE(std::string(us.error).find("check month and day"), std::string::npos);
  for (const char* bad : {"05/10/26", "05-10-2026", "05/10/2026 25:00x", "05.10.2026"}) {
    const Parsed<analytics::Day> p = parse_date(bad, DateOrder::dmy_slash);
    ASSERT_FALSE(p.ok()) << bad;
    EXPECT_NE(std::string(p.error).find("DD/MM/YYYY"), std::string::npos) << bad;
  }
  // The default accepts ISO only, as before.
  EXPECT_FALSE(parse_date("05/10/2026").ok());
  EXPECT_NE(std::string(parse_date("05/10/2026").error).find("YYYY-MM-DD"), std::string::npos);
}

TEST(DateFormat, RegionalTimestamps) {
  const auto at = [](int y, int mo, int d, int h, int mi) {
    return analytics::start_of(days_from_civil(y, mo, d)) + h * 3600 + mi * 60;
  };
  const auto a = parse_timestamp("14/03/2026 06:15", 60, DateOrder::dmy_slash);
  ASSERT_TRUE(a.ok());
  EXPECT_EQ(a.value.utc, at(2026, 3, 14, 5, 15));  // site offset +01:00 assumed
  EXPECT_TRUE(a.value.offset_assumed);
  const auto b = parse_timestamp("03/14/2026 6:15:30+02:00", 0, DateOrder::mdy_slash);
  ASSERT_TRUE(b.ok());
  EXPECT_EQ(b.value.utc, at(2026, 3, 14, 4, 15) + 30);
  EXPECT_FALSE(b.value.offset_assumed);
  EXPECT_TRUE(parse_timestamp("2026-03-14T06:15Z", 0, DateOrder::dmy_dot).ok());  // ISO 8601 always
  const auto c = parse_timestamp("14.03.2026", 0, DateOrder::dmy_dot);
  ASSERT_FALSE(c.ok());
  EXPECT_NE(std::string(c.error).find("DD.MM.YYYY hh:mm"), std::string::npos);
  EXPECT_FALSE(parse_timestamp("14/03/2026 24:00", 0, DateOrder::dmy_slash).ok());
  // ISO wants two-digit hours, as before.
  EXPECT_FALSE(parse_timestamp("2026-03-14T6:15", 0, DateOrder::iso).ok());
}

TEST(DecimalMark, PartySettingOverridesTheFileConvention) {
  DecimalMark m;
  ASSERT_TRUE(parse_decimal_mark("Comma", m));
  EXPECT_EQ(m, DecimalMark::comma);
  EXPECT_TRUE(uses_decimal_comma(m, false));
  ASSERT_TRUE(parse_decimal_mark("point", m));
  EXPECT_FALSE(uses_decimal_comma(m, true));
  ASSERT_TRUE(parse_decimal_mark("auto", m));
  EXPECT_TRUE(uses_decimal_comma(m, true));
  EXPECT_FALSE(uses_decimal_comma(m, false));
  EXPECT_FALSE(parse_decimal_mark("dot", m));

  // A comma-separated file with quoted decimal commas, for a party that writes them.
  testing::Checked c;
  CheckOptions o = testing::test_options();
  o.decimal = DecimalMark::comma;
  c = testing::check_text("unit_id,sample_date,h2_ppm\nT1,2026-03-14,\"12,5\"\n", o);
  ASSERT_TRUE(c.summary.acceptable());
  EXPECT_DOUBLE_EQ(c.rows.oil.at(0).sample.h2.value, 12.5);
  // A semicolon file from a party that writes points: "12,5" is a problem there.
  o.decimal = DecimalMark::point;
  c = testing::check_text("unit_id;sample_date;h2_ppm\nT1;2026-03-14;12,5\n", o);
  EXPECT_TRUE(testing::has_problem(c.summary, 2, "h2_ppm", "use a point"));
}

HeaderMap map_of(const std::string& text) {
  std::istringstream in(text);
  return HeaderMap::parse(in);
}

std::int64_t error_line(const std::string& text, std::string& message) {
  try {
    map_of(text);
  } catch (const HeaderMapError& e) {
    message = e.what();
    return e.line();
  }
  return -1;
}

TEST(HeaderMap, NamesCompareWithoutCaseAndSurroundingSpaces) {
  const HeaderMap m = map_of("their_column,ferrum_column\nH2 (ppm),h2_ppm\n  Sampled  ,Sample_Date\n");
  EXPECT_EQ(m.ferrum_name("h2 (PPM)"), "h2_ppm");
  EXPECT_EQ(m.ferrum_name(" sampled "), "sample_date");
  EXPECT_EQ(m.ferrum_name("unit_id"), "");
  const std::vector<std::string> header = {"unit_id", "SAMPLED", "H2 (ppm)", "Remarks"};
  EXPECT_EQ(m.translate(header), (std::vector<std::string>{"unit_id", "sample_date", "h2_ppm", "Remarks"}));
  const KindDetection d = detect_kind(header, m);
  ASSERT_TRUE(d.recognised);
  EXPECT_EQ(d.kind, FileKind::oil_lab);
  EXPECT_EQ(d.columns["h2_ppm"].header_name, "H2 (ppm)");  // the party's own name
  EXPECT_EQ(d.columns["sample_date"].index, 1);
}

TEST(HeaderMap, ErrorsNameTheLine) {
  std::string why;
  EXPECT_EQ(error_line("their_column,ferrum_column\nH2,h2_ppm\nCH4,methane\n", why), 3);
  EXPECT_NE(why.find("'methane' is not a ferrum column"), std::string::npos);
  EXPECT_EQ(error_line("their_column,ferrum_column\nH2,h2_ppm\nh2 ,ch4_ppm\n", why), 3);
  EXPECT_NE(why.find("listed twice (first on line 2)"), std::string::npos);
  EXPECT_EQ(error_line("theirs,ours\nH2,h2_ppm\n", why), 1);
  EXPECT_EQ(error_line("their_column,ferrum_column\nH2,h2_ppm,extra\n", why), 2);
  EXPECT_EQ(error_line("their_column,ferrum_column\n,h2_ppm\n", why), 2);
  EXPECT_EQ(error_line("", why), 1);
  // Alternative-unit columns are ferrum columns too.
  EXPECT_EQ(map_of("their_column,ferrum_column\nTop oil (F),top_oil_f\n2FAL,furan_2fal_ppm\n").entries().size(), 2u);
}

}  // namespace
}  // namespace ferrum::ingest
