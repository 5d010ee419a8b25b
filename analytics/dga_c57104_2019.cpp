#include "analytics/dga_c57104_2019.h"

#include <algorithm>
#include <charconv>
#include <cstdio>

#include "analytics/dga_gases.h"
#include "analytics/embedded_tables.h"

namespace ferrum::analytics {
namespace {

constexpr std::string_view kHeader = "table,o2n2,age,H2,CH4,C2H6,C2H4,C2H2,CO,CO2";
constexpr const char* kAgeNames[4] = {"unknown", "1-9", "10-30", ">30"};

std::string_view trim(std::string_view s) {
  while (!s.empty() && (s.front() == ' ' || s.front() == '\t')) s.remove_prefix(1);
  while (!s.empty() && (s.back() == ' ' || s.back() == '\t' || s.back() == '\r')) s.remove_suffix(1);
  return s;
}

std::vector<std::string_view> split(std::string_view line) {
  std::vector<std::string_view> out;
  for (std::size_t start = 0;;) {
    const std::size_t comma = line.find(',', start);
    out.push_back(trim(line.substr(start, comma - start)));
    if (comma == std::string_view::npos) return out;
    start = comma + 1;
  }
}

std::optional<double> number(std::string_view s) {
  double v = 0;
  auto [end, ec] = std::from_chars(s.data(), s.data() + s.size(), v);
  if (ec != std::errc() || end != s.data() + s.size() || !(v >= 0)) return std::nullopt;
  return v;
}

// Parses one data row into `tables`; returns an error text or "".
std::string parse_row(const std::vector<std::string_view>& f, C57104_2019Tables& tables,
                      std::array<int, 20>& seen) {
  if (f.size() != 10) return "expected 10 fields, found " + std::to_string(f.size());
  int table = 0;
  if (f[0] == "1" || f[0] == "2" || f[0] == "3" || f[0] == "4") table = f[0][0] - '0';
  else return "table must be 1, 2, 3 or 4";
  int group = f[1] == "low" ? 0 : f[1] == "high" ? 1 : -1;
  if (group < 0) return "o2n2 must be 'low' or 'high'";
  int age = -1;
  if (table <= 2) {
    for (int i = 0; i < 4; ++i)
      if (f[2] == kAgeNames[i]) age = i;
    if (age < 0) return "age must be unknown, 1-9, 10-30 or >30 for tables 1 and 2";
  } else if (f[2] != "any") {
    return "age must be 'any' for tables 3 and 4";
  }
  C57104_2019Row row;
  for (std::size_t g = 0; g < 7; ++g) {
    if (f[3 + g] == "any" && table >= 3) continue;  // nullopt: any increase
    row[g] = number(f[3 + g]);
    if (!row[g]) return "bad value '" + std::string(f[3 + g]) + "' for " + gas_name(kAllGases[g]);
  }
  const int key = table <= 2 ? (table - 1) * 8 + group * 4 + age : 16 + (table - 3) * 2 + group;
  if (seen[key]++) return "duplicate row";
  if (table == 1) tables.table1[group][age] = row;
  if (table == 2) tables.table2[group][age] = row;
  if (table == 3) tables.table3[group] = row;
  if (table == 4) tables.table4[group] = row;
  return "";
}

double stricter(std::optional<double> a, std::optional<double> b) {
  if (!a) return b.value_or(0);
  if (!b) return *a;
  return std::min(*a, *b);
}

// Threshold of one gas in a table row for the O2/N2 group (nullopt group =
// unknown ratio: the lower of the two). nullopt result = "any increase".
std::optional<double> threshold(const std::array<C57104_2019Row, 2>& rows, std::optional<int> group, std::size_t g) {
  if (group) return rows[*group][g];
  if (!rows[0][g] || !rows[1][g]) return std::nullopt;
  return stricter(rows[0][g], rows[1][g]);
}

std::string fmt(const char* f, double a, double b) {
  char buf[96];
  std::snprintf(buf, sizeof buf, f, a, b);
  return buf;
}

}  // namespace

C57104_2019TablesParse parse_c57104_2019_tables(std::string_view text) {
  C57104_2019TablesParse r;
  C57104_2019Tables tables;
  std::array<int, 20> seen{};
  bool header = false;
  int line_no = 0;
  for (std::size_t pos = 0; pos <= text.size();) {
    std::size_t nl = text.find('\n', pos);
    if (nl == std::string_view::npos) nl = text.size();
    const std::string_view line = trim(text.substr(pos, nl - pos));
    pos = nl + 1;
    ++line_no;
    if (line.empty() || line.front() == '#') continue;
    if (!header) {
      if (line != kHeader) {
        r.error_line = line_no;
        r.error = "expected header '" + std::string(kHeader) + "'";
        return r;
      }
      header = true;
      continue;
    }
    std::string err = parse_row(split(line), tables, seen);
    if (!err.empty()) {
      r.error_line = line_no;
      r.error = err;
      return r;
    }
  }
  for (int k = 0; k < 20; ++k) {
    if (seen[k]) continue;
    r.error_line = line_no;
    r.error = k < 16 ? "missing row: table " + std::to_string(k / 8 + 1) + ", o2n2 " +
                           (k % 8 < 4 ? "low" : "high") + ", age " + kAgeNames[k % 4]
                     : "missing row: table " + std::to_string((k - 16) / 2 + 3) + ", o2n2 " +
                           (k % 2 ? "high" : "low");
    return r;
  }
  r.tables = tables;
  return r;
}

std::string_view default_c57104_2019_tables_text() {
  return embedded_data_file("ieee_c57104_2019_tables.csv");
}

const C57104_2019Tables& default_c57104_2019_tables() {
  // The embedded file is checked by a unit test; an empty table set would
  // only arise from a broken build.
  static const C57104_2019Tables tables =
      parse_c57104_2019_tables(default_c57104_2019_tables_text()).tables.value_or(C57104_2019Tables{});
  return tables;
}

AgeGroup c57104_2019_age_group(std::optional<double> age) {
  if (!age || *age < 0) return AgeGroup::unknown;
  if (*age < 10) return AgeGroup::y1_9;
  if (*age <= 30) return AgeGroup::y10_30;
  return AgeGroup::over30;
}

C57104_2019Status c57104_2019_status(const std::vector<OilSample>& history, std::optional<double> age_years,
                                     const C57104_2019Tables& t, const GasTrendOptions& trend_options) {
  C57104_2019Status r;
  std::vector<OilSample> samples;
  for (const OilSample& s : history)
    if (has_gas_analysis(s)) samples.push_back(s);
  std::sort(samples.begin(), samples.end(), [](const OilSample& a, const OilSample& b) { return a.date < b.date; });
  if (samples.empty()) {
    r.why_not = "no dissolved gas analysis";
    return r;
  }
  const OilSample& last = samples.back();
  const OilSample* prev = samples.size() > 1 ? &samples[samples.size() - 2] : nullptr;

  std::optional<int> group;
  if (last.o2.is_measured() && last.n2.is_measured() && last.n2.value > 0) {
    r.o2_n2 = last.o2.value / last.n2.value;
    group = *r.o2_n2 <= 0.2 ? 0 : 1;
    r.o2n2_group = *group == 0 ? "<= 0.2" : "> 0.2";
  } else {
    r.o2n2_group = "unknown (stricter of both)";
  }
  const int age = static_cast<int>(c57104_2019_age_group(age_years));
  r.age_group = kAgeNames[age];
  const std::array<C57104_2019Row, 2> t1 = {t.table1[0][age], t.table1[1][age]};
  const std::array<C57104_2019Row, 2> t2 = {t.table2[0][age], t.table2[1][age]};

  int status = 0;
  std::string reason;
  auto raise = [&](int s, const std::string& why) {
    if (s > status) { status = s; reason = why; }
  };
  for (std::size_t g = 0; g < kAllGases.size(); ++g) {
    const Gas gas = kAllGases[g];
    const auto v = gas_ppm_or_zero(last, gas);
    if (!v) continue;
    const std::string name = gas_name(gas);
    const double l1 = threshold(t1, group, g).value_or(0), l2 = threshold(t2, group, g).value_or(0);
    // Change between consecutive samples (Table 3) and regression rate (Table 4).
    bool changing = false;
    std::string change_text;
    if (prev) {
      if (auto p = gas_ppm_or_zero(*prev, gas)) {
        const double delta = *v - *p;
        const auto l3 = threshold(t.table3, group, g);
        if (l3 ? delta > *l3 : (delta > 0 && gas_value(last, gas).is_measured())) {
          changing = true;
          change_text = name + fmt(" rose %.4g ppm since the previous sample (Table 3 limit %.4g)", delta, l3.value_or(0));
        }
      }
    }
    const GasTrend trend = gas_trend(samples, gas, trend_options);
    if (trend.applicable) {
      const auto l4 = threshold(t.table4, group, g);
      if (l4 ? *trend.ppm_per_year > *l4 : *trend.ppm_per_year > 0) {
        changing = true;
        change_text = name + fmt(" rising %.4g ppm/year (Table 4 limit %.4g)", *trend.ppm_per_year, l4.value_or(0));
      }
    }
    if (*v > l2) raise(3, name + fmt(" %.4g ppm above Table 2 (%.4g)", *v, l2));
    else if (*v > l1 && changing) raise(3, name + fmt(" %.4g ppm above Table 1 (%.4g) and ", *v, l1) + change_text);
    else if (*v > l1) raise(2, name + fmt(" %.4g ppm above Table 1 (%.4g)", *v, l1));
    else if (changing) raise(2, change_text);
  }
  r.applicable = true;
  r.status = std::max(status, 1);
  r.reason = status <= 1 ? "all gases within Table 1, no significant change" : reason;
  return r;
}

}  // namespace ferrum::analytics
