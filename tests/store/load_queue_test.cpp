// The batched load-point path (Store::queue_load_point / flush_load_points):
// same rows and the same duplicate reports, by line, as add_load_point one
// point at a time, whatever the batch boundaries.
#include <gtest/gtest.h>

#include <algorithm>
#include <cmath>
#include <cstdint>
#include <tuple>
#include <optional>
#include <vector>

#include "schema/store.h"
#include "tests/store/store_fixture.h"

using namespace ferrum;

namespace {

// Small batches, so that few rows cross batch boundaries; the store's own
// batch size only changes when they are crossed.
class LoadQueueTest : public ferrum::testing::TwoFilesFixture<256> {
 protected:
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
};

TEST_P(LoadQueueTest, ManyBatchesAndARestAreAllWritten) {
  constexpr int n = 3 * kBatch + 40;  // three full batches and a rest
  EXPECT_TRUE(queue("T1", hourly(n), f1_).empty());
  EXPECT_EQ(s_->count_rows("load_points"), n);
  const auto pts = s_->load_points("T1", 0, 3600LL * (n - 1));
  ASSERT_EQ(pts.size(), static_cast<std::size_t>(n));
  EXPECT_EQ(pts[n - 1].t, 3600LL * (n - 1));
  EXPECT_TRUE(std::isnan(pts[0].ambient_c));
}

TEST_P(LoadQueueTest, DuplicateAgainstAnEarlierBatchIsReportedAtItsLine) {
  constexpr int b = kBatch;
  auto t = hourly(4 * b);
  t[2 * b + 5] = t[10];  // repeats the time of line 12, two batches later
  const auto d = queue("T1", t, f1_);
  ASSERT_EQ(d.size(), 1u);
  EXPECT_EQ(d[0].line, 2 + 2 * b + 5);
  EXPECT_EQ(d[0].unit_id, "T1");
}

TEST_P(LoadQueueTest, FirstOfSeveralDuplicatesInOneBatchIsReported) {
  auto t = hourly(kBatch);  // exactly one full batch
  t[40] = t[39];
  t[50] = t[3];
  const auto d = queue("T1", t, f1_);
  ASSERT_EQ(d.size(), 1u);
  EXPECT_EQ(d[0].line, 42);
}

TEST_P(LoadQueueTest, DuplicateInTheLastShortBatchIsReportedByFlush) {
  constexpr int n = kBatch + 6;
  auto t = hourly(n);
  t[n - 1] = t[n - 4];
  const auto d = queue("T1", t, f1_);
  ASSERT_EQ(d.size(), 1u);
  EXPECT_EQ(d[0].line, n + 1);
}

TEST_P(LoadQueueTest, SameTimeOfAnotherUnitIsNoDuplicate) {
  // Both units' points in one batch.
  for (int i = 0; i < kBatch; ++i) {
    analytics::LoadPoint p{3600LL * (i / 2), 0.5};
    EXPECT_FALSE(s_->queue_load_point(i % 2 ? "T2" : "T1", p, f1_, 2 + i));
  }
  EXPECT_FALSE(s_->flush_load_points());
  EXPECT_EQ(s_->count_rows("load_points"), kBatch);
}

TEST_P(LoadQueueTest, AnEarlierFilesPointsAreReplaced) {
  constexpr int n = 2 * kBatch + 10;  // full batches and a rest
  EXPECT_TRUE(queue("T1", hourly(n), f1_, 0.5).empty());
  EXPECT_TRUE(queue("T1", hourly(n), f2_, 0.7).empty());
  const auto pts = s_->load_points("T1", 0, 3600LL * (n - 1));
  ASSERT_EQ(pts.size(), static_cast<std::size_t>(n));
  for (const auto& p : pts) EXPECT_DOUBLE_EQ(p.load_pu, 0.7);
}

TEST_P(LoadQueueTest, ReadsSeeQueuedPoints) {
  analytics::LoadPoint p{1000, 0.5};
  EXPECT_FALSE(s_->queue_load_point("T1", p, f1_, 2));
  EXPECT_EQ(s_->load_points("T1", 0, 5000).size(), 1u);
  EXPECT_EQ(s_->count_rows("load_points"), 1);
}

TEST_P(LoadQueueTest, CommitRefusesAnUnreportedDuplicate) {
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

TEST_P(LoadQueueTest, ReportedDuplicateIsReturnedOnce) {
  analytics::LoadPoint p{1000, 0.5};
  s_->queue_load_point("T1", p, f1_, 2);
  s_->queue_load_point("T1", p, f1_, 3);
  const auto d = s_->flush_load_points();
  ASSERT_TRUE(d);
  EXPECT_EQ(d->line, 3);
  EXPECT_FALSE(s_->flush_load_points());
}

// Values come back bit for bit, NULLs as NaN, whichever way a batch is
// written: new points (PostgreSQL: COPY straight into the table) and points
// replacing an earlier file's (PostgreSQL: the staging table and the upsert).
// Plumbing test, no published source.
TEST_P(LoadQueueTest, ValuesComeBackExactlyOnBothWritingRoutes) {
  const std::vector<double> loads = {1.2345678901234567, -0.0, 1e-300, 0.1 + 0.2};
  const std::size_t n = 2 * kBatch + 3;  // two full batches and a rest
  auto write = [&](std::int64_t file, double shift, bool with_oil) {
    for (std::size_t i = 0; i < n; ++i) {
      analytics::LoadPoint p{-86400LL * 365 * 30 + 900LL * static_cast<long long>(i), loads[i % loads.size()] + shift};
      p.ambient_c = i % 3 ? -12.375 - shift : std::nan("");
      if (with_oil) p.top_oil_c = 61.0625 + 1e-9 * static_cast<double>(i);
      EXPECT_FALSE(s_->queue_load_point("T1", p, file, static_cast<std::int64_t>(2 + i)));
    }
    EXPECT_FALSE(s_->flush_load_points());
  };
  auto check = [&](double shift, bool with_oil) {
    const auto pts = s_->load_points("T1", INT64_MIN / 2, INT64_MAX / 2);
    ASSERT_EQ(pts.size(), n);
    for (std::size_t i = 0; i < pts.size(); ++i) {
      EXPECT_EQ(pts[i].t, -86400LL * 365 * 30 + 900LL * static_cast<long long>(i));
      EXPECT_EQ(pts[i].load_pu, loads[i % loads.size()] + shift) << i;
      if (i % 3) EXPECT_EQ(pts[i].ambient_c, -12.375 - shift) << i;
      else EXPECT_TRUE(std::isnan(pts[i].ambient_c)) << i;
      if (with_oil) EXPECT_EQ(pts[i].top_oil_c, 61.0625 + 1e-9 * static_cast<double>(i)) << i;
      else EXPECT_TRUE(std::isnan(pts[i].top_oil_c)) << i;
    }
  };
  write(f1_, 0.0, true);
  check(0.0, true);
  s_->begin();  // in a transaction: PostgreSQL's savepoint around the first COPY
  write(f2_, 0.5, false);  // every point replaces file 1's
  check(0.5, false);
  const auto counts = s_->load_counts();
  EXPECT_EQ(counts.replaced_earlier_file, static_cast<long long>(n));
  EXPECT_EQ(counts.added, 0);
  s_->commit();
  check(0.5, false);
}

// A file whose first batch replaces an earlier file's points (PostgreSQL:
// the staging route for the rest of the file) and whose later batches reach
// months nobody wrote yet (PostgreSQL: partitions made on the way).
// Plumbing test, no published source.
TEST_P(LoadQueueTest, AFileTakingTheStagingRouteStillReachesNewMonths) {
  EXPECT_TRUE(queue("T1", hourly(kBatch), f1_, 0.5).empty());
  std::vector<long long> t = hourly(kBatch);  // the first batch: file 1's times
  for (int i = 0; i < 2 * kBatch; ++i) t.push_back(86400LL * 400 + 86400LL * 40 * i);  // then 40 days apart
  s_->begin();
  EXPECT_TRUE(queue("T1", t, f2_, 0.7).empty());
  s_->commit();
  const auto pts = s_->load_points("T1", INT64_MIN / 2, INT64_MAX / 2);
  ASSERT_EQ(pts.size(), t.size());
  for (const auto& p : pts) EXPECT_EQ(p.load_pu, 0.7);
  EXPECT_EQ(pts.back().t, t.back());
}

// Rows of many units in time-major order (every unit at one time, then every
// unit at the next) and shuffled: the same rows, and the same first duplicate
// by line, as unit by unit.
class LoadOrderTest : public LoadQueueTest {
 protected:
  static constexpr int kUnits = 40;
  static constexpr int kTimes = 2000;  // 80,000 points: many batches
  struct Row {
    int unit;
    long long t;
    std::int64_t line;
  };
  void SetUp() override {
    LoadQueueTest::SetUp();
    for (int u = 0; u < kUnits; ++u) s_->upsert_unit(unit("U" + std::to_string(u)), f1_, 10 + u);
  }
  // Queues the rows in the given order; lines are the rows' positions + 2.
  std::vector<store::LoadDuplicate> queue_rows(std::vector<Row>& rows) {
    std::vector<store::LoadDuplicate> found;
    for (std::size_t i = 0; i < rows.size(); ++i) {
      rows[i].line = static_cast<std::int64_t>(2 + i);
      analytics::LoadPoint p{rows[i].t, 0.01 * rows[i].unit + 1e-6 * static_cast<double>(rows[i].line)};
      if (auto d = s_->queue_load_point("U" + std::to_string(rows[i].unit), p, f1_, rows[i].line))
        found.push_back(*d);
    }
    if (auto d = s_->flush_load_points()) found.push_back(*d);
    return found;
  }
  // Every stored point as (unit, time, load).
  std::vector<std::tuple<int, long long, double>> stored() {
    std::vector<std::tuple<int, long long, double>> out;
    for (int u = 0; u < kUnits; ++u)
      for (const auto& p : s_->load_points("U" + std::to_string(u), INT64_MIN / 2, INT64_MAX / 2))
        out.emplace_back(u, p.t, p.load_pu);
    return out;
  }
  static std::vector<Row> time_major() {
    std::vector<Row> rows;
    for (int t = 0; t < kTimes; ++t)
      for (int u = 0; u < kUnits; ++u) rows.push_back({u, 600LL * t, 0});
    return rows;
  }
};

TEST_P(LoadOrderTest, TimeMajorAndShuffledStoreWhatUnitMajorStores) {
  auto rows = time_major();
  EXPECT_TRUE(queue_rows(rows).empty());
  EXPECT_EQ(s_->count_rows("load_points"), kUnits * kTimes);
  // The stored load carries its line: compare with the rows themselves.
  const auto got = stored();
  std::vector<std::tuple<int, long long, double>> want;
  std::vector<Row> by_unit = rows;
  std::stable_sort(by_unit.begin(), by_unit.end(),
                   [](const Row& a, const Row& b) { return a.unit != b.unit ? a.unit < b.unit : a.t < b.t; });
  for (const auto& r : by_unit) want.emplace_back(r.unit, r.t, 0.01 * r.unit + 1e-6 * static_cast<double>(r.line));
  EXPECT_EQ(got, want);

  // Shuffled, written over the first file's points by a second file: all replaced.
  std::vector<Row> shuffled = time_major();
  std::uint64_t x = 88172645463325252ULL;  // xorshift64, a fixed shuffle
  for (std::size_t i = shuffled.size() - 1; i > 0; --i) {
    x ^= x << 13, x ^= x >> 7, x ^= x << 17;
    std::swap(shuffled[i], shuffled[x % (i + 1)]);
  }
  for (std::size_t i = 0; i < shuffled.size(); ++i) {
    analytics::LoadPoint p{shuffled[i].t, 0.25};
    EXPECT_FALSE(s_->queue_load_point("U" + std::to_string(shuffled[i].unit), p, f2_, static_cast<std::int64_t>(2 + i)));
  }
  EXPECT_FALSE(s_->flush_load_points());
  EXPECT_EQ(s_->count_rows("load_points"), kUnits * kTimes);
  for (const auto& [u, t, load] : stored()) EXPECT_DOUBLE_EQ(load, 0.25);
}

TEST_P(LoadOrderTest, FirstDuplicateByLineWhateverTheOrder) {
  // Three duplicates: the reported one is the smallest line that repeats an
  // earlier row, as a row-by-row import would report, although sorting puts
  // the others first.
  auto rows = time_major();
  rows[70000] = rows[69000];  // line 70,002 repeats line 69,002 (unit 0), in a later batch
  rows[50000] = rows[10];     // line 50,002 repeats line 12 (unit 10, time 0), many batches earlier
  rows[50120] = rows[50080];  // same batch as line 50,002 (lines 49,922-50,177): unit 0 sorts first
  static_assert(kBatch == 256, "the batch of line 50,002 is lines 49,922-50,177");
  const auto d = queue_rows(rows);
  ASSERT_GE(d.size(), 1u);  // the caller rejects the file at the first
  EXPECT_EQ(d[0].line, 50002);
  EXPECT_EQ(d[0].unit_id, "U10");
}

TEST_P(LoadQueueTest, RollbackDiscardsTheQueue) {
  s_->begin();
  analytics::LoadPoint p{1000, 0.5};
  s_->queue_load_point("T1", p, f1_, 2);
  s_->rollback();
  EXPECT_FALSE(s_->flush_load_points());
  EXPECT_EQ(s_->count_rows("load_points"), 0);
}

FERRUM_ON_BOTH_BACKENDS(LoadQueueTest);
FERRUM_ON_BOTH_BACKENDS(LoadOrderTest);

}  // namespace
