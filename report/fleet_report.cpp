#include "report/fleet_report.h"

#include <algorithm>
#include <cctype>
#include <map>

#include "report/decision_text.h"
#include "report/health_ruler.h"
#include "report/pdf_chart.h"
#include "report/pdf_document.h"
#include "report/report_format.h"
#include "report/safety_block.h"
#include "report/site_section.h"
#include "report/title_block.h"
#include "report/work_list_report.h"

namespace ferrum::report {
namespace {
// Rows of the work list in the fleet report; the CSV (ferrum worklist --csv) has them all.
constexpr std::size_t kFleetReportWorkListRows = 300;
using analytics::FleetRanking;
using analytics::RankedUnit;
using analytics::UnitAssessment;

std::string lower(std::string s) {
  for (char& c : s) c = static_cast<char>(std::tolower(static_cast<unsigned char>(c)));
  return s;
}

std::string rank_text(const RankedUnit& u) {
  if (u.insufficient_data) return kNoValue;
  return std::to_string(u.rank) + (u.tied ? "=" : "");
}

void ranking_table(PageFlow& flow, const FleetRanking& ranking) {
  flow.section("Ranking by risk");
  if (ranking.units.empty()) {
    flow.paragraph("No units in the ranking.", type::body, FontFace::regular, palette::muted);
    return;
  }
  flow.paragraph("Highest risk first; equal risks share a rank (marked =). Risk is the expected number of failures "
                 "per 1,000 unit-years (from the health index) times the unit's consequence rating (0 to 1). The "
                 "calibration is ferrum's own (" + ranking.risk_calibration + "): compare units with it, do not "
                 "read it as a forecast. Action and year are the unit report's; where the budget plan below "
                 "funds a replacement or refurbishment later, its year follows in brackets; "
                 "\"First action\" is the unit's most urgent task.", type::small, FontFace::regular, palette::muted);
  Table t;
  t.font_size = 7.0;
  t.columns = {{"Rank", 0.46}, {"Unit", 0.72}, {"Site", 0.85}, {"MVA", 0.42, Align::right}, {"HI", 0.42, Align::right},
               {"Band", 1.12}, {"Life", 0.85, Align::right}, {"Limited by", 0.95}, {"Risk", 0.5, Align::right},
               {"Action", 1.05}, {"First action", 2.2}};
  // Why a unit has too little data can run to many lines: it goes under the
  // table at full width, not into the narrow Action cell.
  std::vector<std::string> why_insufficient;
  for (const auto& u : ranking.units) {
    std::string action = u.recommended_action;
    if (u.insufficient_data) {
      action = action_text(u.recommended_action, u.action_year) + " (too little data, see below)";
      why_insufficient.push_back(u.unit_id + ", too little data: " + (u.note.empty() ? "no health index" : u.note));
    }
    const std::string first = first_action_text(u.first_action);
    t.rows.push_back({rank_text(u), u.unit_id, u.site, fmt_mva(u.rated_mva), fmt_health_index(u.health_index),
                      u.band.empty() ? kNoValue : u.band, life_text(u.remaining_life_years, u.beyond_horizon, u.horizon_years),
                      u.limiting_factor.empty() ? kNoValue : limiting_factor_words(u.limiting_factor), risk_text(u.risk),
                      u.insufficient_data ? action : action_text(action, u.action_year, u.budget_plan),
                      first.empty() ? kNoValue : first});
    t.emphasis.push_back(u.recommended_action == "replace");
  }
  flow.table(t);
  for (const auto& why : why_insufficient) flow.paragraph(why, type::small, FontFace::regular, palette::muted);
}

BarChart band_chart(const FleetRanking& ranking) {
  BarChart c;
  std::map<std::string, int> counts;
  for (const auto& u : ranking.units) counts[u.health_index ? lower(u.band) : "no index"]++;
  for (const auto& b : health_index_bands()) {
    c.categories.push_back(b.name);
    c.values.push_back(counts[b.name]);
    counts.erase(b.name);
  }
  for (const auto& [name, n] : counts) {  // bands the ruler does not know, then "no index"
    c.categories.push_back(name);
    c.values.push_back(n);
  }
  for (double v : c.values) c.bar_labels.push_back(fmt_number(v, 0));
  c.y_label = "Units per condition band";
  c.color = Color::gray(0.55f);
  c.counts = true;
  return c;
}

BarChart mva_chart(const FleetRanking& ranking) {
  BarChart c;
  for (const auto& y : ranking.mva_due_by_year) {
    c.categories.push_back(std::to_string(y.year));
    c.values.push_back(y.mva);
    c.bar_labels.push_back(y.mva > 0 ? fmt_mva(y.mva) : "");
  }
  c.y_label = "Rated MVA due for replacement, per year";
  return c;
}

// Every unit whose remaining life ends within the outlook, whatever its
// action this year.
void life_outlook(PageFlow& flow, const FleetRanking& ranking) {
  flow.section("Remaining life ending within ten years", 40);
  if (ranking.outlook.empty()) {
    flow.paragraph("No unit's remaining life ends within the next ten years.", type::body, FontFace::regular,
                   palette::muted);
    return;
  }
  Table t;
  t.font_size = 7.4;
  t.columns = {{"Unit", 0.8}, {"Site", 1.3}, {"MVA", 0.5, Align::right}, {"Life", 0.8, Align::right},
               {"Ends", 0.5, Align::right}, {"Limited by", 1.2}, {"Action", 1.1}};
  std::map<std::string, const analytics::PlanSchedule*> plan_of;
  for (const auto& u : ranking.units) plan_of[u.unit_id] = &u.budget_plan;
  for (const auto& e : ranking.outlook) {
    const auto it = plan_of.find(e.unit_id);
    t.rows.push_back({e.unit_id, e.site, fmt_mva(e.rated_mva),
                      fmt_number(e.remaining_life_years, 1, "years"), std::to_string(e.life_ends_year),
                      limiting_factor_words(e.limiting_factor),
                      it == plan_of.end() ? action_text(e.action, e.action_year)
                                          : action_text(e.action, e.action_year, *it->second)});
  }
  flow.table(t);
}

void charts(PageFlow& flow, const FleetRanking& ranking) {
  flow.section("Condition bands and replacement outlook", 170);
  const double h = 150, gap = 20;
  const double w = (flow.width() - gap) / 2;
  const double top = flow.take(h);
  draw_bar_chart(flow.page(), flow.doc(), Box{flow.x(), top - h, w * 0.85, h}, band_chart(ranking));
  if (ranking.mva_due_by_year.empty())
    draw_text(flow.page(), flow.doc().font(FontFace::regular), type::body, flow.x() + w + gap, top - 20,
              "No replacement due in the next ten years.", palette::muted);
  else
    draw_bar_chart(flow.page(), flow.doc(), Box{flow.x() + w + gap, top - h, w, h}, mva_chart(ranking));
  flow.space(8);
}

void alerts(PageFlow& flow, const std::vector<std::string>& open_alerts) {
  flow.section("Units with open alerts", 30);
  if (open_alerts.empty())
    flow.paragraph("No open alerts.", type::body, FontFace::regular, palette::muted);
  else
    flow.bullets(open_alerts);
}

void coverage(PageFlow& flow, const std::vector<UnitAssessment>& units) {
  flow.section("Data coverage", 40);
  Table t;
  t.font_size = 7.4;
  t.columns = {{"Unit", 0.8}, {"Site", 1.3}, {"Stale or absent data", 2.4}, {"Missing", 2.6}};
  for (const auto& u : units) {
    std::string stale;
    for (const auto& f : u.freshness) {
      std::string item;
      if (!f.latest) item = f.kind + ": none";
      else if (f.age_years && *f.age_years > kStaleDataYears) item = f.kind + ": " + fmt_number(f.age_years, 1, "years old");
      if (!item.empty()) stale += (stale.empty() ? "" : "; ") + item;
    }
    std::string missing;
    for (const auto& m : u.missing) missing += (missing.empty() ? "" : "; ") + m;
    if (stale.empty() && missing.empty()) continue;
    t.rows.push_back({u.unit.unit_id, u.unit.site, stale.empty() ? kNoValue : stale, missing.empty() ? kNoValue : missing});
  }
  if (t.rows.empty()) {
    flow.paragraph("Every unit has current data of every kind (none older than " + fmt_number(kStaleDataYears, 0) +
                   " year).", type::body, FontFace::regular, palette::muted);
    return;
  }
  flow.paragraph("Units with data older than " + fmt_number(kStaleDataYears, 0) + " year, or none at all:", type::small,
                 FontFace::regular, palette::muted);
  flow.table(t);
}

}  // namespace

void render_fleet_report(const FleetRanking& ranking, const std::vector<UnitAssessment>& units,
                         const std::vector<std::string>& open_alerts, const ReportOptions& options,
                         const std::string& path, const PlanSection* plan,
                         const std::vector<analytics::SiteView>* sites) {
  const std::string title = "Fleet condition ranking";
  PdfDocument doc(options, title + " as of " + fmt_day(ranking.as_of), "Fleet ranking by risk");
  PageFlow flow(doc, title + " · as of " + fmt_day(ranking.as_of));
  // Page 1 carries the safety cautions at its foot, as in the unit report.
  const double safety_h = safety_block_height(flow);
  const double first_safety_top = flow.bottom() + safety_h;
  draw_safety_block(flow, first_safety_top);
  flow.reserve_bottom(safety_h + 10);
  draw_title_block(flow, options, "Fleet report", title,
                   "as of " + fmt_day(ranking.as_of) + " · " + std::to_string(ranking.units.size()) + " units");
  ranking_table(flow, ranking);
  charts(flow, ranking);
  life_outlook(flow, ranking);
  if (plan) plan_section(flow, *plan);
  if (sites) site_section(flow, *sites);
  work_list_section(flow, analytics::work_list(units), ranking.as_of, kFleetReportWorkListRows);
  alerts(flow, open_alerts);
  coverage(flow, units);
  // A one-page report already has the block at its foot; a longer one
  // repeats it at the end.
  if (doc.pages().size() > 1) {
    flow.ensure(safety_h + 12);
    doc.add_bookmark("SAFETY", flow.page(), flow.y());
    add_safety_block(flow);
  } else {
    doc.add_bookmark("SAFETY", flow.page(), first_safety_top);
  }
  doc.draw_footers("ferrum · fleet ranking · as of " + fmt_day(ranking.as_of));
  doc.save(path);
}

}  // namespace ferrum::report
