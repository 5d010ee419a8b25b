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
    if (g.gas == "C2H2") EXPECT_DOUBLE_EQ(g.upper[4], 40);
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

}  // namespace
