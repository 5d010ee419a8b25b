// ferrum_demo_gen, electrical field tests: outage test sets of 2016, 2021
// and 2026 for every unit of the demo fleet except the sparse TKQ-T3, as
// the invented testing contractor vornhal_testing delivers them (one file per
// site and outage year).
//
// Storylines (storylines.tsv, README.md):
//   OSB-T2  turns ratio of phase B falls -0.12 % (2021) then -0.85 % (2026):
//           a shorted-turn-like deviation beyond the ±0.5 % tolerance.
//   VNM-T2  bushing H2 (C1) power factor rises 0.31 -> 0.42 -> 0.74 %, more
//           than twice its first test; C1 capacitance +3.1 % (still within
//           5 %): investigate the bushing, not the unit.
// Every other reading is an ordinary value for the unit's age, with a small
// deterministic scatter. The units table must agree with
// drops/teb_planning/units-register.csv (voltages, vector group, taps,
// impedance).
#include <algorithm>
#include <cmath>
#include <cstdint>
#include <cstdio>
#include <filesystem>
#include <string>
#include <string_view>
#include <vector>

#include "analytics/calendar.h"

namespace fs = std::filesystem;

namespace {

using ferrum::analytics::days_from_civil;
using ferrum::analytics::format_day;

struct ElectricalUnit {
  const char* id;
  const char* site;
  int year_built;
  double hv_kv, lv_kv;
  const char* group;      // vector group of the register
  double impedance_pct;   // register impedance_pct
  double r75_hv_ohm;      // HV phase-winding resistance at 75 °C, tap 9
  double excitation_ma;   // outer-phase excitation current at 10 kV
};

// Tap changer of every unit: 17 positions, nominal 9, 1.25 % (register).
constexpr int kTapNominal = 9;
constexpr double kTapStepPct = 1.25;

const std::vector<ElectricalUnit>& units() {
  static const std::vector<ElectricalUnit> u = {
      {"CRW-T1", "CRW", 1968, 132, 33, "YNd1", 12.5, 0.92, 31},
      {"CRW-T2", "CRW", 2019, 132, 33, "YNd1", 12.5, 0.88, 24},
      {"CRW-T3", "CRW", 1996, 132, 33, "YNd1", 11.8, 1.05, 27},
      {"VNM-T1", "VNM", 1983, 132, 33, "YNyn0d1", 10.5, 1.40, 22},
      {"VNM-T2", "VNM", 1985, 132, 33, "YNyn0d1", 10.5, 1.42, 22},
      {"VNM-T3", "VNM", 1977, 33, 11, "Dyn11", 8.0, 0.61, 14},
      {"PLW-T1", "PLW", 1979, 66, 11, "Dyn11", 10.0, 0.74, 18},
      {"PLW-T2", "PLW", 2002, 66, 11, "Dyn11", 10.0, 0.70, 17},
      {"PLW-T3", "PLW", 1971, 66, 11, "Dyn1", 8.0, 0.95, 15},
      {"OSB-T1", "OSB", 1991, 33, 11, "Dyn11", 8.5, 0.52, 12},
      {"OSB-T2", "OSB", 1993, 33, 11, "Dyn11", 8.5, 0.53, 12},
      {"OSB-T3", "OSB", 2008, 33, 11, "Dyn11", 7.5, 0.66, 10},
      {"TKQ-T1", "TKQ", 2012, 33, 11, "Dyn11", 8.5, 0.45, 13},
      {"TKQ-T2", "TKQ", 2012, 33, 11, "Dyn11", 8.5, 0.45, 13},
  };
  return u;
}

// Outage month and day per site.
struct Outage {
  const char* site;
  int month, day;
};
constexpr Outage kOutages[] = {{"CRW", 4, 14}, {"VNM", 5, 5}, {"PLW", 4, 22}, {"OSB", 3, 17}, {"TKQ", 6, 9}};
constexpr int kYears[] = {2016, 2021, 2026};

// Deterministic scatter in [-1, 1] from a name (FNV-1a).
double scatter(const std::string& what) {
  std::uint64_t h = 0xCBF29CE484222325ULL;
  for (unsigned char c : what) h = (h ^ c) * 0x100000001B3ULL;
  h ^= h >> 29;
  return static_cast<double>(h % 20001) / 10000.0 - 1.0;
}

std::string num(double v, int decimals) {
  char buf[32];
  std::snprintf(buf, sizeof buf, "%.*f", decimals, v);
  return buf;
}

// Phase ratio a test set reads (HV-LV pair; winding connections).
double phase_ratio(const ElectricalUnit& u, int tap) {
  const double hv = u.hv_kv * (1 + (kTapNominal - tap) * kTapStepPct / 100);
  const std::string_view g = u.group;
  if (g.starts_with("D") && g[1] == 'y') return std::sqrt(3.0) * hv / u.lv_kv;
  if (g.starts_with("YNd") || g.starts_with("Yd")) return hv / (std::sqrt(3.0) * u.lv_kv);
  return hv / u.lv_kv;  // YNyn0d1: the HV-LV pair is star-star
}

// Ordinary insulation condition by age at the test: power factor at 20 °C
// and polarization index.
double age_pf(int age) { return 0.20 + 0.012 * age; }
double age_pi(int age) { return std::max(1.3, 2.8 - 0.025 * age); }

constexpr const char* kHeader =
    "unit_id,test_date,test,phase,tap,winding,temp_c,insulation,test_kv,bushing,minutes,ratio,resistance_ohm,"
    "power_factor_pct,capacitance_pf,resistance_megohm,current_ma,impedance_pct,nameplate_value,note,crew";

// One row; the value goes in column `value_col` (0 = ratio .. 6 = impedance_pct).
struct Row {
  std::string unit, date, test, phase, tap, winding, temp, insulation, kv, bushing, minutes;
  int value_col = 0;
  std::string value, capacitance, nameplate, note;
};

std::string line(const Row& r) {
  std::string values[7];
  values[r.value_col] = r.value;
  if (!r.capacitance.empty()) values[3] = r.capacitance;
  std::string out = r.unit + "," + r.date + "," + r.test + "," + r.phase + "," + r.tap + "," + r.winding + "," +
                    r.temp + "," + r.insulation + "," + r.kv + "," + r.bushing + "," + r.minutes;
  for (const auto& v : values) out += "," + v;
  return out + "," + r.nameplate + "," + r.note + ",KT-" + r.date.substr(0, 4);
}

void unit_rows(const ElectricalUnit& u, int year, const std::string& date, std::vector<std::string>& out) {
  const int age = year - u.year_built;
  const std::string id = u.id;
  const std::string key = id + "/" + std::to_string(year) + "/";
  const bool three_winding = std::string_view(u.group) == "YNyn0d1";
  const char* phases[] = {"A", "B", "C"};
  // Turns ratio at the nominal tap, and at taps 1 and 17 in 2026.
  std::vector<int> taps = {kTapNominal};
  if (year == 2026) taps = {1, kTapNominal, 17};
  for (int tap : taps) {
    for (const char* ph : phases) {
      double deviation = 0.0004 * scatter(key + "ratio" + ph + std::to_string(tap));
      if (id == "OSB-T2" && std::string_view(ph) == "B")
        deviation += year == 2026 ? -0.0085 : year == 2021 ? -0.0012 : 0;
      const double ratio = phase_ratio(u, tap) * (1 + deviation);
      Row r{id, date, "turns_ratio", ph, std::to_string(tap)};
      r.value_col = 0;
      r.value = num(ratio, 4);
      // ferrum has no nameplate ratio for a three-winding group: give it.
      if (three_winding) r.nameplate = num(phase_ratio(u, tap), 4);
      out.push_back(line(r));
    }
  }
  // HV winding resistance at tap 9, winding temperature of the outage day.
  const double temp = 14 + 4 * scatter(key + "temp");
  for (const char* ph : phases) {
    const double r75 = u.r75_hv_ohm * (1 + 0.003 * scatter(key + "r" + ph));
    const double measured = r75 * (234.5 + temp) / (234.5 + 75);
    Row r{id, date, "winding_resistance", ph, std::to_string(kTapNominal), "HV", num(temp, 1)};
    r.value_col = 1;
    r.value = num(measured, 4);
    out.push_back(line(r));
  }
  // Winding insulation power factor, reported at 20 °C by the test set.
  const double caps[] = {4200, 6800, 5100};
  const char* insulations[] = {"CH", "CL", "CHL"};
  for (int i = 0; i < 3; ++i) {
    Row r{id, date, "insulation_power_factor", "", "", "", "20", insulations[i], "10"};
    r.value_col = 2;
    r.value = num(age_pf(age) * (1 + 0.05 * scatter(key + "pf" + insulations[i])), 2);
    r.capacitance = num(caps[i] * u.excitation_ma / 20 * (1 + 0.002 * scatter(key + "c" + insulations[i])), 0);
    out.push_back(line(r));
  }
  // HV bushings, C1: power factor and capacitance; nameplate C1 445 pF.
  for (const char* b : {"H1", "H2", "H3"}) {
    double pf = 0.30 + 0.01 * scatter(key + "bpf" + b) + 0.002 * age / 10;
    double cap = 445 * (1 + 0.004 * scatter(key + "bc" + b));
    if (id == "VNM-T2" && std::string_view(b) == "H2") {
      pf = year == 2016 ? 0.31 : year == 2021 ? 0.42 : 0.74;
      cap = 445 * (year == 2016 ? 1.004 : year == 2021 ? 1.013 : 1.031);
    }
    Row r{id, date, "bushing_power_factor", "", "", "", "20", "C1", "10", b};
    r.value_col = 2;
    r.value = num(pf, 2);
    r.capacitance = num(cap, 0);
    r.nameplate = "445";
    out.push_back(line(r));
  }
  // Insulation resistance HV to ground at 5 kV DC, 1 and 10 minutes.
  const double r1 = 2400 - 25 * age + 200 * scatter(key + "ir");
  const double pi = age_pi(age) * (1 + 0.03 * scatter(key + "pi"));
  for (int minutes : {1, 10}) {
    Row r{id, date, "insulation_resistance", "", "", "", "20", "HV-GROUND", "5", "", std::to_string(minutes)};
    r.value_col = 4;
    r.value = num(minutes == 1 ? r1 : r1 * pi, 0);
    out.push_back(line(r));
  }
  // Excitation current at 10 kV, tap 9: outer phases similar, middle lower.
  const double share[] = {1.0, 0.71, 0.98};
  for (int i = 0; i < 3; ++i) {
    Row r{id, date, "excitation_current", phases[i], std::to_string(kTapNominal), "", "", "", "10"};
    r.value_col = 5;
    r.value = num(u.excitation_ma * share[i] * (1 + 0.01 * scatter(key + "ex" + phases[i])), 2);
    out.push_back(line(r));
  }
  // Leakage reactance, three-phase equivalent at the nominal tap.
  Row r{id, date, "leakage_reactance", "", std::to_string(kTapNominal)};
  r.value_col = 6;
  r.value = num(u.impedance_pct * (1 + 0.003 * scatter(key + "lr")), 2);
  out.push_back(line(r));
}

}  // namespace

// Writes vornhal_testing/electrical-SITE-YEAR.csv files under `dir`.
bool write_electrical_tests(const fs::path& dir) {
  for (const Outage& o : kOutages) {
    for (int year : kYears) {
      const std::string date = format_day(days_from_civil(year, o.month, o.day));
      std::vector<std::string> rows;
      for (const ElectricalUnit& u : units())
        if (std::string_view(u.site) == o.site && u.year_built < year) unit_rows(u, year, date, rows);
      if (rows.empty()) continue;
      const std::string name = std::string("electrical-") + o.site + "-" + std::to_string(year) + ".csv";
      const fs::path tmp = dir / ("." + name + ".tmp");
      std::FILE* f = std::fopen(tmp.c_str(), "wb");
      if (!f) return false;
      std::string text = std::string(kHeader) + "\n";
      for (const auto& r : rows) text += r + "\n";
      const bool ok = std::fwrite(text.data(), 1, text.size(), f) == text.size();
      if (std::fclose(f) != 0 || !ok) return false;
      std::error_code ec;
      fs::rename(tmp, dir / name, ec);
      if (ec) return false;
    }
  }
  return true;
}
