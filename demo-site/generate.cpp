// ferrum_demo_gen: writes the large, generated part of the demo site's data.
//
//   ferrum_demo_gen OUTDIR
//
// The fleet is the invented Tarrenvale Electricity Board (see README.md in
// this folder). The generator writes, per party folder under OUTDIR:
//   quorlan_labs/       oil-lab history, one file per unit (10-19 years)
//   lanterfield_thermo/ three infrared surveys, one file per survey
//   brevitt_field/      yearly inspections 2018-2026, one file per site and year
//   teb_planning/       one year of 15-minute load per unit (35 040 rows each)
// The units register, the sparse unit's single sample, the follow-up files and
// the deliberately broken files are committed under demo-site/drops/ instead.
//
// Deterministic: every random stream is a splitmix64 seeded from a fixed
// constant and the stream's name (unit id + purpose), normal deviates come
// from the Irwin-Hall sum of twelve uniforms (plain arithmetic, so the bytes
// do not depend on a library's distribution code), and nothing reads a clock.
// Each file is written to ".<name>.tmp" in its folder and renamed into place,
// as the drop contract asks of every deliverer.
//
// The unit table below must agree with drops/teb_planning/units-register.csv;
// the storylines it encodes are listed in storylines.tsv and README.md.
#include <algorithm>
#include <array>
#include <cmath>
#include <cstdint>
#include <cstdio>
#include <filesystem>
#include <string>
#include <string_view>
#include <vector>

#include "analytics/calendar.h"

namespace {

namespace fs = std::filesystem;

// ---------------------------------------------------------------- calendar
// Day arithmetic comes from ferrum's analytics library (analytics/calendar.h).
using ferrum::analytics::civil_from_days;
using ferrum::analytics::CivilDate;
using ferrum::analytics::Day;
using ferrum::analytics::days_from_civil;
using ferrum::analytics::format_day;  // "YYYY-MM-DD"
using ferrum::analytics::weekday_of;  // 0 = Monday

// Fraction of the year, 0 at 1 January.
double year_phase(Day day) {
  const CivilDate c = civil_from_days(day);
  return (day - days_from_civil(c.year, 1, 1)) / 365.25;
}

constexpr double kPi = 3.14159265358979323846;
const Day kAsOf = days_from_civil(2026, 11, 30);  // the demo's "today"

// ---------------------------------------------------------------- random
class Rng {
 public:
  explicit Rng(std::uint64_t seed) : state_(seed) {}
  std::uint64_t next() {  // splitmix64 (Steele, Lea, Flood 2014)
    std::uint64_t z = (state_ += 0x9E3779B97F4A7C15ULL);
    z = (z ^ (z >> 30)) * 0xBF58476D1CE4E5B9ULL;
    z = (z ^ (z >> 27)) * 0x94D049BB133111EBULL;
    return z ^ (z >> 31);
  }
  double uniform() { return static_cast<double>(next() >> 11) * 0x1.0p-53; }
  // Approximately standard normal (Irwin-Hall, |x| <= 6).
  double normal() {
    double s = 0;
    for (int i = 0; i < 12; ++i) s += uniform();
    return s - 6.0;
  }

 private:
  std::uint64_t state_;
};

// One independent stream per (subject, purpose), so that changing one unit's
// data never shifts another's.
Rng stream(std::string_view subject, std::string_view purpose) {
  std::uint64_t h = 0xCBF29CE484222325ULL;  // FNV-1a 64
  auto mix = [&h](std::string_view s) {
    for (unsigned char ch : s) h = (h ^ ch) * 0x100000001B3ULL;
  };
  mix(subject);
  mix("/");
  mix(purpose);
  return Rng(h ^ 0x7E55A11E2026ULL);  // fixed demo seed
}

// ---------------------------------------------------------------- output
// Collects a file in memory; commit() writes ".<name>.tmp" and renames it.
class DropFile {
 public:
  DropFile(fs::path dir, std::string name) : dir_(std::move(dir)), name_(std::move(name)) {}
  void line(const std::string& s) {
    text_ += s;
    text_ += '\n';
  }
  bool commit() const {
    const fs::path tmp = dir_ / ("." + name_ + ".tmp");
    std::FILE* f = std::fopen(tmp.c_str(), "wb");
    if (!f) return false;
    const bool ok = std::fwrite(text_.data(), 1, text_.size(), f) == text_.size();
    if (std::fclose(f) != 0 || !ok) return false;
    std::error_code ec;
    fs::rename(tmp, dir_ / name_, ec);
    return !ec;
  }

