// Electrical tests and the register's electrical columns in both stores
// (migration 002): round trip, re-delivery replaces, provenance queries.
#include <gtest/gtest.h>

#include "schema/store.h"
#include "tests/store/store_fixture.h"

namespace {

using namespace ferrum;

class ElectricalStoreTest : public ferrum::testing::StoreFixture {};
FERRUM_ON_BOTH_BACKENDS(ElectricalStoreTest);

analytics::ElectricalTest bushing_test(double pf) {
  analytics::ElectricalTest t;
  t.date = analytics::days_from_civil(2026, 3, 10);
  t.test = analytics::ElectricalTestKind::bushing_power_factor;
  t.bushing = "H2";
  t.insulation = "C1";
  t.temp_c = 20;
  t.test_kv = 10;
  t.value = pf;
  t.capacitance_pf = 452;
  t.nameplate_value = 445;
  t.crew = "Crew 2";
  return t;
}

TEST_P(ElectricalStoreTest, RoundTripAndRedeliveryReplaces) {
  auto s = open_store();
  EXPECT_GE(store::schema_version(), 2);
  const auto f1 = file(*s, "a");
  const auto f2 = file(*s, "b");
  auto u = unit("T1");
  u.conductor = "al";
  u.tap_positions = 17;
  u.tap_nominal = 9;
  u.tap_step_pct = 1.25;
  u.impedance_pct = 10.5;
  s->upsert_unit(u, f1, 2);
  const auto back = s->find_unit("T1");
  EXPECT_EQ(back->conductor, "al");
  EXPECT_EQ(back->tap_positions, 17);
  EXPECT_EQ(back->tap_nominal, 9);
  EXPECT_DOUBLE_EQ(*back->tap_step_pct, 1.25);
  EXPECT_DOUBLE_EQ(*back->impedance_pct, 10.5);
  EXPECT_FALSE(s->upsert_unit(u, f1, 2));  // unchanged, electrical columns included

  s->add_electrical_test("T1", bushing_test(0.31), f1, 5);
  auto ratio = bushing_test(0);
  ratio.test = analytics::ElectricalTestKind::turns_ratio;
  ratio.bushing.clear();
  ratio.insulation.clear();
  ratio.phase = "A";
  ratio.tap = 9;
  ratio.value = 6.93;
  ratio.capacitance_pf.reset();
  ratio.nameplate_value.reset();
  s->add_electrical_test("T1", ratio, f1, 6);
  s->add_electrical_test("T1", bushing_test(0.35), f2, 2);  // same test re-delivered
  EXPECT_EQ(s->count_rows("electrical_tests"), 2);
  const auto d = s->unit_data("T1");
  ASSERT_EQ(d.electrical.size(), 2u);
  const auto& b = d.electrical[0].test == analytics::ElectricalTestKind::bushing_power_factor ? d.electrical[0]
                                                                                              : d.electrical[1];
  EXPECT_DOUBLE_EQ(*b.value, 0.35);
  EXPECT_DOUBLE_EQ(*b.capacitance_pf, 452);
  EXPECT_DOUBLE_EQ(*b.nameplate_value, 445);
  EXPECT_EQ(b.bushing, "H2");
  EXPECT_EQ(b.crew, "Crew 2");
  EXPECT_FALSE(b.tap);
  EXPECT_FALSE(b.minutes);
  EXPECT_EQ(s->units_of_file(f2), std::vector<std::string>{"T1"});
  EXPECT_EQ(s->files_for_unit("T1").size(), 2u);
}

}  // namespace
