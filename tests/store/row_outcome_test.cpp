// Whether each row a file adds is new or already on file (store::RowInsert),
// for every add_* of the store, and the counts of the batched load path
// (Store::load_counts), exact across batch boundaries. Plumbing only: no
// engineering value, so no source is checked here.
#include <gtest/gtest.h>

#include <cstdint>
#include <vector>

#include "schema/store.h"
#include "tests/store/store_fixture.h"

using namespace ferrum;
using store::RowInsert;

namespace {

// Batches of 64 points: a few hundred points cross several.
class RowOutcomeTest : public ferrum::testing::TwoFilesFixture<64> {
 protected:
  // Queues hourly points [first, first + n) of a unit, then flushes; no
  // duplicate is expected.
  void queue(const std::string& unit, long long first, long long n, std::int64_t file_id, double load) {
    for (long long i = 0; i < n; ++i) {
      EXPECT_FALSE(s_->queue_load_point(unit, {3600 * (first + i), load}, file_id, 2 + i));
    }
    EXPECT_FALSE(s_->flush_load_points());
  }
};

TEST_P(RowOutcomeTest, OilSampleNewThenCorrectedReissueIsOnFile) {
  analytics::OilSample o;
  o.date = analytics::days_from_civil(2026, 3, 14);
  o.lab_ref = "L-1";
  o.h2 = analytics::LabValue::measured(100);
  EXPECT_EQ(s_->add_oil_sample("T1", o, f1_, 2), RowInsert::added);
  o.h2 = analytics::LabValue::measured(90);
  EXPECT_EQ(s_->add_oil_sample("T1", o, f2_, 2), RowInsert::replaced_earlier_file);
  o.lab_ref = "L-2";  // another sample of the same day
  EXPECT_EQ(s_->add_oil_sample("T1", o, f2_, 3), RowInsert::added);
  EXPECT_EQ(s_->add_oil_sample("T1", o, f2_, 4), RowInsert::duplicate_in_file);
}

TEST_P(RowOutcomeTest, InfraredInspectionAndElectricalReportReplacement) {
  analytics::InfraredScan ir;
  ir.date = analytics::days_from_civil(2026, 4, 2);
  ir.component = "bushing_h1";
  ir.spot_c = 41;
  ir.reference_c = 30;
  EXPECT_EQ(s_->add_infrared("T1", ir, f1_, 2), RowInsert::added);
  EXPECT_EQ(s_->add_infrared("T1", ir, f2_, 2), RowInsert::replaced_earlier_file);  // equal re-delivery
  EXPECT_EQ(s_->add_infrared("T2", ir, f2_, 3), RowInsert::added);                  // another unit
  EXPECT_EQ(s_->add_infrared("T2", ir, f2_, 4), RowInsert::duplicate_in_file);

  analytics::InspectionRecord in;
  in.date = analytics::days_from_civil(2026, 4, 3);
  in.item = "breather";
  in.rating = analytics::Rating::fair;
  EXPECT_EQ(s_->add_inspection("T1", in, f1_, 2), RowInsert::added);
  in.rating = analytics::Rating::poor;
  EXPECT_EQ(s_->add_inspection("T1", in, f2_, 2), RowInsert::replaced_earlier_file);
  in.item = "bushings";
  EXPECT_EQ(s_->add_inspection("T1", in, f2_, 3), RowInsert::added);

  analytics::ElectricalTest t;  // the key: unit, day, test, bushing (and more, empty here)
  t.date = analytics::days_from_civil(2026, 3, 10);
  t.test = analytics::ElectricalTestKind::bushing_power_factor;
  t.bushing = "H2";
  t.value = 0.31;
  EXPECT_EQ(s_->add_electrical_test("T1", t, f1_, 2), RowInsert::added);
  t.value = 0.35;
  EXPECT_EQ(s_->add_electrical_test("T1", t, f2_, 2), RowInsert::replaced_earlier_file);
  t.bushing = "H3";
  EXPECT_EQ(s_->add_electrical_test("T1", t, f2_, 3), RowInsert::added);
  EXPECT_EQ(s_->count_rows("electrical_tests"), 2);
}

TEST_P(RowOutcomeTest, LoadPointOneByOneTellsNewFromReplaced) {
  analytics::LoadPoint p{1000, 0.5};
  s_->begin();
  EXPECT_EQ(s_->add_load_point("T1", p, f1_, 2), RowInsert::added);
  EXPECT_EQ(s_->add_load_point("T1", p, f1_, 3), RowInsert::duplicate_in_file);
  EXPECT_EQ(s_->add_load_point("T1", p, f2_, 2), RowInsert::replaced_earlier_file);
  EXPECT_EQ(s_->add_load_point("T1", {2000, 0.5}, f2_, 3), RowInsert::added);
  const auto c = s_->load_counts();
  EXPECT_EQ(c.added, 2);
  EXPECT_EQ(c.replaced_earlier_file, 1);
  s_->commit();
}

TEST_P(RowOutcomeTest, QueuedCountsAreExactAcrossBatches) {
  // File 1: T1 hours 0..299 and T2 hours 0..99 (several batches of 64).
  s_->begin();
  queue("T1", 0, 300, f1_, 0.5);
  queue("T2", 0, 100, f1_, 0.5);
  auto c = s_->load_counts();
  EXPECT_EQ(c.added, 400);
  EXPECT_EQ(c.replaced_earlier_file, 0);
  s_->commit();

  // File 2 overlaps: T1 hours 250..449 (50 on file, 150 new) and T2 hours
  // 0..99 again, interleaved with T1 so that batches mix both.
  s_->begin();
  std::int64_t line = 2;
  for (int i = 0; i < 200; ++i) {
    EXPECT_FALSE(s_->queue_load_point("T1", {3600LL * (250 + i), 0.6}, f2_, line++));
    if (i < 100) {
      EXPECT_FALSE(s_->queue_load_point("T2", {3600LL * i, 0.6}, f2_, line++));
    }
  }
  EXPECT_FALSE(s_->flush_load_points());
  c = s_->load_counts();
  EXPECT_EQ(c.added, 150);
  EXPECT_EQ(c.replaced_earlier_file, 150);
  s_->commit();
  EXPECT_EQ(s_->count_rows("load_points"), 550);
}

TEST_P(RowOutcomeTest, CountsIncludeTheStillQueuedPointsAndRestartAtBegin) {
  s_->begin();
  queue("T1", 0, 10, f1_, 0.5);
  s_->commit();
  s_->begin();
  for (int i = 0; i < 20; ++i) EXPECT_FALSE(s_->queue_load_point("T1", {3600LL * i, 0.7}, f2_, 2 + i));
  const auto c = s_->load_counts();  // less than a batch: still queued until counted
  EXPECT_EQ(c.added, 10);
  EXPECT_EQ(c.replaced_earlier_file, 10);
  s_->rollback();
  s_->begin();
  EXPECT_EQ(s_->load_counts().added, 0);
  EXPECT_EQ(s_->load_counts().replaced_earlier_file, 0);
  s_->rollback();
}

FERRUM_ON_BOTH_BACKENDS(RowOutcomeTest);

}  // namespace
