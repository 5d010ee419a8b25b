// ferrum.ini [electrical] and the electrical health-index weights reaching
// the analytics options. Plumbing: no engineering value is checked here, so no
// published source applies (the electrical checks are tested in tests/analytics/electrical_*_test.cpp).
#include <gtest/gtest.h>

#include "tests/daemon/temp_ini.h"

#include <unistd.h>

#include <filesystem>
#include <fstream>

#include "daemon/assess/assessment_service.h"
#include "daemon/config/site_config.h"

namespace fs = std::filesystem;
using namespace ferrum;

namespace {

config::SiteConfig load(const std::string& extra) {
  return ferrum::testing::load_ini_text("[party.planning]\nkinds = *\nsites = *\n" + extra, "elec");
}

TEST(ElectricalConfig, DefaultsAndValues) {
  EXPECT_EQ(load("").electrical_reference_c, 75);
  EXPECT_TRUE(load("").pf_correction.empty());
  const auto c = load("[electrical]\nreference_c = 85\npf_correction = 10:1.2, 20:1.0, 30:0.8\n");  // illustrative K values, not a table
  EXPECT_EQ(c.electrical_reference_c, 85);
  ASSERT_EQ(c.pf_correction.size(), 3u);
  EXPECT_DOUBLE_EQ(c.pf_correction[2].first, 30);
  EXPECT_DOUBLE_EQ(c.pf_correction[2].second, 0.8);
  const auto o = assess::options_from_config(c, nullptr);
  EXPECT_EQ(o.electrical.reference_c, 85);
  EXPECT_EQ(o.electrical.pf_correction.size(), 3u);
}

TEST(ElectricalConfig, BadCorrectionTablesAreErrors) {
  EXPECT_THROW(load("[electrical]\npf_correction = 20\n"), config::ConfigError);
  EXPECT_THROW(load("[electrical]\npf_correction = 20:1.0, 10:1.2\n"), config::ConfigError);
  EXPECT_THROW(load("[electrical]\npf_correction = 20:abc\n"), config::ConfigError);
  EXPECT_THROW(load("[electrical]\nreference_c = 500\n"), config::ConfigError);
}

TEST(ElectricalConfig, ElectricalFactorWeightsCanBeOverridden) {
  const auto o = assess::options_from_config(load("[health]\nweight_turns_ratio = 9\n"), nullptr);
  bool found = false;
  for (const auto& f : o.health.electrical_factors) {
    if (f.name != "turns_ratio") continue;
    found = true;
    EXPECT_DOUBLE_EQ(f.weight, 9);
  }
  EXPECT_TRUE(found);
}

}  // namespace
