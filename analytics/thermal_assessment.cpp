#include "analytics/thermal_assessment.h"

#include <algorithm>
#include <climits>
#include <cmath>
#include <cstdio>
#include <map>

#include "analytics/action_plan.h"
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

// Load and cooling actions count from the last load point of the summary
// window (the evidence), falling back to as_of.
void thermal_actions(const ThermalSummary& th, Day as_of, const ThermalOptions& o, const std::string& method,
                     UnitAssessment& out) {
  const Day found = th.to ? day_of(*th.to) : as_of;
  if (th.top_oil_discrepancy_k && *th.top_oil_discrepancy_k > o.discrepancy_threshold_k)
    out.actions.push_back(dated_action(
        2, found, o.cooling_check_due_days,
        "Check the cooling system (fans, pumps, radiators, valves, oil level) and the top-oil sensor",
        "measured top oil runs " + fmt("%.1f", *th.top_oil_discrepancy_k) + " K above the " + method +
            " model on average (threshold " + fmt("%.1f", o.discrepancy_threshold_k) + " K)",
        kSourceLoad, "cooling-check", kCrewMaintenance));
  // Above the normal cyclic limit the load already ages the paper faster than
  // the loading guide plans for: P2 within 30 days, so that the relief comes
  // before the next peak season, not after it. Above the long-time emergency
  // limit (140 °C, where IEC 60076-7 warns of gas bubbles from wet paper):
  // P1 within 7 days. Priorities and days: ferrum's policy, no published source.
  if (th.hours_above_normal_cyclic.value_or(0) > 0) {
    const bool emergency = th.hours_above_long_emergency.value_or(0) > 0;
    out.actions.push_back(dated_action(
        emergency ? 1 : 2, found, emergency ? 7 : 30,
        "Reduce the load, or transfer load to a unit the site view names as able to take it",
        std::string(th.hot_spot_from_measured_top_oil ? "hot spot (from measured top oil)" : "model hot spot") +
            " above " + fmt("%.0f", th.normal_cyclic_limit_c) + " °C for " +
            fmt("%.1f", *th.hours_above_normal_cyclic) + " h" +
            (emergency ? " and above " + fmt("%.0f", th.long_emergency_limit_c) + " °C for " +
                             fmt("%.1f", *th.hours_above_long_emergency) + " h"
                       : std::string()) +
            " in the last period (IEC 60076-7 loading limits)",
        kSourceLoad, "load-reduce", kCrewEngineering));
  }
}

// Mean measured-minus-model top oil over the window: its raw points that carry
// a measurement and the days the retention summarised (load_history.h);
// nullopt without any.
std::optional<double> window_discrepancy(std::span<const ThermalPoint> all, std::span<const LoadDay> days, Window w) {
  double sum = 0;
  std::size_t n = 0;
  for (const auto& p : all)
    if (p.t >= w.from && p.t < w.to && std::isfinite(p.measured_top_oil_c)) sum += p.measured_top_oil_c - p.top_oil_c, ++n;
  for (const auto& d : days) {
    sum += d.top_oil_excess_k;
    n += static_cast<std::size_t>(d.top_oil_measurements);
  }
  if (n == 0) return std::nullopt;
  return sum / static_cast<double>(n);
}

// Hot spot from the measured top oil: θ_h = θ_o,measured + Δθ_h, where Δθ_h is
// the model's hot-spot-to-top-oil gradient at that point (IEC 60076-7:2018
// §8.2.3, measured top oil as input; eq. 2 / eq. 3 for V). The ageing of a
// step is re-integrated by the logarithmic mean of V between the step's ends
// (mean_ageing_rate, ferrum's rule). Points without a measurement keep the
// model. The model top oil stays in top_oil_c, so the discrepancy remains
// visible. Returns the number of points changed inside the window.
std::size_t use_measured_top_oil(std::vector<ThermalPoint>& points, PaperType paper, Window w) {
  std::size_t changed = 0;
  double prev_hs = 0, prev_v = 0;
  for (std::size_t i = 0; i < points.size(); ++i) {
    ThermalPoint& p = points[i];
    if (std::isfinite(p.measured_top_oil_c)) {
      p.hot_spot_c = p.measured_top_oil_c + (p.hot_spot_c - p.top_oil_c);
      p.ageing_rate = ageing_rate(paper, p.hot_spot_c);
      if (p.t >= w.from && p.t < w.to) ++changed;
    }
    if (i > 0 && p.step_h > 0)
      p.ageing_h = mean_ageing_rate(paper, prev_hs, prev_v, p.hot_spot_c, p.ageing_rate) * p.step_h;
    prev_hs = p.hot_spot_c;
    prev_v = p.ageing_rate;
  }
  return changed;
}

