// Recognising a file's kind from its header.
#include "daemon/ingest/file_kinds.h"

#include <gtest/gtest.h>

#include <string>
#include <vector>

namespace ferrum::ingest {
namespace {

using Header = std::vector<std::string>;

bool contains(const std::string& text, const std::string& part) {
  return text.find(part) != std::string::npos;
}

TEST(DetectKind, EachKindFromItsRequiredColumns) {
  const std::vector<std::pair<Header, FileKind>> cases = {
      {{"unit_id", "site", "rated_mva", "hv_kv", "lv_kv", "cooling", "year_built"},
       FileKind::units_register},
      {{"unit_id", "sample_date", "h2_ppm"}, FileKind::oil_lab},
      {{"unit_id", "survey_date", "component", "spot_c", "ambient_c"}, FileKind::infrared},
      {{"unit_id", "timestamp", "load_pu"}, FileKind::load_series},
      {{"unit_id", "inspection_date", "item", "rating"}, FileKind::inspection},
  };
  for (const auto& [header, kind] : cases) {
    const KindDetection d = detect_kind(header);
    ASSERT_TRUE(d.recognised) << to_string(kind) << ": " << d.reason;
    EXPECT_EQ(d.kind, kind);
    EXPECT_TRUE(d.unknown_columns.empty());
  }
}

TEST(DetectKind, CaseSpacesAndOrderDoNotMatter) {
  const Header h = {"  Rating ", "ITEM", "Inspection Date", "Unit-ID", "Note"};
  const KindDetection d = detect_kind(h);
  ASSERT_TRUE(d.recognised) << d.reason;
  EXPECT_EQ(d.kind, FileKind::inspection);
  EXPECT_EQ(d.columns["unit_id"].index, 3);
  EXPECT_EQ(d.columns["unit_id"].header_name, "Unit-ID");
  EXPECT_EQ(d.columns["note"].index, 4);
  EXPECT_FALSE(d.columns["inspector"].present());
}

TEST(DetectKind, AlternativeUnitColumnsAreBoundWithTheirConversion) {
  const Header h = {"unit_id", "timestamp", "load_kva", "ambient_f", "top_oil_F", "comment"};
  const KindDetection d = detect_kind(h);
  ASSERT_TRUE(d.recognised) << d.reason;
  EXPECT_EQ(d.kind, FileKind::load_series);
  EXPECT_EQ(d.columns["load_mva"].conversion, Conversion::kva_to_mva);
  EXPECT_EQ(d.columns["ambient_c"].conversion, Conversion::fahrenheit_to_celsius);
  EXPECT_EQ(d.columns["top_oil_c"].header_name, "top_oil_F");
  ASSERT_EQ(d.conversions.size(), 3u);
  EXPECT_EQ(d.conversions[0].column, "load_kva");
  EXPECT_EQ(d.conversions[0].original_unit, "kVA");
  EXPECT_EQ(d.conversions[0].stored_as, "load_mva (MVA)");
  EXPECT_EQ(d.unknown_columns, std::vector<int>{5});
}

TEST(DetectKind, FuranInPpmAndOilTemperatureInFahrenheit) {
  const KindDetection d = detect_kind(Header{"unit_id", "sample_date", "furan_2fal_ppm", "oil_temp_f"});
  ASSERT_TRUE(d.recognised) << d.reason;
  EXPECT_EQ(d.columns["furan_2fal_ppb"].conversion, Conversion::ppm_to_ppb);
  EXPECT_EQ(d.columns["oil_temp_c"].conversion, Conversion::fahrenheit_to_celsius);
}

TEST(Conversions, Values) {
  // 212 degF = 100 degC and -40 degF = -40 degC (definition of the Fahrenheit scale).
  EXPECT_DOUBLE_EQ(apply(Conversion::fahrenheit_to_celsius, 212.0), 100.0);
  EXPECT_DOUBLE_EQ(apply(Conversion::fahrenheit_to_celsius, -40.0), -40.0);
  EXPECT_DOUBLE_EQ(apply(Conversion::ppm_to_ppb, 0.25), 250.0);
  EXPECT_DOUBLE_EQ(apply(Conversion::kva_to_mva, 25000.0), 25.0);
}

TEST(DetectKind, NoMatchListsWhatEachKindNeeds) {
  const KindDetection d = detect_kind(Header{"transformer", "date", "value"});
  EXPECT_FALSE(d.recognised);
  EXPECT_TRUE(contains(d.reason, "matches no kind"));
  EXPECT_TRUE(contains(d.reason, "units register needs unit_id, site, rated_mva"));
  EXPECT_TRUE(contains(d.reason, "oil-lab results needs unit_id, sample_date and at least one test column (h2_ppm"));
  EXPECT_TRUE(contains(d.reason, "infrared survey needs unit_id, survey_date, component, spot_c and reference_c or ambient_c"));
  EXPECT_TRUE(contains(d.reason, "load series needs unit_id, timestamp and exactly one of load_mva, load_pu, load_a"));
  EXPECT_TRUE(contains(d.reason, "field inspection needs unit_id, inspection_date, item, rating"));
}

TEST(DetectKind, ClosestKindNamesMissingColumns) {
  const KindDetection d = detect_kind(Header{"unit_id", "survey_date", "component", "ambient_c"});
  EXPECT_FALSE(d.recognised);
  EXPECT_TRUE(contains(d.reason, "closest: infrared survey, missing spot_c")) << d.reason;
}

TEST(DetectKind, OilLabWithoutTestColumn) {
  const KindDetection d = detect_kind(Header{"unit_id", "sample_date", "lab_ref"});
  EXPECT_FALSE(d.recognised);
  EXPECT_TRUE(contains(d.reason, "at least one test column")) << d.reason;
}

TEST(DetectKind, LoadSeriesNeedsExactlyOneLoadColumn) {
  const KindDetection two = detect_kind(Header{"unit_id", "timestamp", "load_mva", "load_pu"});
  EXPECT_FALSE(two.recognised);
  EXPECT_TRUE(contains(two.reason, "exactly one of load_mva, load_pu, load_a (found 2)")) << two.reason;
  EXPECT_FALSE(detect_kind(Header{"unit_id", "timestamp", "ambient_c"}).recognised);
}

TEST(DetectKind, SameFieldTwiceIsRejected) {
  const KindDetection d =
      detect_kind(Header{"unit_id", "survey_date", "component", "spot_c", "ambient_c", "Ambient_F"});
  EXPECT_FALSE(d.recognised);
  EXPECT_EQ(d.reason_column, 5);
  EXPECT_TRUE(contains(d.reason, "columns 5 (ambient_c) and 6 (Ambient_F) both give ambient_c")) << d.reason;
}

TEST(DetectKind, HeaderFittingTwoKindsIsRejected) {
  const KindDetection d =
      detect_kind(Header{"unit_id", "sample_date", "h2_ppm", "inspection_date", "item", "rating"});
  EXPECT_FALSE(d.recognised);
  EXPECT_TRUE(contains(d.reason, "more than one kind")) << d.reason;
}

TEST(DetectKind, EmptyHeaderNamesAreUnknownColumns) {
  const KindDetection d = detect_kind(Header{"unit_id", "timestamp", "load_pu", ""});
  ASSERT_TRUE(d.recognised);
  EXPECT_EQ(d.unknown_columns, std::vector<int>{3});
}

}  // namespace
}  // namespace ferrum::ingest
