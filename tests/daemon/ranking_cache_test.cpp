// The ranking cache (daemon/assess/ranking_cache.h): what is written is read
// back whole, and only under its key. Plumbing: no engineering values.
#include "daemon/assess/ranking_cache.h"

#include "tests/daemon/temp_dir.h"

using namespace ferrum;
using ferrum::testing::text_of;

namespace {

// A row with every field away from its default.
analytics::RankingInput full_row(const std::string& id) {
  analytics::RankingInput r;
  r.unit_id = id;
  r.site = "Mill";
  r.rated_mva = 31.5;
  r.criticality = 5;
  r.customers_served = 12000;
  r.health_index = 41.5;
  r.condition_index = 55.25;
  r.band = "poor";
  r.confidence = "5 of 7 factors";
  r.missing = {"infrared survey", "inspection"};
  r.remaining_life_years = 6.5;
  r.limiting_factor = "paper";
  r.beyond_horizon = true;
  r.horizon_years = 30;
  r.action = "refurbish";
  r.action_year = 2027;
  r.action_reason = "wet paper";
  r.treats_paper = true;
  analytics::Action f;
  f.priority = 1;
  f.due = 20500;
  f.text = "Reduce the load";
  f.reason = "hot spot";
  f.found = 20400;
  f.source = analytics::kSourceLoad;
  f.need = "load-reduce";
  f.reference = id + "/load-reduce";
  f.outage = true;
  f.crew = analytics::kCrewEngineering;
  f.overdue = true;
  f.status = "booked";
  f.work_date = 20510;
  f.work_note = "crew 3";
  r.first_action = f;
  auto& in = r.site_inputs;
  in.peak_load_pu = 1.05;
  in.emergency_load_pu = 1.3;
  in.hours_above_normal_cyclic = 12;
  in.normal_cyclic_limit_c = 110;
  in.hot_spot_from_measured_top_oil = true;
  in.paper_moisture_pct = 3.2;
  in.unsafe_inspection = true;
  in.active_arcing = true;
  in.c57104_2008_fault_condition = 3;
  return r;
}

class RankingCacheTest : public ferrum::testing::TempDirTest {
 protected:
  void SetUp() override {
    TempDirTest::SetUp();
    root.root = dir;
  }
  std::filesystem::path file() const { return root.root / "cache" / "ranking-inputs.json"; }
  site::SiteRoot root;
};

TEST_F(RankingCacheTest, EveryFieldIsReadBackUnderItsKeyOnly) {
  std::vector<analytics::RankingInput> rows{full_row("T1"), analytics::RankingInput{}, full_row("T3")};
  rows[1].unit_id = "T2";  // the defaults: nothing optional set, no first action
  ASSERT_TRUE(assess::write_ranking_cache(root, "key-1", rows));
  const std::string written = text_of(file());
  EXPECT_FALSE(assess::read_ranking_cache(root, "key-2"));
  auto back = assess::read_ranking_cache(root, "key-1");
  ASSERT_TRUE(back);
  ASSERT_EQ(back->size(), 3u);
  const auto& r = (*back)[0];
  EXPECT_EQ(r.missing, rows[0].missing);
  EXPECT_EQ(r.condition_index, rows[0].condition_index);
  EXPECT_TRUE(r.treats_paper);
  ASSERT_TRUE(r.first_action);
  EXPECT_EQ(r.first_action->work_note, "crew 3");
  EXPECT_EQ(r.site_inputs.c57104_2008_fault_condition, 3);
  EXPECT_EQ(r.site_inputs.normal_cyclic_limit_c, 110);
  EXPECT_FALSE((*back)[1].first_action);
  EXPECT_FALSE((*back)[1].health_index);
  // Written again from what was read, the file is the same to the byte:
  // nothing written is lost on the way back.
  ASSERT_TRUE(assess::write_ranking_cache(root, "key-1", *back));
  EXPECT_EQ(text_of(file()), written);
  // A file cut at a line's end is not taken for a smaller fleet.
  std::ofstream(file()) << written.substr(0, written.rfind("\n{"));
  EXPECT_FALSE(assess::read_ranking_cache(root, "key-1"));
}

// A fleet whose cache is larger than one written piece (64 KiB) is written
// and read back whole.
TEST_F(RankingCacheTest, ALargeFleetIsWrittenWhole) {
  std::vector<analytics::RankingInput> rows;
  for (int i = 0; i < 300; ++i) rows.push_back(full_row("U" + std::to_string(10000 + i)));
  ASSERT_TRUE(assess::write_ranking_cache(root, "k", rows));
  EXPECT_GT(std::filesystem::file_size(file()), 2u * 64 * 1024);
  const auto back = assess::read_ranking_cache(root, "k");
  ASSERT_TRUE(back);
  ASSERT_EQ(back->size(), rows.size());
  EXPECT_EQ(back->back().unit_id, "U10299");
}

}  // namespace
