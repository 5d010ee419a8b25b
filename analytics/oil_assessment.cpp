#include "analytics/oil_assessment.h"

#include <algorithm>
#include <cmath>
#include <cstdio>

#include "analytics/action_plan.h"
#include "analytics/dga_gases.h"
#include "analytics/duval_triangle1.h"
#include "analytics/iec60599_ratios.h"
#include "analytics/oil_quality_c57106.h"

namespace ferrum::analytics {
namespace {

// Result of the DGA part, with the method lines it applied.
struct DgaWork {
  DgaSummary summary;
  std::vector<std::string> methods;
  std::vector<std::string> not_applied;
  std::optional<C57104_2008Procedure> procedure;
  std::optional<C57104_2008Condition> condition;
  std::vector<C57104_2019Status::Driver> s19_drivers;
  std::optional<double> acetylene_before;  // C2H2 of the previous sample, ppm (below limit: 0)
};

std::string method_line(const std::string& method, const std::string& source) { return method + " — " + source; }

std::string fmt_ppm(double v) {
  char buf[32];
  std::snprintf(buf, sizeof buf, "%.4g", v);
  return buf;
}

std::vector<OilSample> main_tank_history(const std::vector<OilSample>& all, Day as_of) {
  std::vector<OilSample> out;
  for (const OilSample& s : all)
    if (is_main_tank(s) && s.date <= as_of) out.push_back(s);
  std::stable_sort(out.begin(), out.end(), [](const OilSample& a, const OilSample& b) { return a.date < b.date; });
  return out;
}

std::optional<double> unit_age_years(const UnitInfo& unit, Day as_of) {
  if (unit.year_built <= 0) return std::nullopt;
  return civil_from_days(as_of).year - unit.year_built;
}

bool is_carbon_oxide(Gas g) { return g == Gas::co || g == Gas::co2; }

void fill_gas_readings(DgaSummary& d, const OilSample& last, const C57104_2008Condition* c2008,
                       const std::vector<OilSample>& history, const GasTrendOptions& trend) {
  for (Gas g : kAllGases) {
    GasReading r;
    r.gas = gas_name(g);
    const LabValue& v = gas_value(last, g);
    if (v.is_measured()) r.ppm = v.value;
    r.below_limit = v.is_below_limit();
    if (c2008) r.c57104_2008_condition = c2008->gas_condition[gas_index(g)];
    const GasTrend t = gas_trend(history, g, trend);
    if (t.applicable) r.rate_ppm_per_year = t.ppm_per_year;
    d.gases.push_back(r);
  }
}

// Acetylene appearing or rising between the last two samples.
bool acetylene_rising(const OilSample* prev, const OilSample& last) {
  if (!prev || !last.c2h2.is_measured() || !(last.c2h2.value > 0)) return false;
  const auto before = gas_ppm_or_zero(*prev, Gas::c2h2);
  return before && last.c2h2.value > *before;
}

bool c2h2_detected(const OilSample& s) { return s.c2h2.is_measured() && s.c2h2.value > 0; }

// Acetylene of the latest sample against the history: appeared (first
// detection), rising (detected before and higher than the previous sample)
// or present (detected before, not higher).
void fill_acetylene(DgaWork& w, const std::vector<OilSample>& samples) {
  DgaSummary& d = w.summary;
  const OilSample& last = samples.back();
  const OilSample* prev = samples.size() > 1 ? &samples[samples.size() - 2] : nullptr;
  if (prev) w.acetylene_before = gas_ppm_or_zero(*prev, Gas::c2h2);
  if (!c2h2_detected(last)) return;
  for (const OilSample& s : samples)
    if (c2h2_detected(s)) {
      d.acetylene_first_detected = s.date;
      break;
    }
  if (*d.acetylene_first_detected == last.date) d.acetylene_trend = "appeared";
  else d.acetylene_trend = acetylene_rising(prev, last) ? "rising" : "present";
}

void fill_duval_history(DgaSummary& d, const std::vector<OilSample>& gas_samples, int keep) {
  for (auto it = gas_samples.rbegin(); it != gas_samples.rend() && static_cast<int>(d.duval_history.size()) < keep; ++it) {
    auto t = duval_triangle1(gas_ppm_or_zero(*it, Gas::ch4), gas_ppm_or_zero(*it, Gas::c2h4),
                             gas_ppm_or_zero(*it, Gas::c2h2));
    if (!t.applicable) continue;
    d.duval_history.push_back({it->date, t.percent->ch4, t.percent->c2h4, t.percent->c2h2, t.zone});
  }
  std::reverse(d.duval_history.begin(), d.duval_history.end());
}

// The follow-up a single gas calls for when it reaches a higher C57.104-2008
// condition than TDCG.
std::string single_gas_followup(Gas g) {
  switch (g) {
    case Gas::c2h2: return "acetylene: investigate arcing";
    case Gas::co:
    case Gas::co2: return "carbon oxides from paper: paper-ageing follow-up with furans (2-FAL)";
    case Gas::h2: return "hydrogen: look for partial discharge with the fault-typing methods";
    default: return "hydrocarbon: look for overheating in oil with the fault-typing methods";
  }
}

void apply_2008(DgaWork& w, const std::vector<OilSample>& samples, const UnitInfo& unit, const OilOptions& o) {
  DgaSummary& d = w.summary;
  const OilSample& last = samples.back();
  const OilSample* prev = samples.size() > 1 ? &samples[samples.size() - 2] : nullptr;
  const C57104_2008Condition c = classify_c57104_2008(last);
  d.tdcg_ppm = c.tdcg_ppm;
  d.c57104_2008_condition = c.condition;
  d.c57104_2008_tdcg_condition = c.tdcg_condition;
  d.c57104_2008_fault_condition = c.fault_condition;
  fill_gas_readings(d, last, &c, samples, o.trend);
  if (prev) d.tdcg_rate_ppm_per_day = tdcg_rate_ppm_per_day(*prev, last);
  if (!c.applicable) return;
  w.condition = c;
  w.methods.push_back(method_line(c.method, c.source));
  for (const auto& g : c.gases_above_tdcg)
    d.c57104_2008_single_gases.push_back(std::string(gas_name(g.gas)) + " " + fmt_ppm(g.ppm) + " ppm (Condition " +
                                         std::to_string(g.condition) + ", above TDCG's): " + single_gas_followup(g.gas));
  // Table 3 is keyed on TDCG and its rate only.
  const C57104_2008Table3Basis basis = c57104_2008_table3_basis(c);
  if (!basis.condition) return;
  d.c57104_2008_table3_basis = basis.basis;
  C57104_2008Procedure p = c57104_2008_table3(*basis.condition, d.tdcg_rate_ppm_per_day, unit.hv_kv, o.table3);
  if (!p.applicable) return;
  d.c57104_2008_interval = p.interval;
  d.c57104_2008_interval_days = p.interval_days;
  d.c57104_2008_action = p.action;
  w.methods.push_back(method_line(p.method, p.source));
  w.procedure = p;
}

// The key-gas reading, marked indicative only where it disagrees with a
// diagnosis of Duval Triangle 1 or the IEC 60599 ratios.
void apply_key_gas(DgaWork& w, const KeyGasResult& k) {
  DgaSummary& d = w.summary;
  d.key_gas = k.reading;
  std::vector<std::string> others;
  if (d.duval_triangle_1) others.push_back("Duval Triangle 1 " + *d.duval_triangle_1);
  if (d.iec60599_ratio_fault) others.push_back("IEC 60599 ratios " + *d.iec60599_ratio_fault);
  if (!k.applicable || others.empty()) return;
  const bool agrees = (d.duval_triangle_1 && key_gas_agrees(k.fault_family, *d.duval_triangle_1)) ||
                      (d.iec60599_ratio_fault && key_gas_agrees(k.fault_family, *d.iec60599_ratio_fault));
  if (agrees) return;
  d.key_gas_indicative_only = true;
  std::string list;
  for (const auto& x : others) list += (list.empty() ? "" : " and ") + x;
  d.key_gas = "indicative only, disagrees with " + list + ": " + k.reading;
}

void apply_fault_typing(DgaWork& w, const std::vector<OilSample>& samples, const OilOptions& o) {
  DgaSummary& d = w.summary;
  const OilSample& last = samples.back();
  const OilSample* prev = samples.size() > 1 ? &samples[samples.size() - 2] : nullptr;
  const bool rising = prev && fault_gases_rising(*prev, last, o.rising_pct_per_month);
  const FaultEvidence evidence = dga_fault_evidence(last, o.typical, rising);

  const Iec60599Result iec = iec60599_ratios(last, o.typical, rising);
  d.iec60599_ratio_fault = iec.fault;
  d.iec60599_reading = iec.reading;
  w.methods.push_back(method_line(iec.method, iec.source));

  const DuvalTriangleResult t = duval_triangle1(gas_ppm_or_zero(last, Gas::ch4), gas_ppm_or_zero(last, Gas::c2h4),
                                                gas_ppm_or_zero(last, Gas::c2h2));
  if (!t.applicable) {
    d.duval_reading = t.why_not;
  } else if (!evidence.present) {
    d.duval_reading = evidence.reason;
  } else {
    d.duval_triangle_1 = t.zone;
    d.duval_reading = t.zone + ": " + t.zone_name;
  }
  w.methods.push_back(method_line(t.method, t.source));
  fill_duval_history(d, samples, o.duval_history_samples);

  const KeyGasResult k = key_gas_reading(last, o.typical, rising, o.key_gas);
  apply_key_gas(w, k);
  w.methods.push_back(method_line(k.method, k.source));

  const Co2CoResult cc = co2_co_reading(last, o.co2_co);
  d.co2_co_ratio = cc.ratio;
  d.co2_co_reading = cc.reading;
  w.methods.push_back(method_line(cc.method, cc.source));

  auto discharge = [](const std::optional<std::string>& f) { return f && (*f == "D1" || *f == "D2"); };
  d.active_arcing = acetylene_rising(prev, last) ||
                    (c2h2_detected(last) && (discharge(d.duval_triangle_1) || discharge(d.iec60599_ratio_fault)));
}

// Methods made for mineral oil, not applied to another fluid.
void note_mineral_only(DgaWork& w, const UnitInfo& unit) {
  const std::string why = ": valid for mineral oil only; this unit is filled with " + std::string(to_string(unit.oil));
  for (const char* m : {"IEEE C57.104-2008 conditions and Table 3 sampling interval",
                        "IEEE C57.104-2019 DGA status", "Duval Triangle 1", "IEC 60599 gas ratios",
                        "Key-gas method (IEEE C57.104-2008)", "CO2/CO ratio (IEC 60599)"})
    w.not_applied.push_back(m + why);
}

DgaWork summarise_dga(const std::vector<OilSample>& history, const UnitInfo& unit, Day as_of, const OilOptions& o) {
  DgaWork w;
  std::vector<OilSample> samples;
  for (const OilSample& s : history)
    if (has_gas_analysis(s)) samples.push_back(s);
  if (samples.empty()) return w;
  w.summary.sample_date = samples.back().date;
  fill_acetylene(w, samples);
  GasTrend trend;
  if (unit.oil != OilType::mineral) {
    // The gases are still trended; only the mineral-oil interpretations are withheld.
    note_mineral_only(w, unit);
    fill_gas_readings(w.summary, samples.back(), nullptr, samples, o.trend);
    const OilSample* prev = samples.size() > 1 ? &samples[samples.size() - 2] : nullptr;
    w.summary.active_arcing = acetylene_rising(prev, samples.back());
    w.methods.push_back(method_line(trend.method, trend.source));
    return w;
  }
  apply_2008(w, samples, unit, o);

  const C57104_2019Tables& tables = o.c57104_2019_tables ? *o.c57104_2019_tables : default_c57104_2019_tables();
  const C57104_2019Status s19 = c57104_2019_status(samples, unit_age_years(unit, as_of), tables, o.trend);
  w.summary.c57104_2019_status = s19.status;
  w.summary.c57104_2019_reason = s19.applicable ? s19.reason : s19.why_not;
  w.s19_drivers = s19.drivers;
  if (s19.applicable) {
    int fault = 1;
    for (const auto& d : s19.drivers)
      if (d.gas != "CO" && d.gas != "CO2") fault = std::max(fault, d.status);
    w.summary.c57104_2019_fault_status = fault;
  }
  w.methods.push_back(method_line(s19.method, s19.source));

  apply_fault_typing(w, samples, o);
  w.methods.push_back(method_line(trend.method, trend.source));
  return w;
}

Action oil_action(int priority, Day found, int due_days, std::string text, std::string reason, const char* need) {
  return dated_action(priority, found, due_days, std::move(text), std::move(reason), kSourceOilSample, need,
                      kCrewOilSampling);
}

std::string acetylene_words(const DgaSummary& d, const std::optional<double>& before) {
  const GasReading* c2h2 = nullptr;
  for (const auto& g : d.gases)
    if (g.gas == "C2H2") c2h2 = &g;
  std::string s = "acetylene " + (d.acetylene_trend.empty() ? std::string("detected") : d.acetylene_trend);
  if (c2h2 && c2h2->ppm) {
    s += " (" + (d.acetylene_trend == "rising" && before ? fmt_ppm(*before) + " -> " : std::string()) +
         fmt_ppm(*c2h2->ppm) + " ppm";
    if (d.acetylene_first_detected) s += ", first detected " + format_day(*d.acetylene_first_detected);
    s += ")";
  }
  return s;
}

// One action per need for the single gases above TDCG (Table 1) and the
// gases driving a C57.104-2019 Status 3.
void single_gas_actions(const DgaWork& w, Day found, const OilOptions& o, UnitAssessment& out) {
  std::string fault_gases, carbon_oxides;
  int fault_priority = 3;
  if (w.condition)
    for (const auto& g : w.condition->gases_above_tdcg) {
      const std::string what = std::string(gas_name(g.gas)) + " " + fmt_ppm(g.ppm) + " ppm (Condition " +
                               std::to_string(g.condition) + ")";
      if (is_carbon_oxide(g.gas)) carbon_oxides += (carbon_oxides.empty() ? "" : ", ") + what;
      else if (g.gas != Gas::c2h2) {
        fault_gases += (fault_gases.empty() ? "" : ", ") + what;
        if (g.condition >= 4) fault_priority = 2;
      }
    }
  const std::string tdcg = w.summary.c57104_2008_table3_basis;
  if (!fault_gases.empty())
    out.actions.push_back(oil_action(
        fault_priority, found, o.fault_gas_followup_days,
        "Investigate the fault gases: identify the fault with the fault-typing methods and confirm with a resample",
        "IEEE C57.104-2008 Table 1: " + fault_gases + " above the TDCG condition (" + tdcg + ")",
        "oil-dga-investigate"));
  std::string s19_fault, s19_oxides;
  for (const auto& d : w.s19_drivers) {
    if (d.status < 3) continue;
    std::string& list = d.gas == "CO" || d.gas == "CO2" ? s19_oxides : s19_fault;
    list += (list.empty() ? "" : "; ") + d.text;
  }
  if (!s19_fault.empty())
    out.actions.push_back(oil_action(2, found, o.status3_investigate_days,
                                     "Investigate the gassing: identify the fault and plan an outage",
                                     "C57.104-2019 DGA Status 3: " + w.summary.c57104_2019_reason, "oil-dga-investigate"));
  if (!carbon_oxides.empty() || !s19_oxides.empty()) {
    std::string reason = "CO and CO2 come from the paper; they set no sampling interval (Table 3 is keyed on TDCG)";
    if (!carbon_oxides.empty()) reason = "IEEE C57.104-2008 Table 1: " + carbon_oxides + " above the TDCG condition (" + tdcg + "); " + reason;
    if (!s19_oxides.empty()) reason += "; C57.104-2019 Status 3 from " + s19_oxides;
    out.actions.push_back(oil_action(3, found, o.paper_followup_days,
                                     "Follow up paper ageing: test furans (2-FAL) and review the CO2/CO ratio and its trend",
                                     reason, "paper-ageing-follow-up"));
  }
}

void dga_actions(const DgaWork& w, const UnitInfo& unit, const OilOptions& o, UnitAssessment& out) {
  const DgaSummary& d = w.summary;
  if (!d.sample_date) return;
  const Day found = *d.sample_date;  // due dates count from the latest sample, not the report date
  if (w.procedure) {
    const C57104_2008Procedure& p = *w.procedure;
    const std::string reason = "C57.104-2008 Table 3: " + d.c57104_2008_table3_basis + ", TDCG rate " + p.rate_band +
                               " ppm/day: interval " + p.interval;
    const int priority = std::max(1, 5 - p.condition);  // Condition 4 -> 1 ... Condition 1 -> 4
    out.actions.push_back(oil_action(priority, found, p.interval_days,
                                     "Resample main-tank oil for DGA within " + std::to_string(p.interval_days) + " days",
                                     reason, "oil-resample"));
    if (p.condition >= 3) {
      // The procedures of Conditions 3 and 4 include planning an outage
      // (IEEE C57.104-2008, Table 3): the job joins the unit's one outage action.
      Action act = oil_action(p.condition == 4 ? 1 : 2, found, p.interval_days, p.action,
                              reason + " (operating procedure)", "oil-dga-investigate");
      act.outage = true;
      act.crew = kCrewEngineering;
      out.actions.push_back(std::move(act));
    }
  } else if (!w.not_applied.empty()) {
    out.actions.push_back(oil_action(4, found, o.non_mineral_resample_days,
                                     "Resample main-tank oil for DGA within " + std::to_string(o.non_mineral_resample_days) + " days",
                                     "fluid other than mineral oil: no published sampling interval applied; the gases are trended",
                                     "oil-resample"));
  }
  single_gas_actions(w, found, o, out);
  const bool c2h2_above_tdcg =
      w.condition && std::any_of(w.condition->gases_above_tdcg.begin(), w.condition->gases_above_tdcg.end(),
                                 [](const auto& g) { return g.gas == Gas::c2h2; });
  if (d.active_arcing || c2h2_above_tdcg) {
    std::string reason = acetylene_words(d, w.acetylene_before);
    if (d.active_arcing) reason += "; acetylene appearing or rising, or a D1/D2 diagnosis with C2H2 detected";
    else reason += "; above the TDCG condition in IEEE C57.104-2008 Table 1";
    std::string text = "Investigate acetylene: confirm with a resample and look for arcing";
    if (unit.oltc == OltcType::communicating) {
      // Common practice, no published source: a communicating OLTC is the first suspect.
      text = "Check first for a leak from the on-load tap-changer compartment into the main tank (an OLTC oil "
             "sample, both conservator levels); then confirm acetylene with a resample and look for arcing";
      reason += "; the register gives a communicating on-load tap changer";
    }
    // Need "oil-resample": the confirming sample is the main-tank resample, so
    // merge_actions makes one job of it and the Table 3 resample, with this
    // urgency and wording, under the reference planners book (common
    // practice, no published source).
    out.actions.push_back(oil_action(d.active_arcing ? 1 : 2, found, o.acetylene_investigate_days, text, reason,
                                     "oil-resample"));
  }
}

const OilSample* latest_with(const std::vector<OilSample>& samples, bool (*has)(const OilSample&)) {
  for (auto it = samples.rbegin(); it != samples.rend(); ++it)
    if (has(*it)) return &*it;
  return nullptr;
}

bool has_moisture(const OilSample& s) { return s.moisture_ppm.present(); }
bool has_full_quality_test(const OilSample& s) {
  return s.breakdown_kv.present() || s.acidity_mgkoh_g.present() || s.ift_mn_m.present() || s.pf25_pct.present() ||
         s.pf100_pct.present() || s.color.present();
}
bool has_furan(const OilSample& s) { return s.furan_2fal_ppb.present(); }

void assess_quality(const std::vector<OilSample>& samples, const UnitInfo& unit, Day /*as_of*/, const OilOptions& o,
                    UnitAssessment& out) {
  // Labs measure water with every DGA sample but the full quality tests
  // (breakdown, acidity, IFT, power factor, colour) less often: take the
  // latest sample with a full test, and the water of a newer sample if any.
  const OilSample* q = latest_with(samples, has_full_quality_test);
  const OilSample* m = latest_with(samples, has_moisture);
  if (!q) q = m;
  if (!q) {
    out.missing.push_back("oil quality tests");
    return;
  }
  OilSample composite = *q;
  if (m && m->date > q->date) {
    composite.moisture_ppm = m->moisture_ppm;
    out.oil.notes.push_back("water content from the sample of " + format_day(m->date) +
                            "; the other tests from the sample of " + format_day(q->date));
  }
  if (q == m && !has_full_quality_test(*q)) out.missing.push_back("oil quality tests (only water content measured)");
  const OilQualityResult r = assess_oil_quality_c57106(composite, unit.hv_kv);
  out.oil.sample_date = q->date;
  out.oil.checks = r.checks;
  out.oil.oil_class = r.oil_class + (r.class_reason.empty() ? "" : " (" + r.class_reason + ")");
  out.oil.notes.insert(out.oil.notes.end(), r.notes.begin(), r.notes.end());
  out.methods.push_back(method_line(r.method, r.source));
  // Counted from the newest sample the class rests on. Both treatments are
  // done by an oil-processing (maintenance) crew and can run on line.
  const Day found = std::max(q->date, m ? m->date : q->date);
  if (r.oil_class == "Class III")
    out.actions.push_back(dated_action(2, found, o.reclaim_due_days, "Reclaim the oil (Fuller's earth treatment)",
                                       "oil Class III per IEEE C57.106 clause 7: " + r.class_reason, kSourceOilSample,
                                       "oil-reclaim", kCrewMaintenance));
  else if (r.oil_class == "Class II")
    out.actions.push_back(dated_action(3, found, o.recondition_due_days,
                                       "Recondition the oil (filtering, vacuum dehydration)",
                                       "oil Class II per IEEE C57.106 clause 7: " + r.class_reason, kSourceOilSample,
                                       "oil-recondition", kCrewMaintenance));
}

void assess_water(const std::vector<OilSample>& samples, const OilOptions& o, UnitAssessment& out) {
  const OilSample* m = latest_with(samples, has_moisture);
  if (!m) return;
  const MoistureResult r = assess_moisture(m->moisture_ppm, m->oil_temp_c, o.moisture);
  out.oil.relative_saturation_pct = r.relative_saturation_pct;
  out.oil.water_solubility_ppm = r.solubility_ppm;
  out.oil.paper_moisture_pct = r.paper_moisture_pct;
  out.oil.moisture_method = method_line(r.method, r.source);
  out.oil.notes.insert(out.oil.notes.end(), r.notes.begin(), r.notes.end());
  if (r.solubility_ppm) out.methods.push_back(out.oil.moisture_method);
  if (!m->oil_temp_c.is_measured()) out.missing.push_back("sampling temperature");
}

void assess_paper(const std::vector<OilSample>& samples, const UnitInfo& unit, const OilOptions& o,
                  UnitAssessment& out) {
  const OilSample* f = latest_with(samples, has_furan);
  if (!f) {
    out.missing.push_back("furan test");
    return;
  }
  PaperSummary& p = out.paper;
  p.sample_date = f->date;
  if (f->furan_2fal_ppb.is_below_limit()) {
    // "ND" / "<x": the test was done and found (almost) no 2-FAL: good paper, not missing data.
    p.furan_below_detection = true;
    if (std::isfinite(f->furan_2fal_ppb.value)) p.furan_detection_limit_ppb = f->furan_2fal_ppb.value;
  }
  if (unit.oil != OilType::mineral) {
    if (f->furan_2fal_ppb.is_measured()) p.furan_2fal_ppb = f->furan_2fal_ppb.value;
    out.methods_not_applied.push_back(
        "DP from 2-FAL (Chendong, De Pablo): correlations made for kraft paper in mineral oil; this unit is filled "
        "with " + std::string(to_string(unit.oil)) + ", in which furans partition differently");
    p.note = "2-FAL reported; no DP estimate for a fluid other than mineral oil";
    return;
  }
  const PaperDpResult r = estimate_paper_dp(f->furan_2fal_ppb, f->date, unit, o.paper);
  p.furan_2fal_ppb = r.fal_ppb;
  p.dp_estimate = r.dp_chendong;
  p.dp_method = "Chendong (1991), log10(2FAL ppm) = 1.51 - 0.0035 DP (from memory)";
  p.dp_alternative = r.dp_de_pablo;
  p.dp_alternative_method = "De Pablo (CIGRE), DP = 7100/(8.88 + 2FAL ppm) (from memory)";
  p.life_used_pct = r.life_used_pct;
  p.trustworthy = r.trustworthy;
  p.note = r.note;
  // The DP fall over the furan history (a treated oil resets furans: only a
  // trustworthy latest result has a usable history).
  std::vector<std::pair<double, double>> pts;  // years since the first sample, DP
  for (const OilSample& s : samples) {
    if (!has_furan(s) || s.date > f->date) continue;
    const PaperDpResult d = estimate_paper_dp(s.furan_2fal_ppb, s.date, unit, o.paper);
    if (d.dp_chendong && d.trustworthy) pts.push_back({s.date / 365.25, *d.dp_chendong});
  }
  if (r.trustworthy && pts.size() >= 3 && pts.back().first - pts.front().first >= 2) {
    double mx = 0, my = 0;
    for (auto [x, y] : pts) mx += x, my += y;
    mx /= pts.size(), my /= pts.size();
    double sxy = 0, sxx = 0;
    for (auto [x, y] : pts) sxy += (x - mx) * (y - my), sxx += (x - mx) * (x - mx);
    if (sxx > 0) p.dp_fall_per_year_history = -sxy / sxx;
    p.dp_history_samples = static_cast<int>(pts.size());
  }
  out.methods.push_back(method_line(r.method, r.source));
}

void fill_gas_history(const std::vector<OilSample>& samples, UnitAssessment& out) {
  for (const OilSample& s : samples) {
    UnitAssessment::GasHistoryPoint p;
    p.date = s.date;
    p.h2 = gas_ppm_or_zero(s, Gas::h2);
    p.ch4 = gas_ppm_or_zero(s, Gas::ch4);
    p.c2h6 = gas_ppm_or_zero(s, Gas::c2h6);
    p.c2h4 = gas_ppm_or_zero(s, Gas::c2h4);
    p.c2h2 = gas_ppm_or_zero(s, Gas::c2h2);
    p.co = gas_ppm_or_zero(s, Gas::co);
    p.co2 = gas_ppm_or_zero(s, Gas::co2);
    out.gas_history.push_back(p);
  }
}

}  // namespace

void assess_oil(const UnitData& data, Day as_of, const OilOptions& o, UnitAssessment& out) {
  const std::vector<OilSample> samples = main_tank_history(data.oil_samples, as_of);
  if (samples.empty()) {
    out.missing.push_back("oil sample");
    return;
  }
  fill_gas_history(samples, out);
  DgaWork w = summarise_dga(samples, data.info, as_of, o);
  if (!w.summary.sample_date) out.missing.push_back("DGA");
  out.dga = w.summary;
  out.active_arcing = w.summary.active_arcing;
  out.methods.insert(out.methods.end(), w.methods.begin(), w.methods.end());
  out.methods_not_applied.insert(out.methods_not_applied.end(), w.not_applied.begin(), w.not_applied.end());
  dga_actions(w, data.info, o, out);
  if (data.info.year_built <= 0) out.assumptions.push_back("unit age unknown: C57.104-2019 'unknown age' rows used");
  out.assumptions.push_back("gases below the detection limit counted as 0 ppm in sums, rates and the gas history");
  assess_quality(samples, data.info, as_of, o, out);
  assess_water(samples, o, out);
  assess_paper(samples, data.info, o, out);
}

DgaSummary interpret_dga_sample(const OilSample& sample, const UnitInfo& unit, Day as_of, const OilOptions& o) {
  return summarise_dga({sample}, unit, as_of, o).summary;
}

}  // namespace ferrum::analytics
