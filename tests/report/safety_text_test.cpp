// The cautions have one source (report/safety_text.cpp); the README's Safety
// section and the man page's SAFETY section are copies kept equal here, and the
// hazards that the work carries are each named.
#include "report/safety_text.h"

#include <gtest/gtest.h>

#include <algorithm>
#include <cctype>
#include <fstream>
#include <sstream>

namespace ferrum::report {
namespace {

std::string read_source(const std::string& relative) {
  std::ifstream in(std::string(FERRUM_SOURCE_ROOT) + "/" + relative);
  std::stringstream s;
  s << in.rdbuf();
  return s.str();
}

// The text between `from` (exclusive) and the next `until` after it.
std::string section(const std::string& text, const std::string& from, const std::string& until) {
  const auto a = text.find(from);
  if (a == std::string::npos) return {};
  const auto b = text.find(until, a + from.size());
  return text.substr(a + from.size(), b == std::string::npos ? std::string::npos : b - a - from.size());
}

std::string lower(std::string s) {
  std::transform(s.begin(), s.end(), s.begin(), [](unsigned char c) { return std::tolower(c); });
  return s;
}

std::string all_text() {
  std::string t = safety_heading() + "\n";
  for (const auto& c : safety_cautions()) t += c.lead + " " + c.text + "\n";
  return lower(t);
}

TEST(SafetyText, ReadmeSafetySectionIsTheCodesText) {
  const std::string readme = read_source("README.md");
  const std::string body = section(readme, "\n## Safety\n", "\n## ");
  ASSERT_FALSE(body.empty()) << "README.md has no '## Safety' section";
  EXPECT_NE(body.find("\n" + safety_markdown()), std::string::npos)
      << "README.md's Safety section differs from report/safety_text.cpp; its bullets must read:\n"
      << safety_markdown();
}

TEST(SafetyText, ManPageSafetySectionIsTheCodesText) {
  const std::string man = read_source("daemon/ferrum.1");
  const std::string body = section(man, "\n.SH SAFETY\n", "\n.SH ");
  ASSERT_FALSE(body.empty()) << "daemon/ferrum.1 has no SAFETY section";
  EXPECT_NE((body + "\n").find(safety_roff()), std::string::npos)
      << "daemon/ferrum.1's SAFETY section differs from report/safety_text.cpp; it must hold:\n"
      << safety_roff();
}

// The hazards of transformer condition work that a caution must name, and the
// deference to local rules and qualified persons. Common practice of
// electrical-safety rules (NFPA 70E:2024; EN 50110-1:2013; OSHA 29 CFR
// 1910.269 (fall protection 1910.269(g), enclosed spaces 1910.269(e))), no
// single published list.
TEST(SafetyText, NamesEveryHazardOfTheWork) {
  const std::string t = all_text();
  for (const char* must :
       {"energised equipment", "qualified persons", "arc-flash", "lock out", "working at height", "fall protection",
        "gas-accumulation relay", "approach distance", "oil fire", "rupture", "pressure-relief", "hot work",
        "fire plan", "negative pressure", "internal flashover", "engineer's permission", "de-energising",
        "confined space", "nitrogen", "test the atmosphere before and during entry", "attendant", "rescue plan",
        "pcb", "jurisdiction", "unknown history", "never heat or burn", "combustible", "flammable",
        "electrical tests", "test voltages", "discharge", "local codes", "licensed", "qualified engineer decides"})
    EXPECT_NE(t.find(must), std::string::npos) << "the cautions do not mention: " << must;
  // One country's PCB cut-off year is not the rule everywhere.
  EXPECT_EQ(t.find("1979"), std::string::npos);
}

TEST(SafetyText, OneLineCautionDefersAndPointsToTheFullText) {
  const std::string& l = one_line_caution();
  EXPECT_EQ(l.rfind("SAFETY:", 0), 0u);
  EXPECT_EQ(l.find('\n'), std::string::npos);
  for (const char* must : {"qualified engineer decides", "local codes", "energised", "arc flash", "cautions"})
    EXPECT_NE(lower(l).find(must), std::string::npos) << must;
  EXPECT_EQ(csv_caution_line(), "# " + l);
}

TEST(SafetyText, RoffHasNoStrayRequests) {
  std::istringstream in(safety_roff());
  for (std::string line; std::getline(in, line);) {
    if (!line.empty() && (line[0] == '.' || line[0] == '\'')) {
      EXPECT_TRUE(line.rfind(".TP", 0) == 0 || line.rfind(".B \"", 0) == 0) << line;
    }
  }
}

}  // namespace
}  // namespace ferrum::report
