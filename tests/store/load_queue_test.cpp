// The batched load-point path (Store::queue_load_point / flush_load_points):
// same rows and the same duplicate reports, by line, as add_load_point one
// point at a time, whatever the batch boundaries.
#include <gtest/gtest.h>

#include <cmath>
#include <optional>
#include <vector>

#include "schema/store.h"
#include "tests/store/store_fixture.h"

using namespace ferrum;

namespace {

class LoadQueueTest : public ferrum::testing::StoreFixture {
 protected:
  void SetUp() override {
    StoreFixture::SetUp();
    s_ = store::open_sqlite_store(db_);
    f1_ = file(*s_, "a");
    f2_ = file(*s_, "b");
    s_->upsert_unit(unit("T1"), f1_, 2);
    s_->upsert_unit(unit("T2"), f1_, 3);
  }
  void TearDown() override {
    s_.reset();
    StoreFixture::TearDown();
  }

  // Queues points at the given times (line = 2 + index) and collects every
  // duplicate reported, the final flush included.
  std::vector<store::LoadDuplicate> queue(const std::string& unit, const std::vector<long long>& times,
                                          std::int64_t file_id, double load = 0.5) {
    std::vector<store::LoadDuplicate> found;
    for (std::size_t i = 0; i < times.size(); ++i) {
      analytics::LoadPoint p{times[i], load};
      if (auto d = s_->queue_load_point(unit, p, file_id, static_cast<std::int64_t>(2 + i))) found.push_back(*d);
    }
    if (auto d = s_->flush_load_points()) found.push_back(*d);
    return found;
  }

  static std::vector<long long> hourly(int n) {
    std::vector<long long> t;
    for (int i = 0; i < n; ++i) t.push_back(3600LL * i);
    return t;
  }

  std::unique_ptr<store::Store> s_;
  std::int64_t f1_ = 0, f2_ = 0;
};

TEST_F(LoadQueueTest, ManyBatchesAndARestAreAllWritten) {
  constexpr int n = 3 * store::kSqliteLoadBatch + 40;  // three full batches and a rest
  EXPECT_TRUE(queue("T1", hourly(n), f1_).empty());
  EXPECT_EQ(s_->count_rows("load_points"), n);
  const auto pts = s_->load_points("T1", 0, 3600LL * (n - 1));
  ASSERT_EQ(pts.size(), static_cast<std::size_t>(n));
  EXPECT_EQ(pts[n - 1].t, 3600LL * (n - 1));
  EXPECT_TRUE(std::isnan(pts[0].ambient_c));
}

TEST_F(LoadQueueTest, DuplicateAgainstAnEarlierBatchIsReportedAtItsLine) {
  constexpr int b = store::kSqliteLoadBatch;
  auto t = hourly(4 * b);
  t[2 * b + 5] = t[10];  // repeats the time of line 12, two batches later
  const auto d = queue("T1", t, f1_);
  ASSERT_EQ(d.size(), 1u);
  EXPECT_EQ(d[0].line, 2 + 2 * b + 5);
  EXPECT_EQ(d[0].unit_id, "T1");
}

TEST_F(LoadQueueTest, FirstOfSeveralDuplicatesInOneBatchIsReported) {
  auto t = hourly(store::kSqliteLoadBatch);  // exactly one full batch
  t[40] = t[39];
  t[50] = t[3];
  const auto d = queue("T1", t, f1_);
  ASSERT_EQ(d.size(), 1u);
  EXPECT_EQ(d[0].line, 42);
}

TEST_F(LoadQueueTest, DuplicateInTheLastShortBatchIsReportedByFlush) {
  constexpr int n = store::kSqliteLoadBatch + 6;
  auto t = hourly(n);
  t[n - 1] = t[n - 4];
  const auto d = queue("T1", t, f1_);
  ASSERT_EQ(d.size(), 1u);
  EXPECT_EQ(d[0].line, n + 1);
}

TEST_F(LoadQueueTest, SameTimeOfAnotherUnitIsNoDuplicate) {
  // Both units' points in one batch.
  for (int i = 0; i < store::kSqliteLoadBatch; ++i) {
    analytics::LoadPoint p{3600LL * (i / 2), 0.5};
    EXPECT_FALSE(s_->queue_load_point(i % 2 ? "T2" : "T1", p, f1_, 2 + i));
  }
  EXPECT_FALSE(s_->flush_load_points());
  EXPECT_EQ(s_->count_rows("load_points"), store::kSqliteLoadBatch);
}

TEST_F(LoadQueueTest, AnEarlierFilesPointsAreReplaced) {
  constexpr int n = 2 * store::kSqliteLoadBatch + 10;  // full batches and a rest
  EXPECT_TRUE(queue("T1", hourly(n), f1_, 0.5).empty());
  EXPECT_TRUE(queue("T1", hourly(n), f2_, 0.7).empty());
  const auto pts = s_->load_points("T1", 0, 3600LL * (n - 1));
  ASSERT_EQ(pts.size(), static_cast<std::size_t>(n));
  for (const auto& p : pts) EXPECT_DOUBLE_EQ(p.load_pu, 0.7);
}

TEST_F(LoadQueueTest, ReadsSeeQueuedPoints) {
  analytics::LoadPoint p{1000, 0.5};
  EXPECT_FALSE(s_->queue_load_point("T1", p, f1_, 2));
  EXPECT_EQ(s_->load_points("T1", 0, 5000).size(), 1u);
  EXPECT_EQ(s_->count_rows("load_points"), 1);
}

TEST_F(LoadQueueTest, CommitRefusesAnUnreportedDuplicate) {
  s_->begin();
  analytics::LoadPoint p{1000, 0.5};
  s_->queue_load_point("T1", p, f1_, 2);
  s_->queue_load_point("T1", p, f1_, 3);
  EXPECT_EQ(s_->count_rows("load_points"), 1);  // written by the read; the duplicate is kept
  EXPECT_THROW(s_->commit(), store::StoreError);
  s_->rollback();
  EXPECT_EQ(s_->count_rows("load_points"), 0);
  EXPECT_FALSE(s_->flush_load_points());
}

TEST_F(LoadQueueTest, ReportedDuplicateIsReturnedOnce) {
  analytics::LoadPoint p{1000, 0.5};
  s_->queue_load_point("T1", p, f1_, 2);
  s_->queue_load_point("T1", p, f1_, 3);
  const auto d = s_->flush_load_points();
  ASSERT_TRUE(d);
  EXPECT_EQ(d->line, 3);
  EXPECT_FALSE(s_->flush_load_points());
}

TEST_F(LoadQueueTest, RollbackDiscardsTheQueue) {
  s_->begin();
  analytics::LoadPoint p{1000, 0.5};
  s_->queue_load_point("T1", p, f1_, 2);
  s_->rollback();
  EXPECT_FALSE(s_->flush_load_points());
  EXPECT_EQ(s_->count_rows("load_points"), 0);
}

}  // namespace