// Steady-state hot spot of the unit's model at load k and ambient θ_a, °C
// (IEC 60076-7 eq. for the ultimate top-oil rise and gradient; IEEE C57.91
// clause 7 ultimate rises), plus a measured top-oil offset.
double steady_hot_spot(const ThermalModel& m, double k, double ambient_c, double offset_k) {
  if (m.method == ThermalMethod::iec60076_7) return iec_steady_state(m.iec, k, ambient_c).hot_spot_c() + offset_k;
  const auto s = ieee_steady_state(m.ieee, k);
  return ambient_c + s.top_oil_rise_k + s.hot_spot_rise_k + offset_k;
}

// Long-time emergency capability: the load at which the steady hot spot
// reaches the long-time emergency limit (IEC 60076-7 Table 4), by bisection
// over 0..3 p.u. (the hot spot rises with load). Steady state is the
// conservative reading of a loss of a neighbour lasting hours.
std::optional<double> emergency_load(const ThermalModel& m, double ambient_c, double offset_k, double limit_c) {
  double lo = 0, hi = 3;
  if (steady_hot_spot(m, lo, ambient_c, offset_k) >= limit_c) return 0.0;
  if (steady_hot_spot(m, hi, ambient_c, offset_k) <= limit_c) return hi;
  for (int i = 0; i < 60; ++i) {
    const double mid = 0.5 * (lo + hi);
    (steady_hot_spot(m, mid, ambient_c, offset_k) < limit_c ? lo : hi) = mid;
  }
  return 0.5 * (lo + hi);
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
  const auto summarised_days = days_in(summarised, w.from, w.to);
  const auto discrepancy = window_discrepancy(points, summarised_days, w);
  th.measured_top_oil_above_k = o.measured_top_oil_above_k;
  th.hot_spot_from_measured_top_oil = discrepancy && *discrepancy > o.measured_top_oil_above_k;
  if (th.hot_spot_from_measured_top_oil) {
    th.measured_top_oil_points = use_measured_top_oil(points, data.info.paper, w);
    if (!summarised_days.empty())
      th.notes.push_back("hot spot from the measured top oil for the raw load points only: the days the retention "
                         "summarised (store.keep_load_points_years) keep the model's hot spot and ageing");
  }
  summarise_window(points, summarised, w, o, th);
  th.top_oil_discrepancy_k = discrepancy;  // measured minus the model, whatever the hot spot's basis
  if (th.peak_load_pu) {
    const auto peak = std::find_if(points.begin(), points.end(), [&](const ThermalPoint& p) {
      return p.t >= w.from && p.t < w.to && p.load_pu == *th.peak_load_pu;
    });
    if (peak != points.end()) {  // the peak may lie in a day the retention summarised
      th.emergency_ambient_c = peak->ambient_c;
      th.emergency_load_pu = emergency_load(model, peak->ambient_c,
                                            th.hot_spot_from_measured_top_oil ? *discrepancy : 0.0,
                                            o.limits.long_emergency_c);
    }
  }
  out.methods.push_back(std::string("hot-spot and top-oil temperature: ") +
                        (o.method == ThermalMethod::iec60076_7
                             ? "IEC 60076-7:2005 §8.2 difference equations"
                             : "IEEE C57.91-2011 clause 7 exponential equations"));
  out.methods.push_back("insulation ageing: " + ageing_rate_source(data.info.paper) +
                        "; % loss of life against " + fmt("%.0f", o.normal_life_h) +
                        " h normal life (IEEE C57.91-2011 Table 1)");
  out.methods.push_back("loading limits: IEC 60076-7:2005 Table 4 hot-spot limits 120/140/160 °C");
  if (th.hot_spot_from_measured_top_oil)
    out.methods.push_back("hot spot and ageing from the measured top-oil temperature plus the model's hot-spot "
                          "gradient (IEC 60076-7:2018 §8.2.3, measured top oil as input) at " +
                          std::to_string(th.measured_top_oil_points) + " points: measured top oil runs " +
                          fmt("%.1f", *th.top_oil_discrepancy_k) + " K above the model on average (more than " +
                          fmt("%.1f", o.measured_top_oil_above_k) + " K, [analysis] measured_top_oil_above_k)");
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
    // Severity 3-4 (retighten or repair) takes the connection out of service;
    // severity 2 is watched by the thermographer; severity 1 waits for the
    // next planned outage (common practice, no published source).
    out.actions.push_back(dated_action(5 - s, f.date, o.infrared_due_days[s - 1], text, reason, kSourceInfrared,
                                       "ir-repair:" + f.component, s == 2 ? kCrewThermography : kCrewMaintenance,
                                       s >= 3));
  }
}

