// The synthetic fleet the benchmarks run on: one deterministic description of
// every unit and its history, used both to write drop files (bench_generate)
// and to build UnitData in memory (bench_kernels). Not a model of any real
// fleet; the values only need to be plausible enough that every analytics
// path runs (gases that grow, a few faulty units, daily and seasonal load).
//
// Deterministic: every random stream is a splitmix64 seeded from the unit
// number and the stream's purpose; nothing reads a clock.
#pragma once

#include <cstdint>
#include <string>
#include <vector>

#include "analytics/calendar.h"
#include "analytics/unit_data.h"

namespace ferrum::bench {

// Deterministic generator (splitmix64; public-domain constants by S. Vigna).
class Random {
 public:
  Random(std::uint64_t unit, std::uint64_t stream) : s_(unit * 0x9E3779B97F4A7C15ULL ^ (stream + 1) * 0xD1B54A32D192ED03ULL) {}
  std::uint64_t next() {
    std::uint64_t z = (s_ += 0x9E3779B97F4A7C15ULL);
    z = (z ^ (z >> 30)) * 0xBF58476D1CE4E5B9ULL;
    z = (z ^ (z >> 27)) * 0x94D049BB133111EBULL;
    return z ^ (z >> 31);
  }
  double uniform() { return static_cast<double>(next() >> 11) * 0x1.0p-53; }      // [0, 1)
  double between(double lo, double hi) { return lo + (hi - lo) * uniform(); }
  double normal() {  // Irwin-Hall: plain arithmetic, same bytes everywhere
    double s = 0;
    for (int i = 0; i < 12; ++i) s += uniform();
    return s - 6.0;
  }

 private:
  std::uint64_t s_;
};

struct FleetShape {
  int units = 5000;
  int oil_years = 20;          // quarterly samples over this many years, ending in last_year
  int last_year = 2025;
  int load_hours = 8760;       // hourly load points ending before load_end
  analytics::Timestamp load_start = analytics::start_of(analytics::days_from_civil(2025, 12, 1));
};

std::string unit_id(int n);   // "U00001" for n = 1
std::string site_of(int n);   // "S001" ... (25 units per site)

analytics::UnitInfo unit_info(int n);
std::vector<analytics::OilSample> oil_history(int n, const FleetShape& shape);
std::vector<analytics::InfraredScan> infrared_history(int n, const FleetShape& shape);
std::vector<analytics::InspectionRecord> inspection_history(int n, const FleetShape& shape);

// `count` load points from `start`, `step_s` apart, for unit n.
std::vector<analytics::LoadPoint> load_series(int n, analytics::Timestamp start, int count, int step_s);

analytics::UnitData unit_data(int n, const FleetShape& shape);

}  // namespace ferrum::bench
