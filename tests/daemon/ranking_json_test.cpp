// `rank --json` streamed a unit at a time (assess::write_json) is the same
// text as the whole document stringified by Poco (assess::to_json), whatever
// the fleet: empty, one unit, tied units, units without an index, text that
// needs escaping. Plumbing: no engineering values.
#include <gtest/gtest.h>

#include <sstream>

#include "analytics/fleet_ranking.h"
#include "daemon/assess/assessment_json.h"

using namespace ferrum;

namespace {

analytics::RankingInput row(const std::string& id, std::optional<double> hi, const std::string& site = "Mill") {
  analytics::RankingInput r;
  r.unit_id = id;
  r.site = site;
  r.rated_mva = 40;
  r.health_index = hi;
  r.band = hi ? "fair" : "";
  r.confidence = hi ? "" : "no oil sample";
  if (!hi) r.missing = {"oil quality", "DGA"};
  r.remaining_life_years = 12.5;
  r.limiting_factor = "paper \"DP\"\nline two";  // quotes and a line end: escaped by Poco
  r.action = "repair";
  r.action_year = 2028;
  r.action_reason = "ñ ü °C";
  analytics::Action f;
  f.priority = 2;
  f.due = 20500;
  f.text = "Take an oil sample";
  f.reference = id + "/oil-resample";
  r.first_action = f;
  return r;
}

std::string whole(const analytics::FleetRanking& r) {
  auto doc = assess::to_json(r);
  doc->set("sites", Poco::JSON::Array::Ptr(new Poco::JSON::Array));
  doc->set("caution", "Advice only.");
  return assess::stringify(doc);
}

std::string streamed(const analytics::FleetRanking& r) {
  std::ostringstream out;
  assess::write_json(out, r, {{"sites", Poco::JSON::Array::Ptr(new Poco::JSON::Array)}, {"caution", "Advice only."}});
  return out.str();
}

analytics::FleetRanking ranking_of(std::vector<analytics::RankingInput> rows) {
  return analytics::rank_fleet(std::move(rows), 20454, analytics::RankingOptions{});
}

}  // namespace

TEST(RankingJson, EmptyFleetStreamsAsTheWholeDocument) {
  EXPECT_EQ(streamed(ranking_of({})), whole(ranking_of({})));
}

TEST(RankingJson, OneUnitStreamsAsTheWholeDocument) {
  const auto r = ranking_of({row("T1", 55)});
  EXPECT_EQ(streamed(r), whole(r));
}

TEST(RankingJson, TiedAndUnrankedUnitsStreamAsTheWholeDocument) {
  const auto r = ranking_of({row("T3", 30), row("T1", 55), row("T2", 55), row("T9", std::nullopt), row("T4", 80, "Weir")});
  ASSERT_EQ(r.units.size(), 5u);
  const std::string text = streamed(r);
  EXPECT_EQ(text, whole(r));
  EXPECT_NE(text.find("\"unit_id\": \"T9\""), std::string::npos);
}
