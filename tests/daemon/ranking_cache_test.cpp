// The ranking cache (daemon/assess/ranking_cache.h): what is written is read
// back whole, and only under its key. Plumbing: no engineering values.
#include "daemon/assess/ranking_cache.h"

#include "tests/daemon/ranking_rows.h"
#include "tests/daemon/temp_dir.h"

using namespace ferrum;
using ferrum::testing::full_row;
using ferrum::testing::text_of;

namespace {

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

// The cache written as units come: it appears only at commit(), and only
// with as many units as its head announced; the old cache stays otherwise.
TEST_F(RankingCacheTest, TheStreamedWriterKeepsItsCount) {
  const std::vector<analytics::RankingInput> rows{full_row("T1"), full_row("T2"), full_row("T3")};
  ASSERT_TRUE(assess::write_ranking_cache(root, "old", rows));
  const std::string old = text_of(file());
  {
    assess::RankingCacheWriter w(root, "new", 3);
    w.add(rows[0]);
    w.add(rows[1]);
    EXPECT_FALSE(w.commit());  // two of three
  }
  { assess::RankingCacheWriter w(root, "new", 3); w.add(rows[0]); }  // never committed
  EXPECT_EQ(text_of(file()), old);
  assess::RankingCacheWriter w(root, "new", 3);
  for (const auto& r : rows) w.add(r);
  ASSERT_TRUE(w.commit());
  ASSERT_TRUE(assess::write_ranking_cache(root, "new", rows));  // the same bytes as the writer's
  const std::string whole = text_of(file());
  EXPECT_NE(whole, old);
  // Read a unit at a time; a file cut part-way gives some units, then false.
  std::vector<std::string> ids;
  EXPECT_TRUE(assess::read_ranking_cache(root, "new", [&](analytics::RankingInput&& u) { ids.push_back(u.unit_id); }));
  EXPECT_EQ(ids, (std::vector<std::string>{"T1", "T2", "T3"}));
  std::ofstream(file()) << whole.substr(0, whole.rfind("\n{"));
  ids.clear();
  EXPECT_FALSE(assess::read_ranking_cache(root, "new", [&](analytics::RankingInput&& u) { ids.push_back(u.unit_id); }));
  EXPECT_EQ(ids.size(), 2u);
  // Empty fleet: a cache of no units is still a cache.
  assess::RankingCacheWriter none(root, "empty", 0);
  ASSERT_TRUE(none.commit());
  const auto back = assess::read_ranking_cache(root, "empty");
  ASSERT_TRUE(back);
  EXPECT_TRUE(back->empty());
}

// A root the command may not write to (here: "cache" is a file) means no
// cache, never an error.
TEST_F(RankingCacheTest, AnUnwritableRootMeansNoCache) {
  std::ofstream(root.root / "cache") << "not a folder";
  assess::RankingCacheWriter w(root, "k", 1);
  w.add(full_row("T1"));
  EXPECT_FALSE(w.commit());
}

}  // namespace

