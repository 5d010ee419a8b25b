// ferrum_bench_kernels: in-process benchmarks (Google Benchmark).
//
//   BM_ThermalUnitYear     simulate_thermal over one unit-year of one-minute
//                          steps (525,600 points, IEC 60076-7 difference
//                          equations, ONAF unit); counter ns_per_step.
//   BM_UnitReports/T       render_unit_report for 200 prepared assessments,
//                          shared out over T std::threads (T = 1, 2); wall
//                          time, counters ms_per_unit and cpu_ms_per_unit
//                          (process CPU time, every thread).
//
// The PDFs go to $FERRUM_BENCH_OUT (default: a folder under /tmp), so that
// bench/run can count the pages of one of them.
#include <benchmark/benchmark.h>

#include <cstdlib>
#include <ctime>
#include <filesystem>
#include <thread>
#include <vector>

#include "analytics/assess_unit.h"
#include "analytics/thermal_simulation.h"
#include "bench/fleet_model.h"
#include "report/unit_report.h"

namespace {

namespace fs = std::filesystem;
using namespace ferrum;

constexpr int kMinutesPerYear = 525600;
constexpr int kReportUnits = 200;

void BM_ThermalUnitYear(benchmark::State& state) {
  const int unit = 2;  // an ONAF unit (fleet_model.cpp: kRatings[n % 5])
  const auto model = analytics::resolve_thermal_model(bench::unit_info(unit), analytics::ThermalMethod::iec60076_7);
  const auto load = bench::load_series(unit, analytics::start_of(analytics::days_from_civil(2025, 1, 1)),
                                       kMinutesPerYear, 60);
  analytics::GapOptions gaps;
  gaps.expected_interval_s = 60;
  std::vector<analytics::ThermalPoint> out(load.size());
  for (auto _ : state) {
    const auto stats = analytics::simulate_thermal(model, load, gaps, out);
    benchmark::DoNotOptimize(stats.loss_of_life_h);
    if (stats.written != load.size()) state.SkipWithError("not every step was simulated");
  }
  state.counters["steps"] = kMinutesPerYear;
  state.counters["ns_per_step"] =
      benchmark::Counter(kMinutesPerYear, benchmark::Counter::kIsIterationInvariantRate | benchmark::Counter::kInvert);
}
BENCHMARK(BM_ThermalUnitYear)->Unit(benchmark::kMillisecond);

fs::path output_dir() {
  const char* env = std::getenv("FERRUM_BENCH_OUT");
  fs::path dir = env && *env ? fs::path(env) : fs::temp_directory_path() / "ferrum-bench-reports";
  fs::create_directories(dir);
  return dir;
}

// 200 assessments of the synthetic fleet, as of 2026-12-01, made once.
const std::vector<analytics::UnitAssessment>& prepared_assessments() {
  static const std::vector<analytics::UnitAssessment> all = [] {
    std::vector<analytics::UnitAssessment> v;
    const bench::FleetShape shape;
    const analytics::Day as_of = analytics::days_from_civil(2026, 12, 1);
    for (int n = 1; n <= kReportUnits; ++n)
      v.push_back(analytics::assess_unit(bench::unit_data(n, shape), as_of, analytics::AssessmentOptions{}));
    return v;
  }();
  return all;
}

void render_share(const std::vector<analytics::UnitAssessment>& units, int first, int stride, const fs::path& dir) {
  report::ReportOptions options;
  options.utility_name = "ferrum benchmark fleet";
  options.creation_date = "2026-12-01T06:00:00Z";
  const std::vector<report::SourceFile> files = {
      {"bench_lab", "oil.csv", "oil-lab", "2026-11-28 09:14 UTC", 400000},
      {"bench_planning", "load-01.csv", "load", "2026-11-28 09:20 UTC", 4380000}};
  for (std::size_t i = static_cast<std::size_t>(first); i < units.size(); i += static_cast<std::size_t>(stride))
    report::render_unit_report(units[i], nullptr, files, options,
                               (dir / ("ferrum-" + units[i].unit.unit_id + ".pdf")).string());
}

void BM_UnitReports(benchmark::State& state) {
  const auto& units = prepared_assessments();
  const int threads = static_cast<int>(state.range(0));
  const fs::path dir = output_dir();
  const std::clock_t cpu_start = std::clock();  // process CPU time, all threads
  for (auto _ : state) {
    std::vector<std::thread> pool;
    for (int t = 0; t < threads; ++t) pool.emplace_back(render_share, std::cref(units), t, threads, dir);
    for (auto& th : pool) th.join();
  }
  // CPU per report: on a shared machine this says more than the wall time.
  state.counters["cpu_ms_per_unit"] = 1e3 * static_cast<double>(std::clock() - cpu_start) / CLOCKS_PER_SEC /
                                      static_cast<double>(state.iterations()) / kReportUnits;
  state.counters["units"] = kReportUnits;
  state.counters["ms_per_unit"] = benchmark::Counter(
      kReportUnits * 1e-3, benchmark::Counter::kIsIterationInvariantRate | benchmark::Counter::kInvert);
}
BENCHMARK(BM_UnitReports)->Arg(1)->Arg(2)->Iterations(1)->UseRealTime()->Unit(benchmark::kMillisecond);

}  // namespace

BENCHMARK_MAIN();
