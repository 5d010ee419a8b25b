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

// Issue 19: the receipt's new / already-on-file counts come from the store's
// bulk path; small batches, so that both files cross batch boundaries.
TEST_P(ImportBridgeLoad, NewAndOnFileRowsAreCountedAcrossBatches) {
  store_.reset();
  store_ = open_store(64);
  const auto import_committed = [this](const std::string& text, const std::string& sha) {
    store_->begin();
    ingest::ImportSettings s;
    s.now = 1800000000;
    s.file_id = file(*store_, sha);
    std::istringstream in(text);
    auto r = ingest::import_stream(in, s, *store_);
    store_->commit();
    return r;
  };
  std::string first = "unit_id,timestamp,load_pu\n", second = first;
  for (int i = 0; i < 300; ++i) first += row(i);
  for (int i = 250; i < 700; ++i) second += row(i, "0.6");  // 50 on file, 400 new
  const auto a = import_committed(first, "a");
  ASSERT_TRUE(a.problems.empty());
  EXPECT_EQ(a.rows_new, 300);
  EXPECT_EQ(a.rows_on_file, 0);
  const auto b = import_committed(second, "b");
  ASSERT_TRUE(b.problems.empty());
  EXPECT_EQ(b.rows_new, 400);
  EXPECT_EQ(b.rows_on_file, 50);
  EXPECT_EQ(b.first_day, analytics::days_from_civil(2026, 1, 11));  // hour 250
  EXPECT_EQ(b.last_day, analytics::days_from_civil(2026, 1, 30));   // hour 699
  // A file with a problem gives no counts.
  const auto c = import(second + row(3, "50"));
  EXPECT_FALSE(c.rows_new);
  EXPECT_FALSE(c.rows_on_file);
}
FERRUM_ON_BOTH_BACKENDS(ImportBridgeLoad);

}  // namespace
