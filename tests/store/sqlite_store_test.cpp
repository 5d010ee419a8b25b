#include <gtest/gtest.h>

#include <cstdio>
#include <filesystem>
#include <fstream>

#include "schema/store.h"
#include "tests/store/store_fixture.h"

namespace fs = std::filesystem;
using namespace ferrum;

namespace {

class StoreTest : public ferrum::testing::StoreFixture {};
FERRUM_ON_BOTH_BACKENDS(StoreTest);

TEST_P(StoreTest, MigratesAndReopens) {
  { auto s = open_store(); EXPECT_EQ(s->count_rows("units"), 0); }
  auto s = open_store();
  EXPECT_EQ(s->count_rows("files"), 0);
  EXPECT_GE(store::schema_version(), 1);
}

TEST_P(StoreTest, RefusesNewerSchema) {
  { auto s = open_store(); }
  // Pretend a future ferrum wrote it.
  if (GetParam() == ferrum::testing::Backend::postgresql) {
    sql(conninfo_, "UPDATE ferrum_schema SET version = 999");
  } else {
    auto cmd = "sqlite3 '" + db_ + "' 'PRAGMA user_version=999'";
    if (std::system(cmd.c_str()) != 0) GTEST_SKIP() << "sqlite3 shell not installed";
  }
  EXPECT_THROW(open_store(), store::IncompatibleStore);
}

TEST_P(StoreTest, RefusesSomethingElse) {
  if (GetParam() == ferrum::testing::Backend::postgresql)
    sql(conninfo_, "CREATE TABLE customers(id integer)");  // another application's database
  else
    std::ofstream(db_) << std::string(8192, 'x');
  EXPECT_THROW(open_store(), store::IncompatibleStore);
}

TEST_P(StoreTest, UnitUpsertKeepsHistory) {
  auto s = open_store();
  const auto f = file(*s);
  EXPECT_TRUE(s->upsert_unit(unit("T1"), f, 2));
  EXPECT_FALSE(s->upsert_unit(unit("T1"), f, 2));  // unchanged
  auto changed = unit("T1");
  changed.criticality = 5;
  EXPECT_TRUE(s->upsert_unit(changed, f, 3));
  EXPECT_EQ(s->count_rows("unit_history"), 1);
  EXPECT_EQ(s->find_unit("T1")->criticality, 5);
}

// Migration 005: the unit's own costs for the plan are kept, read back, and a changed cost is a
// change of the register row (history). Plumbing: no engineering value checked.
TEST_P(StoreTest, UnitCostsRoundTrip) {
  auto s = open_store();
  const auto f = file(*s);
  auto u = unit("T1");
  u.replacement_cost = 1500000;
  u.refurbishment_cost = 300000.5;
  EXPECT_TRUE(s->upsert_unit(u, f, 2));
  auto back = s->find_unit("T1");
  ASSERT_TRUE(back && back->replacement_cost && back->refurbishment_cost);
  EXPECT_DOUBLE_EQ(*back->replacement_cost, 1500000);
  EXPECT_DOUBLE_EQ(*back->refurbishment_cost, 300000.5);
  u.refurbishment_cost.reset();
  EXPECT_TRUE(s->upsert_unit(u, f, 3));
  EXPECT_EQ(s->count_rows("unit_history"), 1);
  const auto all = s->units();
  ASSERT_EQ(all.size(), 1u);
  EXPECT_DOUBLE_EQ(all[0].replacement_cost.value_or(0), 1500000);
  EXPECT_FALSE(all[0].refurbishment_cost);
}

// Migration 007: the register's on-load tap changer is kept and read back on both
// backends; a change is a change of the register row. Plumbing: no engineering value checked.
TEST_P(StoreTest, UnitOltcRoundTrip) {
  auto s = open_store();
  const auto f = file(*s);
  auto u = unit("T1");
  EXPECT_TRUE(s->upsert_unit(u, f, 2));
  EXPECT_EQ(s->find_unit("T1")->oltc, analytics::OltcType::unknown);  // not given: null
  u.oltc = analytics::OltcType::communicating;
  EXPECT_TRUE(s->upsert_unit(u, f, 3));
  EXPECT_EQ(s->count_rows("unit_history"), 1);
  EXPECT_EQ(s->find_unit("T1")->oltc, analytics::OltcType::communicating);
  EXPECT_FALSE(s->upsert_unit(u, f, 4));  // unchanged
  u.oltc = analytics::OltcType::sealed;
  EXPECT_TRUE(s->upsert_unit(u, f, 5));
  const auto all = s->units();
  ASSERT_EQ(all.size(), 1u);
  EXPECT_EQ(all[0].oltc, analytics::OltcType::sealed);
}

// Ids and sites of the register, in unit_id order (byte order on both
// backends), as units() gives them. Plumbing: no engineering value.
TEST_P(StoreTest, UnitSitesInUnitIdOrder) {
  auto s = open_store();
  const auto f = file(*s);
  EXPECT_TRUE(s->unit_sites().empty());
  for (const auto& [id, site] : {std::pair{"T2", "North"}, {"T10", "South"}, {"T1", "North"}, {"a1", "East"}}) {
    auto u = unit(id);
    u.site = site;
    EXPECT_TRUE(s->upsert_unit(u, f, 2));
  }
  const auto sites = s->unit_sites();
  std::vector<std::string> got;
  for (const auto& u : sites) got.push_back(u.unit_id + "@" + u.site);
  EXPECT_EQ(got, (std::vector<std::string>{"T1@North", "T10@South", "T2@North", "a1@East"}));
  const auto all = s->units();
  ASSERT_EQ(all.size(), sites.size());
  for (std::size_t i = 0; i < all.size(); ++i) EXPECT_EQ(all[i].unit_id + "@" + all[i].site, got[i]);
}

TEST_P(StoreTest, OilSampleSupersededByCorrectedReissue) {
  auto s = open_store();
  const auto f = file(*s);
  s->upsert_unit(unit("T1"), f, 2);
  analytics::OilSample o;
  o.date = analytics::days_from_civil(2026, 3, 14);
  o.lab_ref = "L-1";
  o.h2 = analytics::LabValue::measured(100);
  o.c2h2 = analytics::LabValue::below(0.5);
  s->add_oil_sample("T1", o, f, 2);
  o.h2 = analytics::LabValue::measured(90);  // corrected
  s->add_oil_sample("T1", o, f, 3);
  const auto d = s->unit_data("T1");
  ASSERT_EQ(d.oil_samples.size(), 1u);
  EXPECT_DOUBLE_EQ(d.oil_samples[0].h2.value, 90);
  EXPECT_TRUE(d.oil_samples[0].c2h2.is_below_limit());
  EXPECT_DOUBLE_EQ(d.oil_samples[0].c2h2.value, 0.5);
  EXPECT_FALSE(d.oil_samples[0].ch4.present());
  EXPECT_EQ(s->count_rows("oil_samples"), 2);  // the earlier values stay as history
}

// Every lab value comes back as the same double, whatever its digits; a
// value below the detection limit keeps its state, with or without a limit.
// (PostgreSQL sends them as one array per sample.) Plumbing: no published
// source applies.
TEST_P(StoreTest, OilValuesComeBackExactly) {
  auto s = open_store();
  const auto f = file(*s);
  s->upsert_unit(unit("T1"), f, 2);
  analytics::OilSample o;
  o.date = analytics::days_from_civil(2026, 3, 14);
  o.lab_ref = "L-9";
  o.h2 = analytics::LabValue::measured(0.1 + 0.2);
  o.ch4 = analytics::LabValue::measured(1e-300);
  o.co2 = analytics::LabValue::measured(123456789.123456789);
  o.c2h2 = analytics::LabValue::below(std::nan(""));
  o.c2h4 = analytics::LabValue::below(0.7);
  EXPECT_EQ(s->add_oil_sample("T1", o, f, 2), store::RowInsert::added);
  analytics::OilSample empty;  // a sample without values is kept too
  empty.date = o.date + 1;
  EXPECT_EQ(s->add_oil_sample("T1", empty, f, 3), store::RowInsert::added);
  const auto d = s->unit_data("T1");
  ASSERT_EQ(d.oil_samples.size(), 2u);
  const auto& b = d.oil_samples[0];
  EXPECT_EQ(b.h2.value, 0.1 + 0.2);
  EXPECT_TRUE(b.h2.is_measured());
  EXPECT_EQ(b.ch4.value, 1e-300);
  EXPECT_EQ(b.co2.value, 123456789.123456789);
  EXPECT_TRUE(b.c2h2.is_below_limit());
  EXPECT_TRUE(std::isnan(b.c2h2.value));
  EXPECT_TRUE(b.c2h4.is_below_limit());
  EXPECT_EQ(b.c2h4.value, 0.7);
  EXPECT_FALSE(b.c2h6.present());
  EXPECT_FALSE(d.oil_samples[1].h2.present());
}

// PostgreSQL prepares a statement again after 1,024 runs and after 4 times
// as many each time (pg_connection.h): rows written across those points all
// land, and a re-issue is still told from a new row. Plumbing: no published
// source applies.
TEST_P(StoreTest, RowsWrittenAcrossStatementReplansAllLand) {
  auto s = open_store();
  const auto f1 = file(*s, "a");
  const auto f2 = file(*s, "b");
  s->upsert_unit(unit("T1"), f1, 2);
  constexpr int kRows = 4200;  // past the second re-preparation (1,024 and 4,096 runs)
  for (int i = 0; i < kRows; ++i) {
    analytics::InspectionRecord r;
    r.date = analytics::days_from_civil(2015, 1, 1) + i;
    r.item = "bushings";
    ASSERT_EQ(s->add_inspection("T1", r, f1, i + 2), store::RowInsert::added) << i;
  }
  analytics::InspectionRecord again;
  again.date = analytics::days_from_civil(2015, 1, 1) + 7;
  again.item = "bushings";
  again.rating = analytics::Rating::poor;
  EXPECT_EQ(s->add_inspection("T1", again, f2, 2), store::RowInsert::replaced_earlier_file);
  EXPECT_EQ(s->add_inspection("T1", again, f2, 3), store::RowInsert::duplicate_in_file);
  const auto d = s->unit_data("T1");
  ASSERT_EQ(d.inspections.size(), static_cast<std::size_t>(kRows));
  EXPECT_EQ(d.inspections[7].rating, analytics::Rating::poor);
}

TEST_P(StoreTest, LoadDuplicatesDetectedWithinFileReplacedAcrossFiles) {
  auto s = open_store();
  const auto f1 = file(*s, "a");
  const auto f2 = file(*s, "b");
  s->upsert_unit(unit("T1"), f1, 2);
  analytics::LoadPoint p{1000, 0.5};
  EXPECT_EQ(s->add_load_point("T1", p, f1, 2), store::LoadInsert::added);
  EXPECT_EQ(s->add_load_point("T1", p, f1, 3), store::LoadInsert::duplicate_in_file);
  p.load_pu = 0.7;
  EXPECT_NE(s->add_load_point("T1", p, f2, 2), store::LoadInsert::duplicate_in_file);
  const auto pts = s->load_points("T1", 0, 5000);
  ASSERT_EQ(pts.size(), 1u);
  EXPECT_DOUBLE_EQ(pts[0].load_pu, 0.7);
  EXPECT_TRUE(std::isnan(pts[0].ambient_c));
}

TEST_P(StoreTest, RollbackLeavesNothing) {
  auto s = open_store();
  s->begin();
  const auto f = file(*s);
  s->upsert_unit(unit("T1"), f, 2);
  s->rollback();
  EXPECT_EQ(s->count_rows("units"), 0);
  EXPECT_EQ(s->count_rows("files"), 0);
}

}  // namespace
