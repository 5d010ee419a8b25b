#include "analytics/decision/decision.h"

#include <algorithm>
#include <cmath>
#include <cstdio>
#include <map>

#include "analytics/action_plan.h"
#include "analytics/electrical/electrical_assessment.h"
#include "analytics/health_index.h"
#include "analytics/words.h"

namespace ferrum::analytics {

namespace {

std::string fmt(double v, int decimals) {
  char buf[64];
  std::snprintf(buf, sizeof buf, "%.*f", decimals, v);
  return buf;
}

int year_of(Day d) { return civil_from_days(d).year; }

Day days_after(Day from, double years) { return from + static_cast<Day>(std::lround(years * 365.25)); }

bool is_chronic_item(const DecisionOptions& o, const std::string& item) {
  return std::find(o.chronic_items.begin(), o.chronic_items.end(), item) != o.chronic_items.end();
}

// Duval Triangle 1 zones in words (IEC 60599:2022 Table 1 fault types).
std::string fault_words(const std::string& zone) {
  static const std::map<std::string, std::string> kWords{
      {"PD", "partial discharges"},
      {"D1", "low-energy discharges"},
      {"D2", "high-energy discharges (arcing)"},
      {"T1", "a thermal fault below 300 °C"},
      {"T2", "a thermal fault of 300-700 °C"},
      {"T3", "a hot thermal fault above 700 °C"},
      {"DT", "a mixed thermal and electrical fault"},
  };
  auto it = kWords.find(zone);
  return it == kWords.end() ? "a fault of unknown type" : it->second;
}

std::string basis_words(const std::string& basis) {
  if (basis == "paper") return "paper ageing (degree of polymerisation)";
  if (basis == "thermal") return "thermal life consumed";
  if (basis == "age") return "age against expected life";
  if (basis == "condition") return "end-of-life condition score";
  return basis;
}

std::string life_words(const RemainingLife& rl) {
  if (!rl.years) return "no remaining-life estimate";
  if (rl.beyond_horizon) return "more than " + fmt(rl.horizon_years, 0) + " years of remaining life";
  return "about " + fmt(*rl.years, *rl.years < 10 ? 1 : 0) + " years of remaining life, limited by " +
         basis_words(rl.limiting_factor);
}

void add_gassing(const UnitAssessment& a, std::vector<Evidence>& out) {
  const auto& d = a.dga;
  const bool arcing = a.active_arcing || d.active_arcing;
  // The fault-gas condition: CO and CO2 alone mark paper ageing, not a gassing fault.
  const bool c08 = d.c57104_2008_fault_condition && *d.c57104_2008_fault_condition >= 3;
  const bool s19 = d.c57104_2019_fault_status && *d.c57104_2019_fault_status == 3;
  if (!arcing && !c08 && !s19) return;
  std::string text = arcing ? "active arcing in oil (acetylene appearing or rising)" : "an active gassing fault";
  if (d.duval_triangle_1) text += ", Duval Triangle 1 points to " + fault_words(*d.duval_triangle_1);
  if (c08) text += ", IEEE C57.104-2008 fault-gas Condition " + std::to_string(*d.c57104_2008_fault_condition);
  if (s19) text += ", IEEE C57.104-2019 Status 3";
  out.push_back({"gassing", text});
}

// The latest infrared finding per component.
void add_hot_joints(const UnitAssessment& a, std::vector<Evidence>& out) {
  std::map<std::string, const InfraredFinding*> latest;
  for (const auto& f : a.infrared) {
    auto& slot = latest[f.component];
    if (!slot || f.date >= slot->date) slot = &f;
  }
  for (const auto& [component, f] : latest)
    if (f->severity && *f->severity >= 3)
      out.push_back({"hot_joint", "hot connection on the " + component + " (infrared severity " +
                                      std::to_string(*f->severity) + " of 4)"});
}

void add_oil(const UnitAssessment& a, std::vector<Evidence>& out) {
  std::vector<std::string> failed;
  for (const auto& c : a.oil.checks)
    if (c.within_limit == false) failed.push_back(words(c.test));
  const bool class3 = a.oil.oil_class.rfind("Class III", 0) == 0;
  const bool class2 = !class3 && a.oil.oil_class.rfind("Class II", 0) == 0;
  if (failed.empty() && !class2 && !class3) return;
  std::string list;
  for (const auto& f : failed)
    if (list.find(f) == std::string::npos) list += (list.empty() ? "" : ", ") + f;
  const bool wet = std::find(failed.begin(), failed.end(), "moisture") != failed.end() ||
                   std::find(failed.begin(), failed.end(), "breakdown") != failed.end();
  std::string text = std::string(wet ? "wet" : "aged") + " oil";
  if (!list.empty()) text += " (outside the IEEE C57.106 limits: " + list + ")";
  if (class2 || class3) text += ", IEEE C57.106 " + std::string(class3 ? "Class III" : "Class II");
  out.push_back({"oil", text});
}

void add_inspection(const DecisionOptions& o, const UnitAssessment& a, std::vector<Evidence>& eol,
                    std::vector<Evidence>& defects) {
  for (const auto& f : a.inspection) {
    const std::string what = words(f.item) + " rated " + words(to_string(f.rating));
    if (f.rating == Rating::unsafe) {
      defects.push_back({"unsafe_item", what + ": make safe"});
    } else if (is_chronic_item(o, f.item)) {
      if (static_cast<int>(f.rating) >= static_cast<int>(o.chronic_rating))
        eol.push_back({"chronic", what + " (chronic deterioration, not undone by maintenance)"});
    } else if (static_cast<int>(f.rating) >= static_cast<int>(o.defect_rating)) {
      const bool bushing = f.item.find("bushing") != std::string::npos;
      const bool cooling = f.item.find("cooling") != std::string::npos || f.item.find("fan") != std::string::npos;
      defects.push_back({bushing ? "bushing" : cooling ? "cooling" : "fitting", what});
    }
  }
}

void add_cooling(const DecisionOptions& o, const UnitAssessment& a, std::vector<Evidence>& out) {
  const auto& k = a.thermal.top_oil_discrepancy_k;
  if (!k || !(*k > o.cooling_discrepancy_k)) return;
  out.push_back({"cooling", "cooling failure: measured top oil " + fmt(*k, 1) + " K above the thermal model"});
}

// Electrical field tests outside their limits (analytics/electrical/): a
// bushing test is a bushing defect (repaired, or the bushing replaced); a
// test of the active part or of the winding insulation is investigated, as
// the electrical checks' own actions say (IEEE C57.152-2013 clause 7: a
// result outside its limit is confirmed and located before a repair is
// chosen; from memory, verify).
void add_electrical(const UnitAssessment& a, std::vector<Evidence>& out) {
  if (!a.electrical) return;
  // Readings that call for the same action (a deviation at several taps)
  // are one finding: the first, and how many more.
  std::vector<std::pair<std::string, int>> seen;  // action text, readings
  for (const auto& e : electrical_defects(*a.electrical, a.as_of)) {
    if (e.kind.empty()) continue;
    auto it = std::find_if(seen.begin(), seen.end(), [&](const auto& s) { return s.first == e.action.text; });
    if (it != seen.end()) {
      ++it->second;
      continue;
    }
    seen.emplace_back(e.action.text, 1);
    const std::string kind = e.kind == "bushing" ? "bushing" : e.kind == "winding" ? "winding_test" : "insulation_test";
    out.push_back({kind, e.finding});
  }
  std::size_t i = out.size() - seen.size();
  for (const auto& [text, readings] : seen) {
    if (readings > 1)
      out[i].text += " (and " + std::to_string(readings - 1) + " more reading" + (readings > 2 ? "s" : "") + ")";
    ++i;
  }
}

std::string join_defects(const std::vector<Evidence>& d) {
  std::string s;
  for (std::size_t i = 0; i < d.size(); ++i)
    s += (i == 0 ? "" : i + 1 == d.size() ? " and " : "; ") + d[i].text;
  return s;
}

// The defect that leads: unsafe item and gassing first, then an electrical
// test of the active part, hot joints, cooling, bushings, the winding
// insulation, oil, other fittings.
const Evidence& leading_defect(const std::vector<Evidence>& d) {
  static const char* kOrder[] = {"unsafe_item", "gassing", "winding_test", "hot_joint", "cooling",
                                 "bushing",     "insulation_test", "oil",  "fitting"};
  for (const char* k : kOrder)
    for (const auto& e : d)
      if (e.kind == k) return e;
  return d.front();
}

const HealthBand* default_band(double hi) {
  static const std::vector<HealthBand> bands = HealthIndexOptions{}.bands;
  return band_of(hi, bands);
}

std::string index_words(double hi) {
  const HealthBand* b = default_band(hi);
  return fmt(hi, 0) + (b ? " (" + b->name + ")" : "");
}

std::string index_note(const UnitAssessment& a, const std::vector<Evidence>& defects) {
  if (!a.health_index || !a.condition_index || !(*a.condition_index - *a.health_index > 0.05)) return "";
  static const std::map<std::string, std::string> kShort{
      {"gassing", "the gassing fault"}, {"hot_joint", "the hot connection"}, {"unsafe_item", "the unsafe item"},
      {"cooling", "the cooling failure"}, {"bushing", "the bushing defect"}, {"oil", "the oil condition"},
      {"fitting", "the fitting defect"}, {"winding_test", "the electrical test finding"},
      {"insulation_test", "the insulation test finding"}};
  std::string what = "a correctable finding";
  if (!defects.empty()) what = kShort.at(leading_defect(defects).kind);
  return "The health index is held at " + index_words(*a.health_index) + " while " + what +
         " remains; once it is corrected the index is " + index_words(*a.condition_index) +
         ". Risk uses the lower figure.";
}

double lead_years(const DecisionOptions& o) { return std::max(o.lead_time_months, 0) / 12.0; }

bool minor_signals(const UnitAssessment& a, std::string& why) {
  std::vector<std::string> w;
  if (a.dga.c57104_2008_fault_condition && *a.dga.c57104_2008_fault_condition == 2)
    w.push_back("DGA fault-gas Condition 2 (IEEE C57.104-2008)");
  if (a.thermal.hours_above_normal_cyclic.value_or(0) > 0)
    w.push_back("hot spot above the normal cyclic limit for " + fmt(*a.thermal.hours_above_normal_cyclic, 0) +
                " h: manage the load");
  if (a.dga.c57104_2019_fault_status && *a.dga.c57104_2019_fault_status == 2)
    w.push_back("DGA Status 2 from fault gases (IEEE C57.104-2019)");
  for (const auto& f : a.infrared)
    if (f.severity && *f.severity >= 1 && *f.severity <= 2) {
      w.push_back("a minor infrared finding on the " + f.component);
      break;
    }
  for (const auto& x : w) why += (why.empty() ? "" : "; ") + x;
  return !w.empty();
}

}  // namespace

Decision decide(const DecisionOptions& o, const UnitAssessment& a) {
  Decision d;
  const RemainingLife& rl = a.remaining_life;
  for (const auto& e : rl.estimates)
    if (e.years)
      d.end_of_life.push_back({e.basis, basis_words(e.basis) + ": " +
                                            (*e.years >= rl.horizon_years ? "more than " + fmt(rl.horizon_years, 0)
                                                                          : "about " + fmt(*e.years, 1)) +
                                            " years (" + e.method + ")"});
  add_gassing(a, d.defects);
  add_hot_joints(a, d.defects);
  add_cooling(o, a, d.defects);
  add_inspection(o, a, d.end_of_life, d.defects);
  add_oil(a, d.defects);
  add_electrical(a, d.defects);
  d.index_note = index_note(a, d.defects);

  const std::optional<double> life = rl.years;
  const std::string life_text = life_words(rl);
  const double lead = lead_years(o);
  auto replacement_year = [&](double years) { return year_of(days_after(a.as_of, std::max(years, lead))); };
  auto in_service_by = [&](int year) {
    return " A replacement can be in service by " + std::to_string(year) + " (" + std::to_string(o.lead_time_months) +
           "-month procurement lead time); until then the actions below manage the risk.";
  };
  const bool paper_wet = a.oil.paper_moisture_pct && *a.oil.paper_moisture_pct >= o.wet_paper_pct &&
                         !(a.paper.dp_estimate && *a.paper.dp_estimate < o.dry_out_min_dp);
  const bool paper_or_thermal = rl.limiting_factor == "paper" || rl.limiting_factor == "thermal";
  // Wet paper too brittle to dry out: said, so that nobody asks why the water
  // in it is left there.
  const std::string brittle_note =
      (!paper_wet && a.oil.paper_moisture_pct && *a.oil.paper_moisture_pct >= o.wet_paper_pct)
          ? " The paper is wet too (" + fmt(*a.oil.paper_moisture_pct, 1) + " % water), but at DP " +
                fmt(*a.paper.dp_estimate, 0) + " it is too brittle to dry out (below " + fmt(o.dry_out_min_dp, 0) +
                "): drying the active part could damage it."
          : std::string();

  if (life && *life <= o.replace_within_years) {
    d.action = "replace";
    d.year = replacement_year(*life);
    d.reason = "End of life: " + life_text + "." +
               (rl.limiting_factor == "paper"
                    ? " No oil treatment restores aged paper; only rewinding would, which is a rebuild."
                    : std::string()) +
               in_service_by(*d.year);
    if (!d.defects.empty())
      d.reason += " The correctable findings (" + join_defects(d.defects) + ") are made safe, not repaired at length.";
  } else if (!d.defects.empty() && life && *life <= o.planning_window_years) {
    d.action = "replace";
    d.year = replacement_year(*life);
    d.reason = "Repairing " + join_defects(d.defects) + " is not worth it: end-of-life evidence leaves only " +
               life_text + ", within the " + fmt(o.planning_window_years, 0) + "-year planning window." +
               in_service_by(*d.year);
  } else if (!d.defects.empty()) {
    const Evidence& lead_defect = leading_defect(d.defects);
    const std::string life_part = " End-of-life evidence gives " + life_text + ", so replacement is not indicated.";
    if (lead_defect.kind == "gassing") {
      d.action = "investigate";
      d.reason = "Correctable defect: " + lead_defect.text +
                 ". Find and repair the fault (IEEE C57.104 operating procedures: resample, plan an outage, "
                 "internal inspection of joints, core ground and circulating-current paths)." +
                 life_part;
    } else if (lead_defect.kind == "winding_test" || lead_defect.kind == "insulation_test") {
      d.action = "investigate";
      d.reason = "Electrical test finding: " + join_defects(d.defects) +
                 ". Confirm it by a retest and locate the cause before choosing a repair (IEEE C57.152 "
                 "diagnostic tests)." +
                 life_part;
    } else if (lead_defect.kind == "oil") {
      d.action = "refurbish";
      const bool wet = lead_defect.text.rfind("wet", 0) == 0;
      d.treatment = wet ? (paper_wet ? "dry out the active part and the oil" : "dry and degas the oil (vacuum dehydration)")
                        : "reclaim the oil (Fuller's earth)";
      d.treats_paper = wet && paper_wet;
      d.reason = "Correctable defect: " + lead_defect.text + ". Treatment: " + d.treatment + "." +
                 (wet ? (paper_wet ? " Drying out removes water from the paper and slows its ageing; it does not "
                                     "restore paper strength already lost."
                                   : " Drying restores the oil's water content and breakdown strength." + brittle_note)
                      : " Reclamation restores acidity, interfacial tension and colour of the oil; it does not "
                        "restore the paper.") +
                 life_part;
    } else {
      d.action = "repair";
      d.reason = "Correctable defect: " + join_defects(d.defects) + ". Repair it." + life_part;
    }
  } else if (life && *life <= o.planning_window_years && paper_or_thermal && paper_wet) {
    d.action = "refurbish";
    d.treatment = "dry out the active part";
    d.treats_paper = true;
    d.reason = life_text + " and the paper is wet (" + fmt(*a.oil.paper_moisture_pct, 1) +
               " % water): drying out slows paper ageing; it cannot restore paper strength already lost, and oil "
               "reclamation would not change the paper at all.";
    d.reason[0] = static_cast<char>(std::toupper(static_cast<unsigned char>(d.reason[0])));
  } else if (life && *life <= o.planning_window_years) {
    d.action = "replace";
    d.year = replacement_year(*life);
    d.reason = "End of life within the " + fmt(o.planning_window_years, 0) + "-year planning window: " + life_text +
               ". Plan the replacement for " + std::to_string(*d.year) + "; until then monitor." +
               (rl.limiting_factor == "paper" ? " Oil treatment would not restore the paper." : "");
  } else if (!a.health_index) {
    d.action = "investigate";
    d.reason = "Too little data for a health index" + (a.confidence.empty() ? std::string() : " (" + a.confidence + ")") +
               ": collect the missing data before deciding.";
  } else {
    const double hi = a.condition_index.value_or(*a.health_index);
    std::string why;
    if (hi <= o.investigate_below_hi) {
      d.action = "investigate";
      d.reason = "Health index " + index_words(hi) +
                 " without end-of-life evidence or a correctable defect to explain it: more diagnostic testing "
                 "to find the cause (Jahromi 2009 band requirement). " + life_text + ".";
    } else if (hi <= o.monitor_below_hi || minor_signals(a, why)) {
      d.action = "monitor";
      d.reason = (hi <= o.monitor_below_hi ? "Health index " + index_words(hi) : why) +
                 ": more diagnostic testing at shorter intervals; " + life_text + ".";
    } else {
      d.action = "routine";
      d.reason = "No correctable defect and " + life_text + ": normal maintenance.";
    }
  }
  return d;
}

std::vector<Action> decision_actions(const DecisionOptions& o, const UnitAssessment& a, const Decision& d) {
  // A decision on the whole unit rests on no one dated piece of evidence: its
  // actions count from the assessment date (issue #16), except the treatment
  // of the oil or the paper and a resample, which count from the latest oil
  // sample.
  std::vector<Action> out;
  std::optional<Day> last_oil = a.dga.sample_date;
  for (const auto& d : {a.oil.sample_date, a.paper.sample_date})
    if (d && (!last_oil || *d > *last_oil)) last_oil = d;
  const Day sampled = last_oil.value_or(a.as_of);
  // The sampling interval the gases call for (IEEE C57.104-2008 Table 3,
  // computed in the oil assessment) governs the resampling below; six months
  // only where the table gives none.
  const bool table3 = a.dga.c57104_2008_interval_days && !a.dga.c57104_2008_interval.empty();
  const std::string table3_interval = table3 ? a.dga.c57104_2008_interval + ", IEEE C57.104 Table 3" : "";
  if (d.action == "replace" && d.year) {
    const double life = a.remaining_life.years.value_or(0);
    const Day in_service = days_after(a.as_of, std::max(life, lead_years(o)));
    // Procurement starts a lead time before the unit is to be in service;
    // when that is already past, at once, so that its due date plus the lead
    // time is the in-service date the decision states. Within
    // replace_priority_days it is a priority-2 action.
    const Day order_by = std::max(a.as_of, in_service - static_cast<Day>(std::lround(lead_years(o) * 365.25)));
    const bool soon = order_by <= a.as_of + o.replace_priority_days;
    out.push_back(dated_action(soon ? 2 : 3, a.as_of, static_cast<int>(order_by - a.as_of),
                               "Start procurement of the replacement (" + std::to_string(o.lead_time_months) +
                                   "-month lead time)",
                               d.reason, kSourceRegister, "procurement", kCrewEngineering));
    // The replacement is a project with its own outage, planned with the
    // procurement: it is not folded into the unit's maintenance outage.
    out.push_back(dated_action(3, a.as_of, static_cast<int>(in_service - a.as_of),
                               "Replace the transformer (in service by " + std::to_string(*d.year) + ")", d.reason,
                               kSourceRegister, "replace", kCrewEngineering));
    out.push_back(dated_action(3, sampled, table3 ? *a.dga.c57104_2008_interval_days : o.monitor_due_days,
                               "Until the replacement: resample the oil for DGA " +
                                   (table3 ? "at the interval the gases call for (" + table3_interval + ")"
                                           : std::string("every six months")) +
                                   " and keep the load within nameplate",
                               "manage the risk until the new unit is in service", last_oil ? kSourceOilSample : kSourceRegister, "oil-resample",
                               kCrewOilSampling));
  } else if (d.action == "refurbish" && !d.treatment.empty()) {
    const bool dry_out = d.treatment.rfind("dry out", 0) == 0;
    const bool reclaim = d.treatment.rfind("reclaim", 0) == 0;
    out.push_back(dated_action(2, sampled, 365, "Refurbish: " + d.treatment, d.reason, kSourceOilSample,
                               dry_out ? "dry-out" : reclaim ? "oil-reclaim" : "oil-recondition", kCrewMaintenance,
                               dry_out));
  } else if (d.action == "investigate" && a.health_index && d.defects.empty()) {
    out.push_back(dated_action(3, a.as_of, o.investigate_due_days,
                               "Investigate the low health index with diagnostic tests", d.reason, kSourceRegister,
                               "index-investigate", kCrewEngineering));
  } else if (d.action == "monitor") {
    // The surveys within six months; the oil as the gases call for (above).
    out.push_back(dated_action(3, sampled, o.monitor_due_days,
                               table3 ? "Monitor: resample the oil at the interval the gases call for (" +
                                            table3_interval + ") and repeat the surveys within six months"
                                      : std::string("Monitor: resample the oil and repeat the surveys within six months"),
                               d.reason,
                               last_oil ? kSourceOilSample : kSourceRegister, "oil-resample", kCrewOilSampling));
  }
  return out;
}

}  // namespace ferrum::analytics
