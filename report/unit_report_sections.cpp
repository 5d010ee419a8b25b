#include "report/unit_report_sections.h"

#include <algorithm>
#include <cmath>

#include "report/chart_scale.h"
#include "report/duval_plot.h"
#include "report/pdf_chart.h"
#include "report/report_format.h"
#include "report/table_sources.h"

namespace ferrum::report {
namespace {
using analytics::UnitAssessment;

std::string or_dash(const std::string& s) { return s.empty() ? std::string(kNoValue) : s; }
std::string opt_text(const std::optional<std::string>& s) { return s ? *s : std::string(kNoValue); }
std::string opt_int(const std::optional<int>& v) { return v ? std::to_string(*v) : std::string(kNoValue); }
std::string yes_no(const std::optional<bool>& v) { return !v ? std::string(kNoValue) : *v ? "yes" : "NO"; }

// ---- Gases ---------------------------------------------------------------

struct GasStyle {
  const char* key;
  std::optional<double> UnitAssessment::GasHistoryPoint::*field;
  Dash dash;
  Marker marker;
  Color color;
};

const std::vector<GasStyle>& gas_styles() {
  using H = UnitAssessment::GasHistoryPoint;
  static const std::vector<GasStyle> styles = {
      {"H2", &H::h2, Dash::solid, Marker::circle, palette::ink},
      {"CH4", &H::ch4, Dash::dashed, Marker::square, palette::ink},
      {"C2H6", &H::c2h6, Dash::dotted, Marker::triangle, palette::muted},
      {"C2H4", &H::c2h4, Dash::dash_dot, Marker::diamond, palette::ink},
      {"C2H2", &H::c2h2, Dash::solid, Marker::ring, palette::accent},
      {"CO", &H::co, Dash::dashed, Marker::cross, palette::muted},
      {"CO2", &H::co2, Dash::dotted, Marker::plus, palette::muted},
  };
  return styles;
}

// The gases of samples on or after `from`, on a log axis when they span
// decades (wants_log_scale).
LineChart gas_chart(const UnitAssessment& a, analytics::Day from, const std::string& title) {
  LineChart chart;
  double lo = 0, hi = 0;
  for (const auto& g : gas_styles()) {
    ChartSeries s;
    s.label = gas_label(g.key);
    s.dash = g.dash;
    s.marker = g.marker;
    s.color = g.color;
    for (const auto& p : a.gas_history) {
      const auto v = p.*(g.field);
      if (!v || p.date < from) continue;
      s.points.push_back({static_cast<double>(p.date), *v});
      if (*v > 0) {
        lo = lo > 0 ? std::min(lo, *v) : *v;
        hi = std::max(hi, *v);
      }
    }
    if (!s.points.empty()) chart.series.push_back(std::move(s));
  }
  chart.log_y = wants_log_scale(lo, hi);
  chart.y_label = "µL/L (ppm), " + title;
  return chart;
}

// The whole history, and beside it the last kRecentGasYears so that an onset
// of a year or two is not squeezed into the edge of a twenty-year axis.
constexpr int kRecentGasYears = 3;

void gas_trend_chart(PageFlow& flow, const UnitAssessment& a) {
  const double h = 165;
  const double top = flow.take(h);
  analytics::Day first = 0, last = 0;
  for (const auto& p : a.gas_history) {
    first = first == 0 ? p.date : std::min(first, p.date);
    last = std::max(last, p.date);
  }
  const analytics::Day recent_from = last - kRecentGasYears * 365;
  if (first >= recent_from) {  // the history is recent already: one chart
    draw_line_chart(flow.page(), flow.doc(), Box{flow.x(), top - h, flow.width(), h},
                    gas_chart(a, first, "all samples"));
  } else {
    const double gap = 14, w_all = (flow.width() - gap) * 0.55;
    draw_line_chart(flow.page(), flow.doc(), Box{flow.x(), top - h, w_all, h},
                    gas_chart(a, first, "all samples since " + analytics::format_day(first)));
    draw_line_chart(flow.page(), flow.doc(), Box{flow.x() + w_all + gap, top - h, flow.width() - w_all - gap, h},
                    gas_chart(a, recent_from, "last " + std::to_string(kRecentGasYears) + " years"));
  }
  flow.space(6);
}

void latest_gas_table(PageFlow& flow, const UnitAssessment& a) {
  Table t;
  t.font_size = 7.8;
  t.columns = {{"Gas", 1}, {"µL/L (ppm)", 1, Align::right}, {"IEEE C57.104-2008 condition", 1.6, Align::right},
               {"Rate, µL/L per year", 1.3, Align::right}};
  for (const auto& g : a.dga.gases)
    t.rows.push_back({gas_label(g.gas), g.below_limit ? "below limit" : fmt_ppm(g.ppm), opt_int(g.c57104_2008_condition),
                      fmt_number(g.rate_ppm_per_year, 1)});
  flow.table(t);
}

void dga_readings(PageFlow& flow, const UnitAssessment& a) {
  const auto& d = a.dga;
  Table t;
  t.font_size = 7.8;
  t.columns = {{"Method", 1.6}, {"Reading", 1.0}, {"Meaning", 3.4}};
  t.rows = {
      // Rates in µL/L per year, as in the gas table; Table 3's own unit (per day) beside it.
      {"TDCG", fmt_ppm(d.tdcg_ppm) + " µL/L",
       d.tdcg_rate_ppm_per_day ? "rate " + fmt_number(*d.tdcg_rate_ppm_per_day * 365.25, 0) + " µL/L per year (" +
                                     fmt_number(d.tdcg_rate_ppm_per_day, 1) + " µL/L per day, the unit of C57.104-2008 Table 3), last two samples"
                               : ""},
      {"IEEE C57.104-2008 (highest of TDCG and single gases)", "condition " + opt_int(d.c57104_2008_condition),
       d.c57104_2008_fault_condition ? "fault-gas condition (CO, CO₂ left out) " + opt_int(d.c57104_2008_fault_condition) : ""},
      {"IEEE C57.104-2008 Table 3 (TDCG and its rate)", "condition " + opt_int(d.c57104_2008_tdcg_condition),
       or_dash(d.c57104_2008_interval.empty() && d.c57104_2008_action.empty()
                   ? ""
                   : or_dash(d.c57104_2008_table3_basis) + "; sampling: " + or_dash(d.c57104_2008_interval) +
                         "; procedure: " + or_dash(d.c57104_2008_action))},
  };
  for (const auto& g : d.c57104_2008_single_gases)
    t.rows.push_back({"Single gas above TDCG's condition (C57.104-2008 Table 1)", "", g});
  if (!d.acetylene_trend.empty())
    t.rows.push_back({"Acetylene", d.acetylene_trend,
                      d.acetylene_first_detected ? "first detected " + analytics::format_day(*d.acetylene_first_detected) : ""});
  const std::vector<std::vector<std::string>> typing = {
      {"IEEE C57.104-2019", "status " + opt_int(d.c57104_2019_status), or_dash(d.c57104_2019_reason)},
      {"Duval Triangle 1", opt_text(d.duval_triangle_1), or_dash(d.duval_reading)},
      {"Duval Pentagon 1", opt_text(d.duval_pentagon_1), ""},
      {"IEC 60599 ratios", opt_text(d.iec60599_ratio_fault), or_dash(d.iec60599_reading)},
      {"CO₂/CO ratio", fmt_number(d.co2_co_ratio, 1), or_dash(d.co2_co_reading)},
      {"Key gas", d.key_gas_indicative_only ? "indicative only" : "", or_dash(d.key_gas)},
  };
  t.rows.insert(t.rows.end(), typing.begin(), typing.end());
  flow.table(t);
}

void duval_block(PageFlow& flow, const UnitAssessment& a) {
  flow.subsection("Duval Triangle 1 (mineral oil, main tank)", 200);
  const double h = 200, tri_w = 250;
  const double top = flow.take(h);
  draw_duval_triangle(flow.page(), flow.doc(), Box{flow.x(), top - h, tri_w, h}, duval_triangle1_zones(),
                      a.dga.duval_history);
  // Beside the triangle: the plotted samples and the zone legend.
  const double tx = flow.x() + tri_w + 16, tw = flow.width() - tri_w - 16;
  double y = top - 4;
  y = flow.draw_wrapped("Plotted samples (latest filled)", tx, y, tw, 8, FontFace::bold);
  if (a.dga.duval_history.empty())
    y = flow.draw_wrapped("No sample with enough CH₄, C₂H₄ and C₂H₂ to plot.", tx, y, tw, 7.6, FontFace::regular, palette::muted);
  const size_t n = a.dga.duval_history.size();
  for (size_t i = n > 8 ? n - 8 : 0; i < n; ++i) {
    const auto& p = a.dga.duval_history[i];
    const std::string line = analytics::format_day(p.date) + "   " + fmt_number(p.pct_ch4, 1) + " / " +
                             fmt_number(p.pct_c2h4, 1) + " / " + fmt_number(p.pct_c2h2, 1) + " %   " + p.zone;
    y = flow.draw_wrapped(line, tx, y, tw, 7.4, FontFace::regular);
  }
  y = flow.draw_wrapped("Shares: CH₄ / C₂H₄ / C₂H₂ in % of their sum.", tx, y - 3, tw, 6.8, FontFace::regular, palette::muted);
  y -= 4;
  y = flow.draw_wrapped("Zones", tx, y, tw, 8, FontFace::bold);
  static const char* legend[] = {"PD partial discharge", "T1 thermal fault below 300 °C",
                                 "T2 thermal fault 300–700 °C", "T3 thermal fault above 700 °C",
                                 "D1 discharges of low energy", "D2 discharges of high energy",
                                 "DT mixed electrical and thermal"};
  for (const char* l : legend) y = flow.draw_wrapped(l, tx, y, tw, 7.2, FontFace::regular);
  flow.draw_wrapped("Zone vertices: Akbari et al., Software implementation of the Duval Triangle, Table II.",
                    tx, y - 3, tw, 6.6, FontFace::regular, palette::muted);
  flow.space(4);
}

// ---- Thermal -------------------------------------------------------------

// One time series of daily values, drawn full width at the flow position.
void place_time_chart(PageFlow& flow, LineChart chart, const std::vector<analytics::SeriesPoint>& values,
                      const std::string& label, Color color, double height) {
  ChartSeries s;
  s.label = label;
  s.color = color;
  for (const auto& p : values) s.points.push_back({static_cast<double>(p.t) / 86400.0, p.value});
  chart.series.push_back(std::move(s));
  chart.y_min = 0;
  const double top = flow.take(height);
  draw_line_chart(flow.page(), flow.doc(), Box{flow.x(), top - height, flow.width(), height}, chart);
  flow.space(4);
}

void hot_spot_chart(PageFlow& flow, const analytics::ThermalSummary& th) {
  LineChart chart;
  chart.y_label = "Hot-spot temperature, °C (daily maximum)";
  auto limit = [](double c, const std::string& name, Dash dash) {
    return LimitLine{c, name + " " + fmt_number(c, 0, "°C"), dash};
  };
  chart.limits = {limit(th.normal_cyclic_limit_c, "normal cyclic", Dash::dashed),
                  limit(th.long_emergency_limit_c, "long-time emergency", Dash::dash_dot),
                  limit(th.short_emergency_limit_c, "short-time emergency", Dash::dotted)};
  chart.bands = {{th.normal_cyclic_limit_c, th.short_emergency_limit_c + 1000, palette::accent_light}};
  place_time_chart(flow, chart, th.hot_spot_series, "hot spot", palette::ink, 160);
}

void load_chart(PageFlow& flow, const analytics::ThermalSummary& th) {
  LineChart chart;
  chart.y_label = "Load, per unit of rating (daily maximum)";
  chart.limits = {{1.0, "nameplate 1.0 pu", Dash::dashed}};
  place_time_chart(flow, chart, th.load_series, "load", palette::accent, 120);
}

}  // namespace

void gases_section(PageFlow& flow, const UnitAssessment& a) {
  flow.section("Dissolved gases");
  if (!a.dga.sample_date && a.gas_history.empty()) {
    no_data_note(flow, "No dissolved-gas analysis on record: the gas diagnostics and the DGA factor are missing.");
    return;
  }
  flow.subsection("Latest sample: " + fmt_day(a.dga.sample_date));
  latest_gas_table(flow, a);
  const bool mineral = a.unit.oil == analytics::OilType::mineral;
  if (mineral) {
    dga_readings(flow, a);
  } else {
    // The mineral-oil interpretations are withheld; the gases are still trended.
    flow.paragraph("Interpretation methods made for mineral oil are not applied to this " +
                       std::string(analytics::to_string(a.unit.oil)) + "-filled unit:",
                   type::body, FontFace::regular);
    flow.bullets(a.methods_not_applied, type::small + 0.3);
  }
  flow.subsection("Gas trend over the sample history", 170);
  if (a.gas_history.size() < 2)
    no_data_note(flow, "Fewer than two samples: no trend to draw.");
  else
    gas_trend_chart(flow, a);
  if (mineral) duval_block(flow, a);
}

void oil_paper_section(PageFlow& flow, const UnitAssessment& a) {
  flow.section("Oil quality and paper");
  const auto& o = a.oil;
  if (!o.sample_date && o.checks.empty()) {
    no_data_note(flow, "No oil-quality tests on record.");
  } else {
    flow.subsection("Oil tests of " + fmt_day(o.sample_date) + " against their limits");
    Table t;
    t.font_size = 7.8;
    t.columns = {{"Test", 1.8}, {"Value", 1.05, Align::right}, {"Limit", 1.15, Align::right}, {"Within", 0.55}, {"Limit source", 2.6}};
    for (const auto& c : o.checks) {
      const std::string limit =
          c.limit ? (c.limit_kind == "min" ? "≥ " : "≤ ") + fmt_measure(c.limit, c.unit) : std::string(kNoValue);
      t.rows.push_back({oil_test_title(c.test), fmt_measure(c.value, c.unit), limit,
                        yes_no(c.within_limit), or_dash(c.source)});
      t.emphasis.push_back(c.within_limit && !*c.within_limit);
    }
    flow.table(t);
    flow.key_values({{"Relative saturation of the oil", fmt_number(o.relative_saturation_pct, 1, "%")},
                     {"Water solubility at sampling temperature", fmt_number(o.water_solubility_ppm, 0, "mg/kg")},
                     {"Water in paper (estimate)", fmt_number(o.paper_moisture_pct, 1, "%")},
                     {"Oil class (IEEE C57.106)", or_dash(o.oil_class)}},
                    4);
    if (!o.moisture_method.empty()) flow.paragraph("Moisture method: " + o.moisture_method, type::small, FontFace::regular, palette::muted);
    if (!o.notes.empty()) flow.bullets(o.notes);
  }
  const auto& p = a.paper;
  flow.subsection("Paper insulation");
  if (!p.furan_2fal_ppb && !p.dp_estimate) {
    no_data_note(flow, "No furan analysis on record: degree of polymerisation not estimated.");
    return;
  }
  flow.key_values({{"2-FAL (sample " + fmt_day(p.sample_date) + ")", fmt_number(p.furan_2fal_ppb, 0, "µg/L")},
                   {"DP estimate", fmt_number(p.dp_estimate, 0) + (p.dp_method.empty() ? "" : " (" + p.dp_method + ")")},
                   {"DP, second correlation", fmt_number(p.dp_alternative, 0) + (p.dp_alternative_method.empty() ? "" : " (" + p.dp_alternative_method + ")")},
                   {"Paper life used", fmt_number(p.life_used_pct, 0, "%")}},
                  4);
  if (!p.trustworthy || !p.note.empty())
    flow.paragraph((p.trustworthy ? "" : "Use with care: ") + p.note, type::body, FontFace::regular, palette::ink);
}

void thermal_section(PageFlow& flow, const UnitAssessment& a) {
  flow.section("Loading and heat", 200);
  const auto& th = a.thermal;
  if (!a.site_summary.empty()) flow.paragraph(a.site_summary, type::body, FontFace::bold);  // site view, N-1
  if (th.hot_spot_series.empty() && !th.peak_hot_spot_c) {
    no_data_note(flow, "No load data on record: hot-spot temperature, ageing and loss of life are not computed.");
    return;
  }
  const std::string period = th.from && th.to ? fmt_timestamp(*th.from) + " to " + fmt_timestamp(*th.to) : std::string(kNoValue);
  flow.paragraph("Period " + period + ". Model: " + or_dash(th.method) + "." +
                     (th.hot_spot_from_measured_top_oil
                          ? " Hot spot and ageing from the measured top oil (+ model gradient, IEC 60076-7:2018): it runs " +
                                fmt_number(th.top_oil_discrepancy_k, 1, "K") + " above the model (limit " +
                                fmt_number(th.measured_top_oil_above_k, 1, "K") + ")."
                          : std::string()),
                 type::body);
  if (!th.hot_spot_series.empty()) hot_spot_chart(flow, th);
  if (!th.load_series.empty()) load_chart(flow, th);
  flow.key_values({{"Peak hot spot", fmt_number(th.peak_hot_spot_c, 1, "°C")},
                   {"Peak top oil", fmt_number(th.peak_top_oil_c, 1, "°C")},
                   {"Equivalent ageing factor", fmt_ageing_factor(th.equivalent_ageing_factor)},
                   {"Loss of life", fmt_number(th.loss_of_life_hours, 0, "h") + " (" + fmt_number(th.loss_of_life_pct, 3, "%") + ")"},
                   {"Peak / 99th percentile load", fmt_number(th.peak_load_pu, 2) + " / " + fmt_number(th.p99_load_pu, 2, "pu")},
                   {"Hours above nameplate", fmt_number(th.hours_above_nameplate, 0, "h")},
                   {"Hours above " + fmt_number(th.normal_cyclic_limit_c, 0, "°C"), fmt_number(th.hours_above_normal_cyclic, 0, "h")},
                   {"Hours above " + fmt_number(th.long_emergency_limit_c, 0, "°C") + " / " + fmt_number(th.short_emergency_limit_c, 0, "°C"),
                    fmt_number(th.hours_above_long_emergency, 0) + " / " + fmt_number(th.hours_above_short_emergency, 0, "h")},
                   {"Load growth", fmt_number(th.load_growth_pct_per_year, 1, "% per year")},
                   {"Top oil, measured − model", fmt_number(th.top_oil_discrepancy_k, 1, "K")},
                   {"Hours covered / bridged", fmt_number(th.covered_hours, 0) + " / " + fmt_number(th.bridged_hours, 0, "h")},
                   {"Ambient", th.ambient_from_profile ? "from a seasonal profile (no measurements)" : "measured"}},
                  4);
  if (!th.parameter_sources.empty()) {
    flow.paragraph("Thermal parameters", type::small, FontFace::bold, palette::muted);
    flow.bullets(th.parameter_sources, type::small);
  }
  if (!th.notes.empty()) flow.bullets(th.notes, type::small);
}

void findings_section(PageFlow& flow, const UnitAssessment& a) {
  flow.section("Infrared and inspection");
  flow.subsection("Infrared findings");
  if (a.infrared.empty()) {
    no_data_note(flow, "No infrared survey on record.");
  } else {
    Table t;
    t.font_size = 7.6;
    t.columns = {{"Date", 1.0}, {"Component", 1.6}, {"Load at survey", 0.8, Align::right},
                 {"ΔT to reference", 0.95, Align::right}, {"ΔT to ambient", 0.95, Align::right},
                 {"At rated load", 0.95, Align::right}, {"Priority (1 = most urgent)", 2.6}};
    std::vector<std::string> survey_notes;  // image reference and thermographer's note, where recorded
    // The maintenance-testing priority, spelled out, is the only label here:
    // ferrum's severity number (4 = worst, the other way round) stays in JSON.
    for (const auto& f : a.infrared) {
      std::string sev = f.severity_text.empty() ? std::string(kNoValue) : f.severity_text;
      if (f.low_load) sev += " (scan at low load: correction unreliable)";
      t.rows.push_back({analytics::format_day(f.date), f.component, fmt_number(f.load_pct, 0, "%"),
                        fmt_number(f.rise_over_reference_k, 1, "K"), fmt_number(f.rise_over_ambient_k, 1, "K"),
                        fmt_number(f.corrected_rise_k, 1, "K"), sev});
      t.emphasis.push_back(f.severity && *f.severity >= 4);
      if (!f.image_ref.empty() || !f.note.empty())
        survey_notes.push_back(analytics::format_day(f.date) + " " + f.component + ": " +
                               (f.image_ref.empty() ? "" : "image " + f.image_ref) +
                               (f.image_ref.empty() || f.note.empty() ? "" : "; ") +
                               (f.note.empty() ? "" : "thermographer's note: " + f.note));
    }
    flow.table(t);
    if (!survey_notes.empty()) {
      flow.paragraph("Images and notes of the survey", type::small, FontFace::bold, palette::muted);
      flow.bullets(survey_notes, type::small);
    }
  }
  flow.subsection("Inspection findings");
  if (a.inspection.empty()) {
    no_data_note(flow, "No inspection on record.");
    return;
  }
  Table t;
  t.font_size = 7.6;
  t.columns = {{"Item", 1.3}, {"Date", 1.0}, {"Rating", 0.9}, {"Previous", 0.9}, {"Trend", 0.8}, {"Note", 3.2}};
  for (const auto& f : a.inspection) {
    std::string trend = !f.previous ? "first record" : f.worse ? "worse" : f.rating < *f.previous ? "better" : "same";
    t.rows.push_back({item_title(f.item), analytics::format_day(f.date), rating_title(f.rating),
                      f.previous ? rating_title(*f.previous) : std::string(kNoValue), trend, f.note});
    t.emphasis.push_back(f.rating == analytics::Rating::unsafe || f.worse);
  }
  flow.table(t);
}

void health_index_section(PageFlow& flow, const UnitAssessment& a) {
  flow.section("Health index explained");
  if (a.factors.empty()) {
    no_data_note(flow, "No factor could be scored: the health index is not computed.");
  } else {
    flow.paragraph("Each factor is rated 0 to 4 (4 = best); its weight sets its share of the 0–100 index. "
                   "Factors without data carry weight 0.", type::body);
    Table t;
    t.font_size = 7.6;
    t.columns = {{"Factor", 1.2}, {"Score (0–4, 4 = best)", 0.75, Align::right}, {"Weight", 0.6, Align::right},
                 {"Points", 0.6, Align::right}, {"What drove it", 2.6}, {"Method", 2.0}};
    double total = 0;
    for (const auto& f : a.factors) {
      total += f.contribution;
      t.rows.push_back({factor_title(f.name), f.score ? fmt_number(f.score, 1) : "no data", fmt_number(f.weight, 0),
                        fmt_number(f.contribution, 1), f.detail, f.source});
    }
    t.rows.push_back({"Health index", "", "", fmt_number(total, 1), "sum of points, printed as " + fmt_health_index(a.health_index), ""});
    t.emphasis.assign(t.rows.size() - 1, false);
    t.emphasis.push_back(true);
    flow.table(t);
  }
  flow.subsection("Remaining life estimates");
  if (a.remaining_life.estimates.empty()) {
    no_data_note(flow, "No remaining-life estimate could be made.");
    return;
  }
  Table t;
  t.font_size = 7.6;
  t.columns = {{"Basis", 1.0}, {"Years", 0.7, Align::right}, {"Range", 1.0, Align::right}, {"Method", 4.0}};
  for (const auto& e : a.remaining_life.estimates) {
    const bool limiting = e.basis == a.remaining_life.limiting_factor;
    t.rows.push_back({e.basis + (limiting ? " (limiting)" : ""), fmt_number(e.years, 1),
                      e.low_years && e.high_years ? fmt_number(e.low_years, 1) + "–" + fmt_number(e.high_years, 1) : kNoValue, e.method});
    t.emphasis.push_back(limiting);
  }
  flow.table(t);
}

void sources_section(PageFlow& flow, const UnitAssessment& a, const std::vector<SourceFile>& files,
                     const ReportOptions& options) {
  flow.section("Sources, methods and assumptions");
  flow.subsection("Files behind this report");
  if (files.empty()) {
    no_data_note(flow, "No imported file refers to this unit.");
  } else {
    Table t;
    t.font_size = 7.6;
    t.columns = {{"Delivered by", 1.3}, {"File", 2.6}, {"Kind", 0.9}, {"Imported", 1.4}, {"Rows", 0.6, Align::right}};
    for (const auto& f : files)
      t.rows.push_back({f.party, f.file_name, f.kind, f.imported_at, std::to_string(f.rows)});
    flow.table(t);
  }
  if (!options.utc_offset_note.empty()) flow.paragraph("Time zone: " + options.utc_offset_note + ".", type::body, FontFace::regular);
  flow.subsection("Methods and their published sources");
  if (a.methods.empty()) no_data_note(flow, "No method could be applied.");
  else flow.bullets(a.methods, type::small + 0.3);
  if (!a.methods_not_applied.empty()) {
    flow.subsection("Methods not applied to this unit, and why");
    flow.bullets(a.methods_not_applied, type::small + 0.3);
  }
  standard_tables_subsection(flow, a);
  flow.subsection("Assumptions");
  if (a.assumptions.empty()) no_data_note(flow, "None recorded.");
  else flow.bullets(a.assumptions, type::small + 0.3);
  if (!a.missing.empty()) {
    flow.subsection("Missing data");
    flow.bullets(a.missing, type::small + 0.3);
  }
}

}  // namespace ferrum::report
