#include "analytics/standard_tables.h"

#include <atomic>
#include <cctype>
#include <charconv>
#include <cmath>
#include <functional>
#include <limits>
#include <mutex>
#include <set>
#include <stdexcept>

#include "analytics/ageing_rate.h"
#include "analytics/dga_gases.h"
#include "analytics/embedded_tables.h"
#include "analytics/load_indicators.h"

namespace ferrum::analytics {
namespace {

constexpr double kInf = std::numeric_limits<double>::infinity();

// Typed parsers report a problem by throwing; load_standard_tables turns it
// into a refusal.
struct Refused {
  TableError error;
};
[[noreturn]] void refuse(int line, int column, std::string message) { throw Refused{{line, column, std::move(message)}}; }

std::string_view trim(std::string_view s) {
  while (!s.empty() && (s.front() == ' ' || s.front() == '\t')) s.remove_prefix(1);
  while (!s.empty() && (s.back() == ' ' || s.back() == '\t' || s.back() == '\r')) s.remove_suffix(1);
  return s;
}

std::vector<std::string> split_fields(std::string_view s) {
  std::vector<std::string> out;
  for (std::size_t start = 0;;) {
    const std::size_t comma = s.find(',', start);
    out.emplace_back(trim(s.substr(start, comma - start)));
    if (comma == std::string_view::npos) return out;
    start = comma + 1;
  }
}

bool is_date(const std::string& s) {
  if (s.size() != 10 || s[4] != '-' || s[7] != '-') return false;
  for (std::size_t i : {0, 1, 2, 3, 5, 6, 8, 9})
    if (s[i] < '0' || s[i] > '9') return false;
  return true;
}

// Status fields of a finished table; errors point at the table's line.
void check_status(const DataTable& t, const DataFile& f) {
  if (t.clause.empty()) refuse(t.line, 1, "table '" + t.id + "' has no clause line");
  if (t.edition.empty() && f.edition.empty()) refuse(t.line, 1, "table '" + t.id + "' has no edition");
  if (t.columns.empty()) refuse(t.line, 1, "table '" + t.id + "' has no columns line");
  if (t.status == kStatusUnverified) return;
  if (t.status == kStatusChecked) {
    if (t.where.empty()) refuse(t.line, 1, "table '" + t.id + "': status '" + kStatusChecked + "' needs a 'where' line");
    return;
  }
  if (t.status == kStatusVerified) {
    if (t.by.empty()) refuse(t.line, 1, "table '" + t.id + "': status '" + kStatusVerified + "' needs a 'by' line (who)");
    if (!is_date(t.when))
      refuse(t.line, 1, "table '" + t.id + "': status '" + kStatusVerified + "' needs a 'when' line (YYYY-MM-DD)");
    return;
  }
  refuse(t.line, 1, "table '" + t.id + "' has no status line");
}

// --- typed readers ---------------------------------------------------------

const DataTable& table(const DataFile& f, const std::string& id) {
  for (const DataTable& t : f.tables)
    if (t.id == id) return t;
  refuse(f.last_line, 1, "table '" + id + "' is missing");
}

void expect_columns(const DataTable& t, const std::vector<std::string>& names) {
  for (std::size_t i = 0; i < std::max(names.size(), t.columns.size()); ++i) {
    if (i < names.size() && i < t.columns.size() && names[i] == t.columns[i]) continue;
    refuse(t.columns_line, static_cast<int>(i) + 2,
           "table '" + t.id + "': column " + std::to_string(i + 2) + " must be '" +
               (i < names.size() ? names[i] : std::string("(none)")) + "'");
  }
}

// A cell's 1-based column in the file ("row" is column 1).
int column_of(std::size_t cell) { return static_cast<int>(cell) + 2; }

double number(const DataTable& t, const TableRow& r, std::size_t c, double lo = 0, double hi = 1e12) {
  const std::string& s = r.cells[c];
  double v = 0;
  auto [end, ec] = std::from_chars(s.data(), s.data() + s.size(), v);
  if (s.empty() || ec != std::errc() || end != s.data() + s.size() || !(v >= lo && v <= hi))
    refuse(r.line, column_of(c), "table '" + t.id + "': '" + s + "' is not a number in the range allowed for " + t.columns[c]);
  return v;
}

int index_of(const DataTable& t, const TableRow& r, std::size_t c, const std::vector<std::string>& names) {
  for (std::size_t i = 0; i < names.size(); ++i)
    if (r.cells[c] == names[i]) return static_cast<int>(i);
  std::string list;
  for (const auto& n : names) list += (list.empty() ? "" : ", ") + n;
  refuse(r.line, column_of(c), "table '" + t.id + "': '" + r.cells[c] + "' in " + t.columns[c] + " must be one of " + list);
}

// Each key exactly once over a table's rows.
class Once {
 public:
  Once(const DataTable& t, std::size_t count) : t_(t), seen_(count, false) {}
  void mark(const TableRow& r, std::size_t key) {
    if (seen_[key]) refuse(r.line, 2, "table '" + t_.id + "': duplicate row");
    seen_[key] = true;
  }
  void require_all(const std::function<std::string(std::size_t)>& name) const {
    for (std::size_t k = 0; k < seen_.size(); ++k)
      if (!seen_[k]) refuse(t_.rows.empty() ? t_.columns_line : t_.rows.back().line, 1,
                            "table '" + t_.id + "': missing row " + name(k));
  }

