// The broken-file corpus (tests/corpus/broken, one defect per file) and the
// contract examples (schema/examples, one valid file per kind).
#include <gtest/gtest.h>

#include <filesystem>
#include <fstream>
#include <map>
#include <sstream>
#include <string>
#include <vector>

#include "tests/ingest/ingest_test_support.h"

namespace ferrum::ingest {
namespace {

using namespace ferrum::ingest::testing;
namespace fs = std::filesystem;

struct Expected {
  std::int64_t line;
  std::string column;
  std::string reason;
};

std::vector<std::string> split_tabs(const std::string& line) {
  std::vector<std::string> out;
  std::stringstream in(line);
  std::string part;
  while (std::getline(in, part, '\t')) out.push_back(part);
  return out;
}

std::map<std::string, std::vector<Expected>> read_expected(const fs::path& tsv) {
  std::map<std::string, std::vector<Expected>> out;
  std::ifstream in(tsv);
  std::string line;
  std::getline(in, line);  // header
  while (std::getline(in, line)) {
    if (line.empty()) continue;
    const auto parts = split_tabs(line);
    if (parts.size() != 4) {
      ADD_FAILURE() << "bad expected.tsv line: " << line;
      continue;
    }
    out[parts[0]].push_back({std::stoll(parts[1]), parts[2], parts[3]});
  }
  return out;
}

CheckSummary check_file(const fs::path& path) {
  std::ifstream in(path, std::ios::binary);
  KeepAll sink;
  return check_stream(in, test_options(), sink);
}

const fs::path kCorpus = fs::path(FERRUM_TEST_DATA) / "corpus" / "broken";

TEST(BrokenCorpus, EveryExpectedProblemIsReportedAndNothingElse) {
  const auto expected = read_expected(kCorpus / "expected.tsv");
  ASSERT_GE(expected.size(), 30u);
  for (const auto& [file, problems] : expected) {
    SCOPED_TRACE(file);
    ASSERT_TRUE(fs::exists(kCorpus / file));
    const CheckSummary s = check_file(kCorpus / file);
    EXPECT_FALSE(s.acceptable());
    for (const Expected& e : problems) {
      EXPECT_TRUE(has_problem(s, e.line, e.column, e.reason))
          << "missing: line " << e.line << " [" << e.column << "] " << e.reason << "\ngot:\n"
          << problems_text(s);
    }
    // One defect per file: exactly the listed problems, no noise.
    EXPECT_EQ(s.problems.count(), static_cast<std::int64_t>(problems.size())) << problems_text(s);
  }
}

TEST(BrokenCorpus, EveryFileIsListed) {
  const auto expected = read_expected(kCorpus / "expected.tsv");
  for (const auto& entry : fs::directory_iterator(kCorpus)) {
    const std::string name = entry.path().filename().string();
    if (name == "expected.tsv") continue;
    EXPECT_TRUE(expected.count(name)) << name << " has no line in expected.tsv";
  }
}

TEST(ContractExamples, EachKindHasAValidExample) {
  const fs::path dir = fs::path(FERRUM_SOURCE_ROOT) / "schema" / "examples";
  const std::map<std::string, FileKind> files = {
      {"units_register.csv", FileKind::units_register}, {"oil_lab.csv", FileKind::oil_lab},
      {"infrared.csv", FileKind::infrared},             {"load_series.csv", FileKind::load_series},
      {"inspection.csv", FileKind::inspection},         {"electrical_tests.csv", FileKind::electrical_tests},
      {"work_status.csv", FileKind::work_status},
  };
  CheckOptions o = test_options(60);
  for (const auto& [file, kind] : files) {
    SCOPED_TRACE(file);
    std::ifstream in(dir / file, std::ios::binary);
    ASSERT_TRUE(in) << "missing example";
    KeepAll sink;
    const CheckSummary s = check_stream(in, o, sink);
    EXPECT_TRUE(s.acceptable()) << s.rejection << problems_text(s);
    EXPECT_EQ(s.kind, kind);
    EXPECT_GE(s.rows_good, 2);
  }
}

}  // namespace
}  // namespace ferrum::ingest
