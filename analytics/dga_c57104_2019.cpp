#include "analytics/dga_c57104_2019.h"

#include <algorithm>
#include <cstdio>

#include "analytics/dga_gases.h"
#include "analytics/standard_tables.h"

namespace ferrum::analytics {
namespace {

constexpr const char* kAgeNames[4] = {"unknown", "1-9", "10-30", ">30"};

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
  StandardTables t = embedded_standard_tables();
  if (auto err = apply_table_file("ieee_c57104_2019.csv", text, "", t)) {
    r.error_line = err->line;
    r.error_column = err->column;
    r.error = err->message;
    return r;
  }
  r.tables = t.c57104_2019;
  return r;
}

std::string_view default_c57104_2019_tables_text() { return embedded_table_text("ieee_c57104_2019.csv"); }

const C57104_2019Tables& default_c57104_2019_tables() { return standard_tables().c57104_2019; }

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

  auto times = [](double v, double limit) { return limit > 0 ? v / limit : 1e9; };  // "any increase": limit 0
  for (std::size_t g = 0; g < kAllGases.size(); ++g) {
    const Gas gas = kAllGases[g];
    const auto v = gas_ppm_or_zero(last, gas);
    if (!v) continue;
    const std::string name = gas_name(gas);
    const double l1 = threshold(t1, group, g).value_or(0), l2 = threshold(t2, group, g).value_or(0);
    // Change between consecutive samples (Table 3) and regression rate (Table 4).
    bool changing = false;
    double change_times = 0;
    std::string change_text;
    if (prev) {
      if (auto p = gas_ppm_or_zero(*prev, gas)) {
        const double delta = *v - *p;
        const auto l3 = threshold(t.table3, group, g);
        if (l3 ? delta > *l3 : (delta > 0 && gas_value(last, gas).is_measured())) {
          changing = true;
          change_times = times(delta, l3.value_or(0));
          change_text = name + fmt(" rose %.4g ppm since the previous sample (Table 3 limit %.4g)", delta, l3.value_or(0));
        }
      }
    }
    const GasTrend trend = gas_trend(samples, gas, trend_options);
    if (trend.applicable) {
      const auto l4 = threshold(t.table4, group, g);
      if (l4 ? *trend.ppm_per_year > *l4 : *trend.ppm_per_year > 0) {
        changing = true;
        change_times = times(*trend.ppm_per_year, l4.value_or(0));
        change_text = name + fmt(" rising %.4g ppm/year (Table 4 limit %.4g)", *trend.ppm_per_year, l4.value_or(0));
      }
    }
    if (*v > l2) r.drivers.push_back({name, 3, times(*v, l2), name + fmt(" %.4g ppm above Table 2 (%.4g)", *v, l2)});
    else if (*v > l1 && changing)
      r.drivers.push_back({name, 3, times(*v, l1), name + fmt(" %.4g ppm above Table 1 (%.4g) and ", *v, l1) + change_text});
    else if (*v > l1) r.drivers.push_back({name, 2, times(*v, l1), name + fmt(" %.4g ppm above Table 1 (%.4g)", *v, l1)});
    else if (changing) r.drivers.push_back({name, 2, change_times, change_text});
  }
  std::stable_sort(r.drivers.begin(), r.drivers.end(), [](const auto& a, const auto& b) {
    return a.status != b.status ? a.status > b.status : a.times_limit > b.times_limit;
  });
  const int status = r.drivers.empty() ? 1 : r.drivers.front().status;
  std::string reason;
  for (const auto& d : r.drivers) reason += (reason.empty() ? "" : "; ") + d.text;
  r.applicable = true;
  r.status = std::max(status, 1);
  r.reason = status <= 1 ? "all gases within Table 1, no significant change" : reason;
  return r;
}

}  // namespace ferrum::analytics
