// render_weekly_index: the cover page of a week's bundle, the page a planner
// reads first: actions due, what changed, alerts, files per party, overdue
// samples and inspections, then the list of the bundle's unit reports.
#include <algorithm>

#include "report/decision_text.h"
#include "report/fleet_report.h"
#include "report/pdf_document.h"
#include "report/report_format.h"
#include "report/safety_block.h"
#include "report/safety_text.h"
#include "report/title_block.h"
#include "report/work_list_report.h"

namespace ferrum::report {
namespace {

// Rows of the work list on the cover; the fleet report and the CSV have more.
constexpr std::size_t kCoverWorkListRows = 60;

void none(PageFlow& flow, const std::string& text) {
  flow.paragraph(text, type::body, FontFace::regular, palette::muted);
}

void due_table(PageFlow& flow, const std::string& title, const std::vector<PlannerWeek::DueAction>& list,
               analytics::Day as_of) {
  flow.section(title, 40);
  if (list.empty()) return none(flow, "None.");
  Table t;
  t.columns = {{"Due", 1.0}, {"Unit", 0.8}, {"Site", 1.2}, {"Prio", 0.4, Align::right}, {"Action", 2.7}, {"Why", 1.9}};
  for (const auto& a : list) {
    const std::string state = a.booked ? " booked " + analytics::format_day(a.booked) : a.due < as_of ? " overdue" : "";
    t.rows.push_back({analytics::format_day(a.due) + state, a.unit_id, a.site, std::to_string(a.priority), a.text,
                      a.reason.empty() ? kNoValue : short_reason(a.reason)});
    t.emphasis.push_back((!a.booked && a.due < as_of) || a.priority == 1);
  }
  flow.table(t);
}

}  // namespace

void render_weekly_index(const std::string& week_label, const analytics::FleetRanking& ranking,
                         const std::vector<std::pair<std::string, std::string>>& unit_report_files,
                         const PlannerWeek& week, const ReportOptions& options, const std::string& path) {
  const std::string title = "The week " + week_label;
  PdfDocument doc(options, title, "Weekly bundle cover");
  PageFlow flow(doc, title);
  draw_title_block(flow, options, "Weekly bundle", title,
                   analytics::format_day(week.as_of - 6) + " to " + analytics::format_day(week.as_of) + " · " +
                       std::to_string(unit_report_files.size()) + " reports");
  // This page is the one most often printed alone: it carries the caution
  // in one line, the full block is on the last page.
  flow.paragraph(one_line_caution() + " The full cautions are on the last page of this cover.", type::small,
                 FontFace::bold, palette::ink);
  due_table(flow, "Actions due in the next 7 days (or overdue)", week.due_7, week.as_of);

  due_table(flow, "Actions due in 8 to 30 days", week.due_30, week.as_of);

  work_list_section(flow, week.work_list, week.as_of, kCoverWorkListRows);

  flow.section("Units needing action (fleet ranking: most at risk first)", 40);
  if (week.needing_action.empty()) none(flow, "None: every ranked unit is on routine maintenance.");
  else {
    Table t;
    // The budget plan's year only where the plan funds the action later
    // (analytics::apply_plan); no column when it keeps every year.
    const bool any_plan = std::any_of(week.needing_action.begin(), week.needing_action.end(),
                                      [](const auto& u) { return !plan_note(u.budget_plan).empty(); });
    t.columns = {{"Unit", 0.8}, {"Site", 1.2}, {"Action", 0.9}, {"By", 0.5, Align::right}, {"Why", 3.6}};
    if (any_plan) t.columns.push_back({"Budget plan", 1.1});
    for (const auto& u : week.needing_action) {
      t.rows.push_back({u.unit_id, u.site, u.action, u.year ? std::to_string(*u.year) : kNoValue,
                        u.reason.empty() ? kNoValue : short_reason(u.reason, 140)});
      const std::string plan = plan_note(u.budget_plan);  // "budget plan: 2029"
      if (any_plan) t.rows.back().push_back(plan.empty() ? "" : plan.substr(plan.find(": ") + 2));
    }
    flow.table(t);
  }

  flow.section("Changed since last week", 40);
  if (!week.have_previous_week) none(flow, "No earlier weekly bundle to compare with.");
  else if (week.changes.empty()) none(flow, "No unit's health index, band or recommended action changed.");
  else {
    Table t;
    t.columns = {{"Unit", 0.8}, {"Site", 1.2}, {"What changed", 5.0}};
    for (const auto& c : week.changes) t.rows.push_back({c.unit_id, c.site, c.what});
    flow.table(t);
  }

  flow.section("Alerts raised this week", 40);
  if (week.alerts.empty()) none(flow, "None.");
  else {
    Table t;
    t.columns = {{"Raised (site time)", 1.9}, {"Unit", 0.8}, {"Kind", 1.2}, {"Alert", 3.6}};
    for (const auto& a : week.alerts) t.rows.push_back({a.raised_at, a.unit_id, a.kind, a.text});
    t.emphasis.assign(t.rows.size(), true);
    flow.table(t);
  }

  flow.section("Files received this week, per party", 40);
  if (week.parties.empty()) none(flow, "No file was received this week.");
  else {
    Table t;
    t.columns = {{"Party", 1.2}, {"Received", 1.0, Align::right}, {"Rejected", 1.0, Align::right}, {"Rejected files (chase)", 3.6}};
    for (const auto& p : week.parties) {
      std::string names;
      for (const auto& n : p.rejected_names) names += (names.empty() ? "" : ", ") + n;
      t.rows.push_back({p.party, std::to_string(p.received), std::to_string(p.rejected), names});
      t.emphasis.push_back(p.rejected > 0);
    }
    flow.table(t);
  }

  flow.section("Overdue oil samples, infrared surveys and inspections", 40);
  if (week.overdue.empty()) none(flow, "None.");
  else {
    Table t;
    t.columns = {{"Unit", 0.8}, {"Site", 1.2}, {"Overdue", 1.5}, {"Last", 1.0}};
    for (const auto& d : week.overdue)
      t.rows.push_back({d.unit_id, d.site, d.what, d.last ? analytics::format_day(*d.last) : std::string("never")});
    flow.table(t);
  }
  flow.paragraph("Oil samples and infrared surveys are counted overdue after a year, inspections after the "
                     "site's inspection interval (" + std::to_string(week.inspection_interval_days) + " days).",
                 type::small, FontFace::regular, palette::muted);

  flow.section("Reports in this bundle", 40);
  if (unit_report_files.empty()) {
    flow.paragraph("No unit report was produced this week.", type::body, FontFace::regular, palette::muted);
  } else {
    // Ranking order first (highest risk on top), then units the ranking does not know.
    auto position = [&](const std::string& id) {
      const auto it = std::find_if(ranking.units.begin(), ranking.units.end(),
                                   [&](const analytics::RankedUnit& u) { return u.unit_id == id; });
      return std::pair{it - ranking.units.begin(), it};
    };
    auto files = unit_report_files;
    std::stable_sort(files.begin(), files.end(),
                     [&](const auto& a, const auto& b) { return position(a.first).first < position(b.first).first; });
    Table t;
    t.columns = {{"Unit", 0.9}, {"Site", 1.6}, {"HI", 0.5, Align::right}, {"Band", 0.9}, {"Report file", 3.0}};
    for (const auto& [id, file] : files) {
      const auto it = position(id).second;
      const bool known = it != ranking.units.end();
      t.rows.push_back({id, known ? it->site : kNoValue, known ? fmt_health_index(it->health_index) : kNoValue,
                        known && !it->band.empty() ? it->band : kNoValue, file});
    }
    flow.table(t);
  }
  flow.paragraph("Each unit report carries the safety cautions on its first and last page.", type::small,
                 FontFace::regular, palette::muted);
  flow.ensure(safety_block_height(flow) + 12);
  doc.add_bookmark("SAFETY", flow.page(), flow.y());
  add_safety_block(flow);
  doc.draw_footers("ferrum · weekly bundle " + week_label);
  doc.save(path);
}

}  // namespace ferrum::report
