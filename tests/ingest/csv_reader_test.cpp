// CsvReader: RFC 4180 records, header handling and damaged input.
#include "daemon/ingest/csv_reader.h"

#include <gtest/gtest.h>

#include <sstream>
#include <string>
#include <vector>

namespace ferrum::ingest {
namespace {

struct ReadAll {
  bool header_ok = false;
  std::vector<std::string> header;
  std::vector<std::vector<std::string>> rows;
  std::vector<std::int64_t> lines;
  ProblemLog problems;
  char delimiter = 0;
};

ReadAll read_all(const std::string& text, CsvOptions options = {}) {
  ReadAll out;
  std::istringstream in(text);
  CsvReader reader(in, options);
  out.header_ok = reader.read_header(out.problems);
  if (!out.header_ok) return out;
  out.header = reader.header();
  out.delimiter = reader.delimiter();
  for (;;) {
    const RecordStatus status = reader.next(out.problems);
    if (status == RecordStatus::end) break;
    if (status == RecordStatus::malformed) continue;
    out.rows.emplace_back(reader.fields().begin(), reader.fields().end());
    out.lines.push_back(reader.record_line());
  }
  return out;
}

TEST(CsvReader, ReadsHeaderAndRecords) {
  const auto r = read_all("a,b,c\n1,2,3\n4,5,6\n");
  ASSERT_TRUE(r.header_ok);
  EXPECT_EQ(r.header, (std::vector<std::string>{"a", "b", "c"}));
  ASSERT_EQ(r.rows.size(), 2u);
  EXPECT_EQ(r.rows[1], (std::vector<std::string>{"4", "5", "6"}));
  EXPECT_EQ(r.lines, (std::vector<std::int64_t>{2, 3}));
  EXPECT_TRUE(r.problems.empty());
}

TEST(CsvReader, QuotedFieldsWithDelimiterQuotesAndNewlines) {
  // RFC 4180 section 2, rules 5-7.
  const auto r = read_all("a,b\n\"x,y\",\"say \"\"hi\"\"\"\n\"two\nlines\",z\nlast,1\n");
  ASSERT_EQ(r.rows.size(), 3u);
  EXPECT_EQ(r.rows[0][0], "x,y");
  EXPECT_EQ(r.rows[0][1], "say \"hi\"");
  EXPECT_EQ(r.rows[1][0], "two\nlines");
  // The record with the embedded newline starts on line 3; the next on line 5.
  EXPECT_EQ(r.lines, (std::vector<std::int64_t>{2, 3, 5}));
}

TEST(CsvReader, CrLfAndMissingFinalNewline) {
  const auto r = read_all("a,b\r\n1,2\r\n3,4");
  ASSERT_EQ(r.rows.size(), 2u);
  EXPECT_EQ(r.rows[0][1], "2");
  EXPECT_EQ(r.rows[1][1], "4");
  EXPECT_EQ(r.lines[1], 3);
}

TEST(CsvReader, ByteOrderMarkCommentsAndBlankLinesBeforeHeader) {
  const auto r = read_all("\xEF\xBB\xBF# exported by lab X\n\n  \n# second comment\nA , b\n1,2\n\n3,4\n");
  ASSERT_TRUE(r.header_ok);
  EXPECT_EQ(r.header, (std::vector<std::string>{"A", "b"}));
  EXPECT_EQ(r.lines, (std::vector<std::int64_t>{6, 8}));  // blank line 7 skipped
}

TEST(CsvReader, ShortInputAfterByteOrderMarkCheckIsKept) {
  const auto r = read_all("a\nb");
  ASSERT_TRUE(r.header_ok);
  ASSERT_EQ(r.rows.size(), 1u);
  EXPECT_EQ(r.rows[0][0], "b");
}

TEST(CsvReader, DetectsSemicolonDelimiter) {
  const auto r = read_all("unit_id;h2_ppm;note\nT1;12,5;\"a;b, c\"\n");
  EXPECT_EQ(r.delimiter, ';');
  ASSERT_EQ(r.rows.size(), 1u);
  EXPECT_EQ(r.rows[0][1], "12,5");
  EXPECT_EQ(r.rows[0][2], "a;b, c");
}

TEST(CsvReader, SpacesAroundQuotedFieldAreIgnored) {
  const auto r = read_all("a,b\n  \"x\"  , y\n");
  ASSERT_EQ(r.rows.size(), 1u);
  EXPECT_EQ(r.rows[0][0], "x");
  EXPECT_EQ(r.rows[0][1], " y");  // unquoted: kept, trimmed later by the field parsers
}

TEST(CsvReader, RaggedRowsAreProblemsAndReadingGoesOn) {
  const auto r = read_all("a,b,c\n1,2\n1,2,3,4\n5,6,7\n");
  ASSERT_EQ(r.rows.size(), 1u);
  EXPECT_EQ(r.lines[0], 4);
  ASSERT_EQ(r.problems.count(), 2);
  EXPECT_EQ(r.problems.kept()[0].line, 2);
  EXPECT_NE(r.problems.kept()[0].reason.find("2 values but the header has 3"), std::string::npos);
  EXPECT_EQ(r.problems.kept()[1].line, 3);
  EXPECT_EQ(r.problems.kept()[1].value, "4");
}

TEST(CsvReader, StrayQuoteInUnquotedField) {
  const auto r = read_all("a,b\n12\"5,x\nok,1\n");
  ASSERT_EQ(r.problems.count(), 1);
  const Problem& p = r.problems.kept()[0];
  EXPECT_EQ(p.line, 2);
  EXPECT_EQ(p.column, "a");
  EXPECT_EQ(p.column_number, 1);
  EXPECT_EQ(p.value, "12\"5");
  ASSERT_EQ(r.rows.size(), 1u);
}

TEST(CsvReader, TextAfterClosingQuote) {
  const auto r = read_all("a,b\n1,\"x\"y\n");
  ASSERT_EQ(r.problems.count(), 1);
  EXPECT_EQ(r.problems.kept()[0].column, "b");
  EXPECT_NE(r.problems.kept()[0].reason.find("after the closing quote"), std::string::npos);
}

TEST(CsvReader, UnterminatedQuoteReportedAtRecordStartAndEndsReading) {
  const auto r = read_all("a,b\n1,2\n3,\"open\n4,5\n6,7\n");
  ASSERT_EQ(r.rows.size(), 1u);
  ASSERT_EQ(r.problems.count(), 1);
  EXPECT_EQ(r.problems.kept()[0].line, 3);
  EXPECT_EQ(r.problems.kept()[0].column, "b");
  EXPECT_NE(r.problems.kept()[0].reason.find("never closed"), std::string::npos);
}

TEST(CsvReader, NulByteIsAProblemNotACrash) {
  const std::string text = std::string("a,b\n1,2\n3,x") + '\0' + "y\n5,6\n";
  const auto r = read_all(text);
  ASSERT_EQ(r.problems.count(), 1);
  EXPECT_EQ(r.problems.kept()[0].line, 3);
  EXPECT_EQ(r.problems.kept()[0].column, "b");
  EXPECT_EQ(r.problems.kept()[0].value, "x\\x00y");
  EXPECT_EQ(r.rows.size(), 2u);
}

TEST(CsvReader, InvalidUtf8ReportsLineAndColumn) {
  const auto r = read_all("a,b,c\n1,2,3\n1,caf\xE9,3\n");  // Latin-1 e-acute
  ASSERT_EQ(r.problems.count(), 1);
  const Problem& p = r.problems.kept()[0];
  EXPECT_EQ(p.line, 3);
  EXPECT_EQ(p.column, "b");
  EXPECT_EQ(p.column_number, 2);
  EXPECT_EQ(p.value, "caf\\xE9");
  EXPECT_NE(p.reason.find("byte 4"), std::string::npos);
}

TEST(CsvReader, ValidMultibyteUtf8IsAccepted) {
  const auto r = read_all("a,b\n\xC2\xB0" "C,\xE2\x82\xAC\xF0\x9F\x94\xA5\n");
  EXPECT_TRUE(r.problems.empty());
  ASSERT_EQ(r.rows.size(), 1u);
}

TEST(CsvReader, OverlongAndSurrogateUtf8Rejected) {
  // RFC 3629 section 3: C0 80 (overlong NUL) and ED A0 80 (U+D800) are invalid.
  EXPECT_EQ(read_all("a\n\xC0\x80\n").problems.count(), 1);
  EXPECT_EQ(read_all("a\n\xED\xA0\x80\n").problems.count(), 1);
}

TEST(CsvReader, LongLineIsSkippedWithoutBufferingItAll) {
  std::string text = "a,b\n1,2\n";
  text += "3,";
  text.append(std::size_t{3} << 20, 'x');  // 3 MiB in one line
  text += "\n4,5\n";
  const auto r = read_all(text);
  ASSERT_EQ(r.problems.count(), 1);
  EXPECT_EQ(r.problems.kept()[0].line, 3);
  EXPECT_NE(r.problems.kept()[0].reason.find("longer than 1 MiB"), std::string::npos);
  EXPECT_LE(r.problems.kept()[0].value.size(), 83u);
  ASSERT_EQ(r.rows.size(), 2u);
  EXPECT_EQ(r.lines[1], 4);
}

TEST(CsvReader, EmptyFileAndCommentOnlyFileHaveNoHeader) {
  EXPECT_FALSE(read_all("").header_ok);
  const auto r = read_all("# only\n# comments\n");
  EXPECT_FALSE(r.header_ok);
  EXPECT_EQ(r.problems.count(), 1);
}

TEST(CsvReader, Utf16FileRejected) {
  const auto r = read_all(std::string("\xFF\xFE" "a\0,\0b\0", 8));
  EXPECT_FALSE(r.header_ok);
  EXPECT_NE(r.problems.kept()[0].reason.find("UTF-16"), std::string::npos);
}

TEST(CsvReader, BinaryHeaderRejected) {
  const auto r = read_all(std::string("PK\x03\x04\0\0\x14\0junk\n", 13));
  EXPECT_FALSE(r.header_ok);
  EXPECT_NE(r.problems.kept()[0].reason.find("NUL"), std::string::npos);
}

TEST(CsvReader, SmallChunksGiveTheSameResult) {
  const std::string text = "\xEF\xBB\xBF" "a;b\r\n\"x\r\ny\";2\r\n3;4\r\n";
  CsvOptions tiny;
  tiny.chunk_bytes = 1;  // clamped to 16, still splits records across reads
  const auto a = read_all(text, tiny);
  const auto b = read_all(text);
  EXPECT_EQ(a.rows, b.rows);
  EXPECT_EQ(a.lines, b.lines);
  EXPECT_EQ(a.lines, (std::vector<std::int64_t>{2, 4}));
}

}  // namespace
}  // namespace ferrum::ingest

