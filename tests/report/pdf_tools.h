// Helpers for the report tests: run poppler/qpdf tools on rendered files.
#pragma once

#include <cstdio>
#include <cstdlib>
#include <fstream>
#include <sstream>
#include <string>

#include <gtest/gtest.h>

#include "report/report_options.h"

namespace ferrum::report::testing {

inline bool have_tool(const std::string& name) {
  return std::system(("command -v " + name + " >/dev/null 2>&1").c_str()) == 0;
}

// Output of a shell command (stdout only).
inline std::string run(const std::string& command) {
  std::string out;
  FILE* p = popen(command.c_str(), "r");
  if (!p) return out;
  char buf[4096];
  size_t n;
  while ((n = fread(buf, 1, sizeof buf, p)) > 0) out.append(buf, n);
  pclose(p);
  return out;
}

// Text of a PDF; poppler's ToUnicode warnings on stderr are expected and dropped.
inline std::string pdf_text(const std::string& path) {
  return run("pdftotext -layout '" + path + "' - 2>/dev/null");
}

// Same, without layout: reading order, one text run per line.
inline std::string pdf_raw_text(const std::string& path) { return run("pdftotext '" + path + "' - 2>/dev/null"); }

inline bool qpdf_check(const std::string& path) {
  return std::system(("qpdf --check '" + path + "' >/dev/null 2>&1").c_str()) == 0;
}

inline int pdf_pages(const std::string& path) {
  const std::string info = run("pdfinfo '" + path + "' 2>/dev/null");
  const auto pos = info.find("Pages:");
  return pos == std::string::npos ? -1 : std::atoi(info.c_str() + pos + 6);
}

inline std::string file_bytes(const std::string& path) {
  std::ifstream in(path, std::ios::binary);
  std::ostringstream s;
  s << in.rdbuf();
  return s.str();
}

// Options with a fixed creation date, so that output bytes are reproducible.
inline ReportOptions fixed_options() {
  ReportOptions o;
  o.utility_name = "Riverside Distribution";
  o.utc_offset_note = "times without an offset were taken as UTC+01:00";
  o.creation_date = "2026-12-01T10:00:00Z";
  return o;
}

// Base of tests that read rendered PDFs back: skipped without the tools.
class RenderedPdfTest : public ::testing::Test {
 protected:
  void SetUp() override {
    if (!have_tool("pdftotext") || !have_tool("qpdf") || !have_tool("pdfinfo"))
      GTEST_SKIP() << "poppler-utils / qpdf not installed";
  }
};

inline std::string temp_path(const std::string& name) { return "/tmp/ferrum-report-test-" + name; }

// Collapses runs of whitespace so that wrapped phrases can be searched for.
inline std::string squash(const std::string& text) {
  std::string out;
  bool space = false;
  for (char c : text) {
    if (c == ' ' || c == '\n' || c == '\t' || c == '\f') {
      space = true;
      continue;
    }
    if (space && !out.empty()) out += ' ';
    space = false;
    out += c;
  }
  return out;
}

}  // namespace ferrum::report::testing
