// What only a database shared by several site roots has (PostgreSQL store):
// the roots' own file records and state, duplicates across roots, the fleet
// lead, month partitions of the load table, and a lost connection. Plus the
// rule that both backends' migrations carry the same versions.
#include <gtest/gtest.h>

#include <unistd.h>

#include <set>

#include "analytics/calendar.h"
#include "schema/migrations.h"
#include "schema/store.h"
#include "tests/store/store_fixture.h"

using namespace ferrum;

namespace {

TEST(Migrations, BothBackendsHaveTheSameVersions) {
  std::set<int> sqlite, postgresql;
  for (const auto& m : store::embedded_migrations()) sqlite.insert(m.version);
  for (const auto& m : store::embedded_postgresql_migrations()) postgresql.insert(m.version);
  EXPECT_EQ(sqlite, postgresql) << "a migration added to one backend needs its twin in the other";
}

class SharedStoreTest : public ferrum::testing::StoreFixture {
 protected:
  std::unique_ptr<store::Store> open_root(const std::string& root) {
    return store::open_postgresql_store(conninfo_, root);
  }
};
INSTANTIATE_TEST_SUITE_P(Backends, SharedStoreTest, ::testing::Values(ferrum::testing::Backend::postgresql),
                         ferrum::testing::backend_name);

TEST_P(SharedStoreTest, EachRootSeesItsOwnFilesButDuplicatesAcrossRoots) {
  auto north = open_root("host:/srv/north");
  auto south = open_root("host:/srv/south");
  north->add_file(record("same-content"));
  EXPECT_TRUE(south->accepted_file_with_hash("same-content"));     // a duplicate in the second root
  EXPECT_FALSE(south->latest_file_with_hash("same-content"));      // but not its own record to recover
  EXPECT_TRUE(south->recent_files(10).empty());
  EXPECT_EQ(north->recent_files(10).size(), 1u);
  ASSERT_TRUE(south->newest_file_in_database());                   // what changes the fleet ranking
  EXPECT_EQ(south->newest_file_in_database()->sha256, "same-content");
  north->set_state("weekly_last_run", "a");
  EXPECT_FALSE(south->state("weekly_last_run"));
  south->set_state("weekly_last_run", "b");
  EXPECT_EQ(*north->state("weekly_last_run"), "a");
}

TEST_P(SharedStoreTest, OneFleetLeadTakenOverWhenItsHolderIsGone) {
  auto first = open_root("host:/srv/north");
  auto second = open_root("host:/srv/south");
  EXPECT_TRUE(first->hold_fleet_lead());
  EXPECT_TRUE(first->hold_fleet_lead());  // held, not taken twice
  EXPECT_FALSE(second->hold_fleet_lead());
  first.reset();  // its daemon stopped: the session ends, the lock with it
  bool taken = false;  // the server releases it when the ended session's process exits: soon, not at once
  for (int i = 0; i < 100 && !taken; ++i) {
    taken = second->hold_fleet_lead();
    if (!taken) ::usleep(50 * 1000);
  }
  EXPECT_TRUE(taken);
}

TEST_P(SharedStoreTest, LoadPointsGoToMonthPartitionsMadeOnDemand) {
  auto s = open_store(64);
  const auto f = file(*s);
  s->upsert_unit(unit("T1"), f, 2);
  s->begin();
  // 400 half-hourly points from 2025-12-31 20:00 UTC: two months.
  const analytics::Timestamp start = analytics::start_of(analytics::days_from_civil(2025, 12, 31)) + 20 * 3600;
  for (int i = 0; i < 400; ++i)
    EXPECT_FALSE(s->queue_load_point("T1", analytics::LoadPoint{start + 1800LL * i, 0.5}, f, 2 + i));
  EXPECT_FALSE(s->flush_load_points());
  s->commit();
  EXPECT_EQ(s->count_rows("load_points"), 400);
  for (const char* month : {"load_points_p202512", "load_points_p202601"}) {
    PGconn* c = PQconnectdb(conninfo_.c_str());
    PGresult* r = PQexec(c, (std::string("SELECT count(*) FROM ") + month).c_str());
    ASSERT_EQ(PQresultStatus(r), PGRES_TUPLES_OK) << month << ": " << PQresultErrorMessage(r);
    EXPECT_EQ(std::string(PQgetvalue(r, 0, 0)), month == std::string("load_points_p202512") ? "8" : "392");
    PQclear(r);
    PQfinish(c);
  }
}

TEST_P(SharedStoreTest, ALostConnectionRollsBackAndTheStoreReconnects) {
  auto s = open_store();
  const auto f = file(*s);
  s->upsert_unit(unit("T1"), f, 2);
  s->begin();
  const auto f2 = file(*s, "second");
  (void)f2;
  // The server ends this session (as a restart or a network loss would).
  sql(conninfo_, "SELECT pg_terminate_backend(pid) FROM pg_stat_activity WHERE application_name = '" + schema_ +
                     "' AND pid <> pg_backend_pid()");
  EXPECT_THROW(s->upsert_unit(unit("T2"), f, 3), store::StoreUnavailable);
  s->rollback();
  // Outside a transaction the next call reconnects; the file never happened.
  EXPECT_EQ(s->count_rows("files"), 1);
  EXPECT_EQ(s->count_rows("units"), 1);
  s->begin();
  file(*s, "third");
  s->commit();
  EXPECT_EQ(s->count_rows("files"), 2);
}

}  // namespace
