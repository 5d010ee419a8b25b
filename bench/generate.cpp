// ferrum_bench_gen: writes the benchmarks' drop files from the synthetic fleet
// (fleet_model.h). Deterministic: the same arguments give the same bytes.
//
//   ferrum_bench_gen register UNITS FILE          units register of UNITS units
//   ferrum_bench_gen load ROWS UNITS FILE         load series, ROWS rows in runs of one unit
//                                                 (ROWS/UNITS hourly points each, from 2026-01-01)
//   ferrum_bench_gen fleet UNITS DIR              register, oil, infrared, inspection and one
//                                                 year of hourly load (load-NN.csv, 500 units each)
//   ferrum_bench_gen lab COUNT UNITS DIR          COUNT one-sample oil-lab files (lab-NNN.csv) for
//                                                 units 1..UNITS in turn, dated 2026 after the history
#include <charconv>
#include <algorithm>
#include <cmath>
#include <cstdio>
#include <filesystem>
#include <random>
#include <stdexcept>
#include <string>
#include <utility>
#include <vector>

#include "bench/fleet_model.h"

namespace {

namespace fs = std::filesystem;
using namespace ferrum;

// A CSV file written through one large buffer; numbers in their shortest
// exact form (std::to_chars), so the parser sees what a SCADA export holds.
class CsvOut {
 public:
  explicit CsvOut(const fs::path& path) : path_(path), tmp_(path.string() + ".tmp") {
    f_ = std::fopen(tmp_.c_str(), "wb");
    if (!f_) throw std::runtime_error("cannot write " + tmp_.string());
    buf_.reserve(1 << 20);
  }
  ~CsvOut() {
    if (f_) std::fclose(f_);
  }
  CsvOut& text(std::string_view s) {
    buf_.append(s);
    return *this;
  }
  CsvOut& num(double v) {
    if (std::isnan(v)) return *this;  // empty cell
    char b[32];
    auto res = std::to_chars(b, b + sizeof b, v);
    buf_.append(b, res.ptr);
    return *this;
  }
  CsvOut& lab(const analytics::LabValue& v) {
    if (v.is_below_limit()) return text("<").num(v.value);
    if (v.is_measured()) return num(v.value);
    return *this;
  }
  CsvOut& sep() { return text(","); }
  void end_row() {
    buf_.push_back('\n');
    if (buf_.size() > (1 << 20) - 512) flush();
  }
  void close() {  // written under a temporary name, renamed when complete
    flush();
    std::fclose(f_);
    f_ = nullptr;
    fs::rename(tmp_, path_);
  }

