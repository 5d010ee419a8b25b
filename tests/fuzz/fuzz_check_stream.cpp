// libFuzzer target: the whole parse of a drop file (daemon/ingest/
// check_stream.h): CSV reader, kind detection and each kind's row parser,
// with a fixed units register so that unit ids and per-unit load conversion
// are exercised.
//
// Checked beyond "no crash, no sanitizer report": the summary's counts agree
// with the rows the sink received, and every row handed on carries a line
// inside the file.
// Plumbing: no engineering value is checked here, so no published source applies.
#include <cstddef>
#include <cstdint>
#include <cstdio>
#include <cstdlib>
#include <map>
#include <sstream>
#include <string>

#include "analytics/calendar.h"
#include "daemon/ingest/check_stream.h"

namespace {

using namespace ferrum;

void require(bool condition, const char* what) {
  if (!condition) {
    std::fprintf(stderr, "invariant broken: %s\n", what);
    std::abort();
  }
}

// The unit ids of the example files (schema/examples/, demo-site/drops/),
// three-phase, and one single-phase unit.
const std::map<std::string, analytics::UnitInfo, std::less<>>& fixed_register() {
  static const auto units = [] {
    std::map<std::string, analytics::UnitInfo, std::less<>> m;
    for (const char* id : {"T1", "T2", "T3", "TKQ-T1", "TKQ-T2", "TKQ-T3", "OSB-T2", "OSB-T3", "VNM-T2",
                           "VNM-T4", "CRW-T1", "CRW-T2", "CRW-T3"}) {
      analytics::UnitInfo u;
      u.unit_id = id;
      u.rated_mva = 40;
      u.hv_kv = 132;
      u.lv_kv = 33;
      m[id] = u;
    }
    analytics::UnitInfo s1;
    s1.unit_id = "S1";
    s1.rated_mva = 10;
    s1.hv_kv = 66;
    s1.lv_kv = 11;
    s1.phases = 1;
    m["S1"] = s1;
    return m;
  }();
  return units;
}

struct CountingSink : ingest::RowSink {
  std::int64_t rows = 0;
  std::int64_t max_line = 0;
  bool began = false;
  bool begin(const ingest::KindDetection&) override { return began = true; }
  void seen(std::int64_t line) {
    require(began, "a row before begin()");
    require(line > 0, "row line is positive");
    ++rows;
    if (line > max_line) max_line = line;
  }
  void unit(const ingest::UnitRow& r) override { seen(r.line); }
  void oil_sample(const ingest::OilRow& r) override { seen(r.line); }
  void infrared(const ingest::InfraredRow& r) override { seen(r.line); }
  void inspection(const ingest::InspectionRow& r) override { seen(r.line); }
  void load_point(const ingest::LoadRow& r) override { seen(r.line); }
  void electrical(const ingest::ElectricalRow& r) override { seen(r.line); }
  void work_status(const ingest::WorkStatusRow& r) override { seen(r.line); }
};

ingest::CheckOptions fixed_options() {
  ingest::CheckOptions o;
  // 2026-12-31T12:00Z, after every date of the example files.
  o.parse.now = analytics::start_of(analytics::days_from_civil(2026, 12, 31)) + 12 * 3600;
  o.parse.site_utc_offset_min = 60;
  o.parse.lookup_unit = [](std::string_view id) -> const analytics::UnitInfo* {
    const auto& units = fixed_register();
    const auto it = units.find(id);
    return it == units.end() ? nullptr : &it->second;
  };
  o.csv.chunk_bytes = 4096;
  o.csv.max_record_bytes = 16384;
  return o;
}

}  // namespace

extern "C" int LLVMFuzzerTestOneInput(const std::uint8_t* data, std::size_t size) {
  static const ingest::CheckOptions options = fixed_options();
  const std::string text(reinterpret_cast<const char*>(data), size);
  std::istringstream in(text);
  CountingSink sink;
  const ingest::CheckSummary s = ingest::check_stream(in, options, sink);
  require(s.rows_good == sink.rows, "rows_good equals the rows handed to the sink");
  require(s.rows_good <= s.rows_read, "more good rows than rows read");
  require(s.problems.count() >= static_cast<std::int64_t>(s.problems.kept().size()), "kept more than counted");
  require(s.problems.kept().size() <= options.max_problems_kept, "kept more problems than allowed");
  if (!s.recognised) {
    require(sink.rows == 0, "rows from an unrecognised file");
    require(!s.rejection.empty(), "an unrecognised file says why");
  }
  if (s.acceptable()) require(s.rows_good == s.rows_read, "an acceptable file lost rows");
  // Physical lines are at most the line breaks plus one.
  std::int64_t lines = 1;
  for (const char c : text) lines += (c == '\n' || c == '\r');
  require(sink.max_line <= lines, "row line past the end of the file");
  return 0;
}
