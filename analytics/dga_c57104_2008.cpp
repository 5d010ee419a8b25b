#include "analytics/dga_c57104_2008.h"

#include <algorithm>
#include <cmath>
#include <cstdio>

#include "analytics/standard_tables.h"

namespace ferrum::analytics {
namespace {

int level_of(double ppm, const std::array<double, 3>& bounds) {
  for (int i = 0; i < 3; ++i)
    if (ppm <= bounds[i]) return i + 1;
  return 4;
}

std::string describe(const char* what, double ppm, int condition) {
  char buf[96];
  std::snprintf(buf, sizeof buf, "%s %.0f ppm (Condition %d)", what, ppm, condition);
  return buf;
}

}  // namespace

int c57104_2008_gas_condition(Gas gas, double ppm) {
  return level_of(ppm, standard_tables().c57104_2008.gas_bounds[gas_index(gas)]);
}

int c57104_2008_tdcg_condition(double tdcg) { return level_of(tdcg, standard_tables().c57104_2008.tdcg_bounds); }

std::optional<double> tdcg_ppm(const OilSample& sample) {
  double sum = 0;
  for (Gas g : kCombustibleGases) {
    auto v = gas_ppm_or_zero(sample, g);
    if (!v) return std::nullopt;
    sum += *v;
  }
  return sum;
}

C57104_2008Condition classify_c57104_2008(const OilSample& sample) {
  C57104_2008Condition r;
  int worst = 0, worst_fault = 0;
  for (Gas g : kAllGases) {
    auto v = gas_ppm_or_zero(sample, g);
    if (!v) continue;
    int c = c57104_2008_gas_condition(g, *v);
    r.gas_condition[gas_index(g)] = c;
    if (g != Gas::co && g != Gas::co2) worst_fault = std::max(worst_fault, c);
    if (c > worst) {
      worst = c;
      r.deciding = describe(gas_name(g), *v, c);
    }
  }
  r.tdcg_ppm = tdcg_ppm(sample);
  if (r.tdcg_ppm) {
    r.tdcg_condition = c57104_2008_tdcg_condition(*r.tdcg_ppm);
    worst_fault = std::max(worst_fault, *r.tdcg_condition);
    // On a tie the total decides: the guide's conditions are defined on TDCG.
    if (*r.tdcg_condition >= worst) {
      worst = *r.tdcg_condition;
      r.deciding = describe("TDCG", *r.tdcg_ppm, worst);
    }
  }
  if (worst == 0) {
    r.why_not = "no dissolved gas analysed";
    return r;
  }
  r.applicable = true;
  r.condition = worst;
  r.fault_condition = worst_fault;
  const int basis = c57104_2008_table3_basis(r).condition.value_or(0);
  for (Gas g : kAllGases) {
    const auto& c = r.gas_condition[gas_index(g)];
    if (c && *c > basis) r.gases_above_tdcg.push_back({g, *gas_ppm_or_zero(sample, g), *c});
  }
  std::stable_sort(r.gases_above_tdcg.begin(), r.gases_above_tdcg.end(),
                   [](const auto& a, const auto& b) { return a.condition > b.condition; });
  return r;
}

C57104_2008Table3Basis c57104_2008_table3_basis(const C57104_2008Condition& c) {
  C57104_2008Table3Basis b;
  if (c.tdcg_ppm && c.tdcg_condition) {
    b.condition = c.tdcg_condition;
    b.basis = describe("TDCG", *c.tdcg_ppm, *c.tdcg_condition);
  } else if (c.fault_condition) {
    b.condition = c.fault_condition;
    b.basis = "TDCG undefined (a combustible gas not analysed): fault-gas Condition " +
              std::to_string(*c.fault_condition);
  }
  return b;
}

std::optional<double> tdcg_rate_ppm_per_day(const OilSample& earlier, const OilSample& later) {
  const int days = later.date - earlier.date;
  if (days < 1) return std::nullopt;
  auto a = tdcg_ppm(earlier), b = tdcg_ppm(later);
  if (!a || !b) return std::nullopt;
  return (*b - *a) / days;
}

C57104_2008Procedure c57104_2008_table3(int condition, std::optional<double> rate, double hv_kv,
                                        const C57104_2008Table3Options& options) {
  C57104_2008Procedure p;
  if (condition < 1 || condition > 4) {
    p.why_not = "no C57.104-2008 condition";
    return p;
  }
  p.applicable = true;
  p.condition = condition;
  p.rate_ppm_per_day = rate;
  int column = 2;
  if (!rate) {
    p.rate_band = "unknown";
  } else if (*rate > 30) {
    column = 0;
    p.rate_band = ">30";
  } else if (*rate >= 10) {
    column = 1;
    p.rate_band = "10-30";
  } else {
    p.rate_band = "<10";
  }
  const auto& cell = standard_tables().c57104_2008.table3[condition - 1][column];
  p.interval = cell.interval;
  p.interval_days = cell.days;
  p.action = cell.procedure;
  if (condition == 1 && column == 2 && hv_kv >= options.ehv_threshold_kv) {
    p.interval = "6-monthly";
    p.interval_days = 182;
  }
  if (!rate) p.action += " (TDCG rate unknown: resample to establish the trend)";
  return p;
}

}  // namespace ferrum::analytics
