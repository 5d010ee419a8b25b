// Reading ferrum.ini: keys, defaults, errors with their line. Plumbing: no
// engineering value is checked here, so no published source applies.
#include <gtest/gtest.h>

#include <unistd.h>

#include <filesystem>
#include <fstream>
#include <sstream>

#include "daemon/config/site_config.h"

namespace fs = std::filesystem;
using namespace ferrum::config;

namespace {

fs::path write_temp(const std::string& text) {
  static int n = 0;
  const fs::path p = fs::temp_directory_path() / ("ferrum-ini-" + std::to_string(::getpid()) + "-" + std::to_string(++n) + ".ini");
  std::ofstream(p) << text;
  return p;
}

TEST(SiteConfig, DefaultTextLoadsWithPlanningPartyForEverything) {
  const auto p = write_temp(default_site_config_text());
  const SiteConfig c = load_site_config(p.string());
  ASSERT_NE(c.party("planning"), nullptr);
  for (const auto& k : file_kind_names()) EXPECT_TRUE(c.party("planning")->may_deliver(k)) << k;
  EXPECT_TRUE(c.party("planning")->serves("anywhere"));
  EXPECT_EQ(c.utc_offset_minutes, 0);
  EXPECT_EQ(c.settle_seconds, 5);
  fs::remove(p);
}

TEST(SiteConfig, SampleFileShippedWithTheInstallEqualsTheDefault) {
  std::ifstream in(std::string(FERRUM_SOURCE_ROOT) + "/daemon/ferrum.ini.sample");
  ASSERT_TRUE(in) << "daemon/ferrum.ini.sample is missing";
  std::stringstream s;
  s << in.rdbuf();
  EXPECT_EQ(s.str(), default_site_config_text()) << "regenerate it: ferrum init writes the same text";
}

TEST(SiteConfig, SyntaxErrorNamesTheLine) {
  const auto p = write_temp("[site]\nname = x\nthis line has no equals sign\n[party.a]\nkinds = *\n");
  try {
    load_site_config(p.string());
    FAIL() << "no error";
  } catch (const ConfigError& e) {
    EXPECT_NE(std::string(e.what()).find(":3:"), std::string::npos) << e.what();
  }
  fs::remove(p);
}

TEST(SiteConfig, UnknownKeyAndBadValuesAreErrors) {
  for (const char* text : {"[site]\nnmae = typo\n[party.a]\nkinds = *\n",
                           "[ingest]\nsettle_seconds = -1\n[party.a]\nkinds = *\n",
                           "[site]\nutc_offset = +25:00\n[party.a]\nkinds = *\n",
                           "[party.a]\nkinds = oil_lab, photos\n",
                           "[site]\nname = no parties\n",
                           "[schedule]\nweekly_day = someday\n[party.a]\nkinds = *\n"}) {
    const auto p = write_temp(text);
    EXPECT_THROW(load_site_config(p.string()), ConfigError) << text;
    fs::remove(p);
  }
}

TEST(SiteConfig, PartiesKindsAndSites) {
  const auto p = write_temp("[site]\nutc_offset = -05:30\n[party.lab]\nkinds = oil_lab\nsites = North, South\n");
  const SiteConfig c = load_site_config(p.string());
  EXPECT_EQ(c.utc_offset_minutes, -330);
  const Party* lab = c.party("lab");
  ASSERT_NE(lab, nullptr);
  EXPECT_TRUE(lab->may_deliver("oil_lab"));
  EXPECT_FALSE(lab->may_deliver("units_register"));
  EXPECT_TRUE(lab->serves("north"));  // site names compare in lower case
  EXPECT_FALSE(lab->serves("east"));
  fs::remove(p);
}

TEST(SiteConfig, DescribeChangesListsWhatDiffers) {
  SiteConfig a;
  a.parties["x"] = Party{"x", {"oil_lab"}, {"*"}};
  SiteConfig b = a;
  EXPECT_TRUE(describe_changes(a, b).empty());
  b.settle_seconds = 9;
  b.parties["y"] = Party{"y", {"infrared"}, {"*"}};
  const auto d = describe_changes(a, b);
  ASSERT_EQ(d.size(), 2u);
  EXPECT_NE(d[0].find("settle_seconds"), std::string::npos);
  EXPECT_NE(d[1].find("party y added"), std::string::npos);
}

}  // namespace
