#include "report/unit_report.h"

#include "analytics/held_back.h"

#include <algorithm>
#include <cctype>

#include "report/assessment_changes.h"
#include "report/decision_text.h"
#include "report/health_ruler.h"
#include "report/pdf_document.h"
#include "report/report_format.h"
#include "report/safety_block.h"
#include "report/table_sources.h"
#include "report/title_block.h"
#include "report/unit_report_sections.h"

namespace ferrum::report {
namespace {
using analytics::UnitAssessment;

std::string unit_title(const UnitAssessment& a) {
  std::string t = a.unit.unit_id.empty() ? std::string("unnamed unit") : a.unit.unit_id;
  if (!a.unit.site.empty()) t += " · " + a.unit.site;
  return t;
}

// Prominent box at the top of page 1 for conditions that bear on safety.
void safety_warning(PageFlow& flow, const UnitAssessment& a) {
  std::vector<std::string> lines;
  if (a.active_arcing)
    lines.push_back("Active-arcing gas signature in the oil (" + (a.dga.duval_reading.empty() ? std::string("see gases")
                    : a.dga.duval_reading) + "). Do not energise or re-energise this unit until an engineer has evaluated it.");
  if (a.unsafe_inspection) {
    std::string items;
    for (const auto& f : a.inspection)
      if (f.rating == analytics::Rating::unsafe) items += (items.empty() ? "" : ", ") + item_title(f.item);
    lines.push_back("An inspection item is rated UNSAFE" + (items.empty() ? std::string() : " (" + items + ")") +
                    ". Keep clear and have it evaluated by qualified personnel before further work near the unit.");
  }
  if (lines.empty()) return;
  const double pad = 7, w = flow.width() - 2 * pad - 6;
  double h = 2 * pad + 11;
  for (const auto& l : lines) h += flow.text_height(l, w, 8.6, FontFace::bold) + 2;
  const double top = flow.take(h);
  HPDF_Page page = flow.page();
  fill_rect(page, flow.x(), top - h, flow.width(), h, palette::accent_light);
  stroke_rect(page, flow.x(), top - h, flow.width(), h, palette::ink, 2);
  fill_rect(page, flow.x(), top - h, 6, h, palette::ink);
  draw_text(page, flow.doc().font(FontFace::bold), 9.5, flow.x() + pad + 6, top - pad - 9,
            "WARNING — SAFETY-RELEVANT FINDING", palette::ink);
  double y = top - pad - 13;
  for (const auto& l : lines) y = flow.draw_wrapped(l, flow.x() + pad + 6, y, w, 8.6, FontFace::bold) - 2;
  flow.space(8);
}

std::vector<std::pair<std::string, std::string>> identity(const UnitAssessment& a) {
  const auto& u = a.unit;
  const bool known_year = u.year_built > 0;
  const int as_of_year = analytics::civil_from_days(a.as_of).year;
  std::string age = known_year ? std::to_string(as_of_year - u.year_built) + " years (built " +
                                     std::to_string(u.year_built) + ")"
                               : std::string(kNoValue);
  auto text = [](const std::string& s) { return s.empty() ? std::string(kNoValue) : s; };
  return {{"Site", text(u.site)},
          {"Unit", text(u.unit_id) + (u.serial.empty() ? "" : " (serial " + u.serial + ")")},
          {"Rating", fmt_mva(u.rated_mva, "MVA")},
          {"Voltages", u.hv_kv > 0 ? fmt_number(u.hv_kv, u.hv_kv < 10 ? 1 : 0) + " / " +
                                         fmt_number(u.lv_kv, u.lv_kv < 10 ? 1 : 0) + " kV"
                                   : kNoValue},
          {"Cooling", text(u.cooling)},
          {"Vector group", text(u.vector_group)},
          {"Age", age},
          {"Paper / oil", std::string(u.paper == analytics::PaperType::kraft ? "kraft" : "thermally upgraded") +
                              " / " + (u.oil == analytics::OilType::mineral ? "mineral oil" : "ester")}};
}

void health_block(PageFlow& flow, const UnitAssessment& a, const UnitAssessment* previous) {
  flow.subsection("Health index", health_ruler_height() + 10);
  const double ruler_w = flow.width() * 0.55;
  const double h = health_ruler_height();
  const double top = flow.take(h + 4);
  draw_health_ruler(flow.page(), flow.doc(), Box{flow.x(), top - h, ruler_w, h}, a.health_index,
                    previous ? previous->health_index : std::nullopt);
  // Plain words to the right of the ruler.
  const double tx = flow.x() + ruler_w + 18, tw = flow.width() - ruler_w - 18;
  double y = top;
  const std::string headline = a.health_index ? "Health index " + fmt_health_index(a.health_index) + " of 100" +
                                                    (a.band.empty() ? "" : ": " + a.band)
                                              : "Health index: not computed";
  y = flow.draw_wrapped(headline, tx, y, tw, 10, FontFace::bold);
  // A correctable finding holds the index down: the band's expected life would
  // contradict the remaining life, so the line says what holds it instead.
  // Likewise the band's generic expected life never stands beside the unit's
  // own remaining-life estimate.
  if (!a.decision.index_note.empty())
    y = flow.draw_wrapped("Held down by a correctable finding (see the recommendation below); the remaining life "
                          "comes from end-of-life evidence only.", tx, y, tw, 7.8, FontFace::regular);
  else if (a.remaining_life.years)
    // The unit's own estimate (the remaining-life line below) governs; the
    // band's generic expectation could contradict it, so it is not printed.
    y = flow.draw_wrapped("Remaining life: this unit's own estimate, below.", tx, y, tw, 7.8, FontFace::regular);
  else if (!a.band_expected_life.empty())
    y = flow.draw_wrapped("Typical life left in this band: " + a.band_expected_life +
                              " (no estimate of this unit's own: too little data)",
                          tx, y, tw, 7.8, FontFace::regular);
  if (!a.confidence.empty()) y = flow.draw_wrapped("Basis: " + a.confidence, tx, y, tw, 7.8, FontFace::regular, palette::muted);
  if (previous) flow.draw_wrapped("Hollow marker: previous report (" + fmt_day(previous->as_of) + ")", tx, y, tw, 7, FontFace::regular, palette::muted);
}

void remaining_life_line(PageFlow& flow, const UnitAssessment& a) {
  const auto& rl = a.remaining_life;
  std::string text = "Remaining life: ";
  if (rl.years && rl.beyond_horizon) {
    text += "more than " + fmt_number(rl.horizon_years, 0) + " years (the planning horizon)";
    text += ".";
  } else if (rl.years) {
    text += fmt_years_range(rl.years, rl.low_years, rl.high_years);
    if (!rl.limiting_factor.empty()) text += ", limited by " + limiting_factor_words(rl.limiting_factor);
    text += ".";
  } else {
    text += "not estimated (not enough data).";
  }
  flow.paragraph(text, 9.2, FontFace::bold);
  if (rl.years && !rl.beyond_horizon && !rl.range_method.empty())
    flow.paragraph("Range from the uncertainty of the inputs: " + rl.range_method + ". End-of-life evidence only: "
                   "correctable defects do not shorten it.", type::small, FontFace::regular, palette::muted);
  // The one decision, as the fleet ranking shows it.
  const auto& d = a.decision;
  if (d.action.empty()) return;
  flow.paragraph("Recommended: " + action_text(d.action, d.year) + (d.treatment.empty() ? "" : " (" + d.treatment + ")"),
                 9.2, FontFace::bold);
  flow.paragraph(d.reason, type::body);
  // The fleet's budget plan may fund a replacement or refurbishment later than
  // the year above (analytics/plan): say so where it does, or where this
  // report could not know.
  using S = analytics::PlanSchedule::State;
  const auto& plan = a.budget_plan;
  if (plan.state == S::later && plan.year)
    flow.paragraph("The fleet's budget-constrained plan funds this " + d.action + " in " + std::to_string(*plan.year) +
                       ", later than the year above, because the yearly budget does not reach it sooner (see the plan "
                       "in the fleet report).",
                   type::body, FontFace::bold);
  else if (plan.state == S::unfunded)
    flow.paragraph("The fleet's budget-constrained plan does not fund this " + d.action + " by " +
                       std::to_string(plan.last_year) + ", the plan's last year (see the plan in the fleet report).",
                   type::body, FontFace::bold);
  else if (plan.state == S::not_known)
    flow.paragraph("The fleet's budget-constrained plan may fund this " + d.action + " later than the year above: "
                   "see the plan in the fleet report.",
                   type::body);
  if (!d.index_note.empty()) flow.paragraph(d.index_note, type::body);
}

// Work the planners reported done or cancelled (work-status files): listed,
// so that a report never looks as if it ignored a repair. The finding behind
// it may still stand in the data until newer evidence (a sample, a survey,
// load data) shows the repair held; then the action stays closed, and newer
// evidence of the same finding raises it again.
void closed_actions(PageFlow& flow, const UnitAssessment& a) {
  if (a.closed_actions.empty()) return;
  std::string text = "Closed by the planners' work status: ";
  for (std::size_t i = 0; i < a.closed_actions.size(); ++i) {
    const auto& c = a.closed_actions[i];
    text += (i ? "; " : "") + c.reference + " (" + c.text + ") " + c.status + " on " + fmt_day(c.work_date) +
            (c.work_note.empty() ? "" : ": " + c.work_note);
  }
  flow.paragraph(text + ". A finding may still show in the data above until newer evidence confirms the work.",
                 type::small);
}

void actions_table(PageFlow& flow, const UnitAssessment& a) {
  if (a.actions.empty()) {
    flow.subsection("What to do: prioritized actions");
    no_data_note(flow, "No actions: continue routine maintenance and sampling.");
    closed_actions(flow, a);
    return;
  }
  std::vector<analytics::Action> sorted = a.actions;
  std::stable_sort(sorted.begin(), sorted.end(), [](const auto& x, const auto& y) {
    return x.priority != y.priority ? x.priority < y.priority : x.due < y.due;
  });
  // Planner's columns (issue #16): the evidence the due date counts from,
  // the due date and whether it is past, the crew and whether the unit must
  // be out of service, and the reference quoted in a work-status file.
  Table t;
  t.columns = {{"Priority", 0.8}, {"Found", 1.2}, {"Due", 1.2}, {"Action", 3.15}, {"Why", 2.3}, {"Crew", 1.35}};
  for (const auto& act : sorted) {
    const std::string found =
        act.found ? fmt_day(act.found) + (act.source.empty() ? "" : "\n" + act.source) : act.source;
    // A booked action shows its booking date instead of "overdue" (work-status files).
    const std::string due = fmt_day(act.due) + (act.status == "booked" ? "\nbooked " + fmt_day(act.work_date)
                                                : act.overdue                ? "\nOVERDUE"
                                                                             : "");
    const std::string action = act.text + (act.reference.empty() ? "" : "\nref. " + act.reference);
    const std::string crew = (act.crew.empty() ? std::string("-") : act.crew) +
                             (act.outage ? "\noutage: yes" : "\noutage: no");
    t.rows.push_back({priority_title(act.priority), found, due, action, act.reason, crew});
    t.emphasis.push_back(act.priority == 1 || act.overdue);
  }
  // The heading keeps the table's header and first row with it: never a
  // heading with nothing under it above the page's safety block.
  flow.subsection("What to do: prioritized actions", flow.table_start_height(t));
  flow.table(t);
  closed_actions(flow, a);
}

void freshness_table(PageFlow& flow, const UnitAssessment& a) {
  flow.subsection("How fresh the data are");
  std::vector<std::pair<std::string, std::string>> items;
  for (const auto& f : a.freshness)
    items.push_back({f.kind + " data", f.latest ? fmt_day(f.latest) + " (" + fmt_number(f.age_years, 1, "years old") + ")"
                                                : std::string("none on record")});
  if (items.empty())
    no_data_note(flow, "No dated records of any kind.");
  else
    flow.key_values(items, 4);
  if (!a.missing.empty()) flow.paragraph("Missing: " + [&] {
    std::string s;
    for (const auto& m : a.missing) s += (s.empty() ? "" : "; ") + m;
    return s;
  }(), type::body, FontFace::regular, palette::ink);
  // Rejected files holding newer results than this report uses (analytics/held_back.h).
  if (!a.held_back.empty()) {
    flow.paragraph("Data held back", type::body, FontFace::bold, palette::ink);
    std::vector<std::string> lines;
    for (const auto& h : a.held_back) {
      std::string line = analytics::held_back_text(h);
      line[0] = static_cast<char>(std::toupper(static_cast<unsigned char>(line[0])));
      lines.push_back(line + ".");
    }
    flow.bullets(lines, type::small + 0.3);
  }
}

}  // namespace

void no_data_note(PageFlow& flow, const std::string& what) {
  flow.paragraph(what, type::body, FontFace::regular, palette::muted);
}

void summary_section(PageFlow& flow, const UnitAssessment& a, const UnitAssessment* previous,
                     const ReportOptions& options) {
  draw_title_block(flow, options, "Transformer condition report", unit_title(a),
                   "assessment as of " + fmt_day(a.as_of));
  safety_warning(flow, a);
  // The title block already heads page 1: the summary gets a slim heading.
  flow.doc().add_bookmark("Summary", flow.page(), flow.y() + 30);
  draw_text(flow.page(), flow.doc().font(FontFace::bold), 9, flow.x(), flow.y() - 9, "Summary", palette::accent);
  draw_line(flow.page(), flow.x(), flow.y() - 13, flow.x() + flow.width(), flow.y() - 13, palette::rule, 0.5);
  flow.space(19);
  flow.key_values(identity(a), 4);
  unverified_tables_line(flow, a);
  health_block(flow, a, previous);
  remaining_life_line(flow, a);
  actions_table(flow, a);
  freshness_table(flow, a);
  flow.subsection("Since the previous report", 20);
  flow.bullets(describe_changes(a, previous), type::small);
}

void render_unit_report(const UnitAssessment& current, const UnitAssessment* previous,
                        const std::vector<SourceFile>& files, const ReportOptions& options,
                        const std::string& path) {
  const std::string title = "Transformer condition report: " + unit_title(current);
  PdfDocument doc(options, title, "Condition assessment as of " + fmt_day(current.as_of));
  PageFlow flow(doc, title + " · as of " + fmt_day(current.as_of));

  // Page 1 carries the safety cautions at its foot, whatever else it holds.
  const double safety_h = safety_block_height(flow);
  draw_safety_block(flow, flow.bottom() + safety_h);
  flow.reserve_bottom(safety_h + 10);
  summary_section(flow, current, previous, options);

  // Detail starts on a fresh page unless the summary already ran over.
  if (doc.pages().size() == 1) flow.new_page();
  gases_section(flow, current);
  oil_paper_section(flow, current);
  thermal_section(flow, current);
  findings_section(flow, current);
  electrical_section(flow, current);
  health_index_section(flow, current);
  sources_section(flow, current, files, options);

  // The block carries its own SAFETY heading; only a bookmark is added here.
  flow.ensure(safety_h + 12);
  doc.add_bookmark("SAFETY", flow.page(), flow.y());
  add_safety_block(flow);
  doc.draw_footers("ferrum · " + unit_title(current) + " · as of " + fmt_day(current.as_of));
  doc.save(path);
}

}  // namespace ferrum::report
