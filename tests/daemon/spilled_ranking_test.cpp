// The ranking with its rows in a temporary file (daemon/assess/spilled_ranking.h)
// is the ranking analytics::rank_fleet makes of the same units after the
// site view, to the byte of `rank --json`, whatever the register's order of
// sites and whether the rows go to a file or stay in memory. Consistency of
// two ways to make one ranking: no engineering values, no source needed.
#include "daemon/assess/spilled_ranking.h"

#include <gtest/gtest.h>

#include <cstdlib>
#include <sstream>

#include "analytics/calendar.h"
#include "daemon/assess/assessment_json.h"
#include "daemon/assess/ranking_cache.h"
#include "tests/daemon/ranking_rows.h"

using namespace ferrum;
using ferrum::testing::full_row;

namespace {

// A fleet whose sites interleave in unit_id order (a site is complete only
// at the end), with ties large and small, units without an index, lives
// ending within the outlook and load-transfer actions the site view rewrites.
std::vector<analytics::RankingInput> fleet(int n) {
  std::vector<analytics::RankingInput> out;
  for (int i = 0; i < n; ++i) {
    char id[16];
    std::snprintf(id, sizeof id, "U%05d", i);
    auto r = full_row(id);
    r.site = "Site " + std::to_string((i * 3) % 97);  // about 31 units a site at 3,000
    r.criticality = 1 + i % 5;
    r.rated_mva = (i % 3 == 0) ? 10 : (i % 3 == 1) ? 25 : 40;
    r.customers_served.reset();
    if (i % 4 == 3) r.health_index.reset();
    else r.health_index = 20 + (i * 37) % 70;
    r.remaining_life_years = (i % 5 == 0) ? 3.0 + i % 4 : 25.0;
    r.beyond_horizon = false;
    r.horizon_years = 40;
    r.action = (i % 5 == 0) ? "replace" : "monitor";
    r.action_year = 2027 + i % 6;
    if (i % 2) r.first_action.reset();  // the others: "Reduce the load", need load-reduce
    r.site_inputs.peak_load_pu = 0.5 + (i % 7) * 0.1;
    r.site_inputs.emergency_load_pu = 1.2;
    r.site_inputs.unsafe_inspection = false;
    r.site_inputs.active_arcing = false;
    out.push_back(std::move(r));
  }
  return out;
}

const analytics::Day kAsOf = analytics::days_from_civil(2026, 12, 1);

std::string reference_json(std::vector<analytics::RankingInput> units) {
  auto sites = analytics::site_view(units, analytics::SiteViewOptions{});
  analytics::apply_site_view(units, sites);
  const auto ranking = analytics::rank_fleet(std::move(units), kAsOf, analytics::RankingOptions{});
  std::ostringstream out;
  assess::write_json(out, ranking, {{"sites", assess::to_json(sites)}});
  return out.str();
}

std::string spilled_json(const std::vector<analytics::RankingInput>& units, assess::SpilledRanking::Storage storage) {
  assess::SpilledRanking spilled(kAsOf, analytics::RankingOptions{}, analytics::SiteViewOptions{}, true, storage);
  EXPECT_EQ(spilled.in_file(), storage == assess::SpilledRanking::Storage::temporary_file);
  for (const auto& u : fleet(5)) spilled.add(u);  // given, then forgotten (a cache found damaged part-way)
  spilled.clear();
  for (const auto& u : units) spilled.add(u);
  spilled.finish();
  EXPECT_EQ(spilled.size(), units.size());
  EXPECT_TRUE(spilled.summary().units.empty());
  std::ostringstream out;
  assess::write_json(out, spilled.summary(), spilled.rows(), spilled.sites(), {});
  return out.str();
}

TEST(SpilledRanking, EqualsTheRankingMadeInMemory) {
  // 3,000 units: more than one MiB of rows, so that the file is written in
  // several pieces and rows are read back from the file and from what is
  // not yet written.
  const auto units = fleet(3000);
  const std::string expected = reference_json(units);
  ASSERT_NE(expected.find("\"tied\": true"), std::string::npos);
  ASSERT_NE(expected.find("Site 96"), std::string::npos);
  EXPECT_EQ(spilled_json(units, assess::SpilledRanking::Storage::temporary_file), expected);
  EXPECT_EQ(spilled_json(units, assess::SpilledRanking::Storage::memory), expected);
  // The site view was applied: a load-transfer action no longer reads as given.
  EXPECT_EQ(expected.find("\"Reduce the load\""), std::string::npos);
}

TEST(SpilledRanking, SmallAndEmptyFleets) {
  for (int n : {0, 1, 2, 7}) {
    const auto units = fleet(n);
    EXPECT_EQ(spilled_json(units, assess::SpilledRanking::Storage::temporary_file), reference_json(units)) << n;
  }
}

// $TMPDIR that cannot hold the file: /tmp does.
TEST(SpilledRanking, AnUnusableTmpdirFallsBackToTmp) {
  const char* old = std::getenv("TMPDIR");
  const std::string kept = old ? old : "";
  ::setenv("TMPDIR", "/nonexistent/ferrum-test", 1);
  assess::SpilledRanking spilled(kAsOf, analytics::RankingOptions{}, analytics::SiteViewOptions{}, false);
  EXPECT_TRUE(spilled.in_file());
  if (old) ::setenv("TMPDIR", kept.c_str(), 1);
  else ::unsetenv("TMPDIR");
}

// The row's form in the file keeps every field: read back and written as
// the cache writes a unit, it is the same line; a cut row is refused.
TEST(SpilledRanking, TheFileFormKeepsEveryField) {
  analytics::RankingInput defaults;
  defaults.unit_id = "T2";
  for (const auto& r : {full_row("T1"), defaults}) {
    const std::string bytes = assess::spill_form(r);
    EXPECT_EQ(assess::ranking_input_line(assess::of_spill_form(bytes)), assess::ranking_input_line(r));
    EXPECT_THROW(assess::of_spill_form(bytes.substr(0, bytes.size() - 1)), std::exception);
    EXPECT_THROW(assess::of_spill_form(bytes + "x"), std::exception);
  }
}

}  // namespace
