// Planners' work-status rows in both stores (migration 006): round trip in
// date order, re-delivery of the same row replaces it, provenance queries.
#include <gtest/gtest.h>

#include "schema/store.h"
#include "tests/store/store_fixture.h"

namespace {

using namespace ferrum;

class WorkStatusStoreTest : public ferrum::testing::StoreFixture {};
FERRUM_ON_BOTH_BACKENDS(WorkStatusStoreTest);

analytics::WorkStatus row(const std::string& ref, const std::string& status, int day, const std::string& note = "") {
  return {ref, status, analytics::days_from_civil(2026, 11, day), note};
}

TEST_P(WorkStatusStoreTest, RowsComeBackInDateOrderAndRedeliveryReplaces) {
  auto s = open_store();
  EXPECT_GE(store::schema_version(), 6);
  const auto f1 = file(*s, "a");
  const auto f2 = file(*s, "b");
  s->upsert_unit(unit("T1"), f1, 2);
  EXPECT_EQ(s->add_work_status("T1", row("T1/oil-resample", "done", 20, "sampled"), f1, 3), store::RowInsert::added);
  EXPECT_EQ(s->add_work_status("T1", row("T1/oil-resample", "booked", 10), f1, 2), store::RowInsert::added);
  EXPECT_EQ(s->add_work_status("T1", row("T1/outage", "booked", 15), f1, 4), store::RowInsert::added);
  // The same unit, reference, day and status again: the later file's row stands.
  EXPECT_EQ(s->add_work_status("T1", row("T1/outage", "booked", 15, "moved crew"), f2, 2),
            store::RowInsert::replaced_earlier_file);
  EXPECT_EQ(s->count_rows("work_status"), 3);

  const auto d = s->unit_data("T1");
  ASSERT_EQ(d.work_status.size(), 3u);
  EXPECT_EQ(d.work_status[0].status, "booked");  // 2026-11-10 first
  EXPECT_EQ(d.work_status[0].reference, "T1/oil-resample");
  EXPECT_EQ(d.work_status[1].reference, "T1/outage");
  EXPECT_EQ(d.work_status[1].note, "moved crew");
  EXPECT_EQ(d.work_status[2].status, "done");
  EXPECT_EQ(d.work_status[2].date, analytics::days_from_civil(2026, 11, 20));
  EXPECT_EQ(d.work_status[2].note, "sampled");

  EXPECT_EQ(s->units_of_file(f2), std::vector<std::string>{"T1"});
  bool f2_listed = false;
  for (const auto& f : s->files_for_unit("T1")) f2_listed = f2_listed || f.id == f2;
  EXPECT_TRUE(f2_listed);
}

}  // namespace