// The first inspection of the unbroken run of inspections, up to the latest,
// that rated the item as bad as now or worse: a finding re-inspected and
// still there keeps the date it was found (issue #16). Same-day records: the
// worst counts.
Day finding_since(std::span<const InspectionRecord> records, const InspectionFinding& f) {
  std::map<Day, Rating> worst;  // date -> worst rating of that day
  for (const auto& r : records)
    if (r.item == f.item && r.date <= f.date) {
      auto [it, fresh] = worst.emplace(r.date, r.rating);
      if (!fresh && static_cast<int>(r.rating) > static_cast<int>(it->second)) it->second = r.rating;
    }
  Day since = f.date;
  for (auto it = worst.rbegin(); it != worst.rend() && static_cast<int>(it->second) >= static_cast<int>(f.rating); ++it)
    since = it->first;
  return since;
}

// The job an inspection finding calls for: an unsafe item is made safe at
// once; any other item rated fair or worse is repaired by the maintenance
// crew, due from the date it was found by its rating (sooner when it got
// worse).
Action inspection_job(const InspectionFinding& f, Day since, const ThermalOptions& o) {
  const int r = static_cast<int>(f.rating);  // 2 fair .. 5 unsafe
  const std::string item = words(f.item);
  const bool outage = std::find(o.outage_items.begin(), o.outage_items.end(), f.item) != o.outage_items.end();
  // The inspector's note is quoted as theirs: "repair booked for the December
  // outage" there is the inspector's word, not a booking ferrum knows of
  // (bookings come from work-status files, work_status.h).
  const std::string note = (f.note.empty() ? "" : " (inspector's note: \"" + f.note + "\")") +
                           (since < f.date ? ", so rated since " + format_day(since) : "");
  if (f.rating == Rating::unsafe)
    return dated_action(1, since, o.inspection_job_due_days[3], "Make safe or take out of service: " + item,
                        "inspection " + format_day(f.date) + " rated " + item + " unsafe" + note, kSourceInspection,
                        "inspection:" + f.item, kCrewMaintenance, false);
  int priority = 6 - r;  // fair 4, poor 3, very poor 2
  int due_days = o.inspection_job_due_days[r - 2];
  std::string reason = item + " rated " + words(to_string(f.rating)) + " on " + format_day(f.date) + note;
  if (f.worse) {
    priority = std::min(priority, 3);
    due_days = std::min(due_days, o.worse_item_due_days);
    reason += ", previously " + words(to_string(*f.previous));
  }
  return dated_action(priority, since, due_days, "Repair or maintain the " + item + " (inspection finding)", reason,
                      kSourceInspection, "inspection:" + f.item, kCrewMaintenance, outage);
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
    if (f.rating == Rating::good) continue;
    // A fair item waits for the routine maintenance after the inspection
    // that last reported it; poor or worse counts from when it was found.
    const Day since = f.rating >= Rating::poor ? finding_since(data.inspections, f) : f.date;
    (f.rating == Rating::unsafe ? urgent : out.actions).push_back(inspection_job(f, since, o));
  }
  out.actions.insert(out.actions.begin(), urgent.begin(), urgent.end());
  if (!review.overdue_items.empty()) {
    // Due when the oldest of the overdue items fell due: its last inspection
    // plus the interval (already past, so the visit shows as overdue).
    Day oldest = as_of;
    for (const auto& f : review.findings)
      if (std::find(review.overdue_items.begin(), review.overdue_items.end(), f.item) != review.overdue_items.end())
        oldest = std::min(oldest, f.date);
    out.actions.push_back(dated_action(3, oldest, o.inspection.interval_days, "Inspect " + words(join(review.overdue_items)),
                                       "last inspection of these items on " + format_day(oldest) + ", more than " +
                                           std::to_string(o.inspection.interval_days) + " days before " +
                                           format_day(as_of) + " (ferrum inspection interval)",
                                       kSourceInspection, "inspection-visit", kCrewMaintenance));
  }
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
