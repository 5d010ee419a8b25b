// Load series reach the store in batches (Store::queue_load_point), so a
// second reading of the same time is found up to a batch after its row. The
// import must still report what a row-by-row import reports: the duplicate
// at its own line and before any later problem, the same row count, and the
// UTC-offset note only for rows before the duplicate.
// Plumbing: no engineering value is checked here, so no published source applies.
#include <gtest/gtest.h>

#include <sstream>
#include <string>

#include "daemon/pipeline/import_bridge.h"
#include "schema/store.h"
#include "tests/store/store_fixture.h"

using namespace ferrum;

namespace {

class ImportBridgeLoad : public ferrum::testing::StoreFixture {
 protected:
  void SetUp() override {
    StoreFixture::SetUp();
    store_ = open_store();
    store_->upsert_unit(unit("T1"), file(*store_), 2);
  }
  void TearDown() override {
    store_.reset();
    StoreFixture::TearDown();
  }

  ingest::ImportResult import(const std::string& text) {
    store_->begin();
    ingest::ImportSettings s;
    s.now = 1800000000;  // 2027-01-15
    s.file_id = file(*store_, "load");
    std::istringstream in(text);
    auto r = ingest::import_stream(in, s, *store_);
    store_->rollback();
    return r;
  }

  // Data row i (0-based, i < 744) is on line i + 2, at hour i of January 2026.
  static std::string row(int i, const char* load = "0.5", bool zone = true) {
    char b[96];
    std::snprintf(b, sizeof b, "T1,2026-01-%02dT%02d:00%s,%s\n", 1 + i / 24, i % 24, zone ? "Z" : "", load);
    return b;
  }

  std::unique_ptr<store::Store> store_;
};

TEST_P(ImportBridgeLoad, LateDuplicateIsReportedBeforeALaterProblemOfItsBatch) {
  std::string text = "unit_id,timestamp,load_pu\n";
  for (int i = 0; i < 600; ++i) {
    if (i == 300) text += row(5);                 // line 302: same time as line 7
    else if (i == 310) text += row(i, "50");      // line 312: impossible load, same batch
    else text += row(i);
  }
  const auto r = import(text);
  ASSERT_EQ(r.problems.count(), 2) << r.problems.kept()[0].reason;
  EXPECT_EQ(r.problems.kept()[0].line, 302);
  EXPECT_EQ(r.problems.kept()[0].column, "timestamp");
  EXPECT_EQ(r.problems.kept()[0].column_number, 2);
  EXPECT_NE(r.problems.kept()[0].reason.find("a second reading for unit T1"), std::string::npos);
  EXPECT_EQ(r.problems.kept()[1].line, 312);
  EXPECT_EQ(r.rows, 600);  // a rejected file counts every data row read, the bad ones too
}

TEST_P(ImportBridgeLoad, DuplicateInTheLastShortBatchIsReported) {
  std::string text = "unit_id,timestamp,load_pu\n";
  for (int i = 0; i < 20; ++i) text += row(i);
  text += row(3);  // line 22
  const auto r = import(text);
  ASSERT_EQ(r.problems.count(), 1);
  EXPECT_EQ(r.problems.kept()[0].line, 22);
  EXPECT_EQ(r.rows, 21);  // every data row read, the duplicate too
}

TEST_P(ImportBridgeLoad, OffsetNoteCountsOnlyRowsBeforeTheDuplicate) {
  std::string text = "unit_id,timestamp,load_pu\n";
  for (int i = 0; i < 100; ++i) text += row(i);
  text += row(4);                                          // line 102: duplicate
  for (int i = 101; i < 120; ++i) text += row(i, "0.5", false);  // no offset, after it
  EXPECT_FALSE(import(text).offset_assumed);
  text = "unit_id,timestamp,load_pu\n" + row(0, "0.5", false) + text.substr(text.find('\n') + 1);
  EXPECT_TRUE(import(text).offset_assumed);
}

TEST_P(ImportBridgeLoad, CleanFileIsWrittenWhole) {
  std::string text = "unit_id,timestamp,load_pu\n";
  for (int i = 0; i < 700; ++i) text += row(i);  // row() covers 31 days: at most 744 rows
  const auto r = import(text);
  EXPECT_TRUE(r.problems.empty());
  EXPECT_EQ(r.rows, 700);
}

FERRUM_ON_BOTH_BACKENDS(ImportBridgeLoad);

}  // namespace
