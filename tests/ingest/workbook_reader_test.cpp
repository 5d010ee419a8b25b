// WorkbookReader (.xlsx): cell types, date systems, sheet choice, every
// spreadsheet problem located by its cell, damaged input; and the property
// that a file gives the same rows as CSV with ferrum's names, as CSV through
// a party's column map and date format, and as a workbook.
#include <gtest/gtest.h>

#include <filesystem>
#include <fstream>
#include <sstream>

#include "daemon/ingest/check_stream.h"
#include "daemon/ingest/workbook_reader.h"
#include "tests/ingest/ingest_test_support.h"
#include "tests/ingest/xlsx_builder.h"

namespace ferrum::ingest {
namespace {

using testing::build_xlsx;
using testing::check_text;
using testing::KeepAll;
using testing::SheetRows;
using testing::test_options;
using testing::XlsxSpec;

// Serial number of a date in the 1900 date system: days after 1899-12-30
// from 1900-03-01 on.  // value from memory of ECMA-376 Part 1, 18.17.4.1 (date systems); verify
std::string serial(int y, int m, int d) {
  return std::to_string(analytics::days_from_civil(y, m, d) - analytics::days_from_civil(1899, 12, 30));
}

struct Read {
  bool header_ok = false;
  std::vector<std::string> header;
  std::vector<std::vector<std::string>> rows;
  std::vector<std::int64_t> lines;
  ProblemLog problems;
};

Read read_workbook(const std::string& bytes, WorkbookOptions options = {}) {
  std::istringstream in(bytes);
  WorkbookReader reader(in, options);
  Read out;
  out.problems.set_locator([&reader](std::int64_t l, int c) { return reader.locate(l, c); });
  out.header_ok = reader.read_header(out.problems);
  if (out.header_ok) {
    out.header = reader.header();
    for (;;) {
      const RecordStatus s = reader.next(out.problems);
      if (s == RecordStatus::end) break;
      if (s == RecordStatus::malformed) continue;
      out.rows.emplace_back(reader.fields().begin(), reader.fields().end());
      out.lines.push_back(reader.record_line());
    }
  }
  out.problems.set_locator(nullptr);
  return out;
}

std::string one_sheet(SheetRows rows, bool date1904 = false) {
  XlsxSpec spec;
  spec.sheets.push_back({"Sheet1", std::move(rows)});
  spec.date1904 = date1904;
  return build_xlsx(spec);
}

TEST(WorkbookReader, CellTypesBecomeTheTextACsvWouldHold) {
  const Read r = read_workbook(one_sheet({
      {"unit_id", "=i:sample_date", "h2_ppm", "flag", "note"},
      {"T1", "=d:" + serial(2026, 3, 14), "=n:12.5", "=b:1", ""},
      {"=i:T2", "=t:" + serial(2026, 3, 14) + ".25", "=n:45.600000000000001", "=b:0", "=F:A1&\"x\"|7"},
  }));
  ASSERT_TRUE(r.header_ok) << (r.problems.empty() ? "" : r.problems.kept().front().reason);
  EXPECT_EQ(r.header, (std::vector<std::string>{"unit_id", "sample_date", "h2_ppm", "flag", "note"}));
  ASSERT_EQ(r.rows.size(), 2u);
  EXPECT_EQ(r.rows[0], (std::vector<std::string>{"T1", "2026-03-14", "12.5", "TRUE", ""}));
  // 0.25 of a day is 06:00; the shortest text that reads back as the same double.
  EXPECT_EQ(r.rows[1], (std::vector<std::string>{"T2", "2026-03-14T06:00:00", "45.6", "FALSE", "7"}));
  EXPECT_EQ(r.lines, (std::vector<std::int64_t>{2, 3}));
  EXPECT_TRUE(r.problems.empty());
}

TEST(WorkbookReader, DateSystems1900And1904) {
  // value from memory of ECMA-376 Part 1, 18.17.4.1: 1900 system serial 1 = 1900-01-01,
  // 59 = 1900-02-28, 61 = 1900-03-01 (60 is the nonexistent 1900-02-29); 1904 system
  // serial 0 = 1904-01-01; verify
  const Read a = read_workbook(one_sheet({{"d"}, {"=d:1"}, {"=d:59"}, {"=d:61"}, {"=d:60"}}));
  ASSERT_TRUE(a.header_ok);
  ASSERT_EQ(a.rows.size(), 3u);
  EXPECT_EQ(a.rows[0][0], "1900-01-01");
  EXPECT_EQ(a.rows[1][0], "1900-02-28");
  EXPECT_EQ(a.rows[2][0], "1900-03-01");
  ASSERT_EQ(a.problems.count(), 1);
  EXPECT_NE(a.problems.kept()[0].reason.find("29 February 1900"), std::string::npos);
  EXPECT_EQ(a.problems.kept()[0].location, "row 5, cell A5");

  std::istringstream in(one_sheet({{"d"}, {"=d:0"}, {"=d:" + serial(2026, 3, 14)}}, true));
  WorkbookReader reader(in);
  ProblemLog log;
  ASSERT_TRUE(reader.read_header(log));
  EXPECT_TRUE(reader.date1904());
  ASSERT_EQ(reader.next(log), RecordStatus::ok);
  EXPECT_EQ(reader.fields()[0], "1904-01-01");
  ASSERT_EQ(reader.next(log), RecordStatus::ok);
  // The same serial is 1462 days later in the 1904 system.  // value from memory of ECMA-376 Part 1, 18.17.4.1; verify
  EXPECT_EQ(reader.fields()[0],
            analytics::format_day(analytics::days_from_civil(2026, 3, 14) + 1462));
}

TEST(WorkbookReader, SheetNamedAfterAKindIsPreferredElseTheFirst) {
  XlsxSpec spec;
  spec.sheets.push_back({"Notes", {{"written by"}, {"the lab"}}});
  spec.sheets.push_back({"Oil lab", {{"unit_id"}, {"T1"}}});
  const std::string bytes = build_xlsx(spec);
  WorkbookOptions prefer;
  prefer.preferred_sheets = {"oil_lab"};
  EXPECT_EQ(read_workbook(bytes, prefer).header, std::vector<std::string>{"unit_id"});
  EXPECT_EQ(read_workbook(bytes).header, std::vector<std::string>{"written by"});
}

TEST(WorkbookReader, TableMayStartAnywhereAndCellsAreNamedBySheetColumns) {
  XlsxSpec spec;
  spec.first_row = 3;
  spec.first_column = 2;  // column B
  spec.sheets.push_back({"S", {{"unit_id", "h2_ppm"}, {"T1", "=e:#DIV/0!"}}});
  const Read r = read_workbook(build_xlsx(spec));
  ASSERT_TRUE(r.header_ok);
  EXPECT_TRUE(r.rows.empty());
  ASSERT_EQ(r.problems.count(), 1);
  const Problem& p = r.problems.kept()[0];
  EXPECT_EQ(p.line, 4);
  EXPECT_EQ(p.column, "h2_ppm");
  EXPECT_EQ(p.location, "row 4, cell C4");
  EXPECT_NE(p.reason.find("#DIV/0!"), std::string::npos);
}

// Each spreadsheet problem, with the cell it is found in.
TEST(WorkbookReader, EverySpreadsheetProblemIsLocatedByItsCell) {
  struct Case {
    const char* what;
    XlsxSpec spec;
    std::string location;
    std::string reason;
  };
  const auto sheet = [](SheetRows rows, std::vector<std::string> merged = {}) {
    XlsxSpec s;
    s.sheets.push_back({"S", std::move(rows)});
    s.merged = std::move(merged);
    return s;
  };
  const std::vector<Case> cases = {
      {"formula without a saved value", sheet({{"unit_id", "h2_ppm"}, {"T1", "=f:B1*2"}}), "row 2, cell B2",
       "formula without a saved value"},
      {"error value", sheet({{"unit_id", "h2_ppm"}, {"T1", "=e:#N/A"}}), "row 2, cell B2", "#N/A"},
      {"value right of the table", sheet({{"unit_id", "h2_ppm"}, {"T1", "=n:3", "stray"}}), "row 2",
       "cell C2 holds a value outside the table"},
      {"serial 60", sheet({{"unit_id", "sample_date"}, {"T1", "=d:60"}}), "row 2, cell B2", "29 February 1900"},
      {"merged cells", sheet({{"unit_id", "h2_ppm"}, {"T1", "=n:3"}}, {"A1:B1"}), "row 1", "merged cells (A1:B1)"},
      {"second header row (units)", sheet({{"unit_id", "H2", "CH4"}, {"", "ppm", "(ppm)"}, {"T1", "=n:3", "=n:4"}}),
       "row 2", "second header row"},
      {"second header row (names split)", sheet({{"unit_id", "Gas", ""}, {"", "H2", "CH4"}, {"T1", "=n:3", "=n:4"}}),
       "row 2", "second header row"},
      {"header holding a number", sheet({{"unit_id", "=n:5"}}), "row 1", "must hold column names"},
  };
  for (const Case& c : cases) {
    SCOPED_TRACE(c.what);
    const Read r = read_workbook(build_xlsx(c.spec));
    ASSERT_FALSE(r.problems.empty());
    const Problem& p = r.problems.kept()[0];
    EXPECT_EQ(p.location, c.location);
    EXPECT_NE(p.reason.find(c.reason), std::string::npos) << p.reason;
  }
}

TEST(WorkbookReader, DamagedOrForeignContainersAreOneProblemNeverACrash) {
  const std::string good = one_sheet({{"unit_id"}, {"T1"}});
  std::vector<std::string> inputs = {
      "PK\x03\x04", "PK\x05\x06" + std::string(18, '\0'), good.substr(0, good.size() / 2),
      good.substr(0, 40) + std::string(200, 'x') + good.substr(240)};
  // A ZIP that is not a workbook.
  {
    std::ostringstream out;
    Poco::Zip::Compress zip(out, true);
    std::istringstream part("hello");
    zip.addFile(part, Poco::DateTime(2026, 1, 1), Poco::Path("readme.txt"));
    zip.close();
    inputs.push_back(out.str());
  }
  // Each byte of the central directory's end flipped in turn.
  for (std::size_t i = good.size() - 22; i < good.size(); ++i) {
    std::string bad = good;
    bad[i] = static_cast<char>(bad[i] ^ 0x5A);
    inputs.push_back(bad);
  }
  for (const std::string& bytes : inputs) {
    const Read r = read_workbook(bytes);
    if (r.header_ok) continue;  // a flip the format tolerates (e.g. in the comment length) is fine
    ASSERT_EQ(r.problems.count(), 1);
    EXPECT_FALSE(r.problems.kept()[0].reason.empty());
  }
  const Read r = read_workbook(inputs[4]);
  ASSERT_FALSE(r.header_ok);
  EXPECT_NE(r.problems.kept()[0].reason.find("damaged or is not an .xlsx file"), std::string::npos);
}

// A ZIP64 end record (APPNOTE.TXT 4.3.14) whose stated size is more than the
// file holds: Poco::Zip allocates the stated size before reading, so the
// reader must refuse the file before Poco does (Zip64SizeGuard). The first
// two inputs are the ones the fuzzer found (tests/fuzz/fuzz_workbook_reader;
// under AddressSanitizer the allocation aborted the process), the others a
// good workbook with such a record put after its central directory.
// Plumbing: no published value applies.
TEST(WorkbookReader, Zip64RecordLargerThanTheFileIsRefusedBeforeAllocating) {
  std::ifstream f(std::filesystem::path(FERRUM_SOURCE_ROOT) / "tests/corpus/broken/xlsx_zip64_record_size.xlsx",
                  std::ios::binary);
  std::vector<std::string> inputs = {std::string(std::istreambuf_iterator<char>(f), {}),
                                     // The second the fuzzer found: the size cut short by the file's end.
                                     std::string("PK\x06\x06P\x08!U\xa4\x00\xac", 11)};
  ASSERT_GT(inputs[0].size(), 100u);
  const std::string good = one_sheet({{"unit_id"}, {"T1"}});
  const std::size_t end_record = good.rfind(std::string("PK\x05\x06", 4));
  ASSERT_NE(end_record, std::string::npos);
  for (const std::uint64_t stated : {std::uint64_t{1} << 40, std::uint64_t{0x0606060606060606}, std::uint64_t{100000}}) {
    std::string record("PK\x06\x06", 4);
    for (int i = 0; i < 8; ++i) record += static_cast<char>((stated >> (8 * i)) & 0xff);
    record += std::string(44, '\0');
    inputs.push_back(good.substr(0, end_record) + record + good.substr(end_record));
  }
  for (const std::string& bytes : inputs) {
    const Read r = read_workbook(bytes);
    ASSERT_FALSE(r.header_ok);
    ASSERT_EQ(r.problems.count(), 1);
    EXPECT_NE(r.problems.kept()[0].reason.find("a ZIP64 record states more bytes than the file has"), std::string::npos)
        << r.problems.kept()[0].reason;
  }
  // A record that fits, with its locator (APPNOTE.TXT 4.3.15), is read as
  // before: the workbook is not refused for it.
  std::string fits("PK\x06\x06", 4);
  fits += std::string("\x2c\0\0\0\0\0\0\0", 8) + std::string(44, '\0');
  fits += std::string("PK\x06\x07", 4) + std::string(4, '\0');
  for (int i = 0; i < 8; ++i) fits += static_cast<char>((std::uint64_t{end_record} >> (8 * i)) & 0xff);
  fits += std::string("\x01\0\0\0", 4);
  const Read ok = read_workbook(good.substr(0, end_record) + fits + good.substr(end_record));
  EXPECT_TRUE(ok.header_ok) << (ok.problems.count() ? ok.problems.kept()[0].reason : "");
}

TEST(WorkbookReader, ColumnLetters) {
  EXPECT_EQ(column_letters(1), "A");
  EXPECT_EQ(column_letters(26), "Z");
  EXPECT_EQ(column_letters(27), "AA");
  EXPECT_EQ(column_letters(702), "ZZ");
  EXPECT_EQ(column_letters(703), "AAA");
  EXPECT_EQ(column_letters(16384), "XFD");  // last column of a worksheet  // value from memory of ECMA-376 Part 1, 18.3.1.4; verify
}

// ---- the same rows whatever the form of the file ---------------------------

// Reads a CSV into rows of fields (the contract examples).
SheetRows csv_rows(const std::filesystem::path& path) {
  std::ifstream in(path, std::ios::binary);
  CsvReader reader(in);
  ProblemLog log;
  SheetRows out;
  EXPECT_TRUE(reader.read_header(log));
  out.push_back(reader.header());
  while (reader.next(log) == RecordStatus::ok) out.emplace_back(reader.fields().begin(), reader.fields().end());
  return out;
}

std::string to_csv(const SheetRows& rows) {
  std::string out;
  for (const auto& row : rows) {
    for (std::size_t i = 0; i < row.size(); ++i) {
      std::string f = row[i];
      for (std::size_t at = f.find('"'); at != std::string::npos; at = f.find('"', at + 2)) f.insert(at, "\"");
      out += (i ? ",\"" : "\"") + f + "\"";
    }
    out += "\n";
  }
  return out;
}

bool is_date_column(const std::string& name) { return name.ends_with("_date") || name == "timestamp"; }

// A lab's way of writing it: its own column names and DD/MM/YYYY dates.
std::pair<SheetRows, std::string> as_party_export(const SheetRows& rows) {
  SheetRows out = rows;
  std::string map = "their_column,ferrum_column\n";
  for (std::size_t j = 0; j < rows[0].size(); ++j) {
    out[0][j] = "Their " + rows[0][j] + " (as exported)";
    map += "\"" + out[0][j] + "\"," + rows[0][j] + "\n";
    if (!is_date_column(rows[0][j])) continue;
    for (std::size_t i = 1; i < rows.size(); ++i) {
      const std::string& v = rows[i][j];
      if (v.size() < 10) continue;
      out[i][j] = v.substr(8, 2) + "/" + v.substr(5, 2) + "/" + v.substr(0, 4) + (v.size() > 10 ? " " + v.substr(11) : "");
    }
  }
  return {out, map};
}

// Numbers as numbers and dates as serial numbers with a date style.
std::string as_workbook(const SheetRows& rows) {
  SheetRows cells = rows;
  for (std::size_t i = 1; i < rows.size(); ++i) {
    for (std::size_t j = 0; j < rows[i].size(); ++j) {
      const std::string& v = rows[i][j];
      double d = 0;
      if (is_date_column(rows[0][j]) && v.size() == 10) {
        cells[i][j] = "=d:" + serial(std::stoi(v.substr(0, 4)), std::stoi(v.substr(5, 2)), std::stoi(v.substr(8, 2)));
      } else if (!v.empty() && parse_number(v, false).ok() && (d = parse_number(v, false).value, true)) {
        cells[i][j] = "=n:" + v;
      }
    }
  }
  XlsxSpec spec;
  spec.sheets.push_back({"export", cells});
  return build_xlsx(spec);
}

std::string lab(const analytics::LabValue& v) {
  return v.is_measured() ? format_number(v.value) : v.is_below_limit() ? "<" + format_number(v.value) : "-";
}

std::string opt(const std::optional<double>& v) { return v ? format_number(*v) : "-"; }

// Everything a row carries into the store, as text.
std::string fingerprint(const KeepAll& k) {
  std::ostringstream o;
  for (const auto& r : k.units)
    o << r.unit.unit_id << '|' << r.unit.site << '|' << r.unit.rated_mva << '|' << r.unit.cooling << '|'
      << r.unit.year_built << '|' << r.unit.vector_group << '|' << opt(r.unit.oil_volume_l) << '|'
      << (r.unit.oil_treated ? *r.unit.oil_treated : -1) << '\n';
  for (const auto& r : k.oil) {
    const auto& s = r.sample;
    o << r.unit_id << '|' << s.date << '|' << s.lab_ref << '|' << lab(s.h2) << lab(s.ch4) << lab(s.c2h6) << lab(s.c2h4)
      << lab(s.c2h2) << lab(s.co) << lab(s.co2) << '|' << lab(s.moisture_ppm) << '|' << lab(s.breakdown_kv)
      << s.breakdown_method << '|' << lab(s.furan_2fal_ppb) << '\n';
  }
  for (const auto& r : k.ir)
    o << r.unit_id << '|' << r.scan.date << '|' << r.scan.component << '|' << r.scan.spot_c << '|'
      << opt(r.scan.reference_c) << '|' << r.scan.note << '\n';
  for (const auto& r : k.inspections)
    o << r.unit_id << '|' << r.record.date << '|' << r.record.item << '|' << static_cast<int>(r.record.rating) << '|'
      << r.record.note << '\n';
  for (const auto& r : k.load)
    o << r.unit_id << '|' << r.point.t << '|' << format_number(r.point.load_pu) << '|' << r.point.ambient_c << '|'
      << r.point.top_oil_c << '\n';
  return o.str();
}

TEST(SameRowsEveryForm, CsvMappedCsvWithRegionalDatesAndWorkbook) {
  const std::filesystem::path dir = std::filesystem::path(FERRUM_SOURCE_ROOT) / "schema" / "examples";
  for (const char* file : {"units_register.csv", "oil_lab.csv", "infrared.csv", "load_series.csv", "inspection.csv"}) {
    SCOPED_TRACE(file);
    const SheetRows rows = csv_rows(dir / file);
    CheckOptions plain = test_options(60);
    const auto csv = check_text(to_csv(rows), plain);
    ASSERT_TRUE(csv.summary.acceptable()) << csv.summary.rejection;
    ASSERT_GE(csv.summary.rows_good, 2);

    const auto [exported, map_text] = as_party_export(rows);
    CheckOptions party = plain;
    std::istringstream map_in(map_text);
    party.columns = HeaderMap::parse(map_in);
    party.parse.date_order = DateOrder::dmy_slash;
    const auto mapped = check_text(to_csv(exported), party);
    ASSERT_TRUE(mapped.summary.acceptable())
        << (mapped.summary.problems.empty() ? mapped.summary.rejection : mapped.summary.problems.kept()[0].reason);
    // Problems and notes name the party's own columns.
    for (const auto& note : mapped.summary.conversions) EXPECT_TRUE(note.column.starts_with("Their ")) << note.column;

    const auto workbook = check_text(as_workbook(rows), plain);
    ASSERT_TRUE(workbook.summary.acceptable())
        << (workbook.summary.problems.empty() ? workbook.summary.rejection
                                              : workbook.summary.problems.kept()[0].reason);

    EXPECT_EQ(fingerprint(mapped.rows), fingerprint(csv.rows));
    EXPECT_EQ(fingerprint(workbook.rows), fingerprint(csv.rows));
    EXPECT_EQ(mapped.summary.rows_good, csv.summary.rows_good);
    EXPECT_EQ(workbook.summary.rows_good, csv.summary.rows_good);
  }
}

TEST(SameRowsEveryForm, MappedColumnKeepsItsOwnNameInProblems) {
  std::istringstream map_in("their_column,ferrum_column\nH2 (ppm),h2_ppm\nSampled,sample_date\n");
  CheckOptions o = test_options();
  o.columns = HeaderMap::parse(map_in);
  o.parse.date_order = DateOrder::dmy_slash;
  const auto c = check_text("unit_id,Sampled,H2 (ppm)\nT1,05/10/2025,-3\nT1,2025-10-06,4\nT1,10/05/25,4\n", o);
  EXPECT_FALSE(c.summary.acceptable());
  EXPECT_TRUE(testing::has_problem(c.summary, 2, "H2 (ppm)", "cannot be negative"));
  // Two-digit years do not fit DD/MM/YYYY: the message shows the format.
  EXPECT_TRUE(testing::has_problem(c.summary, 4, "Sampled", "DD/MM/YYYY"));
  EXPECT_EQ(c.summary.problems.count(), 2);
}

}  // namespace
}  // namespace ferrum::ingest