 private:
  void flush() {
    if (std::fwrite(buf_.data(), 1, buf_.size(), f_) != buf_.size()) throw std::runtime_error("write failed");
    buf_.clear();
  }
  fs::path path_, tmp_;
  std::FILE* f_ = nullptr;
  std::string buf_;
};

void write_register(int units, const fs::path& path) {
  CsvOut out(path);
  out.text("unit_id,site,serial,rated_mva,hv_kv,lv_kv,cooling,year_built,vector_group,paper,oil_volume_l,"
           "criticality,customers_served");
  out.end_row();
  for (int n = 1; n <= units; ++n) {
    const auto u = bench::unit_info(n);
    out.text(u.unit_id).sep().text(u.site).sep().text(u.serial).sep().num(u.rated_mva).sep().num(u.hv_kv).sep()
        .num(u.lv_kv).sep().text(u.cooling).sep().num(u.year_built).sep().text(u.vector_group).sep()
        .text(u.paper == analytics::PaperType::upgraded ? "upgraded" : "kraft").sep().num(*u.oil_volume_l).sep()
        .num(u.criticality).sep().num(*u.customers_served);
    out.end_row();
  }
  out.close();
}

void write_load_point(CsvOut& out, const std::string& id, const analytics::LoadPoint& p) {
  // "2026-01-01T05:00Z": minutes only, as many SCADA exports write it
  out.text(id).sep().text(analytics::format_utc(p.t).substr(0, 16)).text("Z").sep().num(p.load_pu).sep()
      .num(p.ambient_c).sep().num(p.top_oil_c);
  out.end_row();
}

void write_load_rows(CsvOut& out, int n, analytics::Timestamp start, int count) {
  const std::string id = bench::unit_id(n);
  for (const auto& p : bench::load_series(n, start, count, 3600)) write_load_point(out, id, p);
}

constexpr const char* kLoadHeader = "unit_id,timestamp,load_pu,ambient_c,top_oil_c";

// The same rows in one of three orders: "unit-major" (each unit's series in
// turn, as one meter exports them), "time-major" (every unit at one time,
// then every unit at the next, as a control-room historian exports them) or
// "shuffled" (a fixed pseudo-random permutation).
void write_load(long rows, int units, const fs::path& path, const std::string& order) {
  CsvOut out(path);
  out.text(kLoadHeader).end_row();
  const analytics::Timestamp start = analytics::start_of(analytics::days_from_civil(2026, 1, 1));
  auto count = [&](int n) { return static_cast<int>(rows * n / units - rows * (n - 1) / units); };
  if (order == "unit-major") {
    for (int n = 1; n <= units; ++n) write_load_rows(out, n, start, count(n));
    out.close();
    return;
  }
  if (order != "time-major" && order != "shuffled") throw std::runtime_error("unknown order " + order);
  std::vector<std::vector<analytics::LoadPoint>> series(static_cast<std::size_t>(units));
  std::vector<std::string> ids(static_cast<std::size_t>(units));
  int longest = 0;
  for (int n = 1; n <= units; ++n) {
    series[n - 1] = bench::load_series(n, start, count(n), 3600);
    ids[n - 1] = bench::unit_id(n);
    longest = std::max(longest, count(n));
  }
  std::vector<std::pair<int, int>> cells;  // (unit index, point index)
  cells.reserve(static_cast<std::size_t>(rows));
  for (int i = 0; i < longest; ++i)
    for (int u = 0; u < units; ++u)
      if (i < count(u + 1)) cells.emplace_back(u, i);
  if (order == "shuffled") {
    std::mt19937_64 random(20261202);  // Fisher-Yates with a fixed seed: the same file every run
    for (std::size_t i = cells.size() - 1; i > 0; --i) std::swap(cells[i], cells[random() % (i + 1)]);
  }
  for (const auto& [u, i] : cells) write_load_point(out, ids[u], series[u][i]);
  out.close();
}

constexpr const char* kOilHeader =
    "unit_id,sample_date,lab_ref,sample_point,h2_ppm,ch4_ppm,c2h6_ppm,c2h4_ppm,c2h2_ppm,co_ppm,co2_ppm,o2_ppm,"
    "n2_ppm,moisture_ppm,oil_temp_c,breakdown_kv,breakdown_method,acidity_mgkoh_g,ift_mn_m,pf25_pct,color,"
    "furan_2fal_ppb";

void write_oil_row(CsvOut& out, const std::string& id, const analytics::OilSample& s) {
  out.text(id).sep().text(analytics::format_day(s.date)).sep().text(s.lab_ref).sep().text(s.sample_point).sep()
      .lab(s.h2).sep().lab(s.ch4).sep().lab(s.c2h6).sep().lab(s.c2h4).sep().lab(s.c2h2).sep().lab(s.co).sep()
      .lab(s.co2).sep().lab(s.o2).sep().lab(s.n2).sep().lab(s.moisture_ppm).sep().lab(s.oil_temp_c).sep()
      .lab(s.breakdown_kv).sep().text(s.breakdown_method).sep().lab(s.acidity_mgkoh_g).sep().lab(s.ift_mn_m).sep()
      .lab(s.pf25_pct).sep().lab(s.color).sep().lab(s.furan_2fal_ppb);
  out.end_row();
}

void write_fleet(int units, const fs::path& dir) {
  fs::create_directories(dir);
  const bench::FleetShape shape{.units = units};
  write_register(units, dir / "units.csv");
  CsvOut oil(dir / "oil.csv"), ir(dir / "infrared.csv"), insp(dir / "inspection.csv");
  oil.text(kOilHeader).end_row();
  ir.text("unit_id,survey_date,component,spot_c,reference_c,ambient_c,load_pct").end_row();
  insp.text("unit_id,inspection_date,item,rating,inspector").end_row();
  static const char* kRating[] = {"", "good", "fair", "poor", "very poor", "unsafe"};
  for (int n = 1; n <= units; ++n) {
    const std::string id = bench::unit_id(n);
    for (const auto& s : bench::oil_history(n, shape)) write_oil_row(oil, id, s);
    for (const auto& s : bench::infrared_history(n, shape)) {
      ir.text(id).sep().text(analytics::format_day(s.date)).sep().text(s.component).sep().num(s.spot_c).sep()
          .num(*s.reference_c).sep().num(*s.ambient_c).sep().num(*s.load_pct);
      ir.end_row();
    }
    for (const auto& r : bench::inspection_history(n, shape)) {
      insp.text(id).sep().text(analytics::format_day(r.date)).sep().text(r.item).sep()
          .text(kRating[static_cast<int>(r.rating)]).sep().text(r.inspector);
      insp.end_row();
    }
  }
  oil.close();
  ir.close();
  insp.close();
  constexpr int kUnitsPerLoadFile = 500;
  for (int first = 1; first <= units; first += kUnitsPerLoadFile) {
    char name[32];
    std::snprintf(name, sizeof name, "load-%02d.csv", (first - 1) / kUnitsPerLoadFile + 1);
    CsvOut load(dir / name);
    load.text(kLoadHeader).end_row();
    for (int n = first; n < first + kUnitsPerLoadFile && n <= units; ++n)
      write_load_rows(load, n, shape.load_start, shape.load_hours);
    load.close();
  }
}

// One sample per file, later than the history (2026), one day apart per round.
void write_lab_drops(int count, int units, const fs::path& dir) {
  fs::create_directories(dir);
  const bench::FleetShape shape{.units = units};
  for (int i = 0; i < count; ++i) {
    const int n = i % units + 1;
    auto s = bench::oil_history(n, shape).back();
    s.date = analytics::days_from_civil(2026, 1, 10) + i / units;
    s.lab_ref = "D" + std::to_string(i);
    char name[32];
    std::snprintf(name, sizeof name, "lab-%03d.csv", i);
    CsvOut out(dir / name);
    out.text(kOilHeader).end_row();
    write_oil_row(out, bench::unit_id(n), s);
    out.close();
  }
}

int usage() {
  std::fputs("usage: ferrum_bench_gen register UNITS FILE | load ROWS UNITS [unit-major|time-major|shuffled] FILE |"
             " fleet UNITS DIR |"
             " lab COUNT UNITS DIR\n", stderr);
  return 2;
}

}  // namespace

int main(int argc, char** argv) {
  const std::vector<std::string> a(argv + 1, argv + argc);
  try {
    if (a.size() == 3 && a[0] == "register") write_register(std::stoi(a[1]), a[2]);
    else if (a.size() == 4 && a[0] == "load") write_load(std::stol(a[1]), std::stoi(a[2]), a[3], "unit-major");
    else if (a.size() == 5 && a[0] == "load") write_load(std::stol(a[1]), std::stoi(a[2]), a[4], a[3]);
    else if (a.size() == 3 && a[0] == "fleet") write_fleet(std::stoi(a[1]), a[2]);
    else if (a.size() == 4 && a[0] == "lab") write_lab_drops(std::stoi(a[1]), std::stoi(a[2]), a[3]);
    else return usage();
  } catch (const std::exception& e) {
    std::fprintf(stderr, "ferrum_bench_gen: %s\n", e.what());
    return 1;
  }
  return 0;
}
