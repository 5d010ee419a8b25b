#include "analytics/thermal_assessment.h"

#include <algorithm>
#include <climits>
#include <cmath>
#include <cstdio>

#include "analytics/ageing_rate.h"
#include "analytics/load_history.h"
#include "analytics/words.h"

namespace ferrum::analytics {
namespace {

std::string fmt(const char* format, double v) {
  char buf[64];
  std::snprintf(buf, sizeof buf, format, v);
  return buf;
}

std::string join(const std::vector<std::string>& v) {
  std::string s;
  for (const auto& x : v) s += (s.empty() ? "" : ", ") + x;
  return s;
}

Action action(int priority, Day due, std::string text, std::string reason) {
  return Action{priority, due, std::move(text), std::move(reason)};
}

// Window of the summary: [as_of − summary_days + 1, as_of], whole days.
struct Window {
  Timestamp from, to;  // to exclusive
};
Window summary_window(Day as_of, int days) { return {start_of(as_of + 1 - days), start_of(as_of + 1)}; }

void note_data_handling(const SimulationStats& st, ThermalSummary& th) {
  auto add = [&](std::size_t n, const char* what) {
    if (n > 0) th.notes.push_back(std::to_string(n) + " " + what);
  };
  add(st.duplicates, "load points with a duplicated timestamp dropped");
  add(st.backward_jumps, "load points earlier than their predecessor (clock stepped back) dropped");
  add(st.invalid_loads, "load points without a valid load dropped");
  if (st.restarts > 0)
    th.notes.push_back(std::to_string(st.restarts) + " gaps longer than the bridging limit (" +
                       fmt("%.0f", st.unbridged_h) + " h in all): model restarted from steady state");
}

void fill_parameters(const ThermalModel& model, const UnitInfo& unit, UnitAssessment& out) {
  out.thermal.parameter_sources = model.parameter_sources;
  if (!model.defaulted.empty())
    out.assumptions.push_back("thermal characteristics " + join(model.defaulted) +
                              " not in the unit register: recommended values of IEC 60076-7:2005 Table 5 used");
  if (!model.cooling_known)
    out.assumptions.push_back("cooling '" + unit.cooling + "' not recognised: treated as ONAN medium/large");
}

void thermal_actions(const ThermalSummary& th, Day as_of, const ThermalOptions& o, const std::string& method,
                     UnitAssessment& out) {
  if (th.top_oil_discrepancy_k && *th.top_oil_discrepancy_k > o.discrepancy_threshold_k)
    out.actions.push_back(action(
        2, as_of + o.cooling_check_due_days,
        "Check the cooling system (fans, pumps, radiators, valves, oil level) and the top-oil sensor",
        "measured top oil runs " + fmt("%.1f", *th.top_oil_discrepancy_k) + " K above the " + method +
            " model on average (threshold " + fmt("%.1f", o.discrepancy_threshold_k) + " K)"));
  if (th.hours_above_normal_cyclic.value_or(0) > 0) {
    const bool emergency = th.hours_above_long_emergency.value_or(0) > 0;
    out.actions.push_back(action(
        emergency ? 2 : 3, as_of + (emergency ? 30 : 90), "Reduce the load or transfer load to other units",
        "model hot spot above " + fmt("%.0f", th.normal_cyclic_limit_c) + " °C for " +
            fmt("%.1f", *th.hours_above_normal_cyclic) + " h" +
            (emergency ? " and above " + fmt("%.0f", th.long_emergency_limit_c) + " °C for " +
                             fmt("%.1f", *th.hours_above_long_emergency) + " h"
                       : std::string()) +
            " in the last period (IEC 60076-7 loading limits)"));
  }
}

// Days of the retention's summaries (load_history.h) with their start in [from, to).
std::span<const LoadDay> days_in(const LoadHistory* h, Timestamp from, Timestamp to) {
  if (!h) return {};
  auto first = std::find_if(h->days.begin(), h->days.end(), [&](const LoadDay& d) { return start_of(d.day) >= from; });
  auto last = std::find_if(first, h->days.end(), [&](const LoadDay& d) { return start_of(d.day) >= to; });
  return {first, last};
}

// The load-growth trend over the summarised days before the raw points, then
// the raw points: the same least squares as over the raw points alone.
LoadGrowth growth_over(std::span<const LoadDay> days, std::span<const ThermalPoint> all, double min_span_days) {
  if (days.empty()) return load_growth(all, min_span_days);
  GrowthSums sums;
  const Timestamp t0 = days.front().first_t;
  std::size_t count = 0;
  for (const auto& d : days) {
    sums.add_shifted(d.growth, (start_of(d.day) - t0) / kSecondsPerYear);
    count += 2;  // at least one point a day; two days or more give a span
  }
  const Timestamp last = all.empty() ? days.back().last_t : all.back().t;
  return load_growth(sums, t0, all, last, count + all.size(), min_span_days);
}

// Adds the summarised days of the window to the indicators of its raw points.
void add_days(std::span<const LoadDay> days, LoadIndicators& ind) {
  double excess = ind.top_oil_discrepancy_k.value_or(0) * static_cast<double>(ind.top_oil_measurements);
  for (const auto& d : days) {
    ind.period_h += d.covered_h;
    ind.bridged_h += d.bridged_h;
    ind.loss_of_life_h += d.ageing_h;
    ind.peak_load_pu = std::max(ind.peak_load_pu.value_or(d.peak_load_pu), d.peak_load_pu);
    ind.peak_hot_spot_c = std::max(ind.peak_hot_spot_c.value_or(d.peak_hot_spot_c), d.peak_hot_spot_c);
    ind.peak_top_oil_c = std::max(ind.peak_top_oil_c.value_or(d.peak_top_oil_c), d.peak_top_oil_c);
    ind.hours_above_nameplate += d.hours_above_nameplate;
    ind.hours_above_normal_cyclic += d.hours_above_normal_cyclic;
    ind.hours_above_long_emergency += d.hours_above_long_emergency;
    ind.hours_above_short_emergency += d.hours_above_short_emergency;
    excess += d.top_oil_excess_k;
    ind.top_oil_measurements += static_cast<std::size_t>(d.top_oil_measurements);
  }
  if (ind.top_oil_measurements > 0) ind.top_oil_discrepancy_k = excess / static_cast<double>(ind.top_oil_measurements);
}

// Chart points of the summarised days: each day's peak at its time.
std::vector<ThermalPoint> day_peaks(std::span<const LoadDay> days, std::span<const ThermalPoint> window,
                                    bool hot_spot) {
  std::vector<ThermalPoint> out;
  for (const auto& d : days) {
    ThermalPoint p;
    p.t = hot_spot ? d.peak_hot_spot_t : d.peak_load_t;
    p.load_pu = d.peak_load_pu;
    p.hot_spot_c = d.peak_hot_spot_c;
    out.push_back(p);
  }
  out.insert(out.end(), window.begin(), window.end());
  return out;
}

void summarise_window(std::span<const ThermalPoint> all, const LoadHistory* history, Window w,
                      const ThermalOptions& o, ThermalSummary& th) {
  std::vector<ThermalPoint> window;
  for (const auto& p : all)
    if (p.t >= w.from && p.t < w.to) window.push_back(p);
  const auto old_days = days_in(history, w.from, w.to);
  auto ind = load_indicators(window, o.limits);
  const auto growth = growth_over(days_in(history, INT64_MIN, w.to), all, o.min_growth_span_days);
  if (!window.empty()) th.from = window.front().t, th.to = window.back().t;
  if (!old_days.empty()) {
    add_days(old_days, ind);
    th.from = old_days.front().first_t;
    if (window.empty()) th.to = old_days.back().last_t;
    th.notes.push_back("load points before " + format_day(day_of(history->raw_from)) +
                       " summarised by day (store.keep_load_points_years): the 99th-percentile load is of the " +
                       "later points only");
    if (window.empty()) ind.p99_load_pu.reset();
  }
  th.covered_hours = ind.period_h;
  th.bridged_hours = ind.bridged_h;
  th.peak_hot_spot_c = ind.peak_hot_spot_c;
  th.peak_top_oil_c = ind.peak_top_oil_c;
  th.peak_load_pu = ind.peak_load_pu;
  th.p99_load_pu = ind.p99_load_pu;
  th.hours_above_nameplate = ind.hours_above_nameplate;
  th.hours_above_normal_cyclic = ind.hours_above_normal_cyclic;
  th.hours_above_long_emergency = ind.hours_above_long_emergency;
  th.hours_above_short_emergency = ind.hours_above_short_emergency;
  th.top_oil_discrepancy_k = ind.top_oil_discrepancy_k;
  th.load_growth_pct_per_year = growth.pct_per_year;
  if (!growth.pct_per_year) th.notes.push_back("no load growth trend: " + growth.note);
  if (ind.period_h > 0) {
    const auto age = summarise_ageing(ind.period_h, ind.loss_of_life_h, o.normal_life_h);
    th.equivalent_ageing_factor = age.equivalent_factor;
    th.loss_of_life_hours = age.loss_of_life_h;
    th.loss_of_life_pct = age.loss_of_life_pct;
  }
  th.ambient_from_profile = std::any_of(window.begin(), window.end(), [](auto& p) { return p.ambient_from_profile; }) ||
                            std::any_of(old_days.begin(), old_days.end(), [](auto& d) { return d.ambient_from_profile; });
  if (old_days.empty()) {
    th.load_series = reduce_to_bucket_maxima(window, o.chart_points, &ThermalPoint::load_pu);
    th.hot_spot_series = reduce_to_bucket_maxima(window, o.chart_points, &ThermalPoint::hot_spot_c);
  } else {
    th.load_series = reduce_to_bucket_maxima(day_peaks(old_days, window, false), o.chart_points, &ThermalPoint::load_pu);
    th.hot_spot_series =
        reduce_to_bucket_maxima(day_peaks(old_days, window, true), o.chart_points, &ThermalPoint::hot_spot_c);
  }
}

void assess_load(const UnitData& data, Day as_of, const ThermalOptions& o, UnitAssessment& out) {
  ThermalSummary& th = out.thermal;
  th.normal_cyclic_limit_c = o.limits.normal_cyclic_c;
  th.long_emergency_limit_c = o.limits.long_emergency_c;
  th.short_emergency_limit_c = o.limits.short_emergency_c;
  th.method = to_string(o.method);
  const Window w = summary_window(as_of, o.summary_days);
  std::vector<LoadPoint> history;
  for (const auto& p : data.load)
    if (p.t < w.to) history.push_back(p);
  const ThermalModel model = resolve_thermal_model(data.info, o.method);
  std::vector<ThermalPoint> points(history.size());
  // After the retention, the model goes on from where the summarised points left it.
  const LoadHistory* summarised = data.load_history.get();
  SimulationResume resume = summarised ? summarised->resume : SimulationResume{};
  const SimulationStats st = simulate_thermal(model, history, o.gaps, points, resume);
  points.resize(st.written);
  if (std::none_of(points.begin(), points.end(), [&](auto& p) { return p.t >= w.from; }) &&
      days_in(summarised, w.from, w.to).empty()) {
    out.missing.push_back("load series");
    return;
  }
  fill_parameters(model, data.info, out);
  note_data_handling(st, th);
  summarise_window(points, summarised, w, o, th);
  out.methods.push_back(std::string("hot-spot and top-oil temperature: ") +
                        (o.method == ThermalMethod::iec60076_7
                             ? "IEC 60076-7:2005 §8.2 difference equations"
                             : "IEEE C57.91-2011 clause 7 exponential equations"));
  out.methods.push_back("insulation ageing: " + ageing_rate_source(data.info.paper) +
                        "; % loss of life against " + fmt("%.0f", o.normal_life_h) +
                        " h normal life (IEEE C57.91-2011 Table 1)");
  out.methods.push_back("loading limits: IEC 60076-7:2005 Table 4 hot-spot limits 120/140/160 °C");
  if (th.ambient_from_profile)
    out.assumptions.push_back(
        "ambient temperature missing for part of the load series: monthly ambient profile used "
        "(common practice, no published source)");
  thermal_actions(th, as_of, o, th.method, out);
}

void assess_infrared(const UnitData& data, Day as_of, const ThermalOptions& o, UnitAssessment& out) {
  out.infrared = assess_infrared_survey(data.infrared, as_of, o.infrared);
  if (out.infrared.empty()) {
    out.missing.push_back("infrared survey");
    return;
  }
  out.methods.push_back("infrared: " + out.infrared.front().source + ", exponent " +
                        fmt("%.1f", std::clamp(o.infrared.load_exponent, 1.6, 2.0)));
  static const char* kText[] = {"Investigate the %s at the next planned outage",
                                "Monitor the %s and repair it when corrective measures can be taken",
                                "Retighten or repair the %s",
                                "Retighten or repair the %s immediately"};
  for (const auto& f : out.infrared) {
    if (!f.severity) continue;
    const int s = *f.severity;
    char text[256];
    std::snprintf(text, sizeof text, kText[s - 1], f.component.c_str());
    std::string reason = "infrared survey " + format_day(f.date) + ": " + f.severity_text;
    if (f.corrected_rise_k) reason += ", " + fmt("%.1f", *f.corrected_rise_k) + " K at rated load";
    out.actions.push_back(action(5 - s, as_of + o.infrared_due_days[s - 1], text, reason));
  }
}

void assess_inspections(const UnitData& data, Day as_of, const ThermalOptions& o, UnitAssessment& out) {
  const auto review = review_inspections(data.inspections, as_of, o.inspection);
  out.inspection = review.findings;
  if (review.findings.empty()) {
    out.missing.push_back("inspection");
    return;
  }
  out.unsafe_inspection = !review.unsafe_items.empty();
  std::vector<Action> urgent;
  for (const auto& f : review.findings) {
    if (f.rating == Rating::unsafe)
      urgent.push_back(action(1, as_of, "Make safe or take out of service: " + words(f.item),
                              "inspection " + format_day(f.date) + " rated " + words(f.item) + " unsafe" +
                                  (f.note.empty() ? "" : " (" + f.note + ")")));
    else if (f.worse)
      out.actions.push_back(action(3, as_of + o.worse_item_due_days, "Re-inspect and plan repair of " + words(f.item),
                                   words(f.item) + " rated " + words(to_string(f.rating)) + " on " + format_day(f.date) +
                                       ", previously " + words(to_string(*f.previous))));
  }
  out.actions.insert(out.actions.begin(), urgent.begin(), urgent.end());
  if (!review.overdue_items.empty())
    out.actions.push_back(action(3, as_of + o.overdue_inspection_due_days,
                                 "Inspect " + words(join(review.overdue_items)),
                                 "last inspection more than " + std::to_string(o.inspection.interval_days) +
                                     " days before " + format_day(as_of) + " (ferrum inspection interval)"));
}

}  // namespace

std::vector<SeriesPoint> reduce_to_bucket_maxima(std::span<const ThermalPoint> points, std::size_t max_points,
                                                 double ThermalPoint::*field) {
  std::vector<SeriesPoint> out;
  if (points.empty() || max_points == 0) return out;
  const Day first = day_of(points.front().t);
  const Day span = day_of(points.back().t) - first + 1;
  const Day per_bucket = std::max<Day>(1, (span + static_cast<Day>(max_points) - 1) / static_cast<Day>(max_points));
  Day bucket = -1;
  for (const auto& p : points) {
    const Day b = (day_of(p.t) - first) / per_bucket;
    if (b != bucket || out.empty()) {
      out.push_back({p.t, p.*field});
      bucket = b;
    } else if (p.*field > out.back().value) {
      out.back() = {p.t, p.*field};
    }
  }
  return out;
}

std::vector<ThermalPoint> thermal_series(const UnitInfo& unit, std::span<const LoadPoint> load,
                                         const ThermalOptions& options) {
  std::vector<ThermalPoint> out(load.size());
  const auto st = simulate_thermal(resolve_thermal_model(unit, options.method), load, options.gaps, out);
  out.resize(st.written);
  return out;
}

void assess_thermal(const UnitData& data, Day as_of, const ThermalOptions& options, UnitAssessment& out) {
  assess_load(data, as_of, options, out);
  assess_infrared(data, as_of, options, out);
  assess_inspections(data, as_of, options, out);
}

}  // namespace ferrum::analytics
