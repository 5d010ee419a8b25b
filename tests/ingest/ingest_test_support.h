// Helpers shared by the ingest tests: a small units register, a sink that
// keeps every row, and a one-call check of CSV text.
#pragma once

#include <map>
#include <sstream>
#include <string>
#include <vector>

#include "analytics/calendar.h"
#include "daemon/ingest/check_stream.h"

namespace ferrum::ingest::testing {

// 2026-06-01T12:00Z: the "now" of every test.
inline analytics::Timestamp test_now() {
  return analytics::start_of(analytics::days_from_civil(2026, 6, 1)) + 12 * 3600;
}

// T1: 40 MVA, 132/33 kV, three-phase. S1: 10 MVA single-phase at 66 kV.
inline const std::map<std::string, analytics::UnitInfo, std::less<>>& test_units() {
  static const auto units = [] {
    std::map<std::string, analytics::UnitInfo, std::less<>> m;
    analytics::UnitInfo t1;
    t1.unit_id = "T1";
    t1.rated_mva = 40;
    t1.hv_kv = 132;
    t1.lv_kv = 33;
    m["T1"] = t1;
    analytics::UnitInfo t2 = t1;
    t2.unit_id = "T2";
    m["T2"] = t2;
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

inline CheckOptions test_options(int site_offset_min = 0) {
  CheckOptions o;
  o.parse.now = test_now();
  o.parse.site_utc_offset_min = site_offset_min;
  o.parse.lookup_unit = [](std::string_view id) -> const analytics::UnitInfo* {
    const auto& units = test_units();
    const auto it = units.find(id);
    return it == units.end() ? nullptr : &it->second;
  };
  return o;
}

struct KeepAll : RowSink {
  std::vector<UnitRow> units;
  std::vector<OilRow> oil;
  std::vector<InfraredRow> ir;
  std::vector<InspectionRow> inspections;
  std::vector<LoadRow> load;
  std::vector<ElectricalRow> tests;
  std::vector<WorkStatusRow> work;
  void work_status(const WorkStatusRow& r) override { work.push_back(r); }
  void electrical(const ElectricalRow& r) override { tests.push_back(r); }
  void unit(const UnitRow& r) override { units.push_back(r); }
  void oil_sample(const OilRow& r) override { oil.push_back(r); }
  void infrared(const InfraredRow& r) override { ir.push_back(r); }
  void inspection(const InspectionRow& r) override { inspections.push_back(r); }
  void load_point(const LoadRow& r) override { load.push_back(r); }
};

struct Checked {
  CheckSummary summary;
  KeepAll rows;
};

inline Checked check_text(const std::string& text, const CheckOptions& options = test_options()) {
  std::istringstream in(text);
  Checked c;
  c.summary = check_stream(in, options, c.rows);
  return c;
}

inline bool has_problem(const CheckSummary& s, std::int64_t line, const std::string& column,
                        const std::string& reason_part) {
  for (const Problem& p : s.problems.kept()) {
    if (p.line == line && p.column == column && p.reason.find(reason_part) != std::string::npos) {
      return true;
    }
  }
  return false;
}

inline std::string problems_text(const CheckSummary& s) {
  std::string out;
  for (const Problem& p : s.problems.kept()) {
    out += std::to_string(p.line) + " [" + p.column + "] '" + p.value + "' " + p.reason + "\n";
  }
  return out;
}

}  // namespace ferrum::ingest::testing
