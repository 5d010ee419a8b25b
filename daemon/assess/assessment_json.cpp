#include "daemon/assess/assessment_json.h"

#include <Poco/JSON/Stringifier.h>

#include <algorithm>
#include <cmath>
#include <sstream>
#include <stdexcept>
#include <string_view>

#include "daemon/assess/electrical_json.h"
#include "analytics/held_back.h"

namespace ferrum::assess {
namespace {

using Poco::JSON::Array;
using Poco::JSON::Object;
using Poco::Dynamic::Var;

// Rounds to a sensible number of digits so that the JSON does not carry
// floating-point noise (0.30000000000000004).
double tidy(double v) {
  if (!std::isfinite(v)) return v;
  const double scale = 1e6;
  return std::round(v * scale) / scale;
}

Var opt(const std::optional<double>& v) {
  if (!v || !std::isfinite(*v)) return Var();
  return tidy(*v);
}
Var opt(const std::optional<int>& v) { return v ? Var(*v) : Var(); }
Var opt(const std::optional<std::string>& v) { return v ? Var(*v) : Var(); }
Var opt_day(const std::optional<analytics::Day>& d) { return d ? Var(analytics::format_day(*d)) : Var(); }
Var text_or_null(const std::string& s) { return s.empty() ? Var() : Var(s); }

Var opt_ts(const std::optional<analytics::Timestamp>& t) { return t ? Var(analytics::format_utc(*t)) : Var(); }

Array::Ptr strings(const std::vector<std::string>& v) {
  Array::Ptr a = new Array;
  for (const auto& s : v) a->add(s);
  return a;
}

Object::Ptr unit_json(const analytics::UnitInfo& u) {
  Object::Ptr o = new Object;
  o->set("unit_id", u.unit_id);
  o->set("site", u.site);
  o->set("serial", text_or_null(u.serial));
  o->set("rated_mva", tidy(u.rated_mva));
  o->set("hv_kv", tidy(u.hv_kv));
  o->set("lv_kv", tidy(u.lv_kv));
  o->set("cooling", u.cooling);
  o->set("year_built", u.year_built);
  o->set("phases", u.phases);
  o->set("vector_group", text_or_null(u.vector_group));
  o->set("oil_type", std::string(analytics::to_string(u.oil)));
  o->set("paper", std::string(analytics::to_string(u.paper)));
  o->set("oltc", text_or_null(analytics::to_string(u.oltc)));
  o->set("criticality", u.criticality);
  o->set("customers_served", opt(u.customers_served));
  return o;
}

Object::Ptr remaining_life_json(const analytics::RemainingLife& r) {
  Object::Ptr o = new Object;
  o->set("years", opt(r.years));
  o->set("low_years", opt(r.low_years));
  o->set("high_years", opt(r.high_years));
  o->set("limiting_factor", text_or_null(r.limiting_factor));
  o->set("beyond_horizon", r.beyond_horizon);
  o->set("horizon_years", r.horizon_years);
  o->set("range_method", text_or_null(r.range_method));
  Array::Ptr est = new Array;
  for (const auto& e : r.estimates) {
    Object::Ptr x = new Object;
    x->set("basis", e.basis);
    x->set("years", opt(e.years));
    x->set("low_years", opt(e.low_years));
    x->set("high_years", opt(e.high_years));
    x->set("method", e.method);
    x->set("range", text_or_null(e.range));
    est->add(x);
  }
  o->set("estimates", est);
  return o;
}

Object::Ptr oil_json(const analytics::OilSummary& s) {
  Object::Ptr o = new Object;
  o->set("sample_date", opt_day(s.sample_date));
  Array::Ptr checks = new Array;
  for (const auto& c : s.checks) {
    Object::Ptr x = new Object;
    x->set("test", c.test);
    x->set("value", opt(c.value));
    x->set("limit", opt(c.limit));
    x->set("limit_kind", text_or_null(c.limit_kind));
    x->set("unit", text_or_null(c.unit));
    x->set("within_limit", c.within_limit ? Var(*c.within_limit) : Var());
    x->set("source", c.source);
    checks->add(x);
  }
  o->set("checks", checks);
  o->set("relative_saturation_pct", opt(s.relative_saturation_pct));
  o->set("water_solubility_ppm", opt(s.water_solubility_ppm));
  o->set("paper_moisture_pct", opt(s.paper_moisture_pct));
  o->set("moisture_method", text_or_null(s.moisture_method));
  o->set("oil_class", text_or_null(s.oil_class));
  o->set("notes", strings(s.notes));
  return o;
}

Object::Ptr paper_json(const analytics::PaperSummary& p) {
  Object::Ptr o = new Object;
  o->set("sample_date", opt_day(p.sample_date));
  o->set("furan_2fal_ppb", opt(p.furan_2fal_ppb));
  o->set("furan_below_detection", p.furan_below_detection);
  o->set("furan_detection_limit_ppb", opt(p.furan_detection_limit_ppb));
  o->set("dp_estimate", opt(p.dp_estimate));
  o->set("dp_method", text_or_null(p.dp_method));
  o->set("dp_alternative", opt(p.dp_alternative));
  o->set("dp_alternative_method", text_or_null(p.dp_alternative_method));
  o->set("life_used_pct", opt(p.life_used_pct));
  o->set("dp_fall_per_year_history", opt(p.dp_fall_per_year_history));
  o->set("trustworthy", p.trustworthy);
  o->set("note", text_or_null(p.note));
  return o;
}

Object::Ptr thermal_json(const analytics::ThermalSummary& t) {
  Object::Ptr o = new Object;
  o->set("from", opt_ts(t.from));
  o->set("to", opt_ts(t.to));
  o->set("method", text_or_null(t.method));
  o->set("peak_hot_spot_c", opt(t.peak_hot_spot_c));
  o->set("peak_top_oil_c", opt(t.peak_top_oil_c));
  o->set("equivalent_ageing_factor", opt(t.equivalent_ageing_factor));
  o->set("loss_of_life_hours", opt(t.loss_of_life_hours));
  o->set("loss_of_life_pct", opt(t.loss_of_life_pct));
  o->set("hours_above_nameplate", opt(t.hours_above_nameplate));
  o->set("peak_load_pu", opt(t.peak_load_pu));
  o->set("p99_load_pu", opt(t.p99_load_pu));
  o->set("hours_above_normal_cyclic", opt(t.hours_above_normal_cyclic));
  o->set("hours_above_long_emergency", opt(t.hours_above_long_emergency));
  o->set("hours_above_short_emergency", opt(t.hours_above_short_emergency));
  o->set("load_growth_pct_per_year", opt(t.load_growth_pct_per_year));
  o->set("top_oil_discrepancy_k", opt(t.top_oil_discrepancy_k));
  o->set("hot_spot_basis", t.hot_spot_from_measured_top_oil ? "measured top oil" : "model");
  o->set("measured_top_oil_above_k", tidy(t.measured_top_oil_above_k));
  o->set("measured_top_oil_points", static_cast<Poco::UInt64>(t.measured_top_oil_points));
  o->set("emergency_load_pu", opt(t.emergency_load_pu));
  o->set("emergency_ambient_c", opt(t.emergency_ambient_c));
  o->set("covered_hours", tidy(t.covered_hours));
  o->set("bridged_hours", tidy(t.bridged_hours));
  o->set("ambient_from_profile", t.ambient_from_profile);
  o->set("parameter_sources", strings(t.parameter_sources));
  o->set("notes", strings(t.notes));
  return o;
}

// The planner's fields of an action (issue #16): evidence date and kind,
// need and reference, overdue, outage, crew.
void set_plan_fields(Object& x, const analytics::Action& a) {
  x.set("found", a.found ? Var(analytics::format_day(a.found)) : Var());
  x.set("source", text_or_null(a.source));
  x.set("need", text_or_null(a.need));
  x.set("reference", text_or_null(a.reference));
  x.set("overdue", a.overdue);
  x.set("outage", a.outage);
  x.set("crew", text_or_null(a.crew));
  x.set("status", a.status.empty() ? Var("open") : Var(a.status));  // "open", "booked"; closed: "done", "cancelled"
  x.set("work_date", a.work_date ? Var(analytics::format_day(a.work_date)) : Var());
  x.set("work_note", text_or_null(a.work_note));
}

Var action_json(const std::optional<analytics::Action>& a) {
  if (!a) return Var();
  Object::Ptr x = new Object(Poco::JSON_PRESERVE_KEY_ORDER);
  x->set("priority", a->priority);
  x->set("due", analytics::format_day(a->due));
  x->set("text", a->text);
  set_plan_fields(*x, *a);
  return x;
}

Array::Ptr evidence_json(const std::vector<analytics::Evidence>& list) {
  Array::Ptr arr = new Array;
  for (const auto& e : list) {
    Object::Ptr x = new Object;
    x->set("kind", e.kind);
    x->set("text", e.text);
    arr->add(x);
  }
  return arr;
}

Object::Ptr decision_json(const analytics::Decision& d) {
  Object::Ptr o = new Object(Poco::JSON_PRESERVE_KEY_ORDER);
  o->set("action", text_or_null(d.action));
  o->set("year", opt(d.year));
  o->set("reason", text_or_null(d.reason));
  o->set("treatment", text_or_null(d.treatment));
  o->set("treats_paper", d.treats_paper);
  o->set("index_note", text_or_null(d.index_note));
  o->set("first_action", action_json(d.first_action));
  o->set("end_of_life", evidence_json(d.end_of_life));
  o->set("defects", evidence_json(d.defects));
  return o;
}

}  // namespace

Object::Ptr to_json(const analytics::DgaSummary& d) {
  Object::Ptr o = new Object;
  o->set("sample_date", opt_day(d.sample_date));
  o->set("tdcg_ppm", opt(d.tdcg_ppm));
  o->set("c57104_2008_condition", opt(d.c57104_2008_condition));
  o->set("c57104_2008_tdcg_condition", opt(d.c57104_2008_tdcg_condition));
  o->set("c57104_2008_fault_condition", opt(d.c57104_2008_fault_condition));
  o->set("c57104_2008_table3_basis", text_or_null(d.c57104_2008_table3_basis));
  o->set("c57104_2008_single_gases", strings(d.c57104_2008_single_gases));
  o->set("c57104_2019_status", opt(d.c57104_2019_status));
  o->set("c57104_2019_fault_status", opt(d.c57104_2019_fault_status));
  o->set("duval_triangle_1", opt(d.duval_triangle_1));
  o->set("duval_pentagon_1", opt(d.duval_pentagon_1));
  o->set("iec60599_ratio_fault", opt(d.iec60599_ratio_fault));
  o->set("co2_co_ratio", opt(d.co2_co_ratio));
  o->set("tdcg_rate_ppm_per_day", opt(d.tdcg_rate_ppm_per_day));
  o->set("c57104_2008_interval", text_or_null(d.c57104_2008_interval));
  o->set("c57104_2008_action", text_or_null(d.c57104_2008_action));
  o->set("c57104_2019_reason", text_or_null(d.c57104_2019_reason));
  o->set("key_gas", text_or_null(d.key_gas));
  o->set("key_gas_indicative_only", d.key_gas_indicative_only);
  o->set("co2_co_reading", text_or_null(d.co2_co_reading));
  o->set("iec60599_reading", text_or_null(d.iec60599_reading));
  o->set("duval_reading", text_or_null(d.duval_reading));
  o->set("active_arcing", d.active_arcing);
  o->set("acetylene_trend", text_or_null(d.acetylene_trend));
  o->set("acetylene_first_detected", opt_day(d.acetylene_first_detected));
  Array::Ptr gases = new Array;
  for (const auto& g : d.gases) {
    Object::Ptr x = new Object;
    x->set("gas", g.gas);
    x->set("ppm", opt(g.ppm));
    x->set("below_limit", g.below_limit);
    x->set("c57104_2008_condition", opt(g.c57104_2008_condition));
    x->set("rate_ppm_per_year", opt(g.rate_ppm_per_year));
    gases->add(x);
  }
  o->set("gases", gases);
  Array::Ptr duval = new Array;
  for (const auto& p : d.duval_history) {
    Object::Ptr x = new Object;
    x->set("date", analytics::format_day(p.date));
    x->set("pct_ch4", tidy(p.pct_ch4));
    x->set("pct_c2h4", tidy(p.pct_c2h4));
    x->set("pct_c2h2", tidy(p.pct_c2h2));
    x->set("zone", p.zone);
    duval->add(x);
  }
  o->set("duval_history", duval);
  return o;
}

Object::Ptr to_json(const analytics::UnitAssessment& a) {
  Object::Ptr o = new Object(Poco::JSON_PRESERVE_KEY_ORDER);
  o->set("unit_id", a.unit.unit_id);
  o->set("as_of", analytics::format_day(a.as_of));
  o->set("unit", unit_json(a.unit));
  o->set("health_index", opt(a.health_index));
  o->set("condition_index", opt(a.condition_index));
  o->set("band", text_or_null(a.band));
  o->set("band_expected_life", text_or_null(a.band_expected_life));
  o->set("confidence", text_or_null(a.confidence));
  Array::Ptr factors = new Array;
  for (const auto& f : a.factors) {
    Object::Ptr x = new Object;
    x->set("name", f.name);
    x->set("score", opt(f.score));
    x->set("weight", tidy(f.weight));
    x->set("contribution", tidy(f.contribution));
    x->set("source", f.source);
    x->set("detail", text_or_null(f.detail));
    factors->add(x);
  }
  o->set("factors", factors);
  o->set("remaining_life", remaining_life_json(a.remaining_life));
  o->set("dga", to_json(a.dga));
  o->set("oil", oil_json(a.oil));
  o->set("paper", paper_json(a.paper));
  o->set("site_summary", text_or_null(a.site_summary));
  o->set("thermal", thermal_json(a.thermal));
  Array::Ptr ir = new Array;
  for (const auto& f : a.infrared) {
    Object::Ptr x = new Object;
    x->set("date", analytics::format_day(f.date));
    x->set("component", f.component);
    x->set("rise_over_reference_k", opt(f.rise_over_reference_k));
    x->set("rise_over_ambient_k", opt(f.rise_over_ambient_k));
    x->set("corrected_rise_k", opt(f.corrected_rise_k));
    x->set("severity", opt(f.severity));
    x->set("severity_text", text_or_null(f.severity_text));
    x->set("low_load", f.low_load);
    x->set("load_pct", opt(f.load_pct));
    x->set("image_ref", text_or_null(f.image_ref));
    x->set("note", text_or_null(f.note));
    x->set("source", text_or_null(f.source));
    ir->add(x);
  }
  o->set("infrared", ir);
  Array::Ptr insp = new Array;
  for (const auto& f : a.inspection) {
    Object::Ptr x = new Object;
    x->set("item", f.item);
    x->set("rating", std::string(analytics::to_string(f.rating)));
    x->set("date", analytics::format_day(f.date));
    x->set("previous", f.previous ? Var(std::string(analytics::to_string(*f.previous))) : Var());
    x->set("worse", f.worse);
    x->set("note", text_or_null(f.note));
    insp->add(x);
  }
  o->set("inspection", insp);
  o->set("electrical", electrical_json(a.electrical));
  auto actions_array = [](const std::vector<analytics::Action>& list) {
    Array::Ptr out = new Array;
    for (const auto& act : list) {
      Object::Ptr x = new Object;
      x->set("priority", act.priority);
      x->set("due", analytics::format_day(act.due));
      x->set("text", act.text);
      x->set("reason", act.reason);
      set_plan_fields(*x, act);
      out->add(x);
    }
    return out;
  };
  o->set("actions", actions_array(a.actions));
  // Done or cancelled by the planners' work status (status, work_date, work_note).
  o->set("closed_actions", actions_array(a.closed_actions));
  o->set("decision", decision_json(a.decision));
  o->set("missing", strings(a.missing));
  Array::Ptr fresh = new Array;
  for (const auto& f : a.freshness) {
    Object::Ptr x = new Object;
    x->set("kind", f.kind);
    x->set("latest", opt_day(f.latest));
    x->set("age_years", opt(f.age_years));
    fresh->add(x);
  }
  o->set("freshness", fresh);
  Array::Ptr held = new Array;  // rejected files holding newer results (analytics/held_back.h)
  for (const auto& h : a.held_back) {
    Object::Ptr x = new Object;
    x->set("kind", h.kind);
    x->set("newest", analytics::format_day(h.newest));
    x->set("rejected_on", h.rejected_on);
    x->set("file", text_or_null(h.file));
    x->set("text", analytics::held_back_text(h));
    held->add(x);
  }
  o->set("held_back", held);
  o->set("methods", strings(a.methods));
  o->set("methods_not_applied", strings(a.methods_not_applied));
  o->set("assumptions", strings(a.assumptions));
  o->set("unsafe_inspection", a.unsafe_inspection);
  o->set("active_arcing", a.active_arcing);
  return o;
}

namespace {

Object::Ptr ranked_unit_json(const analytics::RankedUnit& u) {
  Object::Ptr x = new Object;
  x->set("rank", u.insufficient_data ? Var() : Var(u.rank));
  x->set("tied", u.tied);
  x->set("unit_id", u.unit_id);
  x->set("site", u.site);
  x->set("rated_mva", tidy(u.rated_mva));
  x->set("health_index", opt(u.health_index));
  x->set("band", text_or_null(u.band));
  x->set("remaining_life_years", opt(u.remaining_life_years));
  x->set("beyond_horizon", u.beyond_horizon);
  x->set("horizon_years", tidy(u.horizon_years));
  x->set("limiting_factor", text_or_null(u.limiting_factor));
  x->set("probability_of_failure", opt(u.probability_of_failure));
  x->set("failures_per_1000_unit_years", opt(u.failures_per_1000_unit_years));
  x->set("consequence", tidy(u.consequence));
  x->set("risk", opt(u.risk));
  x->set("recommended_action", text_or_null(u.recommended_action));
  x->set("action_year", opt(u.action_year));
  x->set("action_reason", text_or_null(u.action_reason));
  x->set("treats_paper", u.treats_paper);
  x->set("first_action", action_json(u.first_action));
  x->set("insufficient_data", u.insufficient_data);
  x->set("note", text_or_null(u.note));
  return x;
}

// Everything of the ranking but its units.
Object::Ptr ranking_head_json(const analytics::FleetRanking& r) {
  Object::Ptr o = new Object;
  o->set("as_of", analytics::format_day(r.as_of));
  Array::Ptr due = new Array;
  for (const auto& y : r.mva_due_by_year) {
    Object::Ptr x = new Object;
    x->set("year", y.year);
    x->set("mva", tidy(y.mva));
    x->set("units", y.units);
    due->add(x);
  }
  o->set("mva_due_by_year", due);
  Array::Ptr outlook = new Array;
  for (const auto& e : r.outlook) {
    Object::Ptr x = new Object;
    x->set("unit_id", e.unit_id);
    x->set("site", e.site);
    x->set("rated_mva", tidy(e.rated_mva));
    x->set("remaining_life_years", tidy(e.remaining_life_years));
    x->set("life_ends_year", e.life_ends_year);
    x->set("limiting_factor", text_or_null(e.limiting_factor));
    x->set("recommended_action", text_or_null(e.action));
    x->set("action_year", opt(e.action_year));
    outlook->add(x);
  }
  o->set("outlook", outlook);
  o->set("risk_calibration", text_or_null(r.risk_calibration));
  return o;
}

}  // namespace

Object::Ptr to_json(const analytics::FleetRanking& r) {
  Object::Ptr o = ranking_head_json(r);
  Array::Ptr units = new Array;
  for (const auto& u : r.units) units->add(ranked_unit_json(u));
  o->set("units", units);
  return o;
}

void write_json(std::ostream& out, const analytics::FleetRanking& r,
                const std::vector<std::pair<std::string, Var>>& extra) {
  write_json(out, r, analytics::rows_of(r), extra);
}

namespace {

// The document `head` with each of `arrays` in it under its key, written an
// element at a time: the head is stringified with a marker where each array
// goes, and each array is laid out as Poco's Stringifier lays out an array
// of objects under a top-level key at indent 2 (elements at 4, their keys at
// 6, ",\n" between them, "\n  ]" after the last; "[\n\n  ]" when empty).
// tests/daemon/ranking_json_test.cpp holds this to stringify(to_json(r)).
void write_document(std::ostream& out, Object::Ptr head,
                    const std::vector<std::pair<std::string, TextElements>>& arrays) {
  const std::string marker = "ferrum-array-goes-here-";
  for (std::size_t k = 0; k < arrays.size(); ++k) head->set(arrays[k].first, marker + std::to_string(k));
  const std::string text = stringify(head);
  std::vector<std::pair<std::size_t, std::size_t>> places;  // (position of its marker, array)
  for (std::size_t k = 0; k < arrays.size(); ++k) {
    const auto pos = text.find("\"" + arrays[k].first + "\": \"" + marker + std::to_string(k) + "\"");
    if (pos == std::string::npos) throw std::logic_error("write_json: the marker of " + arrays[k].first + " is missing");
    places.emplace_back(pos, k);
  }
  std::sort(places.begin(), places.end());
  std::size_t from = 0;
  for (const auto& [pos, k] : places) {
    const std::string at = "\"" + arrays[k].first + "\": \"" + marker + std::to_string(k) + "\"";
    out.write(text.data() + from, static_cast<std::streamsize>(pos - from));
    out << "\"" << arrays[k].first << "\": [\n";
    bool first = true;
    arrays[k].second([&](std::string_view element) {
      if (!first) out << ",\n";
      first = false;
      out << element;
    });
    out << "\n  ]";
    from = pos + at.size();
  }
  out << std::string_view(text).substr(from);
}

TextElements unit_elements(const analytics::RankedRows& rows) {
  return [&rows](const std::function<void(std::string_view)>& each) {
    rows([&](const analytics::RankedUnit& u) { each(element_text(ranked_unit_json(u))); });
  };
}

}  // namespace

std::string element_text(const Var& element) {
  std::ostringstream out;
  out << "    ";
  Poco::JSON::Stringifier::stringify(element, out, 6, 2);
  return std::move(out).str();
}

void write_json(std::ostream& out, const analytics::FleetRanking& r, const analytics::RankedRows& rows,
                const std::vector<std::pair<std::string, Var>>& extra) {
  Object::Ptr o = ranking_head_json(r);
  for (const auto& [key, value] : extra) o->set(key, value);
  write_document(out, o, {{"units", unit_elements(rows)}});
}

void write_json(std::ostream& out, const analytics::FleetRanking& r, const analytics::RankedRows& rows,
                const TextElements& sites, const std::vector<std::pair<std::string, Var>>& extra) {
  Object::Ptr o = ranking_head_json(r);
  for (const auto& [key, value] : extra) o->set(key, value);
  write_document(out, o, {{"sites", sites}, {"units", unit_elements(rows)}});
}

namespace {

Object::Ptr site_json(const analytics::SiteView& s) {
  Object::Ptr o = new Object(Poco::JSON_PRESERVE_KEY_ORDER);
  o->set("site", s.site);
  o->set("installed_mva", tidy(s.installed_mva));
  o->set("peak_load_mva", opt(s.peak_load_mva));
  o->set("units_without_load", strings(s.without_load));
  o->set("n1_unit_out", text_or_null(s.n1_unit_out));
  o->set("n1_unit_out_mva", tidy(s.n1_unit_out_mva));
  o->set("n1_capacity_mva", opt(s.n1_capacity_mva));
  o->set("n1_margin_mva", opt(s.n1_margin_mva));
  o->set("n1_ok", s.n1_ok ? Var(*s.n1_ok) : Var());
  o->set("flagged", s.flagged());
  o->set("n1_text", s.n1_text);
  Array::Ptr units = new Array;
  for (const auto& u : s.units) {
    Object::Ptr x = new Object(Poco::JSON_PRESERVE_KEY_ORDER);
    x->set("unit_id", u.unit_id);
    x->set("rated_mva", tidy(u.rated_mva));
    x->set("peak_load_mva", opt(u.peak_load_mva));
    x->set("emergency_mva", opt(u.emergency_mva));
    x->set("spare_mva", opt(u.spare_mva));
    x->set("can_take_load", u.can_take_load());
    x->set("constrained", u.constrained);
    x->set("wet", u.wet);
    x->set("unhealthy", u.unhealthy);
    x->set("limits", strings(u.limits));
    units->add(x);
  }
  o->set("units", units);
  return o;
}

}  // namespace

std::string site_element_text(const analytics::SiteView& site) { return element_text(site_json(site)); }

Array::Ptr to_json(const std::vector<analytics::SiteView>& sites) {
  Array::Ptr out = new Array;
  for (const auto& s : sites) out->add(site_json(s));
  return out;
}

std::string stringify(const Var& v) {
  std::ostringstream out;
  Poco::JSON::Stringifier::stringify(v, out, 2);
  return out.str();
}

}  // namespace ferrum::assess