 private:
  fs::path dir_;
  std::string name_;
  std::string text_;
};

std::string num(double v, int decimals) {
  char buf[32];
  std::snprintf(buf, sizeof buf, "%.*f", decimals, v);
  // "-0.0" is a rounding artefact, not a sign.
  if (buf[0] == '-' && std::string_view(buf + 1).find_first_not_of("0.") == std::string_view::npos)
    return buf + 1;
  return buf;
}

// ---------------------------------------------------------------- the fleet
enum class LoadShape { residential, commercial, industrial };

struct Gases {
  double h2 = 0, ch4 = 0, c2h6 = 0, c2h4 = 0, c2h2 = 0, co = 0, co2 = 0;
};

struct OilQuality {
  double moisture = 0;      // mg/kg at about 40 °C oil temperature
  double breakdown = 0;     // kV, ASTM D1816 2 mm equivalent
  double acidity = 0;       // mg KOH/g
  double ift = 0;           // mN/m
  double pf25 = 0;          // %
  double pf100 = 0;         // %
  double color = 0;         // ASTM D1500
};

struct Site {
  const char* code;
  double mean_c;            // annual mean ambient, °C
  double season_amp_k;      // half the summer-winter swing of daily means
  double day_amp_k;         // half the day-night swing in midsummer
};

// Sites share one ambient series per site (units in one yard see the same air).
const std::array<Site, 5> kSites = {{
    {"CRW", 10.5, 9.0, 5.5},   // Corrowby Grid: open farmland
    {"VNM", 9.5, 9.0, 5.0},    // Vantmoor: upland moor, cooler
    {"PLW", 12.0, 10.5, 6.0},  // Pellowick: sheltered inland valley, hottest summers
    {"OSB", 11.0, 9.0, 5.5},   // Ostrel Bridge: river town
    {"TKQ", 11.5, 7.0, 3.5},   // Teskary Quay: coastal, mild
}};

struct Unit {
  const char* id;
  const char* site;
  double mva;
  const char* cooling;
  int year_built;
  // Load year
  double peak_k;            // annual maximum of load_pu
  LoadShape shape;
  double summer_gain;       // extra summer level (air conditioning), fraction
  double heat_coef;         // extra p.u. per K of ambient above 21 °C
  bool top_oil_sensor;
  double cooling_factor;    // measured top-oil rise / model rise (1 = healthy)
  bool load_in_mva;         // deliver load_mva instead of load_pu
  // Oil history
  int history_from;         // first year sampled
  int sample_month, sample_day;
  int samples_per_year;
  bool sealed;              // sealed conservator: little O2
  Gases start, end;         // background at history start and at the as-of date
  Gases fault;              // increment reached at the as-of date
  Day fault_onset;          // 0 = no fault
  double fault_power;       // growth curve exponent
  OilQuality q_start, q_end;
  double fal_start_ppb, fal_end_ppb;
  Day oil_treated;          // 0 = never; 2-FAL restarts from ND after it
  Day follow_from;          // 0 = none: extra DGA samples every follow_days
  int follow_days;
  Day follow2_from;
  int follow2_days;
};

Day D(int y, int m, int d) { return days_from_civil(y, m, d); }

// The storyline of every unit is in README.md; the comments say what each
// row is tuned to show. Gas end values are the as-of targets checked against
// IEEE C57.104-2008 Table 1, Duval Triangle 1 and IEC 60599 Table 1. Units
// without a gas story keep every gas within the C57.104-2019 Table 2 values
// for free-breathing units (analytics/data/ieee_c57104_2019.csv), and
// most of them within Table 1, so that gases do not drown out their stories.
const std::vector<Unit>& fleet() {
  static const std::vector<Unit> units = {
      // CRW-T1: 1968 OFAF, old kraft paper. 2-FAL 1.7 -> 7.4 ppm (Chendong DP
      // ~365 -> ~183); oil fails acidity, IFT and colour (class III); CO2 in
      // C57.104-2008 condition 3 from normal ageing. Ranks first for replacement.
      {"CRW-T1", "CRW", 60, "OFAF", 1968, 0.78, LoadShape::residential, 0.22, 0.004, false, 1.0,
       false, 2008, 4, 14, 2, false, {25, 16, 14, 3, 0, 320, 3400}, {42, 30, 30, 7, 0, 520, 5600},
       {}, 0, 1, {14, 58, 0.08, 29, 0.12, 2.0, 2.5}, {21, 49, 0.19, 22, 0.46, 4.6, 4.0}, 1700, 7400,
       0, 0, 0, 0, 0},
      // CRW-T2: 2019 ONAF, upgraded paper, sealed conservator: the healthy unit.
      {"CRW-T2", "CRW", 60, "ONAF", 2019, 0.72, LoadShape::residential, 0.22, 0.004, true, 1.0,
       false, 2019, 6, 3, 1, true, {8, 2, 1, 0.3, 0, 40, 300}, {22, 9, 6, 1.5, 0, 190, 1400}, {}, 0, 1,
       {5, 78, 0.01, 44, 0.01, 0.3, 0.5}, {8, 72, 0.02, 41, 0.02, 0.6, 0.5}, 0, 0, 0, 0, 0, 0, 0},
      // CRW-T3: 1996 ONAF with fan groups 2 and 3 dead: measured top oil runs
      // ~50 % more rise than the model all year.
      {"CRW-T3", "CRW", 45, "ONAF", 1996, 0.80, LoadShape::commercial, 0.25, 0.005, true, 1.5,
       false, 2008, 5, 6, 1, false, {16, 8, 7, 2.5, 0, 200, 1800}, {30, 16, 12, 4.5, 0, 340, 3000},
       {}, 0, 1, {9, 66, 0.03, 38, 0.03, 0.8, 1.0}, {15, 58, 0.07, 32, 0.09, 1.6, 1.5}, 60, 420, 0, 0,
       0, 0, 0},
      // VNM-T1: 1983 ODAF; arcing from late 2023: C2H2 appears in the March
      // 2024 sample and rises to ~88 ppm. End point: H2 1330, CH4 175, C2H6 32,
      // C2H4 120, C2H2 88, CO 360 -> Duval D2, IEC 60599 D2, TDCG ~2100 (cond. 3).
      {"VNM-T1", "VNM", 30, "ODAF", 1983, 0.70, LoadShape::residential, 0.15, 0.003, false, 1.0,
       false, 2008, 3, 10, 2, false, {20, 12, 14, 2, 0, 200, 1800}, {30, 20, 26, 4, 0, 330, 2900},
       {1300, 155, 6, 116, 88, 30, 0}, D(2023, 11, 1), 1.7, {10, 62, 0.04, 36, 0.05, 1.0, 1.0},
       {16, 55, 0.09, 31, 0.12, 2.2, 2.0}, 150, 900, 0, D(2024, 5, 15), 91, D(2025, 9, 1), 30},
      // VNM-T2: 1985 OFAF sister unit, ordinary ageing (background).
      {"VNM-T2", "VNM", 30, "OFAF", 1985, 0.70, LoadShape::residential, 0.15, 0.003, false, 1.0,
       false, 2008, 3, 12, 2, false, {16, 8, 7, 2, 0, 190, 1700}, {26, 15, 12, 3.2, 0, 300, 2800},
       {}, 0, 1, {10, 61, 0.04, 36, 0.05, 1.0, 1.0}, {15, 56, 0.08, 32, 0.10, 2.0, 1.5}, 140, 820,
       0, 0, 0, 0, 0},
      // VNM-T3: 1977 ONAN, oil regenerated 2015-06-18 (2-FAL reset to ND).
      {"VNM-T3", "VNM", 12, "ONAN", 1977, 0.85, LoadShape::residential, 0.10, 0.003, false, 1.0,
       false, 2010, 9, 22, 1, false, {22, 14, 20, 2.5, 0, 260, 2600}, {30, 20, 30, 4, 0, 340, 3300},
       {}, 0, 1, {18, 45, 0.16, 24, 0.30, 3.5, 3.0}, {14, 56, 0.05, 34, 0.08, 1.4, 1.5}, 2400, 260,
       D(2015, 6, 18), 0, 0, 0, 0},
      // PLW-T1: 1979 ONAN, wet: moisture 16 -> 46 mg/kg, D1816 2 mm 62 -> 29 kV
      // (C57.106 <=69 kV: 35 mg/kg max, 40 kV min). Breather neglected.
      {"PLW-T1", "PLW", 20, "ONAN", 1979, 0.80, LoadShape::residential, 0.20, 0.004, false, 1.0,
       false, 2008, 7, 2, 1, false, {18, 7, 7, 1.8, 0, 240, 2400}, {32, 13, 12, 3.2, 0, 400, 3600},
       {}, 0, 1, {16, 62, 0.06, 32, 0.05, 1.1, 1.5}, {46, 29, 0.14, 26, 0.38, 4.2, 2.5}, 300, 1500,
       0, 0, 0, 0, 0},
      // PLW-T2: 2002 ONAF feeding a growing suburb with air conditioning:
      // summer afternoons at 1.2-1.3 p.u., hot spot above 120 °C. Its gases
      // stay below C57.104-2019 Table 1 and C57.104-2008 condition 1: the
      // story is heat, so the gases must not become the limiting factor.
      {"PLW-T2", "PLW", 20, "ONAF", 2002, 1.15, LoadShape::residential, 0.45, 0.010, true, 1.0,
       false, 2008, 7, 2, 1, false, {12, 6, 5, 1.2, 0, 150, 1200}, {28, 14, 12, 4, 0, 320, 2350},
       {}, 0, 1, {8, 68, 0.02, 40, 0.02, 0.5, 0.5}, {14, 58, 0.07, 33, 0.08, 1.8, 1.5}, 40, 380, 0,
       0, 0, 0, 0},
      // PLW-T3: 1971 ONAN, small and old but lightly loaded (background).
      {"PLW-T3", "PLW", 12, "ONAN", 1971, 0.75, LoadShape::residential, 0.15, 0.003, false, 1.0,
       false, 2008, 7, 3, 2, false, {24, 15, 18, 3, 0, 330, 3000}, {34, 22, 28, 4.5, 0, 440, 3800},
       {}, 0, 1, {14, 56, 0.07, 31, 0.10, 1.8, 2.0}, {20, 48, 0.14, 27, 0.22, 3.0, 3.0}, 900, 2600,
       0, 0, 0, 0, 0},
      // OSB-T1: 1991 ONAN; hot thermal fault in oil (e.g. a circulating current
      // at a bad joint) from early 2023. End: H2 300, CH4 480, C2H6 140, C2H4
      // 820, C2H2 <0.5, CO 520 -> Duval T3, IEC 60599 T3, TDCG ~2260 (cond. 3).
      {"OSB-T1", "OSB", 10, "ONAN", 1991, 0.70, LoadShape::commercial, 0.20, 0.003, false, 1.0,
       false, 2008, 5, 20, 1, false, {15, 10, 12, 2, 0, 180, 1600}, {25, 20, 25, 4, 0, 300, 2800},
       {275, 460, 115, 810, 0, 220, 1400}, D(2023, 2, 1), 1.4, {9, 64, 0.03, 38, 0.03, 0.8, 1.0},
       {14, 57, 0.07, 33, 0.09, 1.7, 1.5}, 80, 520, 0, D(2024, 8, 20), 91, D(2026, 3, 1), 61},
      // OSB-T2: 1993 ONAN sister unit (background).
      {"OSB-T2", "OSB", 10, "ONAN", 1993, 0.75, LoadShape::commercial, 0.20, 0.003, false, 1.0,
       false, 2008, 5, 21, 1, false, {12, 6, 5, 1.5, 0, 160, 1400}, {22, 12, 10, 2.6, 0, 280, 2300},
       {}, 0, 1, {9, 64, 0.03, 38, 0.03, 0.8, 1.0}, {13, 58, 0.07, 33, 0.08, 1.6, 1.5}, 70, 480, 0,
       0, 0, 0, 0},
      // OSB-T3: 2008 ONAN, upgraded paper (background).
      {"OSB-T3", "OSB", 7.5, "ONAN", 2008, 0.80, LoadShape::residential, 0.15, 0.003, false, 1.0,
       false, 2009, 5, 21, 1, false, {8, 3, 2, 0.6, 0, 70, 600}, {14, 6, 5, 1.5, 0, 210, 1700}, {},
       0, 1, {6, 72, 0.01, 42, 0.02, 0.4, 0.5}, {11, 63, 0.05, 35, 0.06, 1.2, 1.0}, 0, 90, 0, 0, 0,
       0, 0},
      // TKQ-T1: 2012 ONAF at the port; LV bushing X2 connector overheating
      // (infrared surveys: +4 K, +11 K, +37.5 K over the other phases).
      {"TKQ-T1", "TKQ", 15, "ONAF", 2012, 0.80, LoadShape::industrial, 0.10, 0.002, false, 1.0,
       true, 2012, 10, 8, 1, false, {10, 3, 2, 0.6, 0, 60, 500}, {20, 11, 12, 2, 0, 230, 2000}, {}, 0,
       1, {6, 74, 0.01, 43, 0.01, 0.3, 0.5}, {10, 65, 0.04, 37, 0.05, 1.0, 1.0}, 0, 60, 0, 0, 0, 0,
       0},
      // TKQ-T2: 2012 ONAF; the 2026 inspection finds the tank earth conductor
      // cut away (unsafe).
      {"TKQ-T2", "TKQ", 15, "ONAF", 2012, 0.75, LoadShape::industrial, 0.10, 0.002, false, 1.0,
       true, 2012, 10, 9, 1, false, {11, 3, 2, 0.6, 0, 65, 520}, {21, 12, 12, 2, 0, 240, 2100}, {}, 0,
       1, {6, 74, 0.01, 43, 0.01, 0.3, 0.5}, {10, 66, 0.04, 37, 0.05, 1.0, 1.0}, 0, 55, 0, 0, 0, 0,
       0},
  };
  return units;
}

const Site& site_of(const Unit& u) {
  for (const Site& s : kSites)
    if (std::string_view(s.code) == u.site) return s;
  return kSites[0];
}

double lerp(double a, double b, double f) { return a + (b - a) * f; }

// ================================================================ load year
// 15-minute intervals from 2025-12-01T00:00+01:00; each value is the mean of
// the interval that starts at its timestamp. Local time is UTC+01:00 with
// summer time UTC+02:00 between 01:00 UTC on the last Sundays of March and
// October (2026-03-29 and 2026-10-25).
constexpr int kSteps = 365 * 96;
const long long kYearStartUtc = days_from_civil(2025, 12, 1) * 86400LL - 3600;  // 2025-12-01T00:00+01:00
const long long kSummerFrom = static_cast<long long>(days_from_civil(2026, 3, 29)) * 86400 + 3600;
const long long kSummerTo = static_cast<long long>(days_from_civil(2026, 10, 25)) * 86400 + 3600;

int utc_offset_minutes(long long utc) { return utc >= kSummerFrom && utc < kSummerTo ? 120 : 60; }

std::string local_timestamp(long long utc) {
  const int off = utc_offset_minutes(utc);
  const long long local = utc + off * 60LL;
  const Day day = static_cast<Day>(local / 86400);
  const int sec = static_cast<int>(local % 86400);
  char buf[40];
  std::snprintf(buf, sizeof buf, "%sT%02d:%02d+%02d:00", format_day(day).c_str(), sec / 3600,
                sec / 60 % 60, off / 60);
  return buf;
}

// Smooth bump, 1 at `centre` (fraction of year), width in years.
double seasonal_bump(double phase, double centre, double width) {
  double d = std::fabs(phase - centre);
  d = std::min(d, 1.0 - d);
  return std::exp(-0.5 * (d / width) * (d / width));
}

// Deterministic part of the site ambient at a UTC time (standard time for the sun).
double ambient_expected(const Site& s, long long utc) {
  const long long standard = utc + 3600;
  const Day day = static_cast<Day>(standard / 86400);
  const double hour = (standard % 86400) / 3600.0;
  const double phase = year_phase(day);
  const double season = -std::cos(2 * kPi * (phase - 22.0 / 365.25));  // coldest ~22 January
  const double day_amp = s.day_amp_k * (0.6 + 0.4 * (season + 1) / 2);
  double t = s.mean_c + s.season_amp_k * season + day_amp * std::cos(2 * kPi * (hour - 15.0) / 24);
  // A July 2026 heat wave and a January 2026 cold spell, shared by all sites.
  auto spell = [day](Day from, Day to, double k) {
    if (day < from || day > to) return 0.0;
    return k * std::sin(kPi * (day - from + 0.5) / (to - from + 1));
  };
  t += spell(D(2026, 7, 12), D(2026, 7, 26), 5.5);
  t += spell(D(2026, 1, 14), D(2026, 1, 23), -6.0);
  return t;
}

std::vector<double> ambient_series(const Site& s) {
  Rng rng = stream(s.code, "ambient");
  std::vector<double> out(kSteps);
  double weather = 0;  // AR(1), ~1.5-day memory, ~2.2 K standard deviation
  const double phi = std::exp(-0.25 / 36.0);
  const double sigma = 2.2 * std::sqrt(1 - phi * phi);
  for (int i = 0; i < kSteps; ++i) {
    weather = phi * weather + sigma * rng.normal();
    out[i] = ambient_expected(s, kYearStartUtc + i * 900LL) + weather;
  }
  return out;
}

// Daily load shape, 0..1, by local hour and weekday (0 = Monday).
double day_shape(LoadShape shape, double hour, int weekday) {
  const bool weekend = weekday >= 5;
  auto bump = [hour](double centre, double width) {
    const double d = hour - centre;
    return std::exp(-0.5 * (d / width) * (d / width));
  };
  switch (shape) {
    case LoadShape::residential:
      return 0.50 + 0.22 * bump(8.0, 1.6) + 0.35 * bump(15.5, 3.2) + 0.30 * bump(19.5, 2.0) -
             (weekend ? 0.03 : 0.0);
    case LoadShape::commercial:
      return 0.45 + (weekend ? 0.25 : 0.55) * bump(13.5, 3.6);
    case LoadShape::industrial:
      return (weekend ? 0.55 : 0.70) + (weekend ? 0.05 : 0.25) * bump(12.0, 4.5);
  }
  return 0.5;
}

// Load in p.u. before scaling to the unit's peak, without noise.
double load_raw(const Unit& u, long long utc, double ambient) {
  const long long local = utc + utc_offset_minutes(utc) * 60LL;
  const Day day = static_cast<Day>(local / 86400);
  const double hour = (local % 86400) / 3600.0;
  const double phase = year_phase(day);
  const double level = 1.0 + u.summer_gain * seasonal_bump(phase, 0.55, 0.09) +
                       0.12 * seasonal_bump(phase, 0.04, 0.07);
  const double heat = u.heat_coef * std::max(0.0, ambient - 21.0) *
                      (0.4 + 0.6 * std::exp(-0.5 * std::pow((hour - 15.5) / 3.5, 2)));
  return level * day_shape(u.shape, hour, weekday_of(day)) + heat;
}

// Thermal characteristics by cooling class: IEC 60076-7:2005 Tables 4-5
// (medium/large power transformers), IEC 60076-7:2005 Table 5.
struct OilThermal {
  double x, R, k11, tau_o_min, rise_k;
};

OilThermal oil_thermal(std::string_view cooling) {
  if (cooling == "ONAN") return {0.8, 6, 0.5, 210, 52};
  if (cooling == "ONAF") return {0.8, 6, 0.5, 150, 52};
  if (cooling == "OFAF") return {1.0, 6, 1.0, 90, 56};
  return {1.0, 6, 1.0, 90, 49};  // ODAF
}

// Top-oil temperature by the IEC 60076-7 §8.2 difference equation; the
// measured series of a unit with failed fans uses a larger effective rise.
std::vector<double> top_oil_series(const Unit& u, const std::vector<double>& k,
                                   const std::vector<double>& amb, double rise_factor) {
  const OilThermal p = oil_thermal(u.cooling);
  const double dt = 15.0;
  auto ultimate_rise = [&](double kk) {
    return std::pow((1 + kk * kk * p.R) / (1 + p.R), p.x) * p.rise_k * rise_factor;
  };
  std::vector<double> out(k.size());
  double theta = amb[0] + ultimate_rise(k[0]);
  for (size_t i = 0; i < k.size(); ++i) {
    theta += dt / (p.k11 * p.tau_o_min) * (ultimate_rise(k[i]) - (theta - amb[i]));
    out[i] = theta;
  }
  return out;
}

std::vector<double> load_series(const Unit& u, const std::vector<double>& amb) {
  std::vector<double> raw(kSteps);
  double peak = 0;
  for (int i = 0; i < kSteps; ++i) {
    raw[i] = load_raw(u, kYearStartUtc + i * 900LL, amb[i]);
    peak = std::max(peak, raw[i]);
  }
  Rng rng = stream(u.id, "load");
  double noise = 0;  // AR(1) multiplicative noise, ~3 %
  const double phi = 0.9;
  const double sigma = 0.03 * std::sqrt(1 - phi * phi);
  std::vector<double> out(kSteps);
  for (int i = 0; i < kSteps; ++i) {
    noise = phi * noise + sigma * rng.normal();
    out[i] = std::max(0.05, raw[i] / peak * u.peak_k * (1 + noise));
  }
  return out;
}

bool write_load_file(const Unit& u, const std::vector<double>& amb, const fs::path& dir) {
  const std::vector<double> k = load_series(u, amb);
  std::vector<double> top;
  if (u.top_oil_sensor) {
    top = top_oil_series(u, k, amb, u.cooling_factor);
    Rng rng = stream(u.id, "sensor");
    double err = 0;  // slow sensor/installation error, ~0.4 K
    for (double& t : top) {
      err = 0.98 * err + 0.4 * std::sqrt(1 - 0.98 * 0.98) * rng.normal();
      t += err;
    }
  }
  DropFile f(dir, std::string("load-") + u.id + "-2025-12_2026-11.csv");
  std::string header = std::string("unit_id,timestamp,") + (u.load_in_mva ? "load_mva" : "load_pu") +
                       ",ambient_c" + (u.top_oil_sensor ? ",top_oil_c" : "");
  f.line(header);
  for (int i = 0; i < kSteps; ++i) {
    std::string row = std::string(u.id) + "," + local_timestamp(kYearStartUtc + i * 900LL) + ",";
    row += u.load_in_mva ? num(k[i] * u.mva, 2) : num(k[i], 3);
    row += "," + num(amb[i], 1);
    if (u.top_oil_sensor) row += "," + num(top[i], 1);
    f.line(row);
  }
  return f.commit();
}

// Load factor the unit would show at a UTC time in any year: the shape of the
// load year, without noise (used for infrared survey conditions).
double load_at(const Unit& u, long long utc, double ambient) {
  double peak = 0;
  for (int i = 0; i < kSteps; i += 4) {  // hourly pass is enough for the scale
    const long long t = kYearStartUtc + i * 900LL;
    peak = std::max(peak, load_raw(u, t, ambient_expected(site_of(u), t)));
  }
  return load_raw(u, utc, ambient) / peak * u.peak_k;
}

// ================================================================ oil lab
struct Sample {
  Day date;
  bool full;  // routine sample with oil-quality tests; else DGA follow-up
};

std::vector<Sample> sample_dates(const Unit& u) {
  Rng rng = stream(u.id, "sample-dates");
  std::vector<Sample> out;
  const Day last_allowed = kAsOf - 3;
  for (int y = u.history_from; y <= 2026; ++y) {
    for (int s = 0; s < u.samples_per_year; ++s) {
      Day d = days_from_civil(y, u.sample_month, u.sample_day) + s * 182 +
              static_cast<int>(rng.uniform() * 15) - 7;
      if (d <= last_allowed && d > days_from_civil(u.year_built, 12, 31) - 300)
        out.push_back({d, true});
    }
  }
  auto follow = [&](Day from, int every, Day until) {
    for (Day d = from; from != 0 && d <= until; d += every) out.push_back({d, false});
  };
  follow(u.follow_from, u.follow_days, u.follow2_from ? u.follow2_from - 1 : last_allowed);
  follow(u.follow2_from, u.follow2_days, last_allowed);
  std::sort(out.begin(), out.end(), [](const Sample& a, const Sample& b) { return a.date < b.date; });
  // A follow-up within three weeks of a routine sample is the same visit.
  std::vector<Sample> merged;
  for (const Sample& s : out) {
    if (!merged.empty() && s.date - merged.back().date < 21) {
      merged.back().full = merged.back().full || s.full;
      continue;
    }
    merged.push_back(s);
  }
  return merged;
}

// Fraction of the history elapsed at `day` (0 at the first year, 1 at as-of).
double history_fraction(const Unit& u, Day day) {
  const Day from = days_from_civil(u.history_from, 1, 1);
  return std::clamp(static_cast<double>(day - from) / (kAsOf - from), 0.0, 1.0);
}

double fault_fraction(const Unit& u, Day day) {
  if (u.fault_onset == 0 || day <= u.fault_onset) return 0;
  return std::pow(static_cast<double>(day - u.fault_onset) / (kAsOf - u.fault_onset), u.fault_power);
}

// Gas value as the lab prints it: "<DL" below the detection limit.
std::string gas_text(double v, double dl, bool nd_style) {
  if (v < dl) return nd_style ? "ND" : "<" + num(dl, dl < 1 ? 1 : 0);
  return num(v, v < 10 ? 1 : 0);
}

struct Row {
  std::vector<std::string> cells;
  std::string join() const {
    std::string s;
    for (size_t i = 0; i < cells.size(); ++i) s += (i ? "," : "") + cells[i];
    return s;
  }
};

double oil_temperature(const Unit& u, Day day, Rng& rng) {
  const double season = -std::cos(2 * kPi * (year_phase(day) - 22.0 / 365.25));
  return site_of(u).mean_c + 22 + 8 * season + 10 * (u.peak_k - 0.7) + 2.5 * rng.normal();
}

std::string furan_text(const Unit& u, Day day, double f, Rng& rng) {
  double ppb;
  if (u.oil_treated != 0 && day >= u.oil_treated) {
    // After regeneration 2-FAL restarts near zero and regrows slowly.
    const double since = (day - u.oil_treated) / 365.25;
    ppb = u.fal_end_ppb * std::pow(since / ((kAsOf - u.oil_treated) / 365.25), 1.3);
  } else if (u.oil_treated != 0) {
    ppb = u.fal_start_ppb * (1 + 0.15 * f);
  } else {
    // Exponential growth between the start and end values.
    ppb = u.fal_start_ppb > 0 ? u.fal_start_ppb * std::pow(u.fal_end_ppb / u.fal_start_ppb, f)
                              : u.fal_end_ppb * f * f;
  }
  ppb *= 1 + 0.04 * rng.normal();
  if (ppb < 10) return "ND";
  return num(ppb, 0);
}

Row oil_row(const Unit& u, const Sample& s, int seq, Rng& rng) {
  const double f = history_fraction(u, s.date);
  const double g = fault_fraction(u, s.date);
  const bool old_lims = s.date < days_from_civil(2013, 1, 1);  // lab changed systems in 2013
  auto gas = [&](double a, double b, double fault, double dl) {
    const double v = (lerp(a, b, f) + fault * g) * (1 + 0.04 * rng.normal());
    return gas_text(v, dl, old_lims);
  };
  const double temp = oil_temperature(u, s.date, rng);
  Row r;
  r.cells.push_back(u.id);
  r.cells.push_back(format_day(s.date));
  r.cells.push_back(gas(u.start.h2, u.end.h2, u.fault.h2, 5));
  r.cells.push_back(gas(u.start.ch4, u.end.ch4, u.fault.ch4, 1));
  r.cells.push_back(gas(u.start.c2h6, u.end.c2h6, u.fault.c2h6, 1));
  r.cells.push_back(gas(u.start.c2h4, u.end.c2h4, u.fault.c2h4, 1));
  r.cells.push_back(gas(u.start.c2h2, u.end.c2h2, u.fault.c2h2, 0.5));
  r.cells.push_back(gas(u.start.co, u.end.co, u.fault.co, 5));
  r.cells.push_back(gas(u.start.co2, u.end.co2, u.fault.co2, 10));
  const double o2 = u.sealed ? 1800 + 900 * rng.uniform() : 17000 + 6000 * rng.uniform();
  const double n2 = u.sealed ? 38000 + 5000 * rng.uniform() : 52000 + 8000 * rng.uniform();
  r.cells.push_back(num(o2, 0));
  r.cells.push_back(num(n2, 0));
  // Water in oil rises with oil temperature (moisture leaves the paper).
  const double water = lerp(u.q_start.moisture, u.q_end.moisture, f) * (1 + 0.015 * (temp - 40)) *
                       (1 + 0.04 * rng.normal());
  r.cells.push_back(water < 2 ? "<2" : num(water, 0));
  r.cells.push_back(num(temp, 0));
  if (s.full) {
    const double bd = lerp(u.q_start.breakdown, u.q_end.breakdown, f) + 1.5 * rng.normal();
    // ASTM D877 (disc electrodes) reads lower than D1816 on the same oil.
    r.cells.push_back(num(old_lims ? bd * 0.72 : bd, 0));
    r.cells.push_back(old_lims ? "ASTM D877" : "ASTM D1816 2 mm");
    r.cells.push_back(num(lerp(u.q_start.acidity, u.q_end.acidity, f) * (1 + 0.05 * rng.normal()), 3));
    r.cells.push_back(num(lerp(u.q_start.ift, u.q_end.ift, f) + 0.6 * rng.normal(), 1));
    r.cells.push_back(num(lerp(u.q_start.pf25, u.q_end.pf25, f) * (1 + 0.05 * rng.normal()), 3));
    // Power factor at 100 °C was added to the routine package in 2013.
    r.cells.push_back(old_lims ? "" : num(lerp(u.q_start.pf100, u.q_end.pf100, f) * (1 + 0.05 * rng.normal()), 2));
    r.cells.push_back(num(std::round(lerp(u.q_start.color, u.q_end.color, f) * 2) / 2, 1));
    // Furans every third year, yearly on units with ageing paper.
    const bool furans = u.fal_end_ppb > 1000 || (civil_from_days(s.date).year - u.history_from) % 3 == 0;
    r.cells.push_back(furans ? furan_text(u, s.date, f, rng) : "");
  } else {
    for (int i = 0; i < 8; ++i) r.cells.push_back("");
  }
  const CivilDate c = civil_from_days(s.date);
  char ref[32];
  std::snprintf(ref, sizeof ref, "QL-%04d-%s-%03d", c.year, u.id, seq);
  r.cells.push_back(ref);
  r.cells.push_back("main_tank");
  return r;
}

bool write_oil_history(const Unit& u, const fs::path& dir) {
  Rng rng = stream(u.id, "oil");
  DropFile f(dir, std::string("QL-history-") + u.id + ".csv");
  f.line(
      "unit_id,sample_date,h2_ppm,ch4_ppm,c2h6_ppm,c2h4_ppm,c2h2_ppm,co_ppm,co2_ppm,o2_ppm,n2_ppm,"
      "moisture_ppm,oil_temp_c,breakdown_kv,breakdown_method,acidity_mgkoh_g,ift_mn_m,pf25_pct,"
      "pf100_pct,color,furan_2fal_ppb,lab_ref,sample_point");
  int seq = 1;
  for (const Sample& s : sample_dates(u)) f.line(oil_row(u, s, seq++, rng).join());
  return f.commit();
}

// ================================================================ infrared
struct Survey {
  Day date;
  const char* name;
};

const std::array<Survey, 3> kSurveys = {{
    {D(2024, 7, 16), "2024-07"},
    {D(2025, 8, 12), "2025-08"},
    {D(2026, 8, 4), "2026-08"},
}};

// Excess over the other phases of TKQ-T1's LV bushing X2 connector, per survey.
constexpr std::array<double, 3> kHotConnectorExcess = {4.0, 11.0, 37.5};

void infrared_rows(const Unit& u, int survey_index, int unit_index, DropFile& f) {
  const Survey& sv = kSurveys[survey_index];
  Rng rng = stream(u.id, std::string("ir-") + sv.name);
  // The crew works the yards in a fixed order through the early afternoon.
  const long long utc = static_cast<long long>(sv.date) * 86400 + (11 + unit_index % 4) * 3600LL;
  const double ambient = ambient_expected(site_of(u), utc) + 1.2 * rng.normal();
  const double k = load_at(u, utc, ambient);
  const std::string date = format_day(sv.date);
  const std::string load = num(k * 100, 0);
  int image = 1;
  auto row = [&](const std::string& comp, double spot, const std::string& ref, double emis,
                 const std::string& note) {
    char img[40];
    std::snprintf(img, sizeof img, "LT%s-%s-%02d", sv.name, u.id, image++);
    f.line(std::string(u.id) + "," + date + "," + comp + "," + num(spot, 1) + "," + ref + "," +
           num(ambient, 1) + "," + load + "," + num(emis, 2) + "," + img + "," + note);
  };
  // Three phases of each connector group: rise grows with the square of load.
  // Sound connectors of one group agree within a few tenths of a kelvin; a
  // larger spread would read, once corrected to rated load, as the NETA
  // "possible deficiency" (1-3 K) on healthy units.
  auto phases = [&](const char* side, const char* letter, double rated_rise) {
    std::array<double, 3> spot{};
    for (int p = 0; p < 3; ++p) spot[p] = ambient + 1.5 + rated_rise * k * k + 0.12 * rng.normal();
    const bool hot = std::string_view(u.id) == "TKQ-T1" && std::string_view(letter) == "X";
    if (hot) spot[1] = std::min(spot[0], spot[2]) + kHotConnectorExcess[survey_index];
    for (int p = 0; p < 3; ++p) {
      // The crew quotes the cooler of the two other phases as the reference.
      const double ref = std::min(spot[(p + 1) % 3], spot[(p + 2) % 3]);
      std::string note;
      if (hot && p == 1)
        note = survey_index == 2 ? "X2 palm and clamp hot; discoloured; repair immediately"
                                 : "X2 clamp warmer than X1 and X3; recheck";
      row(std::string(side) + " bushing " + letter + std::to_string(p + 1) + " connector", spot[p],
          num(ref, 1), 0.90, note);
    }
  };
  phases("HV", "H", 4.0);
  phases("LV", "X", 9.0);
  // Tank and coolers are recorded as thermal patterns: no similar component
  // for the tank; forced-cooled units have two cooler banks to compare.
  const OilThermal p = oil_thermal(u.cooling);
  const double top_rise = std::pow((1 + k * k * p.R) / (1 + p.R), p.x) * p.rise_k;
  const bool fans_out = std::string_view(u.id) == "CRW-T3" && survey_index >= 1;
  const double tank = ambient + 0.85 * top_rise * (fans_out ? 1.5 : 1.0) + 0.5 * rng.normal();
  row("main tank top", tank, "", 0.95, "");
  if (std::string_view(u.cooling) == "ONAN") {
    row("radiators", tank - 6 - 2 * rng.uniform(), "", 0.95, "");
    return;
  }
  const double bank1 = tank - 7 - 2 * rng.uniform();
  const double bank2 = fans_out ? bank1 + 7.5 : bank1 + 0.6 * rng.normal();
  row("cooler bank 1", bank1, num(bank2, 1), 0.95, "");
  row("cooler bank 2", bank2, num(bank1, 1), 0.95,
      fans_out ? "fans of bank 2 not running; bank warmer than bank 1" : "");
}

bool write_infrared_surveys(const fs::path& dir) {
  for (int s = 0; s < static_cast<int>(kSurveys.size()); ++s) {
    DropFile f(dir, std::string("IR-survey-") + kSurveys[s].name + ".csv");
    f.line("unit_id,survey_date,component,spot_c,reference_c,ambient_c,load_pct,emissivity,image_ref,note");
    int index = 0;
    for (const Unit& u : fleet()) infrared_rows(u, s, index++, f);
    if (!f.commit()) return false;
  }
  return true;
}

// ================================================================ inspection
const std::array<const char*, 12> kItems = {
    "bushings",       "main_tank",       "gaskets_and_leaks",   "conservator_and_oil_level",
    "breather",       "cooling_fans_and_pumps", "radiators",    "on_load_tap_changer",
    "control_cabinet", "grounding",      "foundation",          "surge_arresters"};

// Typical wording of a "fair" finding, per item.
const char* fair_note(std::string_view item) {
  if (item == "bushings") return "light pollution on porcelain; clean at next outage";
  if (item == "main_tank") return "paint chalking and surface rust on tank lid";
  if (item == "gaskets_and_leaks") return "slight weep at a radiator flange";
  if (item == "conservator_and_oil_level") return "level gauge glass fogged; level reads normal";
  if (item == "breather") return "silica gel one-third discoloured";
  if (item == "cooling_fans_and_pumps") return "one fan noisy bearing";
  if (item == "radiators") return "fins partly blocked by debris";
  if (item == "on_load_tap_changer") return "operation counter high; maintenance due";
  if (item == "control_cabinet") return "heater not working; some condensation";
  if (item == "grounding") return "surface corrosion on earth clamps";
  if (item == "foundation") return "hairline cracks in plinth";
  return "counter not readable";
}

struct Override {
  const char* unit;
  const char* item;
  int from_year;
  const char* rating;
  const char* note;
};

// Storyline findings; the latest matching row (by from_year) wins.
const std::vector<Override> kOverrides = {
    {"CRW-T1", "gaskets_and_leaks", 2019, "fair", "weeping at radiator flanges and drain valve"},
    {"CRW-T1", "gaskets_and_leaks", 2023, "poor", "active leaks at radiator flanges; oil on plinth; top-ups every quarter"},
    {"CRW-T1", "main_tank", 2021, "poor", "corrosion through paint on tank base and cover; pitting at lifting lugs"},
    {"CRW-T1", "bushings", 2020, "fair", "HV bushing oil-level sight glasses discoloured"},
    {"CRW-T1", "on_load_tap_changer", 2022, "fair", "diverter overdue for maintenance; obsolete spares"},
    {"CRW-T3", "cooling_fans_and_pumps", 2025, "poor", "fan groups 2 and 3 not running; contactors burnt; repair deferred"},
    {"PLW-T1", "breather", 2022, "fair", "silica gel two-thirds discoloured"},
    {"PLW-T1", "breather", 2024, "poor", "silica gel fully saturated; oil seal cup dry; breather not maintained"},
    {"PLW-T1", "conservator_and_oil_level", 2024, "fair", "rust streaks below conservator; water in drain sample"},
    {"PLW-T2", "radiators", 2025, "fair", "radiators very hot to the touch at afternoon peak"},
    {"TKQ-T1", "bushings", 2026, "fair", "discoloured palm on LV bushing X2; see infrared survey"},
    {"TKQ-T2", "grounding", 2026, "unsafe", "main tank earth conductor cut and removed (theft); tank not bonded to the earth grid; area cordoned"},
};

const Override* find_override(std::string_view unit, std::string_view item, int year) {
  const Override* best = nullptr;
  for (const Override& o : kOverrides)
    if (unit == o.unit && item == o.item && year >= o.from_year) best = &o;
  return best;
}

// Inspection day of each site, by month and day; the years 2018-2026.
struct SiteVisit {
  const char* site;
  int month, day;
  const char* inspector;
};

const std::array<SiteVisit, 5> kVisits = {{
    {"CRW", 9, 15, "BF-114"},
    {"VNM", 10, 6, "BF-121"},
    {"PLW", 6, 10, "BF-114"},
    {"OSB", 5, 12, "BF-108"},
    {"TKQ", 10, 14, "BF-121"},
}};

bool write_inspections(const fs::path& dir) {
  for (const SiteVisit& v : kVisits) {
    for (int year = 2018; year <= 2026; ++year) {
      DropFile f(dir, std::string("inspection-") + v.site + "-" + std::to_string(year) + ".csv");
      f.line("unit_id,inspection_date,item,rating,note,inspector");
      const std::string date = format_day(days_from_civil(year, v.month, v.day));
      int units = 0;
      for (const Unit& u : fleet()) {
        if (std::string_view(u.site) != v.site || u.year_built > year) continue;
        ++units;
        for (const char* item : kItems) {
          const std::string_view it(item);
          if (it == "cooling_fans_and_pumps" && std::string_view(u.cooling) == "ONAN") continue;
          // Each item of each unit turns "fair" in a year drawn once from its
          // own stream; younger units rarely get there within the record.
          Rng rng = stream(u.id, std::string("wear-") + item);
          const int fair_from = u.year_built + 28 + static_cast<int>(rng.uniform() * 45);
          std::string rating = year >= fair_from ? "fair" : "good";
          std::string note = year >= fair_from ? fair_note(it) : "";
          if (const Override* o = find_override(u.id, it, year)) {
            rating = o->rating;
            note = o->note;
          }
          f.line(std::string(u.id) + "," + date + "," + item + "," + rating + "," + note + "," + v.inspector);
        }
      }
      if (units > 0 && !f.commit()) return false;
    }
  }
  return true;
}

// ================================================================ main
bool make_dir(const fs::path& p) {
  std::error_code ec;
  fs::create_directories(p, ec);
  return !ec;
}

}  // namespace

int main(int argc, char** argv) {
  if (argc != 2) {
    std::fprintf(stderr, "usage: ferrum_demo_gen OUTDIR\n");
    return 2;
  }
  const fs::path out = argv[1];
  const fs::path lab = out / "quorlan_labs", ir = out / "lanterfield_thermo",
                 field = out / "brevitt_field", planning = out / "teb_planning";
  for (const fs::path& p : {lab, ir, field, planning}) {
    if (!make_dir(p)) {
      std::fprintf(stderr, "ferrum_demo_gen: cannot create %s\n", p.c_str());
      return 1;
    }
  }
  bool ok = true;
  for (const Unit& u : fleet()) ok = write_oil_history(u, lab) && ok;
  ok = write_infrared_surveys(ir) && ok;
  ok = write_inspections(field) && ok;
  for (const Site& s : kSites) {
    const std::vector<double> amb = ambient_series(s);
    for (const Unit& u : fleet())
      if (std::string_view(u.site) == s.code) ok = write_load_file(u, amb, planning) && ok;
  }
  if (!ok) {
    std::fprintf(stderr, "ferrum_demo_gen: writing under %s failed\n", out.c_str());
    return 1;
  }
  return 0;
}