namespace ferrum::ingest {
namespace {

// Issue 19, item 4: a "sep=" first line, as spreadsheet programs write it.
TEST(CsvReaderSepLine, NamesTheDelimiterAndIsNotTheHeader) {
  const ReadAll r = read_all("sep=;\nunit_id;h2_ppm\nT1;1,5\n");
  ASSERT_TRUE(r.header_ok);
  EXPECT_EQ(r.delimiter, ';');
  EXPECT_EQ(r.header, (std::vector<std::string>{"unit_id", "h2_ppm"}));
  ASSERT_EQ(r.rows.size(), 1u);
  EXPECT_EQ(r.rows[0], (std::vector<std::string>{"T1", "1,5"}));
  EXPECT_EQ(r.lines[0], 3);  // lines keep counting the sep= line
}

TEST(CsvReaderSepLine, OverridesDetection) {
  // Detection alone would take ';' (more of them in the header than ',').
  EXPECT_EQ(read_all("a;b;c,d\n1;2;3,4\n").delimiter, ';');
  const ReadAll r = read_all("sep=,\na;b;c,d\n1;2;3,4\n");
  ASSERT_TRUE(r.header_ok);
  EXPECT_EQ(r.delimiter, ',');
  EXPECT_EQ(r.header, (std::vector<std::string>{"a;b;c", "d"}));
}

TEST(CsvReaderSepLine, OnlyASepLineIsNoHeader) {
  const ReadAll r = read_all("sep=;\n");
  EXPECT_FALSE(r.header_ok);
  EXPECT_EQ(r.problems.count(), 1);
}

TEST(CsvReaderSepLine, ReportsThatItWasDeclared) {
  std::istringstream with("sep=;\na;b\n"), without("a;b\n");
  ProblemLog p;
  CsvReader a(with), b(without);
  ASSERT_TRUE(a.read_header(p));
  ASSERT_TRUE(b.read_header(p));
  EXPECT_TRUE(a.delimiter_declared());
  EXPECT_FALSE(b.delimiter_declared());
}

}  // namespace
}  // namespace ferrum::ingest
