#include "daemon/reporting/report_writer.h"

#include "daemon/reporting/planner_week_builder.h"

#include <spdlog/spdlog.h>

#include <algorithm>
#include <chrono>
#include <cstdio>
#include <fstream>
#include <map>

#include "daemon/assess/assessment_service.h"
#include "daemon/assess/plan_service.h"
#include "daemon/assess/ranking_cache.h"
#include "daemon/config/plan_config.h"
#include "daemon/pipeline/held_back_record.h"
#include "daemon/site/atomic_file.h"
#include "report/alert_report.h"
#include "report/fleet_report.h"
#include "report/safety_text.h"
#include "report/site_section.h"
#include "report/unit_report.h"

namespace fs = std::filesystem;

namespace ferrum::reporting {
namespace {

std::string iso_now() {
  const auto now = std::chrono::system_clock::to_time_t(std::chrono::system_clock::now());
  std::tm tm{};
  gmtime_r(&now, &tm);
  char buf[32];
  std::strftime(buf, sizeof buf, "%Y-%m-%dT%H:%M:%SZ", &tm);
  return buf;
}

// File names carry the unit id; anything but letters, digits, '-', '_' and
// '.' becomes '_', so that no unit id can name a path outside the folder.
std::string safe_component(const std::string& s) {
  std::string out;
  for (char c : s) out += (std::isalnum(static_cast<unsigned char>(c)) || c == '-' || c == '_' || c == '.') ? c : '_';
  if (out.empty() || out[0] == '.') out.insert(out.begin(), '_');
  return out.substr(0, 120);
}

std::string csv_field(const std::string& s) {
  if (s.find_first_of(",\"\n\r") == std::string::npos) return s;
  std::string out = "\"";
  for (char c : s) {
    if (c == '"') out += '"';
    out += c;
  }
  return out + "\"";
}

}  // namespace

analytics::UnitData data_as_of(const analytics::UnitData& d, analytics::Day day) {
  analytics::UnitData out;
  out.info = d.info;
  for (const auto& s : d.oil_samples)
    if (s.date <= day) out.oil_samples.push_back(s);
  const analytics::Timestamp end = analytics::start_of(day + 1);
  for (const auto& p : d.load)
    if (p.t < end) out.load.push_back(p);
  for (const auto& s : d.infrared)
    if (s.date <= day) out.infrared.push_back(s);
  for (const auto& s : d.inspections)
    if (s.date <= day) out.inspections.push_back(s);
  for (const auto& t : d.electrical)
    if (t.date <= day) out.electrical.push_back(t);
  // Work done or cancelled by then; a booking counts whatever its date (it lies ahead).
  for (const auto& w : d.work_status)
    if (w.date <= day || w.status == "booked") out.work_status.push_back(w);
  for (const auto& s : d.site_inspections)
    if (s.record.date <= day) out.site_inspections.push_back(s);
  out.held_back = d.held_back;
  out.load_history = d.load_history;  // summarised days: the assessment reads those before its window's end
  return out;
}

ReportWriter::ReportWriter(const site::SiteRoot& root, const config::SiteConfig& config, store::Store& store)
    : root_(root), config_(config), store_(store), options_(assess::options_from_config(config, &root)) {}

std::string ReportWriter::week_label(analytics::Day d) {
  const auto w = analytics::iso_week_of(d);
  char buf[16];
  std::snprintf(buf, sizeof buf, "%04d-W%02d", w.year, w.week);
  return buf;
}

analytics::UnitAssessment ReportWriter::assess(const std::string& unit_id, analytics::Day as_of) {
  return assess::assess_unit(store_, unit_id, as_of, options_);
}

static report::ReportOptions report_options(const config::SiteConfig& c) {
  report::ReportOptions o;
  o.paper = c.paper == "letter" ? report::ReportOptions::Paper::letter : report::ReportOptions::Paper::a4;
  o.utility_name = c.utility_name;
  o.utc_offset_note = "times delivered without a UTC offset were taken as UTC" + c.utc_offset_text +
                      " (site.utc_offset in ferrum.ini)";
  return o;
}

namespace {

// The day of the unit's previous report: its last report when that was
// before `as_of`, else a week earlier.
analytics::Day previous_report_day(store::Store& store, const std::string& unit_id, analytics::Day as_of) {
  if (auto last = store.state("report:" + unit_id)) {
    const analytics::Day d = std::atoi(last->c_str());
    if (d < as_of) return d;
  }
  return as_of - 7;
}

// Renders one unit's PDF from its assessment as of `as_of` (site view
// applied) and its data, which give the "what changed" view: the data as it
// stood at `previous_day`, under the same site view.
fs::path render_unit_file(store::Store& store, const analytics::UnitAssessment& current, const analytics::UnitData& data,
                          analytics::Day as_of, analytics::Day previous_day, const std::vector<analytics::SiteView>& sites,
                          const analytics::AssessmentOptions& options, const report::ReportOptions& report_options,
                          const fs::path& out_dir) {
  const std::string& unit_id = current.unit.unit_id;
  analytics::UnitAssessment previous = analytics::assess_unit(data_as_of(data, previous_day), previous_day, options);
  // The same site view: its load-transfer advice is not a change of the unit.
  analytics::apply_site_view(previous, sites);
  std::vector<report::SourceFile> files;
  for (const auto& f : store.files_for_unit(unit_id))
    files.push_back({f.party, f.original_name, f.kind, f.received_at, f.rows});
  fs::create_directories(out_dir);
  const fs::path path = out_dir / ("ferrum-" + safe_component(unit_id) + "-" + analytics::format_day(as_of) + ".pdf");
  report::render_unit_report(current, &previous, files, report_options, path.string());
  return path;
}

}  // namespace

fs::path ReportWriter::unit_report(const std::string& unit_id, analytics::Day as_of, const fs::path& out_dir) {
  const auto outcome = unit_reports_by_id({unit_id}, as_of, out_dir).at(0);
  if (!outcome.error.empty()) throw std::runtime_error(outcome.error);
  return outcome.path;
}

std::vector<ReportWriter::UnitReportOutcome> ReportWriter::unit_reports_by_id(
    const std::vector<std::string>& unit_ids, analytics::Day as_of, const fs::path& out_dir,
    const std::function<void(const analytics::UnitAssessment&)>& assessed) {
  std::vector<UnitReportOutcome> out;
  out.reserve(unit_ids.size());
  for (const auto& id : unit_ids) out.push_back({id, {}, {}});
  std::vector<analytics::UnitInfo> register_units;
  try {
    register_units = store_.units();
  } catch (const std::exception& e) {
    for (auto& o : out) o.error = e.what();
    return out;
  }
  // Which of the wanted units each site holds (positions in `out`).
  std::map<std::string, std::vector<std::size_t>> by_site;
  for (std::size_t k = 0; k < out.size(); ++k) {
    const auto u = std::find_if(register_units.begin(), register_units.end(),
                                [&](const analytics::UnitInfo& x) { return x.unit_id == out[k].unit_id; });
    if (u == register_units.end()) out[k].error = "unit " + out[k].unit_id + " is not in the register";
    else by_site[u->site].push_back(k);
  }
  const report::ReportOptions ropts = report_options(config_);
  CachedPlan plan;
  for (const auto& [site, wanted] : by_site) {
    // Every unit of the site, assessed once: the site view needs them all.
    std::vector<analytics::UnitAssessment> peers;
    std::vector<analytics::SiteView> sites;
    try {
      for (const auto& u : register_units)
        if (u.site == site) peers.push_back(assess::assess_unit(store_, u.unit_id, as_of, options_));
      sites = analytics::site_view(peers, assess::site_view_options_from_config(config_));
    } catch (const std::exception& e) {
      for (const auto k : wanted) out[k].error = e.what();
      continue;
    }
    for (const auto k : wanted) {
      const std::string& unit_id = out[k].unit_id;
      try {
        const auto peer = std::find_if(peers.begin(), peers.end(), [&](const analytics::UnitAssessment& a) {
          return a.unit.unit_id == unit_id;
        });
        analytics::UnitData data = store_.unit_data(unit_id);
        data.held_back = ingest::held_back_of(store_, unit_id);
        if (assessed) assessed(*peer);  // one of register_units: always found
        analytics::UnitAssessment current = *peer;
        analytics::apply_site_view(current, sites);
        current.budget_plan = unit_plan_schedule(current, as_of, plan);
        const analytics::Day previous_day = previous_report_day(store_, unit_id, as_of);
        out[k].path = render_unit_file(store_, current, data, as_of, previous_day, sites, options_, ropts, out_dir);
        if (previous_day != as_of) store_.set_state("report:" + unit_id, std::to_string(as_of));
      } catch (const std::exception& e) {
        out[k].error = e.what();
      }
    }
  }
  return out;
}

std::vector<fs::path> ReportWriter::unit_reports(const std::vector<analytics::UnitAssessment>& units,
                                                 const std::vector<analytics::SiteView>& sites, analytics::Day as_of,
                                                 const fs::path& out_dir) {
  // Rendered on every core (assess::run_in_order: each worker reads through
  // its own connection and renders into its own libharu document); the
  // calling thread reports progress and, at the end, records each unit's
  // report day.
  const std::size_t n = units.size();
  std::vector<fs::path> paths(n);
  std::vector<analytics::Day> previous_days(n, as_of);
  const report::ReportOptions ropts = report_options(config_);
  assess::run_in_order(
      store_, n, 0,
      [&](store::Store& store, std::size_t i) {
        const std::string& id = units[i].unit.unit_id;
        analytics::UnitData data = store.unit_data(id);
        data.held_back = ingest::held_back_of(store, id);
        previous_days[i] = previous_report_day(store, id, as_of);
        paths[i] = render_unit_file(store, units[i], data, as_of, previous_days[i], sites, options_, ropts, out_dir);
      },
      [&](std::size_t i) {
        if (progress_) progress_("unit reports", i + 1, n);
      });
  for (std::size_t i = 0; i < n; ++i)
    if (previous_days[i] != as_of) store_.set_state("report:" + units[i].unit.unit_id, std::to_string(as_of));
  return paths;
}

ReportWriter::FleetFiles ReportWriter::fleet_report(analytics::Day as_of, const fs::path& out_dir) {
  auto units = assess::assess_fleet_parallel(store_, as_of, options_, progress_);
  const auto sites = assess::apply_site_view(units, config_);
  auto ranking = rank(units, as_of);
  const report::PlanSection plan = plan_section(ranking, as_of);
  return fleet_files(units, ranking, plan, sites, as_of, out_dir);
}

report::PlanSection ReportWriter::plan_section(analytics::FleetRanking& ranking, analytics::Day as_of) {
  report::PlanSection s;
  s.configured = config::plan_configured(config_);
  s.horizon_years = assess::plan_settings_from_config(config_).options.horizon_years;
  if (s.configured)
    s.plan = assess::make_plan(assess::plan_units(ranking, store_.units()), as_of, config_, std::nullopt, std::nullopt,
                              &s.unavailable);
  if (s.plan) analytics::apply_plan(ranking, *s.plan);
  return s;
}

analytics::PlanSchedule ReportWriter::unit_plan_schedule(const analytics::UnitAssessment& unit, analytics::Day as_of,
                                                         CachedPlan& plan) {
  analytics::PlanSchedule none;
  // Only the actions the plan funds (analytics/plan/plan.h): an oil treatment
  // is maintenance and never waits for the plan's budget.
  if (unit.decision.action != "replace" && !(unit.decision.action == "refurbish" && unit.decision.treats_paper))
    return none;
  if (!config::plan_configured(config_)) return none;
  analytics::PlanSchedule unknown;
  unknown.state = analytics::PlanSchedule::State::not_known;
  if (!plan.read) {
    plan.read = true;
    // The plan is the fleet's: without the fleet's current ranking inputs it
    // would take assessing every unit, which a unit's report does not do.
    auto inputs = assess::read_ranking_cache(root_, assess::ranking_cache_key(root_, store_, as_of));
    if (inputs) {
      assess::apply_site_view(*inputs, config_);
      auto ranking = analytics::rank_fleet(std::move(*inputs), as_of, assess::ranking_options_from_config(config_));
      if (plan_section(ranking, as_of).plan) plan.ranking = std::move(ranking);
    }
  }
  if (!plan.ranking) return unknown;
  for (const auto& r : plan.ranking->units)
    if (r.unit_id == unit.unit.unit_id && r.recommended_action == unit.decision.action &&
        r.action_year == unit.decision.year)
      return r.budget_plan;
  return unknown;  // the cached assessment of the unit differs from this one
}

analytics::FleetRanking ReportWriter::rank(const std::vector<analytics::UnitAssessment>& units, analytics::Day as_of) {
  return analytics::rank_fleet(units, as_of, assess::ranking_options_from_config(config_));
}

ReportWriter::FleetFiles ReportWriter::fleet_files(const std::vector<analytics::UnitAssessment>& units,
                                                   const analytics::FleetRanking& ranking,
                                                   const report::PlanSection& plan,
                                                   const std::vector<analytics::SiteView>& sites, analytics::Day as_of,
                                                   const fs::path& out_dir) {
  std::vector<std::string> alerts;
  for (const auto& a : store_.open_alerts())
    alerts.push_back(a.unit_id + ": " + a.text + " (" + config::site_timestamp_of_stored(a.raised_at, config_.time_zone) + ")");
  fs::create_directories(out_dir);
  FleetFiles f;
  f.pdf = out_dir / ("ferrum-fleet-" + analytics::format_day(as_of) + ".pdf");
  f.csv = out_dir / ("ferrum-fleet-" + analytics::format_day(as_of) + ".csv");
  f.sites_csv = out_dir / ("ferrum-fleet-sites-" + analytics::format_day(as_of) + ".csv");
  report::render_fleet_report(ranking, units, alerts, report_options(config_), f.pdf.string(), &plan, &sites);
  site::write_file_atomically(f.csv, report::fleet_ranking_csv(ranking));
  site::write_file_atomically(f.sites_csv, report::fleet_sites_csv(sites));
  return f;
}

fs::path ReportWriter::weekly_bundle(analytics::Day as_of) {
  const std::string label = week_label(as_of);
  const fs::path dir = root_.reports() / label;
  if (fs::exists(dir / "index.pdf")) return dir;  // that week is done: leave it untouched
  // Build in a scratch folder and rename it into place, so that a week folder
  // is either complete or absent.
  const fs::path scratch = root_.reports() / ("." + label + ".building");
  fs::remove_all(scratch);
  fs::create_directories(scratch);
  // One fleet assessment serves the fleet report, the index and the unit
  // reports' site lines.
  auto units = assess::assess_fleet_parallel(store_, as_of, options_, progress_);
  const auto sites = assess::apply_site_view(units, config_);
  // The ranking and the budget plan first: each unit report says where the
  // plan puts the unit's action, as the ranking does.
  auto ranking = rank(units, as_of);
  const report::PlanSection plan = plan_section(ranking, as_of);
  {
    std::map<std::string, const analytics::PlanSchedule*> by_unit;
    for (const auto& r : ranking.units) by_unit[r.unit_id] = &r.budget_plan;
    for (auto& u : units)
      if (auto it = by_unit.find(u.unit.unit_id); it != by_unit.end()) u.budget_plan = *it->second;
  }
  // The unit reports reuse that assessment as their current view.
  std::vector<std::pair<std::string, std::string>> unit_files;
  const auto paths = unit_reports(units, sites, as_of, scratch);
  for (std::size_t i = 0; i < units.size(); ++i) unit_files.emplace_back(units[i].unit.unit_id, paths[i].filename().string());
  fleet_files(units, ranking, plan, sites, as_of, scratch);
  // The planner's week: on the cover, as summary.txt (the weekly mail's
  // body) and week.tsv (what the next week compares with).
  PlannerWeekInputs in;
  in.week_label = label;
  in.as_of = as_of;
  in.units = &units;
  in.ranking = &ranking;
  in.previous_week_tsv = previous_week_tsv(root_.reports(), label);
  in.alerts = store_.open_alerts();
  // Files of the week: newest first, fetched until one is older than the week.
  const std::string week_start = analytics::format_utc(analytics::start_of(as_of - 6));
  for (int limit = 512;; limit *= 4) {
    in.files = store_.recent_files(limit);
    if (static_cast<int>(in.files.size()) < limit || in.files.back().received_at < week_start) break;
  }
  in.inspection_interval_days = config_.inspection_interval_days;
  report::PlannerWeek week = build_planner_week(in);
  for (auto& a : week.alerts) a.raised_at = config::site_timestamp_of_stored(a.raised_at, config_.time_zone);  // sorted in UTC, printed in site time
  report::render_weekly_index(label, ranking, unit_files, week, report_options(config_), (scratch / "index.pdf").string());
  site::write_file_atomically(scratch / "summary.txt", report::planner_week_text(week));
  site::write_file_atomically(scratch / "week.tsv", week_units_tsv(ranking));
  if (fs::exists(dir)) fs::remove_all(dir);  // an incomplete earlier attempt (no index.pdf)
  fs::rename(scratch, dir);
  site::sync_directory(root_.reports());
  return dir;
}

fs::path ReportWriter::alert(const std::string& unit_id, const std::string& kind, const std::string& text,
                             const std::string& first_step, std::int64_t at_utc) {
  // Printed in site time, by the one function the mail uses too.
  const std::string raised_at = config::site_timestamp(at_utc, config_.time_zone);
  fs::create_directories(root_.alerts());
  const auto unit = store_.find_unit(unit_id);
  report::AlertInfo info{unit_id, unit ? unit->site : "", kind, raised_at, text, first_step};
  std::string stamp = raised_at.substr(0, raised_at.find(" ("));  // "2026-11-30 07:10:05 CET"
  std::replace(stamp.begin(), stamp.end(), ':', '-');
  std::replace(stamp.begin(), stamp.end(), ' ', '_');
  // One alert, one PDF: a second finding of the same kind and second gets
  // its own file (-2, -3, ...), so each alerts.csv line names the PDF that
  // shows its finding.
  const std::string base = "alert-" + safe_component(unit_id) + "-" + safe_component(kind) + "-" + safe_component(stamp);
  fs::path pdf = root_.alerts() / (base + ".pdf");
  for (int n = 2; fs::exists(pdf); ++n) pdf = root_.alerts() / (base + "-" + std::to_string(n) + ".pdf");
  report::render_alert(info, report_options(config_), pdf.string());
  // alerts.csv is appended, one line per alert (a header when new).
  const fs::path csv = root_.alerts() / "alerts.csv";
  const bool fresh = !fs::exists(csv);
  std::ofstream out(csv, std::ios::app);
  // The file grows by appending, so its caution is a comment line at its top.
  if (fresh) out << report::csv_caution_line() << "\nraised_at,unit_id,site,kind,text,first_step,pdf\n";
  out << csv_field(raised_at) << "," << csv_field(unit_id) << "," << csv_field(info.site) << "," << csv_field(kind)
      << "," << csv_field(text) << "," << csv_field(first_step) << "," << csv_field(pdf.filename().string()) << "\n";
  out.flush();
  store::Alert a;
  a.unit_id = unit_id;
  a.kind = kind;
  a.raised_at = at_utc > 0 ? analytics::format_utc(at_utc) : iso_now();  // the store keeps UTC: it sorts
  a.text = text;
  store_.add_alert(a);
  spdlog::warn("ALERT {} {}: {}", unit_id, kind, text);
  return pdf;
}

}  // namespace ferrum::reporting
