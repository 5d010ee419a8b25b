// Cell parsers: numbers, dates, timestamps with offsets, lab values, codes.
#include "daemon/ingest/field_parsers.h"

#include <gtest/gtest.h>

#include <cmath>

namespace ferrum::ingest {
namespace {

TEST(ParseNumber, PointAndExponent) {
  EXPECT_DOUBLE_EQ(parse_number(" 12.5 ", false).value, 12.5);
  EXPECT_DOUBLE_EQ(parse_number("+3", false).value, 3.0);
  EXPECT_DOUBLE_EQ(parse_number("-0.25", false).value, -0.25);
  EXPECT_DOUBLE_EQ(parse_number("1.5e3", false).value, 1500.0);
}

TEST(ParseNumber, DecimalCommaOnlyWhereAllowed) {
  EXPECT_DOUBLE_EQ(parse_number("12,5", true).value, 12.5);
  EXPECT_DOUBLE_EQ(parse_number("12.5", true).value, 12.5);  // a point is accepted there too
  EXPECT_FALSE(parse_number("12,5", false).ok());
  EXPECT_FALSE(parse_number("1.234,5", true).ok());  // thousands separator
  EXPECT_FALSE(parse_number("1,234,5", true).ok());
}

TEST(ParseNumber, RejectsTextInfinityAndNan) {
  for (const char* bad : {"", "abc", "12 ppm", "inf", "nan", "1e999", "0x10", "--1", "1..2"}) {
    EXPECT_FALSE(parse_number(bad, false).ok()) << bad;
  }
}

TEST(ParseInteger, WholeNumbersOnly) {
  EXPECT_EQ(parse_integer(" 1998 ").value, 1998);
  EXPECT_FALSE(parse_integer("3.0").ok());
  EXPECT_FALSE(parse_integer("").ok());
}

TEST(ParseDate, IsoCalendarDates) {
  // 2026-03-14 is day 20526 since 1970-01-01 (computed with Python's datetime).
  EXPECT_EQ(parse_date("2026-03-14").value, 20526);
  EXPECT_EQ(parse_date("2024-02-29").value, analytics::days_from_civil(2024, 2, 29));
  EXPECT_FALSE(parse_date("2025-02-29").ok());  // not a leap year
  EXPECT_FALSE(parse_date("2026-13-01").ok());
  EXPECT_FALSE(parse_date("14/03/2026").ok());
  EXPECT_FALSE(parse_date("2026-3-14").ok());
  EXPECT_FALSE(parse_date("2026-03-14T06:00").ok());
}

// Expected epoch seconds computed with Python's datetime, e.g.
// datetime(2026,3,14,6,15,tzinfo=timezone.utc).timestamp() == 1773468900.
TEST(ParseTimestamp, UtcDesignator) {
  const auto t = parse_timestamp("2026-03-14T06:15Z", 60);
  ASSERT_TRUE(t.ok());
  EXPECT_EQ(t.value.utc, 1773468900);
  EXPECT_FALSE(t.value.offset_assumed);
}

TEST(ParseTimestamp, ExplicitOffsetsWithSecondsAndSpace) {
  EXPECT_EQ(parse_timestamp("2026-03-14 06:15:30+02:00", 0).value.utc, 1773461730);
  EXPECT_EQ(parse_timestamp("2026-03-14T06:15:30+0200", 0).value.utc, 1773461730);
  EXPECT_EQ(parse_timestamp("2026-03-14T06:15:30.75+02", 0).value.utc, 1773461730);
  EXPECT_EQ(parse_timestamp("2026-03-14T06:15-05:30", 0).value.utc, 1773488700);
}

TEST(ParseTimestamp, NoOffsetTakesSiteOffsetAndSaysSo) {
  const auto t = parse_timestamp("2026-03-14T08:15", 120);  // site at UTC+02:00
  ASSERT_TRUE(t.ok());
  EXPECT_EQ(t.value.utc, 1773468900);
  EXPECT_TRUE(t.value.offset_assumed);
}

TEST(ParseTimestamp, Rejections) {
  for (const char* bad : {"2026-03-14", "2026-03-14T6:15", "2026-03-14T24:00", "2026-03-14T10:60",
                          "2026-03-14T10:00+25:00", "2026-03-14T10:00 CET", "2026-02-30T10:00",
                          "2026-03-14T10:00:00."}) {
    EXPECT_FALSE(parse_timestamp(bad, 0).ok()) << bad;
  }
}

TEST(ParseLabValue, MeasuredMissingAndBelowLimit) {
  EXPECT_EQ(parse_lab_value("  ", false).value.state, analytics::LabValue::State::missing);
  const auto m = parse_lab_value("12.5", false).value;
  EXPECT_TRUE(m.is_measured());
  EXPECT_DOUBLE_EQ(m.value, 12.5);
  const auto lt = parse_lab_value("<5", false).value;
  EXPECT_TRUE(lt.is_below_limit());
  EXPECT_DOUBLE_EQ(lt.value, 5.0);  // the limit is kept, never turned into zero
  EXPECT_DOUBLE_EQ(parse_lab_value("< 0,5", true).value.value, 0.5);
  for (const char* nd : {"ND", "nd", "<ND", "< nd"}) {
    const auto v = parse_lab_value(nd, false).value;
    EXPECT_TRUE(v.is_below_limit()) << nd;
    EXPECT_TRUE(std::isnan(v.value)) << nd;
  }
  EXPECT_FALSE(parse_lab_value("<", false).ok());
  EXPECT_FALSE(parse_lab_value("<-1", false).ok());
  EXPECT_FALSE(parse_lab_value("n/a", false).ok());
}

TEST(ToSnakeCase, CaseSpacesAndHyphens) {
  EXPECT_EQ(to_snake_case("On-Load Tap  Changer"), "on_load_tap_changer");
  EXPECT_EQ(to_snake_case(" Main_Tank "), "main_tank");
  EXPECT_EQ(to_snake_case("very-poor"), "very_poor");
}

TEST(ParseCooling, SingleAndCombinedRatings) {
  EXPECT_EQ(parse_cooling("onan").value, "ONAN");
  EXPECT_EQ(parse_cooling("ONAN/ONAF").value, "ONAF");
  EXPECT_EQ(parse_cooling("ONAN / ONAF / OFAF").value, "OFAF");
  EXPECT_EQ(parse_cooling("ODWF").value, "ODWF");
  EXPECT_EQ(parse_cooling("KNAN").value, "KNAN");  // ester-filled
  EXPECT_FALSE(parse_cooling("fan cooled").ok());
  EXPECT_FALSE(parse_cooling("ONAN/").ok());
  EXPECT_FALSE(parse_cooling("OXAN").ok());
}

TEST(ParseVectorGroup, PatternsAndNormalisation) {
  EXPECT_EQ(parse_vector_group("Dyn11").value, "Dyn11");
  EXPECT_EQ(parse_vector_group("DYN11").value, "Dyn11");
  EXPECT_EQ(parse_vector_group("YNd1").value, "YNd1");
  EXPECT_EQ(parse_vector_group("ynyn0d1").value, "YNyn0d1");
  EXPECT_EQ(parse_vector_group("YNa0").value, "YNa0");
  EXPECT_EQ(parse_vector_group("Ii0").value, "Ii0");
  for (const char* bad : {"", "Dyn", "Dyn12", "Xy1", "D11", "Dyn11x"}) {
    EXPECT_FALSE(parse_vector_group(bad).ok()) << bad;
  }
}

TEST(ParseBreakdownMethod, Normalised) {
  EXPECT_EQ(parse_breakdown_method("ASTM D1816 2 mm").value, "ASTM D1816 2 mm");
  EXPECT_EQ(parse_breakdown_method("d1816-1mm").value, "ASTM D1816 1 mm");
  EXPECT_EQ(parse_breakdown_method("astm D1816 (2.0 mm)").value, "ASTM D1816 2 mm");
  EXPECT_EQ(parse_breakdown_method("ASTM D877").value, "ASTM D877");
  EXPECT_EQ(parse_breakdown_method("IEC60156").value, "IEC 60156");
  EXPECT_FALSE(parse_breakdown_method("ASTM D1816").ok());  // gap missing
  EXPECT_FALSE(parse_breakdown_method("VDE 0370").ok());
}

}  // namespace
}  // namespace ferrum::ingest
