#include "analytics/standard_tables.h"

#include <gtest/gtest.h>

#include <filesystem>
#include <fstream>
#include <set>
#include <sstream>
#include <string>

#include "analytics/dga_c57104_2008.h"
#include "analytics/dga_fault_evidence.h"
#include "analytics/infrared_severity.h"
#include "analytics/load_indicators.h"

namespace ferrum::analytics {
namespace {

std::string source_file(const std::string& name) {
  std::ifstream in(std::string(FERRUM_SOURCE_ROOT) + "/analytics/data/" + name);
  std::ostringstream s;
  s << in.rdbuf();
  return s.str();
}

// The text of a table file without the block of one table (from its "table,"
// line up to the next "table," line or the end).
std::string without_table(const std::string& text, const std::string& id) {
  const std::size_t start = text.find("\ntable," + id + "\n");
  if (start == std::string::npos) return text;
  std::size_t end = text.find("\ntable,", start + 1);
  if (end == std::string::npos) end = text.size();
  return text.substr(0, start + 1) + text.substr(end == text.size() ? end : end + 1);
}

const TableInfo& info(const std::string& file, const std::string& id) {
  for (const TableInfo& i : embedded_standard_tables().info)
    if (i.file == file && i.id == id) return i;
  throw std::runtime_error("no table " + file + " " + id);
}

int line_of(const std::string& text, const std::string& needle) {
  int line = 1;
  for (std::size_t i = 0; i < text.find(needle); ++i) line += text[i] == '\n';
  return line;
}

TEST(StandardTables, EveryDataFileIsReadAndEmbedded) {
  std::set<std::string> on_disk;
  for (const auto& e : std::filesystem::directory_iterator(std::string(FERRUM_SOURCE_ROOT) + "/analytics/data"))
    if (e.path().extension() == ".csv") on_disk.insert(e.path().filename().string());
  const std::set<std::string> read(standard_table_files().begin(), standard_table_files().end());
  EXPECT_EQ(on_disk, read);  // no data file that no method reads, no method table without a file
  for (const std::string& f : standard_table_files()) {
    EXPECT_EQ(std::string(embedded_table_text(f)), source_file(f)) << f << " embedded as in the source tree";
    StandardTables t;
    EXPECT_FALSE(apply_table_file(f, source_file(f), "", t)) << f;
    EXPECT_FALSE(embedded_standard_tables().tables_of(f).empty()) << f;
  }
}

TEST(StandardTables, AFileWithoutATableAMethodUsesIsRefused) {
  // Set A of the IEC 60599 typical values is kept for comparison; no method
  // reads it unless a site names it in force.
  const std::set<std::string> optional = {"iec60599.csv typical_values_a"};
  for (const std::string& f : standard_table_files()) {
    const std::string text = source_file(f);
    const auto parsed = parse_data_file(text);
    ASSERT_TRUE(parsed.file) << f << ": " << parsed.error.text();
    for (const DataTable& t : parsed.file->tables) {
      if (optional.count(f + " " + t.id)) continue;
      StandardTables into = embedded_standard_tables();
      const std::string cut = without_table(text, t.id);
      ASSERT_NE(cut, text) << f << " " << t.id;
      EXPECT_TRUE(apply_table_file(f, cut, "tables/" + f, into)) << f << " without " << t.id << " was accepted";
    }
  }
}

TEST(StandardTables, StatusOfTheTablesConfirmedAgainstPublicReproductions) {
  // Issue 17 lists what was confirmed against public reproductions: C57.104-2008
  // Table 1; Duval Triangle 1 vertices; IEC 60599 ratio ranges; IEC 60076-7 ONAF and
  // distribution columns; 180,000 h normal life; hot-spot limits 120/140/160 °C; the ΔT table.
  for (auto [file, id] : {std::pair{"ieee_c57104_2008.csv", "table1"}, {"duval_triangle1.csv", "vertices"},
                          {"iec60599.csv", "table1_ratios"}, {"iec60076_7.csv", "table5_checked"},
                          {"ieee_c57_91.csv", "table1_normal_life"}, {"iec60076_7.csv", "table4_hot_spot_limits"},
                          {"thermography.csv", "delta_t"}}) {
    EXPECT_EQ(info(file, id).status, kStatusChecked) << file << " " << id;
    EXPECT_FALSE(info(file, id).where.empty());
  }
  // Neither commonly reproduced typical-value set is verified.
  EXPECT_EQ(info("iec60599.csv", "typical_values_a").status, kStatusUnverified);
  EXPECT_EQ(info("iec60599.csv", "typical_values_b").status, kStatusUnverified);
  EXPECT_EQ(info("ieee_c57104_2019.csv", "table2").status, kStatusUnverified);
  EXPECT_TRUE(embedded_standard_tables().any_unverified());
}

TEST(StandardTables, EmbeddedValuesTheMethodsRead) {
  const StandardTables& t = embedded_standard_tables();
  EXPECT_EQ(t.hot_spot_limits_c, (std::array<double, 3>{120, 140, 160}));  // IEC 60076-7:2005 Table 4
  EXPECT_EQ(t.normal_life_h, 180000);                                        // IEEE C57.91-2011 Table 1
  EXPECT_EQ(t.c57104_2008.tdcg_bounds, (std::array<double, 3>{720, 1920, 4630}));  // IEEE C57.104-2008 Table 1
  EXPECT_EQ(t.iec60076_7_table5[static_cast<int>(IecCoolingClass::onan)].k21, 2.0);  // IEC 60076-7:2005 Table 5, ONAN
  EXPECT_EQ(t.c57_91_exponents[static_cast<int>(IecCoolingClass::of)].n, 0.9);  // IEEE C57.91-2011 Table 4, OFAF (named choice)
  EXPECT_EQ(t.iec60599.typical_in_force, "typical_values_b");
  // IEC 60599 Annex A, the set ferrum uses (lower ends): H2 60, CH4 40, C2H6 50, C2H4 60, C2H2 3 (value from memory; verify).
  EXPECT_EQ(TypicalGasLevels{}.h2, 60);
  EXPECT_EQ(TypicalGasLevels{}.c2h2, 3);
  // ANSI/NETA MTS ΔT over a similar component: 1-3 priority 4, 4-15 priority 3, >15 priority 1.
  EXPECT_EQ(neta_priority_over_reference(0.9), 0);
  EXPECT_EQ(neta_priority_over_reference(3), 4);
  EXPECT_EQ(neta_priority_over_reference(3.5), 3);
  EXPECT_EQ(neta_priority_over_reference(16), 1);
  EXPECT_EQ(neta_priority_over_ambient(40.5), 1);  // over ambient: >40 priority 1
  EXPECT_EQ(neta_priority_over_ambient(40), 2);
}

TEST(StandardTables, ASiteCopyChangesTheResult) {
  // A made-up site correction, to see that it is used: H2 bound of Condition 2 at 140 ppm.
  std::string text = source_file("ieee_c57104_2008.csv");
  text.replace(text.find("row,H2,100,700,1800"), 19, "row,H2,100,140,1800");
  const std::string checked = "status,checked against a public reproduction\n";
  text.replace(text.find(checked), checked.size(),
               "status,verified against the licensed standard\nby,A. Engineer\nwhen,2026-11-30\n");
  const TableLoad load = load_standard_tables({{"ieee_c57104_2008.csv", "tables/ieee_c57104_2008.csv", text, ""}});
  ASSERT_TRUE(load.refused.empty()) << load.refused.front().text();
  EXPECT_EQ(c57104_2008_gas_condition(Gas::h2, 150), 2);  // IEEE C57.104-2008 Table 1 (embedded): 101-700
  {
    ScopedStandardTables scope(load.tables);
    EXPECT_EQ(c57104_2008_gas_condition(Gas::h2, 150), 3);  // the site's table: above 140
    const auto notes = standard_tables().tables_of("ieee_c57104_2008.csv");
    ASSERT_EQ(notes.size(), 2u);
    EXPECT_TRUE(notes[0]->site_override);
    EXPECT_EQ(notes[0]->origin, "tables/ieee_c57104_2008.csv");
    EXPECT_EQ(notes[0]->status_text(), "verified against the licensed standard by A. Engineer on 2026-11-30");
    EXPECT_EQ(notes[1]->status, kStatusUnverified);  // Table 3 keeps the status the copy gives it
  }
  EXPECT_EQ(c57104_2008_gas_condition(Gas::h2, 150), 2);  // restored
}

TEST(StandardTables, ASiteSetsItsOwnTypicalValues) {
  std::string text = source_file("iec60599.csv");
  text.replace(text.find("row,typical_values_b"), 20, "row,typical_values_site");
  text += "\ntable,typical_values_site\nedition,site population 2020-2025\nclause,typical 90 % values of our fleet\n"
          "status,unverified\ncolumns,gas,low,high\nrow,H2,80,150\nrow,CH4,40,110\nrow,C2H6,50,90\nrow,C2H4,60,280\n"
          "row,C2H2,1,50\nrow,CO,540,900\nrow,CO2,5100,13000\n";
  const TableLoad load = load_standard_tables({{"iec60599.csv", "tables/iec60599.csv", text, ""}});
  ASSERT_TRUE(load.refused.empty()) << load.refused.front().text();
  ScopedStandardTables scope(load.tables);
  EXPECT_EQ(TypicalGasLevels{}.h2, 80);
  EXPECT_EQ(TypicalGasLevels{}.c2h2, 1);
  EXPECT_NE(TypicalGasLevels{}.source.find("typical 90 % values of our fleet"), std::string::npos);
}

TEST(StandardTables, SetAOfTheTypicalValuesCanBeNamedInForce) {
  std::string text = source_file("iec60599.csv");
  text.replace(text.find("row,typical_values_b"), 20, "row,typical_values_a");
  const TableLoad load = load_standard_tables({{"iec60599.csv", "tables/iec60599.csv", text, ""}});
  ASSERT_TRUE(load.refused.empty());
  ScopedStandardTables scope(load.tables);
  EXPECT_EQ(TypicalGasLevels{}.h2, 50);  // set A lower end, H2 50-150 (commonly reproduced; unverified)
  EXPECT_EQ(TypicalGasLevels{}.c2h6, 20);
}

struct Malformed {
  const char* file;
  const char* from;
  const char* to;
  int column;  // expected column; the line is that of `to` (or of `line_of`)
  const char* message;
  const char* line_of = nullptr;
};

TEST(StandardTables, AMalformedSiteCopyIsRefusedWithLineAndColumn) {
  const Malformed cases[] = {
      {"ieee_c57104_2008.csv", "row,CO,350,570,1400", "row,CO,350,5x0,1400", 4, "not a number"},
      {"ieee_c57104_2008.csv", "row,CO,350,570,1400", "row,CO,350,570", 5, "expected 4 cells"},
      {"ieee_c57104_2008.csv", "row,CO,350,570,1400", "row,XO,350,570,1400", 2, "must be one of"},
      {"ieee_c57104_2008.csv", "row,CO,350,570,1400", "row,CO,350,300,1400", 4, "must increase"},
      {"iec60599.csv", "row,D1,discharges of low energy,>1,0.1-0.5,>1", "row,D1,discharges of low energy,>1,0.5-0.1,>1", 5,
       "runs backwards"},
      {"iec60599.csv", "row,typical_values_b", "row,typical_values_x", 2, "no table 'typical_values_x'"},
      {"ieee_c57_91.csv", "columns,cooling,n,m", "columns,cooling,n,x", 4, "must be 'm'"},
      {"thermography.csv", "status,checked against a public reproduction", "status,checked", 2, "status must be"},
      {"iec60076_7.csv", "status,unverified", "status,verified against the licensed standard", 1, "needs a 'by' line",
       "table,table5_other"},
      {"health_index.csv", "row,dga,10", "rows,dga,10", 1, "unknown line 'rows'"},
  };
  for (const Malformed& c : cases) {
    std::string text = source_file(c.file);
    ASSERT_NE(text.find(c.from), std::string::npos) << c.from;
    text.replace(text.find(c.from), std::string(c.from).size(), c.to);
    const TableLoad load = load_standard_tables({{c.file, std::string("tables/") + c.file, text, ""}});
    ASSERT_EQ(load.refused.size(), 1u) << c.to;
    const TableError& e = load.refused[0].error;
    EXPECT_EQ(e.line, line_of(text, c.line_of ? c.line_of : c.to)) << c.to;
    EXPECT_EQ(e.column, c.column) << c.to << ": " << e.text();
    EXPECT_NE(e.message.find(c.message), std::string::npos) << e.message;
    EXPECT_EQ(load.refused[0].text().rfind(std::string("tables/") + c.file + ": line ", 0), 0u);
    // The embedded tables stay in force.
    for (const TableInfo& i : load.tables->info) EXPECT_FALSE(i.site_override);
    EXPECT_EQ(load.tables->c57104_2008.gas_bounds, embedded_standard_tables().c57104_2008.gas_bounds);
  }
}

TEST(StandardTables, UnknownOrUnreadableFilesAreRefusedAndTheRestUsed) {
  std::string good = source_file("ieee_c57_91.csv");
  good.replace(good.find("row,normal_insulation_life,180000"), 33, "row,normal_insulation_life,150000");
  const TableLoad load = load_standard_tables({{"notes.csv", "tables/notes.csv", "x", ""},
                                               {"iec60599.csv", "tables/iec60599.csv", "", "not a regular file of at most 1 MiB"},
                                               {"ieee_c57_91.csv", "tables/ieee_c57_91.csv", good, ""}});
  ASSERT_EQ(load.refused.size(), 2u);
  EXPECT_NE(load.refused[0].text().find("not a table file ferrum reads"), std::string::npos);
  EXPECT_NE(load.refused[1].text().find("not a regular file"), std::string::npos);
  EXPECT_EQ(load.tables->normal_life_h, 150000);  // the valid copy is used (a made-up value)
}

TEST(StandardTables, OptionDefaultsComeFromTheTablesInForce) {
  std::string text = source_file("iec60076_7.csv");
  text.replace(text.find("row,normal_cyclic,120"), 21, "row,normal_cyclic,115");
  const TableLoad load = load_standard_tables({{"iec60076_7.csv", "tables/iec60076_7.csv", text, ""}});
  ASSERT_TRUE(load.refused.empty());
  EXPECT_EQ(LoadingLimits{}.normal_cyclic_c, 120);  // IEC 60076-7:2005 Table 4
  ScopedStandardTables scope(load.tables);
  EXPECT_EQ(LoadingLimits{}.normal_cyclic_c, 115);  // the site's (made-up) value
}

}  // namespace
}  // namespace ferrum::analytics
