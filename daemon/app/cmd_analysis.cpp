// assess, rank, dga, thermal: the analytics on the command line.

#include <algorithm>
#include <cmath>
#include <deque>
#include <iomanip>
#include <iostream>
#include <map>
#include <optional>
#include <set>
#include <span>

#include "analytics/oil_assessment.h"
#include "analytics/thermal_assessment.h"
#include "daemon/app/commands_impl.h"
#include "daemon/app/fleet_inputs.h"
#include "daemon/app/progress_display.h"
#include "daemon/app/site_context.h"
#include "daemon/assess/assessment_json.h"
#include "daemon/assess/assessment_service.h"
#include "daemon/assess/ranking_cache.h"
#include "daemon/assess/spilled_ranking.h"
#include "daemon/ingest/field_parsers.h"
#include "report/decision_text.h"
#include "report/fleet_report.h"
#include "report/report_format.h"
#include "report/safety_text.h"

namespace ferrum::app {
namespace {

std::string fmt(const std::optional<double>& v, int decimals, const std::string& unit = "") {
  if (!v) return "-";
  std::ostringstream o;
  o << std::fixed << std::setprecision(decimals) << *v << unit;
  return o.str();
}

void print_assessment_text(const analytics::UnitAssessment& a) {
  std::cout << a.unit.unit_id << " (" << a.unit.site << ")  as of " << analytics::format_day(a.as_of) << "\n"
            << "  health index " << fmt(a.health_index, 0) << "  " << (a.band.empty() ? "-" : a.band) << "  ("
            << a.confidence << ")\n"
            << "  remaining life "
            << report::life_text(a.remaining_life.years, a.remaining_life.beyond_horizon, a.remaining_life.horizon_years, 0)
            << " (" << fmt(a.remaining_life.low_years, 0) << "-" << fmt(a.remaining_life.high_years, 0) << "), limited by "
            << (a.remaining_life.limiting_factor.empty() ? "-" : report::limiting_factor_words(a.remaining_life.limiting_factor))
            << "\n"
            << "  recommended: " << report::action_text(a.decision.action, a.decision.year) << ": " << a.decision.reason
            << "\n";
  if (a.dga.sample_date)
    std::cout << "  gases " << analytics::format_day(*a.dga.sample_date) << ": TDCG " << fmt(a.dga.tdcg_ppm, 0)
              << " ppm, C57.104-2008 condition " << (a.dga.c57104_2008_condition ? std::to_string(*a.dga.c57104_2008_condition) : "-")
              << ", 2019 status " << (a.dga.c57104_2019_status ? std::to_string(*a.dga.c57104_2019_status) : "-")
              << ", Duval " << a.dga.duval_triangle_1.value_or("-") << ", IEC 60599 "
              << a.dga.iec60599_ratio_fault.value_or("-") << "\n";
  for (const auto& act : a.actions)
    std::cout << "  [" << act.priority << "] by " << analytics::format_day(act.due) << (act.status == "booked" ? " booked " + analytics::format_day(act.work_date)
                                                                    : act.overdue ? std::string(" OVERDUE") : std::string())
              << ": " << act.text << (act.reference.empty() ? "" : " (" + act.reference + ")") << "\n";
  for (const auto& m : a.missing) std::cout << "  missing: " << m << "\n";
}

// A JSON document with the one-line caution under "caution" (report/safety_text.h).
std::string with_caution(Poco::JSON::Object::Ptr doc) {
  doc->set("caution", report::one_line_caution());
  return assess::stringify(doc);
}

}  // namespace

int cmd_assess(const Invocation& inv) {
  auto site = open_site(inv, Access::read);
  const analytics::Day as_of = today(inv, site->config);
  const auto options = assess::options_from_config(site->config, &site->root);
  std::vector<std::string> ids = inv.args;
  const bool whole_fleet = ids.empty();
  // The key before the first read: an import meanwhile changes it (ranking_cache.h).
  const std::string cache_key = whole_fleet ? assess::ranking_cache_key(site->root, *site->store, as_of) : "";
  if (!whole_fleet)  // named units must exist; the register's own list needs no check
    for (const auto& id : ids)
      if (!site->store->find_unit(id)) throw std::runtime_error("unit " + id + " is not in the register");
  // The site view (load transfer targets, the site line) needs every unit of
  // a site: named units bring their site's other units along (assessed, not
  // printed), and a unit is printed once its site is complete.
  std::map<std::string, std::size_t> site_left;
  std::map<std::string, std::size_t> site_to_print;  // a site's view goes once its units are printed
  std::set<std::string> printed;  // named units; the whole fleet prints every unit
  {
    const auto register_units = site->store->unit_sites();
    if (whole_fleet) {
      ids.reserve(register_units.size());
      for (const auto& u : register_units) ids.push_back(u.unit_id);
      for (const auto& u : register_units) ++site_left[u.site];
      site_to_print = site_left;
    } else {
      std::map<std::string, std::string> site_of;
      for (const auto& u : register_units) site_of[u.unit_id] = u.site;
      printed.insert(ids.begin(), ids.end());
      for (const auto& [id, s] : site_of)
        if (!printed.count(id) && std::any_of(ids.begin(), ids.end(), [&](auto& x) { return site_of[x] == s; }))
          ids.push_back(id);
      for (const auto& id : ids) ++site_left[site_of[id]];
      for (const auto& id : printed) ++site_to_print[site_of[id]];
    }
  }
  // Over the whole fleet, each unit's ranking input goes to the ranking
  // cache as it comes (`rank` after `assess` reads it), never held.
  std::optional<assess::RankingCacheWriter> cache;
  if (whole_fleet) cache.emplace(site->root, cache_key, ids.size());
  std::map<std::string, std::vector<analytics::RankingInput>> site_units;  // until the site is complete
  std::map<std::string, analytics::SiteView> site_views;
  std::deque<analytics::UnitAssessment> waiting;  // printed units whose site is not complete yet
  // Units are assessed on every core and written out one by one, in order:
  // the JSON array is streamed, never held whole (as one Poco document, 5,000
  // units took 755 MiB).
  const bool json = inv.has("json");
  bool first = true;
  if (json) std::cout << "[";
  // Progress on a terminal only; with text on the same terminal it would
  // interleave, so only while the output goes elsewhere (--json or a pipe).
  ProgressDisplay progress("assessing", "units", inv.has("quiet") || (!json && is_terminal(1)));
  std::size_t done = 0;
  const auto site_options = assess::site_view_options_from_config(site->config);
  const auto print = [&](analytics::UnitAssessment& a) {
    analytics::apply_site_view(a, std::span<const analytics::SiteView>(&site_views.at(a.unit.site), 1));
    if (!json) return print_assessment_text(a);
    std::cout << (first ? "\n" : ",\n") << with_caution(assess::to_json(a));
    first = false;
  };
  assess::assess_units_parallel(*site->store, ids, as_of, options, 0,
                                [&](analytics::UnitAssessment&& a) {
                                  progress.update(static_cast<double>(++done), static_cast<double>(ids.size()));
                                  const std::string& s = a.unit.site;
                                  auto row = analytics::ranking_input(a);
                                  if (cache) cache->add(row);
                                  site_units[s].push_back(std::move(row));
                                  if (--site_left[s] == 0) {
                                    site_views[s] = analytics::site_view(site_units[s], site_options).at(0);
                                    site_units.erase(s);
                                  }
                                  if (whole_fleet || printed.count(a.unit.unit_id)) waiting.push_back(std::move(a));
                                  while (!waiting.empty() && site_views.count(waiting.front().unit.site)) {
                                    const std::string printed_site = waiting.front().unit.site;
                                    print(waiting.front());
                                    waiting.pop_front();
                                    if (--site_to_print[printed_site] == 0) site_views.erase(printed_site);
                                  }
                                });
  if (json) std::cout << (first ? "]\n" : "\n]\n");
  else std::cout << "\n" << report::one_line_caution() << "\n";
  if (cache) cache->commit();
  return kOk;
}

int cmd_rank(const Invocation& inv) {
  if (inv.has("json") && inv.has("csv")) throw UsageError("--json or --csv, not both");
  auto site = open_site(inv, Access::read);
  const analytics::Day as_of = today(inv, site->config);
  // The rows wait in a temporary file, a unit's few dozen bytes of order in
  // memory: `rank` of any fleet holds about as much as of a small one.
  assess::SpilledRanking ranking(as_of, assess::ranking_options_from_config(site->config),
                                 assess::site_view_options_from_config(site->config), inv.has("json"));
  for_each_fleet_ranking_input(
      inv, *site, as_of, [&](analytics::RankingInput&& u) { ranking.add(u); }, [&] { ranking.clear(); });
  ranking.finish();
  const analytics::FleetRanking& summary = ranking.summary();
  if (inv.has("json")) {
    assess::write_json(std::cout, summary, ranking.rows(), ranking.sites(), {{"caution", report::one_line_caution()}});
    std::cout << "\n";
    return kOk;
  }
  if (inv.has("csv")) {
    report::write_fleet_ranking_csv(std::cout, ranking.rows());
    return kOk;
  }
  std::cout << std::left << std::setw(6) << "rank" << std::setw(9) << "unit" << std::setw(16) << "site"
            << std::setw(5) << "HI" << std::setw(15) << "band" << std::setw(19) << "remaining life" << std::setw(8)
            << "risk" << std::setw(18) << "action" << "first action\n";
  ranking.rows()([](const analytics::RankedUnit& u) {
    std::cout << std::left << std::setw(6)
              << (u.insufficient_data ? std::string("-") : std::to_string(u.rank) + (u.tied ? "=" : ""))
              << std::setw(9) << u.unit_id << std::setw(16) << u.site << std::setw(5) << fmt(u.health_index, 0)
              << std::setw(15) << (u.band.empty() ? "-" : u.band) << std::setw(19)
              << report::life_text(u.remaining_life_years, u.beyond_horizon, u.horizon_years, 0) << std::setw(8)
              << report::risk_text(u.risk) << std::setw(18) << report::action_text(u.recommended_action, u.action_year)
              << report::first_action_text(u.first_action) << "\n";
    if (u.insufficient_data) std::cout << "      too little data: " << u.note << "\n";
  });
  std::cout << "\nrisk: expected failures per 1,000 unit-years x consequence (0-1); calibration: "
            << summary.risk_calibration << "\n";
  if (!summary.outlook.empty()) {
    std::cout << "remaining life ending within ten years:";
    for (const auto& e : summary.outlook)
      std::cout << "  " << e.unit_id << " " << e.life_ends_year << " (" << report::limiting_factor_words(e.limiting_factor) << ")";
    std::cout << "\n";
  }
  std::cout << "\nrated MVA due per year:";
  for (const auto& y : summary.mva_due_by_year) std::cout << "  " << y.year << ": " << report::fmt_mva(y.mva);
  std::cout << "\n\n" << report::one_line_caution() << "\n";
  return kOk;
}

int cmd_dga(const Invocation& inv) {
  analytics::OilSample s;
  struct GasOpt {
    const char* name;
    analytics::LabValue analytics::OilSample::*member;
  };
  const GasOpt gases[] = {{"h2", &analytics::OilSample::h2},     {"ch4", &analytics::OilSample::ch4},
                          {"c2h6", &analytics::OilSample::c2h6}, {"c2h4", &analytics::OilSample::c2h4},
                          {"c2h2", &analytics::OilSample::c2h2}, {"co", &analytics::OilSample::co},
                          {"co2", &analytics::OilSample::co2},   {"o2", &analytics::OilSample::o2},
                          {"n2", &analytics::OilSample::n2}};
  int given = 0;
  for (const auto& g : gases) {
    if (!inv.has(g.name)) continue;
    const auto v = ingest::parse_lab_value(inv.get(g.name), false);
    if (!v.ok()) throw UsageError("--" + std::string(g.name) + ": '" + inv.get(g.name) + "': " + v.error);
    if (v.value.is_measured() && v.value.value < 0) throw UsageError("--" + std::string(g.name) + " cannot be negative");
    s.*(g.member) = v.value;
    ++given;
  }
  if (given == 0) throw UsageError("give at least one gas, e.g. --h2 120 --ch4 50 --c2h2 2");
  analytics::UnitInfo unit;
  unit.unit_id = "(command line)";
  unit.hv_kv = inv.has("hv-kv") ? std::stod(inv.get("hv-kv")) : 132;
  const analytics::Day today_day = today(inv, config::SiteConfig{});
  s.date = today_day;
  if (inv.has("age")) unit.year_built = analytics::civil_from_days(today_day).year - std::stoi(inv.get("age"));
  const auto d = analytics::interpret_dga_sample(s, unit, today_day, analytics::OilOptions{});
  if (inv.has("json")) {
    std::cout << with_caution(assess::to_json(d)) << "\n";
    return kOk;
  }
  std::cout << "TDCG                     " << fmt(d.tdcg_ppm, 0, " ppm") << "\n"
            << "IEEE C57.104-2008        condition "
            << (d.c57104_2008_condition ? std::to_string(*d.c57104_2008_condition) : "-") << "\n"
            << "IEEE C57.104-2019        status " << (d.c57104_2019_status ? std::to_string(*d.c57104_2019_status) : "-")
            << (d.c57104_2019_reason.empty() ? "" : "  (" + d.c57104_2019_reason + ")") << "\n"
            << "Duval triangle 1         " << d.duval_triangle_1.value_or("-") << "  " << d.duval_reading << "\n"
            << "IEC 60599 ratios         " << d.iec60599_ratio_fault.value_or("-") << "  " << d.iec60599_reading << "\n"
            << "key gas                  " << d.key_gas << "\n"
            << "CO2/CO                   " << fmt(d.co2_co_ratio, 1) << "  " << d.co2_co_reading << "\n";
  if (!d.c57104_2008_interval.empty())
    std::cout << "sampling (C57.104-2008)  " << d.c57104_2008_interval << "; " << d.c57104_2008_action << "\n";
  std::cout << "\nDo not re-energise a unit with signs of active arcing before an engineer has evaluated it.\n"
            << report::one_line_caution() << "\n";
  return kOk;
}

int cmd_thermal(const Invocation& inv) {
  if (inv.args.size() != 1) throw UsageError("name exactly one unit");
  auto site = open_site(inv, Access::read);
  const auto unit = site->store->find_unit(inv.args[0]);
  if (!unit) throw std::runtime_error("unit " + inv.args[0] + " is not in the register");
  auto parse_day = [&](const std::string& opt, analytics::Timestamp fallback) -> analytics::Timestamp {
    if (!inv.has(opt)) return fallback;
    const auto d = ingest::parse_date(inv.get(opt));
    if (!d.ok()) throw UsageError("--" + opt + ": '" + inv.get(opt) + "': " + d.error);
    return analytics::start_of(d.value) - site->config.utc_offset_minutes * 60LL;
  };
  const analytics::Timestamp from = parse_day("from", INT64_MIN / 2);
  const analytics::Timestamp to = inv.has("to") ? parse_day("to", 0) + 86400 - 1 : INT64_MAX / 2;
  const auto load = site->store->load_points(unit->unit_id, from, to);
  const auto options = assess::options_from_config(site->config, &site->root);
  const auto series = analytics::thermal_series(*unit, load, options.thermal);
  const char sep = inv.has("csv") ? ',' : '\t';
  std::cout << "time_utc" << sep << "load_pu" << sep << "ambient_c" << sep << "top_oil_c" << sep << "hot_spot_c" << sep
            << "ageing_rate" << sep << "measured_top_oil_c\n";
  std::cout << std::fixed;
  for (const auto& p : series) {
    std::cout << analytics::format_utc(p.t) << sep << std::setprecision(3) << p.load_pu << sep << std::setprecision(1) << p.ambient_c << sep
              << p.top_oil_c << sep << p.hot_spot_c << sep << std::setprecision(4) << p.ageing_rate << sep;
    if (!std::isnan(p.measured_top_oil_c)) std::cout << std::setprecision(1) << p.measured_top_oil_c;
    std::cout << "\n";
  }
  // A comment line, so that the series still reads as CSV/TSV.
  std::cout << report::csv_caution_line() << "\n";
  return kOk;
}

}  // namespace ferrum::app
