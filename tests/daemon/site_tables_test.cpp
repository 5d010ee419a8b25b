// Reading the site's copies of the standard tables from ROOT/tables/: which
// files are taken, which are refused unread, and that loading installs the
// set the analytics read.
// Plumbing: the one engineering value is named with its source where it is checked.
#include "daemon/assess/site_tables.h"

#include <gtest/gtest.h>
#include <unistd.h>

#include <filesystem>
#include <fstream>

#include "analytics/dga_c57104_2008.h"

using namespace ferrum;

namespace {

class SiteTablesTest : public ::testing::Test {
 protected:
  void SetUp() override {
    char tmpl[] = "/tmp/ferrum-tables-XXXXXX";
    ASSERT_NE(::mkdtemp(tmpl), nullptr);
    root.root = tmpl;
    std::filesystem::create_directories(root.tables());
  }
  void TearDown() override {
    analytics::install_standard_tables(std::make_shared<analytics::StandardTables>(analytics::embedded_standard_tables()));
    std::filesystem::remove_all(root.root);
  }
  void write(const std::string& name, const std::string& text) { std::ofstream(root.tables() / name) << text; }
  site::SiteRoot root;
};

TEST_F(SiteTablesTest, NoFolderNoOverrides) {
  std::filesystem::remove_all(root.tables());
  EXPECT_TRUE(assess::read_site_tables(root).empty());
}

TEST_F(SiteTablesTest, TakesCsvFilesSortedAndLeavesOthersAlone) {
  write("iec60599.csv", "a");
  write("duval_triangle1.csv", "b");
  write(".hidden.csv", "c");
  write("README.txt", "d");
  std::filesystem::create_directory(root.tables() / "folder.csv");
  const auto found = assess::read_site_tables(root);
  ASSERT_EQ(found.size(), 3u);
  EXPECT_EQ(found[0].file, "duval_triangle1.csv");
  EXPECT_EQ(found[0].shown, "tables/duval_triangle1.csv");
  EXPECT_EQ(found[0].text, "b");
  EXPECT_EQ(found[1].file, "folder.csv");
  EXPECT_FALSE(found[1].refused.empty());  // not a regular file: refused unread
  EXPECT_EQ(found[2].file, "iec60599.csv");
}

TEST_F(SiteTablesTest, LoadInstallsTheValidCopyAndRefusesTheMalformedOne) {
  std::string text(analytics::embedded_table_text("ieee_c57104_2008.csv"));
  text.replace(text.find("row,H2,100,700,1800"), 19, "row,H2,100,140,1800");  // a made-up correction
  write("ieee_c57104_2008.csv", text);
  write("iec60599.csv", "standard,IEC 60599\nedition,2015\ntable,table1_ratios\nclause,x\nstatus,maybe\n");
  const auto load = assess::load_site_tables(root);
  ASSERT_EQ(load.refused.size(), 1u);
  EXPECT_EQ(load.refused[0].text(), "tables/iec60599.csv: line 5, column 2: status must be 'unverified', "
                                    "'checked against a public reproduction' or 'verified against the licensed standard'");
  EXPECT_EQ(analytics::c57104_2008_gas_condition(analytics::Gas::h2, 150), 3);  // the site's table is in force
  EXPECT_EQ(analytics::standard_tables().iec60599.typical_in_force, "typical_values_b");  // embedded stays
}

}  // namespace
