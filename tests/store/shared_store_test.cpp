// What only a database shared by several site roots has (PostgreSQL store):
// the roots' own file records and state, duplicates across roots, the fleet
// lead, month partitions of the load table, and a lost connection. Plus the
// rule that both backends' migrations carry the same versions.
#include <gtest/gtest.h>

#include <unistd.h>

#include <cmath>
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

// One string of a one-row, one-column query (SQL of the test, not of ferrum).
std::string scalar(const std::string& conninfo, const std::string& text) {
  PGconn* c = PQconnectdb(conninfo.c_str());
  PGresult* r = PQexec(c, text.c_str());
  std::string v = PQresultStatus(r) == PGRES_TUPLES_OK && PQntuples(r) == 1 ? PQgetvalue(r, 0, 0) : "error";
  PQclear(r);
  PQfinish(c);
  return v;
}

// The same points, NaN in the same places (a packed NULL comes back NaN).
void expect_same_points(const std::vector<analytics::LoadPoint>& a, const std::vector<analytics::LoadPoint>& b) {
  ASSERT_EQ(a.size(), b.size());
  auto same = [](double x, double y) { return (std::isnan(x) && std::isnan(y)) || x == y; };
  for (std::size_t i = 0; i < a.size(); ++i) {
    EXPECT_EQ(a[i].t, b[i].t) << i;
    EXPECT_TRUE(same(a[i].load_pu, b[i].load_pu) && same(a[i].ambient_c, b[i].ambient_c) &&
                same(a[i].top_oil_c, b[i].top_oil_c))
        << i;
  }
}

// 400 half-hourly points from 2025-12-31 20:00 UTC (two months: 8 in
// December, 392 in January), every other one without ambient or top oil.
const analytics::Timestamp kPackStart = analytics::start_of(analytics::days_from_civil(2025, 12, 31)) + 20 * 3600;
analytics::LoadPoint pack_point(int i) {
  analytics::LoadPoint p{kPackStart + 1800LL * i, 0.25 + i / 1000.0};
  if (i % 2 == 0) {
    p.ambient_c = 10.0 + i / 8.0;
    p.top_oil_c = 40.0 + i / 16.0;
  }
  return p;
}

class SharedStoreTest : public ferrum::testing::StoreFixture {
 protected:
  std::unique_ptr<store::Store> open_root(const std::string& root) {
    return store::open_postgresql_store(conninfo_, root);
  }
  // Unit T1 of the register with the 400 points of pack_point, from one file.
  static void store_pack_points(store::Store& s) {
    const auto f = file(s);
    s.upsert_unit(unit("T1"), f, 2);
    s.begin();
    for (int i = 0; i < 400; ++i) EXPECT_FALSE(s.queue_load_point("T1", pack_point(i), f, 2 + i));
    EXPECT_FALSE(s.flush_load_points());
    s.commit();
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

// Load packs (schema/postgresql/migrations/012_load_packs.sql): a read packs
// each whole month; the next read takes the packs, which a change of the
// rows behind ferrum's back shows; every write through the store (another
// file's point, the retention rule) makes its month's pack stale.
TEST_P(SharedStoreTest, LoadPacksAreReadUntilAWriteMakesThemStale) {
  auto s = open_store(64);
  store_pack_points(*s);
  EXPECT_EQ(scalar(conninfo_, "SELECT count(*) FROM load_packs WHERE points IS NOT NULL"), "0");

  const auto rows = s->load_points("T1", INT64_MIN, INT64_MAX);
  ASSERT_EQ(rows.size(), 400u);
  for (int i : {0, 1, 399}) expect_same_points({rows[static_cast<std::size_t>(i)]}, {pack_point(i)});
  EXPECT_EQ(scalar(conninfo_, "SELECT count(*) || ' ' || sum(length(points)) FROM load_packs WHERE points IS NOT NULL"),
            "2 12800");  // two months, 32 bytes a point

  // Changed behind ferrum's back (ferrum never does that): the packs are read.
  sql(conninfo_, "UPDATE load_points SET load_pu = 0.9 WHERE ts = " + std::to_string(kPackStart));
  expect_same_points(s->load_points("T1", INT64_MIN, INT64_MAX), rows);
  // A part of the range, from the packs: the same points as from the rows.
  const analytics::Timestamp from = kPackStart + 3 * 1800, to = kPackStart + 300 * 1800;
  expect_same_points(s->load_points("T1", from, to), {rows.begin() + 3, rows.begin() + 301});

  // Another file's reading of a December point, through the store: December
  // is read from its rows again (with the change behind ferrum's back too).
  const auto f2 = file(*s, "second");
  s->begin();
  EXPECT_FALSE(s->queue_load_point("T1", analytics::LoadPoint{kPackStart + 1800, 0.7}, f2, 2));
  EXPECT_FALSE(s->flush_load_points());
  s->commit();
  // A part of a month is read from its rows and not packed.
  const auto part = s->load_points("T1", from, to);
  ASSERT_EQ(part.size(), 298u);
  EXPECT_EQ(part[0].t, kPackStart + 3 * 1800);
  EXPECT_EQ(scalar(conninfo_, "SELECT count(*) FROM load_packs WHERE points IS NULL"), "1");
  auto now = s->load_points("T1", INT64_MIN, INT64_MAX);
  ASSERT_EQ(now.size(), 400u);
  EXPECT_EQ(now[0].load_pu, 0.9);
  EXPECT_EQ(now[1].load_pu, 0.7);
  expect_same_points({now.begin() + 8, now.end()}, {rows.begin() + 8, rows.end()});  // January: its pack
  expect_same_points(s->load_points("T1", INT64_MIN, INT64_MAX), now);             // December packed again

  // The retention rule deletes December's points: none comes back from a pack.
  analytics::LoadHistory h;
  h.raw_from = analytics::start_of(analytics::days_from_civil(2026, 1, 1));
  s->begin();
  s->keep_load_history("T1", h);
  s->commit();
  expect_same_points(s->load_points("T1", INT64_MIN, INT64_MAX), {rows.begin() + 8, rows.end()});
}

// Two daemons on one database: a reader packs a month while a writer's
// transaction holds new points of it, uncommitted; the writer's commit makes
// that pack stale, so the reader then sees the points. Also when the packs
// are gone (an unlogged table is empty after a crash).
TEST_P(SharedStoreTest, APackMadeBeforeAWritersCommitIsNotReadAfterIt) {
  auto writer = open_store(64);
  auto reader = open_store(64);
  store_pack_points(*writer);
  for (bool packs_lost : {false, true}) {
    SCOPED_TRACE(packs_lost ? "load_packs emptied" : "load_packs kept");
    const auto before = reader->load_points("T1", INT64_MIN, INT64_MAX);  // packs both months
    if (packs_lost) sql(conninfo_, "TRUNCATE load_packs");
    const auto f2 = file(*writer, packs_lost ? "fourth" : "third");
    const analytics::Timestamp added = kPackStart + 1800LL * 400 + (packs_lost ? 60 : 0);  // January, new times
    writer->begin();
    EXPECT_FALSE(writer->queue_load_point("T1", analytics::LoadPoint{added, 0.5}, f2, 2));
    EXPECT_FALSE(writer->flush_load_points());
    expect_same_points(reader->load_points("T1", INT64_MIN, INT64_MAX), before);  // not committed: not seen
    writer->commit();
    const auto after = reader->load_points("T1", INT64_MIN, INT64_MAX);
    ASSERT_EQ(after.size(), before.size() + 1);
    EXPECT_EQ(after.back().t, added);
    expect_same_points(reader->load_points("T1", INT64_MIN, INT64_MAX), after);
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
