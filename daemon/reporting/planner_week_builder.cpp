#include "daemon/reporting/planner_week_builder.h"

#include <algorithm>
#include <cmath>
#include <fstream>
#include <map>
#include <sstream>

#include "report/safety_text.h"

namespace fs = std::filesystem;

namespace ferrum::reporting {
namespace {

std::string hi_text(const std::optional<double>& hi) {
  return hi ? std::to_string(static_cast<int>(std::lround(*hi))) : "-";
}

struct Row {
  std::string site, hi, band, action;
};

std::map<std::string, Row> parse_tsv(const std::string& text) {
  std::map<std::string, Row> out;
  std::istringstream in(text);
  for (std::string line; std::getline(in, line);) {
    if (!line.empty() && line[0] == '#') continue;  // the caution (week_units_tsv)
    std::vector<std::string> f;
    std::istringstream ls(line);
    for (std::string x; std::getline(ls, x, '\t');) f.push_back(x);
    if (f.size() == 5) out[f[0]] = {f[1], f[2], f[3], f[4]};
  }
  return out;
}

}  // namespace

std::string week_units_tsv(const analytics::FleetRanking& ranking) {
  std::ostringstream o;
  o << report::csv_caution_line() << "\n";  // a comment line: readers skip lines that open with '#'
  auto clean = [](std::string s) {
    std::replace(s.begin(), s.end(), '\t', ' ');
    std::replace(s.begin(), s.end(), '\n', ' ');
    return s;
  };
  for (const auto& u : ranking.units)
    o << clean(u.unit_id) << "\t" << clean(u.site) << "\t" << hi_text(u.health_index) << "\t" << clean(u.band) << "\t"
      << clean(u.recommended_action) << "\n";
  return o.str();
}

std::string previous_week_tsv(const fs::path& reports, const std::string& week_label) {
  std::string best;
  if (fs::is_directory(reports))
    for (const auto& e : fs::directory_iterator(reports)) {
      const std::string name = e.path().filename().string();
      if (e.is_directory() && name.size() == week_label.size() && name < week_label && name > best &&
          fs::exists(e.path() / "week.tsv"))
        best = name;
    }
  if (best.empty()) return "";
  std::ifstream in(reports / best / "week.tsv");
  std::ostringstream o;
  o << in.rdbuf();
  return o.str();
}

report::PlannerWeek build_planner_week(const PlannerWeekInputs& in) {
  report::PlannerWeek w;
  w.week_label = in.week_label;
  w.as_of = in.as_of;
  w.units = static_cast<int>(in.units->size());
  w.inspection_interval_days = in.inspection_interval_days;
  // Units the decision (analytics/decision) recommends acting on, in the
  // fleet ranking's order: most at risk first, equal risk by unit id, units
  // without enough data for a risk last (analytics/fleet_ranking.h); the
  // routine ones are not listed.
  for (const auto& u : in.ranking->units)
    if (!u.recommended_action.empty() && u.recommended_action != "routine")
      w.needing_action.push_back({u.unit_id, u.site, u.recommended_action, u.action_year, u.action_reason, u.budget_plan});
  // Actions due: within 7 days (overdue included) and in 8..30 days.
  for (const auto& a : *in.units)
    for (const auto& act : a.actions) {
      if (act.due > in.as_of + 30) continue;
      report::PlannerWeek::DueAction d{act.due, act.priority, a.unit.unit_id, a.unit.site, act.text,
                                       act.status == "booked" ? act.work_date : 0, act.reason};
      (act.due <= in.as_of + 7 ? w.due_7 : w.due_30).push_back(d);
    }
  w.work_list = analytics::work_list(*in.units);
  for (auto* list : {&w.due_7, &w.due_30})
    std::stable_sort(list->begin(), list->end(), [](const auto& x, const auto& y) {
      return x.due != y.due ? x.due < y.due : x.priority < y.priority;
    });
  // What changed since last week's bundle.
  w.have_previous_week = !in.previous_week_tsv.empty();
  if (w.have_previous_week) {
    const auto before = parse_tsv(in.previous_week_tsv);
    const auto now = parse_tsv(week_units_tsv(*in.ranking));
    for (const auto& [unit, r] : now) {
      auto it = before.find(unit);
      if (it == before.end()) {
        w.changes.push_back({unit, r.site, "new this week"});
        continue;
      }
      std::string what;
      auto add = [&](const char* name, const std::string& a, const std::string& b) {
        if (a != b) what += (what.empty() ? "" : "; ") + std::string(name) + " " + a + " -> " + b;
      };
      add("HI", it->second.hi, r.hi);
      add("band", it->second.band, r.band);
      add("action", it->second.action, r.action);
      if (!what.empty()) w.changes.push_back({unit, r.site, what});
    }
  }
  // Alerts and files of the week (UTC times; the week is the 7 days to as_of).
  const std::string since = analytics::format_utc(analytics::start_of(in.as_of - 6));
  for (const auto& a : in.alerts)
    if (a.raised_at >= since) w.alerts.push_back({a.raised_at, a.unit_id, a.kind, a.text});
  std::sort(w.alerts.begin(), w.alerts.end(), [](const auto& x, const auto& y) { return x.raised_at < y.raised_at; });
  std::map<std::string, report::PlannerWeek::PartyFiles> parties;
  for (const auto& f : in.files) {
    if (f.received_at < since) continue;
    auto& p = parties[f.party];
    p.party = f.party;
    ++p.received;
    if (f.status == "rejected") {
      ++p.rejected;
      p.rejected_names.push_back(f.original_name);
    }
  }
  for (auto& [name, p] : parties) w.parties.push_back(std::move(p));
  // Overdue: oil sample and infrared survey older than a year, inspection
  // older than [analysis] inspection_interval_days, or none at all.
  // Yearly oil sampling of a unit in normal condition: value from memory of
  // IEEE C57.104-2019 (sampling intervals), verify; yearly infrared survey:
  // common practice, no published source.
  struct Rule {
    const char* kind;
    const char* what;
    int days;
  };
  const Rule rules[] = {{"oil", "oil sample", 365}, {"infrared", "infrared survey", 365},
                        {"inspection", "inspection", in.inspection_interval_days}};
  for (const auto& a : *in.units)
    for (const auto& r : rules) {
      std::optional<analytics::Day> last;
      for (const auto& f : a.freshness)
        if (f.kind == r.kind) last = f.latest;
      if (!last || *last + r.days < in.as_of) w.overdue.push_back({a.unit.unit_id, a.unit.site, r.what, last});
    }
  return w;
}

}  // namespace ferrum::reporting
