// The edge between ferrum.ini and the analytics options, and the parallel
// assessment of units. Plumbing: no engineering value is checked here, so no
// published source applies (the methods are checked in tests/analytics).
#include <gtest/gtest.h>

#include <unistd.h>

#include <filesystem>
#include <fstream>

#include "daemon/assess/assessment_service.h"

namespace fs = std::filesystem;
using namespace ferrum;

namespace {

config::SiteConfig load(const std::string& text) {
  const fs::path p = fs::temp_directory_path() / ("ferrum-svc-" + std::to_string(::getpid()) + ".ini");
  std::ofstream(p) << text;
  auto c = config::load_site_config(p.string());
  fs::remove(p);
  return c;
}

TEST(AssessmentService, IniOverridesReachTheAnalyticsOptions) {
  const auto c = load(
      "[analysis]\nthermal_method = ieee_c57_91\ninspection_interval_days = 180\n"
      "[health]\nweight_dga = 12\nweight_age = 0\n"
      "[ranking]\nweight_mva = 0.7\npof_at_zero = 0.3\n"
      "[party.p]\nkinds = *\n");
  const auto o = assess::options_from_config(c, nullptr);
  EXPECT_EQ(o.thermal.method, analytics::ThermalMethod::ieee_c57_91);
  EXPECT_EQ(o.thermal.inspection.interval_days, 180);
  EXPECT_DOUBLE_EQ(o.health.weight_dga, 12);
  EXPECT_DOUBLE_EQ(o.health.weight_age, 0);
  EXPECT_NE(o.health.source.find("ferrum.ini"), std::string::npos);
  const auto r = assess::ranking_options_from_config(c);
  EXPECT_DOUBLE_EQ(r.weight_mva, 0.7);
  EXPECT_DOUBLE_EQ(r.pof_at_zero, 0.3);
  EXPECT_DOUBLE_EQ(r.weight_criticality, analytics::RankingOptions{}.weight_criticality);
}

TEST(AssessmentService, ScoreBandsCanBeOverridden) {
  const auto c = load("[health]\ndga_cuts = 1.1, 1.4, 1.9, 2.9\ngas_c2h2 = 1, 2, 10, 20, 40\ndp_cuts = 800, 600, 400, 250\n"
                      "[party.p]\nkinds = *\n");
  const auto o = assess::options_from_config(c, nullptr);
  EXPECT_DOUBLE_EQ(o.health.dga_cuts[0], 1.1);
  EXPECT_DOUBLE_EQ(o.health.dp_cuts[3], 250);
  for (const auto& g : o.health.gas_bands)
    if (g.gas == "C2H2") {
      EXPECT_DOUBLE_EQ(g.upper[4], 40);
    }
  EXPECT_NE(o.health.source.find("score bands"), std::string::npos);
  EXPECT_THROW(load("[health]\ndga_cuts = 1, 2, 3\n[party.p]\nkinds = *\n"), config::ConfigError);
  EXPECT_THROW(load("[health]\nage_cuts = 40, 30, 20, 10\n[party.p]\nkinds = *\n"), config::ConfigError);
}

TEST(AssessmentService, DefaultsWhenNothingIsOverridden) {
  const auto c = load("[party.p]\nkinds = *\n");
  const auto o = assess::options_from_config(c, nullptr);
  EXPECT_DOUBLE_EQ(o.health.weight_dga, analytics::HealthIndexOptions{}.weight_dga);
  EXPECT_EQ(o.thermal.method, analytics::ThermalMethod::iec60076_7);
}

TEST(AssessmentService, RankingValuesOutOfRangeAreErrors) {
  EXPECT_THROW(load("[ranking]\npof_as_new = 2\n[party.p]\nkinds = *\n"), config::ConfigError);
}


// Parallel assessment: the same assessments as one by one, handed over in
// the order of the ids whatever the number of workers; a failing worker's
// error reaches the caller. (Plumbing: no engineering values checked here.)
class ParallelAssessment : public ::testing::Test {
 protected:
  void SetUp() override {
    db_ = (fs::temp_directory_path() / ("ferrum-par-" + std::to_string(::getpid()) + ".db")).string();
    fs::remove(db_);
    store_ = store::open_sqlite_store(db_);
    store_->begin();
    store::FileRecord f;
    f.sha256 = "0";
    f.party = "p";
    f.original_name = "units.csv";
    f.kind = "units_register";
    f.status = "accepted";
    const auto file = store_->add_file(f);
    for (int i = 0; i < 9; ++i) {
      analytics::UnitInfo u;
      u.unit_id = "T" + std::to_string(i);
      u.rated_mva = 10 + 5 * i;
      u.cooling = i % 2 ? "ONAF" : "ONAN";
      u.year_built = 1960 + 6 * i;
      store_->upsert_unit(u, file, i + 2);
      for (int h = 0; h < 48; ++h)
        store_->add_load_point(u.unit_id, {1767225600 + h * 3600, 0.4 + 0.1 * i, 20}, file, 100 + h);
    }
    store_->commit();
  }
  void TearDown() override {
    store_.reset();
    for (const char* suffix : {"", "-wal", "-shm"}) fs::remove(db_ + suffix);
  }
  std::string db_;
  std::unique_ptr<store::Store> store_;
};

TEST_F(ParallelAssessment, SameResultsInTheOrderAsked) {
  const std::vector<std::string> ids = {"T5", "T0", "T8", "T3", "T1", "T7", "T2", "T6", "T4"};
  const auto as_of = analytics::days_from_civil(2026, 6, 1);
  const analytics::AssessmentOptions options;
  for (unsigned workers : {1u, 2u, 4u}) {
    std::vector<analytics::UnitAssessment> got;
    assess::assess_units_parallel(*store_, ids, as_of, options, workers,
                                  [&](analytics::UnitAssessment&& a) { got.push_back(std::move(a)); });
    ASSERT_EQ(got.size(), ids.size());
    for (std::size_t i = 0; i < ids.size(); ++i) {
      const auto alone = assess::assess_unit(*store_, ids[i], as_of, options);
      EXPECT_EQ(got[i].unit.unit_id, ids[i]) << workers;
      EXPECT_EQ(got[i].health_index, alone.health_index) << ids[i];
      ASSERT_TRUE(alone.thermal.loss_of_life_hours.has_value()) << ids[i];
      EXPECT_EQ(got[i].thermal.loss_of_life_hours, alone.thermal.loss_of_life_hours) << ids[i];
    }
  }
  const auto fleet = assess::assess_fleet_parallel(*store_, as_of, options);
  ASSERT_EQ(fleet.size(), 9u);
  EXPECT_EQ(fleet.front().unit.unit_id, "T0");
  EXPECT_EQ(fleet.back().unit.unit_id, "T8");
}

TEST_F(ParallelAssessment, AWorkersErrorReachesTheCaller) {
  int emitted = 0;
  // A database whose folder is gone: the workers' connections cannot be opened.
  const fs::path gone = fs::path(db_ + ".d");
  fs::create_directories(gone);
  auto lost = store::open_sqlite_store((gone / "lost.db").string());
  fs::remove_all(gone);
  EXPECT_ANY_THROW(assess::assess_units_parallel(*lost, {"T0", "T1"},
                                                 analytics::days_from_civil(2026, 6, 1), {}, 2,
                                                 [&](analytics::UnitAssessment&&) { ++emitted; }));
  EXPECT_EQ(emitted, 0);
  // The caller's own exception stops the workers too.
  EXPECT_THROW(assess::assess_units_parallel(*store_, {"T0", "T1", "T2", "T3"}, analytics::days_from_civil(2026, 6, 1),
                                             {}, 2, [](analytics::UnitAssessment&&) { throw std::runtime_error("x"); }),
               std::runtime_error);
}

}  // namespace