 private:
  const DataTable& t_;
  std::vector<bool> seen_;
};

std::vector<std::string> gas_names() {
  std::vector<std::string> out;
  for (Gas g : kAllGases) out.push_back(gas_name(g));
  return out;
}

const std::vector<std::string> kClasses = {"le69kv", "69to230kv", "ge230kv"};
const std::vector<std::string> kCooling = {"onan_distribution", "onan", "onaf", "of", "od"};

// --- one function per file -------------------------------------------------

void read_c57104_2008(const DataFile& f, StandardTables& s) {
  const DataTable& t1 = table(f, "table1");
  expect_columns(t1, {"gas", "condition1", "condition2", "condition3"});
  std::vector<std::string> names = gas_names();
  names.push_back("TDCG");
  Once once1(t1, names.size());
  for (const TableRow& r : t1.rows) {
    const int g = index_of(t1, r, 0, names);
    once1.mark(r, g);
    std::array<double, 3> b{};
    for (std::size_t c = 0; c < 3; ++c) {
      b[c] = number(t1, r, c + 1);
      if (c > 0 && !(b[c] > b[c - 1])) refuse(r.line, column_of(c + 1), "table 'table1': bounds must increase");
    }
    if (g < 7) s.c57104_2008.gas_bounds[g] = b;
    else s.c57104_2008.tdcg_bounds = b;
  }
  once1.require_all([&](std::size_t k) { return names[k]; });

  const DataTable& t3 = table(f, "table3");
  expect_columns(t3, {"condition", "rate", "interval", "interval_days", "procedure"});
  const std::vector<std::string> conditions = {"1", "2", "3", "4"}, rates = {">30", "10-30", "<10"};
  Once once3(t3, 12);
  for (const TableRow& r : t3.rows) {
    const int c = index_of(t3, r, 0, conditions), rate = index_of(t3, r, 1, rates);
    once3.mark(r, c * 3 + rate);
    auto& cell = s.c57104_2008.table3[c][rate];
    cell.interval = r.cells[2];
    cell.days = static_cast<int>(number(t3, r, 3, 1, 3650));
    cell.procedure = r.cells[4];
    if (cell.interval.empty() || cell.procedure.empty()) refuse(r.line, column_of(cell.interval.empty() ? 2 : 4), "table 'table3': empty cell");
  }
  once3.require_all([&](std::size_t k) { return "condition " + conditions[k / 3] + ", rate " + rates[k % 3]; });
}

void read_c57104_2019(const DataFile& f, StandardTables& s) {
  std::vector<std::string> cols12 = {"o2n2", "age"}, cols34 = {"o2n2"};
  for (const auto& g : gas_names()) {
    cols12.push_back(g);
    cols34.push_back(g);
  }
  const std::vector<std::string> groups = {"low", "high"}, ages = {"unknown", "1-9", "10-30", ">30"};
  auto row_of = [](const DataTable& t, const TableRow& r, std::size_t first, bool any_allowed) {
    C57104_2019Row row;
    for (std::size_t g = 0; g < 7; ++g) {
      if (any_allowed && r.cells[first + g] == "any") continue;  // nullopt: any increase
      row[g] = number(t, r, first + g);
    }
    return row;
  };
  for (int n = 1; n <= 2; ++n) {
    const DataTable& t = table(f, "table" + std::to_string(n));
    expect_columns(t, cols12);
    Once once(t, 8);
    for (const TableRow& r : t.rows) {
      const int g = index_of(t, r, 0, groups), a = index_of(t, r, 1, ages);
      once.mark(r, g * 4 + a);
      (n == 1 ? s.c57104_2019.table1 : s.c57104_2019.table2)[g][a] = row_of(t, r, 2, false);
    }
    once.require_all([&](std::size_t k) { return "o2n2 " + groups[k / 4] + ", age " + ages[k % 4]; });
  }
  for (int n = 3; n <= 4; ++n) {
    const DataTable& t = table(f, "table" + std::to_string(n));
    expect_columns(t, cols34);
    Once once(t, 2);
    for (const TableRow& r : t.rows) {
      const int g = index_of(t, r, 0, groups);
      once.mark(r, g);
      (n == 3 ? s.c57104_2019.table3 : s.c57104_2019.table4)[g] = row_of(t, r, 1, true);
    }
    once.require_all([&](std::size_t k) { return "o2n2 " + groups[k]; });
  }
}

// A ratio range cell: NS, <v, >v or lo-hi (ends included).
RatioRange ratio_range(const DataTable& t, const TableRow& r, std::size_t c) {
  const std::string& s = r.cells[c];
  auto value = [&](std::string_view text) {
    double v = 0;
    auto [end, ec] = std::from_chars(text.data(), text.data() + text.size(), v);
    if (text.empty() || ec != std::errc() || end != text.data() + text.size() || !(v >= 0))
      refuse(r.line, column_of(c), "table '" + t.id + "': '" + s + "' must be NS, <v, >v or lo-hi");
    return v;
  };
  if (s == "NS") return {-kInf, kInf};
  if (!s.empty() && s[0] == '<') return {-kInf, std::nextafter(value(std::string_view(s).substr(1)), -kInf)};
  if (!s.empty() && s[0] == '>') return {std::nextafter(value(std::string_view(s).substr(1)), kInf), kInf};
  const std::size_t dash = s.find('-');
  if (dash == std::string::npos) value("");
  const RatioRange range{value(std::string_view(s).substr(0, dash)), value(std::string_view(s).substr(dash + 1))};
  if (!(range.lo <= range.hi)) refuse(r.line, column_of(c), "table '" + t.id + "': range '" + s + "' runs backwards");
  return range;
}

void read_iec60599(const DataFile& f, StandardTables& s) {
  const DataTable& t1 = table(f, "table1_ratios");
  expect_columns(t1, {"code", "name", "C2H2/C2H4", "CH4/H2", "C2H4/C2H6"});
  s.iec60599.ratios.clear();
  for (const TableRow& r : t1.rows) {
    if (r.cells[0].empty()) refuse(r.line, 2, "table 'table1_ratios': empty code");
    s.iec60599.ratios.push_back({r.cells[0], r.cells[1], ratio_range(t1, r, 2), ratio_range(t1, r, 3), ratio_range(t1, r, 4)});
  }
  if (s.iec60599.ratios.empty()) refuse(t1.columns_line, 1, "table 'table1_ratios' has no rows");

  s.iec60599.typical_sets.clear();
  const std::vector<std::string> gases = gas_names();
  for (const DataTable& t : f.tables) {
    if (t.id.rfind("typical_values_", 0) != 0 || t.id == "typical_values_in_force") continue;
    expect_columns(t, {"gas", "low", "high"});
    TypicalGasSet set{t.id, t.clause + ", " + (t.edition.empty() ? f.edition : t.edition), {}, {}};
    Once once(t, 7);
    for (const TableRow& r : t.rows) {
      const int g = index_of(t, r, 0, gases);
      once.mark(r, g);
      set.low[g] = number(t, r, 1);
      set.high[g] = number(t, r, 2);
      if (set.high[g] < set.low[g]) refuse(r.line, column_of(2), "table '" + t.id + "': high below low");
    }
    once.require_all([&](std::size_t k) { return gases[k]; });
    s.iec60599.typical_sets.push_back(std::move(set));
  }
  const DataTable& in_force = table(f, "typical_values_in_force");
  expect_columns(in_force, {"set"});
  if (in_force.rows.size() != 1) refuse(in_force.columns_line, 1, "table 'typical_values_in_force' needs exactly one row");
  const TableRow& r = in_force.rows.front();
  bool found = false;
  for (const auto& set : s.iec60599.typical_sets) found = found || set.id == r.cells[0];
  if (!found) refuse(r.line, 2, "table 'typical_values_in_force': no table '" + r.cells[0] + "' in this file");
  s.iec60599.typical_in_force = r.cells[0];
}

void read_duval(const DataFile& f, StandardTables& s) {
  const DataTable& zones = table(f, "zones");
  expect_columns(zones, {"code", "name"});
  const std::vector<std::string> codes = {"PD", "T1", "T2", "T3", "D1", "D2", "DT"};
  std::vector<DuvalZone> out;
  Once once(zones, codes.size());
  for (const TableRow& r : zones.rows) {
    once.mark(r, index_of(zones, r, 0, codes));
    out.push_back({r.cells[0], r.cells[1], {}});
  }
  once.require_all([&](std::size_t k) { return codes[k]; });
  if (out.back().code != "DT") refuse(zones.rows.back().line, 2, "table 'zones': DT (the remainder) must be the last zone");
  const DataTable& v = table(f, "vertices");
  expect_columns(v, {"zone", "CH4", "C2H4", "C2H2"});
  for (const TableRow& r : v.rows) {
    const int z = index_of(v, r, 0, codes);
    const TrianglePercent p{number(v, r, 1, 0, 100), number(v, r, 2, 0, 100), number(v, r, 3, 0, 100)};
    if (std::fabs(p.ch4 + p.c2h4 + p.c2h2 - 100) > 1e-6) refuse(r.line, 3, "table 'vertices': the three shares must sum to 100");
    for (auto& zone : out)
      if (zone.code == codes[z]) zone.vertices.push_back(p);
  }
  for (const auto& zone : out)
    if (zone.vertices.size() < 3) refuse(v.rows.empty() ? v.columns_line : v.rows.back().line, 1, "table 'vertices': zone " + zone.code + " needs at least 3 vertices");
  s.duval_zones = std::move(out);
}

void read_c57106(const DataFile& f, StandardTables& s) {
  const DataTable& t = table(f, "service_aged_limits");
  expect_columns(t, {"test", "unit", "kind", "le69kv", "69to230kv", "ge230kv"});
  const std::vector<std::string> tests = {"moisture", "acidity", "ift", "pf25", "pf100", "color", "breakdown_d1816_1mm", "breakdown_d1816_2mm"};
  s.c57106.clear();
  Once once(t, tests.size());
  for (const TableRow& r : t.rows) {
    once.mark(r, index_of(t, r, 0, tests));
    C57106Limit l{r.cells[0], r.cells[1], index_of(t, r, 2, {"max", "min"}) == 1, {}};
    for (std::size_t c = 0; c < 3; ++c) l.by_class[c] = number(t, r, 3 + c);
    s.c57106.push_back(std::move(l));
  }
  once.require_all([&](std::size_t k) { return tests[k]; });
}

void read_iec60076_7(const DataFile& f, StandardTables& s) {
  Once once(f.tables.front(), kCooling.size());  // over both parts of Table 5
  for (const char* id : {"table5_checked", "table5_other"}) {
    const DataTable& t = table(f, id);
    expect_columns(t, {"cooling", "x", "y", "R", "k11", "k21", "k22", "tau_o_min", "tau_w_min", "top_oil_rise_k", "hot_spot_gradient_k"});
    for (const TableRow& r : t.rows) {
      const int c = index_of(t, r, 0, kCooling);
      once.mark(r, c);
      IecThermalParameters& p = s.iec60076_7_table5[c];
      double* fields[] = {&p.x, &p.y, &p.r, &p.k11, &p.k21, &p.k22, &p.tau_o_min, &p.tau_w_min, &p.top_oil_rise_k, &p.hot_spot_gradient_k};
      for (std::size_t i = 0; i < 10; ++i) *fields[i] = number(t, r, i + 1, 1e-6, 1e4);
    }
  }
  once.require_all([&](std::size_t k) { return "cooling " + kCooling[k] + " (table5_checked or table5_other)"; });
  const DataTable& t4 = table(f, "table4_hot_spot_limits");
  expect_columns(t4, {"loading", "hot_spot_c"});
  const std::vector<std::string> loadings = {"normal_cyclic", "long_emergency", "short_emergency"};
  Once once4(t4, 3);
  for (const TableRow& r : t4.rows) {
    const int l = index_of(t4, r, 0, loadings);
    once4.mark(r, l);
    s.hot_spot_limits_c[l] = number(t4, r, 1, 20, 400);
  }
  once4.require_all([&](std::size_t k) { return loadings[k]; });
}

void read_c57_91(const DataFile& f, StandardTables& s) {
  const DataTable& t = table(f, "table4_exponents");
  expect_columns(t, {"cooling", "n", "m"});
  Once once(t, kCooling.size());
  for (const TableRow& r : t.rows) {
    const int c = index_of(t, r, 0, kCooling);
    once.mark(r, c);
    s.c57_91_exponents[c] = {number(t, r, 1, 0.1, 3), number(t, r, 2, 0.1, 3)};
  }
  once.require_all([&](std::size_t k) { return kCooling[k]; });
  const DataTable& t1 = table(f, "table1_normal_life");
  expect_columns(t1, {"basis", "hours"});
  Once once1(t1, 1);
  for (const TableRow& r : t1.rows) {
    once1.mark(r, index_of(t1, r, 0, {"normal_insulation_life"}));
    s.normal_life_h = number(t1, r, 1, 1, 1e7);
  }
  once1.require_all([](std::size_t) { return std::string("normal_insulation_life"); });
}

RatingCuts cuts_of(const DataTable& t, const TableRow& r) {
  RatingCuts c{};
  for (std::size_t i = 0; i < 4; ++i) c[i] = number(t, r, i + 1, -1e12, 1e12);
  const bool up = c[1] > c[0];
  for (std::size_t i = 1; i < 4; ++i)
    if (up ? !(c[i] > c[i - 1]) : !(c[i] < c[i - 1]))
      refuse(r.line, column_of(i + 1), "table '" + t.id + "': cuts must increase (or, for DP, decrease)");
  return c;
}

void read_health_index(const DataFile& f, StandardTables& s) {
  HealthIndexTables& h = s.health;
  const DataTable& w = table(f, "factor_weights");
  expect_columns(w, {"factor", "weight"});
  const std::vector<std::string> factors = {"dga", "thermal", "oil_quality", "paper", "infrared", "inspection", "age"};
  Once once_w(w, factors.size());
  for (const TableRow& r : w.rows) {
    once_w.mark(r, index_of(w, r, 0, factors));
    h.weights[r.cells[0]] = number(w, r, 1, 0, 100);
  }
  once_w.require_all([&](std::size_t k) { return factors[k]; });

  const DataTable& g = table(f, "gas_scores");
  expect_columns(g, {"gas", "weight", "score1", "score2", "score3", "score4", "score5"});
  const std::vector<std::string> gases = gas_names();
  Once once_g(g, gases.size());
  h.gas_bands.clear();
  for (const TableRow& r : g.rows) {
    once_g.mark(r, index_of(g, r, 0, gases));
    GasScoreBands b{r.cells[0], number(g, r, 1, 0, 100), {}};
    for (std::size_t i = 0; i < 5; ++i) {
      b.upper[i] = number(g, r, 2 + i);
      if (i > 0 && !(b.upper[i] > b.upper[i - 1])) refuse(r.line, column_of(2 + i), "table 'gas_scores': limits must increase");
    }
    h.gas_bands.push_back(b);
  }
  once_g.require_all([&](std::size_t k) { return gases[k]; });

  const DataTable& o = table(f, "oil_scores");
  expect_columns(o, {"test", "weight", "better", "voltage_class", "score1", "score2", "score3"});
  const std::vector<std::string> tests = {"moisture", "breakdown", "pf25", "ift", "color", "acidity"};
  Once once_o(o, tests.size() * 3);
  h.oil_bands.clear();
  for (const TableRow& r : o.rows) {
    const int t = index_of(o, r, 0, tests), c = index_of(o, r, 3, kClasses);
    once_o.mark(r, t * 3 + c);
    OilScoreBands* b = nullptr;
    for (auto& x : h.oil_bands)
      if (x.test == tests[t]) b = &x;
    if (!b) b = &h.oil_bands.emplace_back(OilScoreBands{tests[t], number(o, r, 1, 0, 100), false, {}, {}, {}});
    b->weight = number(o, r, 1, 0, 100);
    b->higher_is_better = index_of(o, r, 2, {"lower", "higher"}) == 1;
    auto& lim = c == 0 ? b->le69kv : c == 1 ? b->kv69to230 : b->ge230kv;
    for (std::size_t i = 0; i < 3; ++i) lim[i] = number(o, r, 4 + i);
  }
  once_o.require_all([&](std::size_t k) { return tests[k / 3] + ", " + kClasses[k % 3]; });

  for (const char* id : {"rating_cuts", "ferrum_cuts"}) {
    const DataTable& t = table(f, id);
    expect_columns(t, {"factor", "a_b", "b_c", "c_d", "d_e"});
    for (const TableRow& r : t.rows) {
      if (h.cuts.count(r.cells[0])) refuse(r.line, 2, "table '" + t.id + "': duplicate row");
      h.cuts[r.cells[0]] = cuts_of(t, r);
    }
  }
  for (const char* need : {"dga", "oil", "furan_ppm", "dp", "ageing_factor", "age"})
    if (!h.cuts.count(need)) refuse(f.last_line, 1, std::string("rating cuts for '") + need + "' are missing");
}

void read_thermography(const DataFile& f, StandardTables& s) {
  const DataTable& t = table(f, "delta_t");
  expect_columns(t, {"basis", "rise_from_c", "rise_to_c", "priority"});
  s.delta_t_reference.clear();
  s.delta_t_ambient.clear();
  for (const TableRow& r : t.rows) {
    auto& rows = index_of(t, r, 0, {"reference", "ambient"}) == 0 ? s.delta_t_reference : s.delta_t_ambient;
    DeltaTRow d{number(t, r, 1, 0, 1000), r.cells[2].empty() ? kInf : number(t, r, 2, 0, 1000),
                static_cast<int>(number(t, r, 3, 1, 4))};
    if (d.rise_to_c < d.rise_from_c) refuse(r.line, column_of(2), "table 'delta_t': rise_to_c below rise_from_c");
    if (!rows.empty() && !(d.rise_from_c > rows.back().rise_to_c))
      refuse(r.line, column_of(1), "table 'delta_t': rows of a basis must follow in increasing order");
    rows.push_back(d);
  }
  if (s.delta_t_reference.empty() || s.delta_t_ambient.empty())
    refuse(f.last_line, 1, "table 'delta_t' needs rows for both bases, reference and ambient");
}

struct FileSpec {
  const char* file;
  void (*read)(const DataFile&, StandardTables&);
};

const FileSpec kFiles[] = {
    {"ieee_c57104_2008.csv", read_c57104_2008}, {"ieee_c57104_2019.csv", read_c57104_2019},
    {"iec60599.csv", read_iec60599},            {"duval_triangle1.csv", read_duval},
    {"ieee_c57106.csv", read_c57106},           {"iec60076_7.csv", read_iec60076_7},
    {"ieee_c57_91.csv", read_c57_91},           {"health_index.csv", read_health_index},
    {"thermography.csv", read_thermography},
};

std::vector<TableInfo> info_of(const std::string& file, const DataFile& f, const std::string& origin) {
  std::vector<TableInfo> out;
  for (const DataTable& t : f.tables)
    out.push_back({file, t.id, f.standard, t.edition.empty() ? f.edition : t.edition, t.clause, t.status, t.where,
                   t.by, t.when, t.note, !origin.empty(), origin.empty() ? "embedded" : origin});
  return out;
}

std::optional<TableError> apply(const FileSpec& spec, std::string_view text, const std::string& origin, StandardTables& into) {
  DataFileParse parsed = parse_data_file(text);
  if (!parsed.file) return parsed.error;
  try {
    spec.read(*parsed.file, into);
  } catch (const Refused& r) {
    return r.error;
  }
  std::erase_if(into.info, [&](const TableInfo& i) { return i.file == spec.file; });
  auto info = info_of(spec.file, *parsed.file, origin);
  // Keep the listing in file order.
  std::size_t at = 0;
  for (const FileSpec& s : kFiles) {
    if (std::string_view(s.file) == spec.file) break;
    while (at < into.info.size() && into.info[at].file == s.file) ++at;
  }
  into.info.insert(into.info.begin() + static_cast<std::ptrdiff_t>(at), info.begin(), info.end());
  return std::nullopt;
}

const FileSpec* spec_of(std::string_view file) {
  for (const FileSpec& s : kFiles)
    if (file == s.file) return &s;
  return nullptr;
}

std::atomic<const StandardTables*>& active() {
  static std::atomic<const StandardTables*> a{&embedded_standard_tables()};
  return a;
}

}  // namespace

std::string TableError::text() const {
  return "line " + std::to_string(line) + ", column " + std::to_string(column) + ": " + message;
}

std::string TableRefusal::text() const { return shown + (error.line > 0 ? ": " + error.text() : ": " + error.message); }

DataFileParse parse_data_file(std::string_view text) {
  DataFileParse out;
  DataFile f;
  DataTable* t = nullptr;
  std::set<std::string> ids;
  int line_no = 0;
  try {
    for (std::size_t pos = 0; pos <= text.size();) {
      std::size_t nl = text.find('\n', pos);
      if (nl == std::string_view::npos) nl = text.size();
      const std::string_view line = trim(text.substr(pos, nl - pos));
      pos = nl + 1;
      ++line_no;
      if (line.empty() || line.front() == '#') continue;
      const std::size_t comma = line.find(',');
      const std::string key(trim(line.substr(0, comma)));
      const std::string value = comma == std::string_view::npos ? "" : std::string(trim(line.substr(comma + 1)));
      auto need_value = [&] {
        if (value.empty()) refuse(line_no, 2, "'" + key + "' needs a value");
      };
      auto need_table = [&] {
        if (!t) refuse(line_no, 1, "'" + key + "' before the first 'table' line");
      };
      if (key == "standard" || key == "title" || (key == "edition" && !t)) {
        need_value();
        if (t) refuse(line_no, 1, "'" + key + "' belongs before the first table");
        (key == "standard" ? f.standard : key == "title" ? f.title : f.edition) = value;
      } else if (key == "table") {
        need_value();
        if (f.standard.empty()) refuse(line_no, 1, "the file needs a 'standard' line before its first table");
        if (t) check_status(*t, f);
        if (!ids.insert(value).second) refuse(line_no, 2, "duplicate table '" + value + "'");
        t = &f.tables.emplace_back();
        t->id = value;
        t->line = line_no;
      } else if (key == "clause" || key == "edition" || key == "status" || key == "where" || key == "by" ||
                 key == "when" || key == "note") {
        need_table();
        need_value();
        if (key == "status" && value != kStatusUnverified && value != kStatusChecked && value != kStatusVerified)
          refuse(line_no, 2, "status must be '" + std::string(kStatusUnverified) + "', '" + kStatusChecked + "' or '" +
                                 kStatusVerified + "'");
        if (key == "when" && !is_date(value)) refuse(line_no, 2, "when must be a date YYYY-MM-DD");
        std::string& field = key == "clause" ? t->clause : key == "edition" ? t->edition : key == "status" ? t->status
                             : key == "where" ? t->where : key == "by" ? t->by : key == "when" ? t->when : t->note;
        field = value;
      } else if (key == "columns") {
        need_table();
        if (!t->columns.empty()) refuse(line_no, 1, "second 'columns' line in table '" + t->id + "'");
        t->columns = split_fields(value);
        t->columns_line = line_no;
      } else if (key == "row") {
        need_table();
        if (t->columns.empty()) refuse(line_no, 1, "'row' before the 'columns' line of table '" + t->id + "'");
        TableRow r{line_no, split_fields(value)};
        if (r.cells.size() != t->columns.size())
          refuse(line_no, static_cast<int>(std::min(r.cells.size(), t->columns.size())) + 2,
                 "expected " + std::to_string(t->columns.size()) + " cells after 'row', found " + std::to_string(r.cells.size()));
        t->rows.push_back(std::move(r));
      } else {
        refuse(line_no, 1, "unknown line '" + key + "' (expected standard, edition, title, table, clause, status, where, by, when, note, columns or row)");
      }
    }
    if (f.standard.empty()) refuse(line_no, 1, "the file has no 'standard' line");
    if (!t) refuse(line_no, 1, "the file has no table");
    check_status(*t, f);
  } catch (const Refused& r) {
    out.error = r.error;
    return out;
  }
  f.last_line = line_no;
  out.file = std::move(f);
  return out;
}

std::string TableInfo::status_text() const {
  if (status == kStatusChecked) return status + " (" + where + ")";
  if (status == kStatusVerified) return status + " by " + by + " on " + when;
  return status;
}

std::string TableInfo::title() const {
  const bool year = edition.size() == 4 && std::isdigit(static_cast<unsigned char>(edition[0]));
  // IEC writes the edition after a colon (IEC 60076-7:2005), IEEE after a dash.
  const std::string joint = standard.rfind("IEC", 0) == 0 ? ":" : "-";
  return (year ? standard + joint + edition : standard + " (" + edition + ")") + ", " + clause;
}

bool StandardTables::any_unverified() const {
  for (const TableInfo& i : info)
    if (i.status == kStatusUnverified) return true;
  return false;
}

std::vector<const TableInfo*> StandardTables::tables_of(std::string_view file) const {
  std::vector<const TableInfo*> out;
  for (const TableInfo& i : info)
    if (i.file == file) out.push_back(&i);
  return out;
}

const std::vector<std::string>& standard_table_files() {
  static const std::vector<std::string> files = [] {
    std::vector<std::string> v;
    for (const FileSpec& s : kFiles) v.push_back(s.file);
    return v;
  }();
  return files;
}

std::string_view embedded_table_text(std::string_view file) { return embedded_data_file(file); }

std::optional<TableError> apply_table_file(std::string_view file, std::string_view text, const std::string& origin,
                                           StandardTables& into) {
  const FileSpec* spec = spec_of(file);
  if (!spec) return TableError{0, 0, "not a table file ferrum reads"};
  return apply(*spec, text, origin, into);
}

const StandardTables& embedded_standard_tables() {
  static const StandardTables tables = [] {
    StandardTables t;
    for (const FileSpec& s : kFiles) {
      const std::string_view text = embedded_data_file(s.file);
      if (text.empty()) throw std::logic_error(std::string("table file missing from the build: ") + s.file);
      if (auto err = apply(s, text, "", t)) throw std::logic_error(std::string(s.file) + ": " + err->text());
    }
    return t;
  }();
  return tables;
}

TableLoad load_standard_tables(const std::vector<TableOverride>& overrides) {
  TableLoad out;
  auto t = std::make_shared<StandardTables>(embedded_standard_tables());
  for (const TableOverride& o : overrides) {
    if (!o.refused.empty()) {
      out.refused.push_back({o.shown, {0, 0, o.refused}});
      continue;
    }
    StandardTables trial = *t;  // a refused file leaves no trace
    if (auto err = apply_table_file(o.file, o.text, o.shown, trial))
      out.refused.push_back({o.shown, *err});
    else
      *t = std::move(trial);
  }
  out.tables = std::move(t);
  return out;
}

const StandardTables& standard_tables() { return *active().load(std::memory_order_acquire); }

void install_standard_tables(std::shared_ptr<const StandardTables> tables) {
  static std::mutex mutex;
  static std::vector<std::shared_ptr<const StandardTables>> kept;  // never freed: readers hold references
  std::lock_guard lock(mutex);
  kept.push_back(tables);
  active().store(tables.get(), std::memory_order_release);
}

ScopedStandardTables::ScopedStandardTables(std::shared_ptr<const StandardTables> tables) : previous_(&standard_tables()) {
  install_standard_tables(std::move(tables));
}

ScopedStandardTables::~ScopedStandardTables() { active().store(previous_, std::memory_order_release); }

// --- accessors used by the defaults of the methods' options ----------------

double iec60076_7_hot_spot_limit_c(int loading) { return standard_tables().hot_spot_limits_c.at(static_cast<std::size_t>(loading)); }

double c57_91_normal_life_hours() { return standard_tables().normal_life_h; }

double health_index_weight(const char* factor) { return standard_tables().health.weights.at(factor); }

RatingCuts health_index_cuts(const char* factor) { return standard_tables().health.cuts.at(factor); }

const std::vector<GasScoreBands>& health_index_gas_bands() { return standard_tables().health.gas_bands; }

const std::vector<OilScoreBands>& health_index_oil_bands() { return standard_tables().health.oil_bands; }

}  // namespace ferrum::analytics
