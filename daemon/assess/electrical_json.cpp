#include "daemon/assess/electrical_json.h"

#include <Poco/JSON/Array.h>
#include <Poco/JSON/Object.h>

#include <cmath>

namespace ferrum::assess {
namespace {

using Poco::Dynamic::Var;
using Poco::JSON::Array;
using Poco::JSON::Object;

Var num(const std::optional<double>& v) {
  if (!v || !std::isfinite(*v)) return Var();
  return std::round(*v * 1e6) / 1e6;
}
Var num(double v) { return num(std::optional<double>(v)); }
Var num(const std::optional<int>& v) { return v ? Var(*v) : Var(); }
Var flag(const std::optional<bool>& v) { return v ? Var(*v) : Var(); }
Var text(const std::string& s) { return s.empty() ? Var() : Var(s); }

Object::Ptr dated(analytics::Day d) {
  Object::Ptr o = new Object(Poco::JSON_PRESERVE_KEY_ORDER);
  o->set("date", analytics::format_day(d));
  return o;
}

template <class R, class F>
Array::Ptr list(const std::vector<R>& rows, F fill) {
  Array::Ptr a = new Array;
  for (const auto& r : rows) {
    Object::Ptr o = dated(r.date);
    fill(*o, r);
    a->add(o);
  }
  return a;
}

}  // namespace

Var electrical_json(const std::optional<analytics::ElectricalSummary>& s) {
  if (!s) return Var();
  Object::Ptr o = new Object(Poco::JSON_PRESERVE_KEY_ORDER);
  o->set("latest", s->latest ? Var(analytics::format_day(*s->latest)) : Var());
  o->set("turns_ratio", list(s->turns_ratio, [](Object& x, const analytics::TurnsRatioResult& r) {
    x.set("tap", num(r.tap));
    x.set("phase", text(r.phase));
    x.set("measured", num(r.measured));
    x.set("nameplate", num(r.nameplate));
    x.set("nameplate_basis", text(r.nameplate_basis));
    x.set("deviation_pct", num(r.deviation_pct));
    x.set("within_limit", flag(r.within_limit));
    x.set("note", text(r.note));
    x.set("source", r.source);
  }));
  o->set("winding_resistance", list(s->winding_resistance, [](Object& x, const analytics::WindingResistanceResult& r) {
    x.set("winding", text(r.winding));
    x.set("tap", num(r.tap));
    x.set("phase", text(r.phase));
    x.set("measured_ohm", num(r.measured_ohm));
    x.set("temp_c", num(r.temp_c));
    x.set("corrected_ohm", num(r.corrected_ohm));
    x.set("reference_c", num(r.reference_c));
    x.set("phase_spread_pct", num(r.phase_spread_pct));
    x.set("change_pct", num(r.change_pct));
    x.set("change_basis", text(r.change_basis));
    x.set("within_limit", flag(r.within_limit));
    x.set("source", r.source);
  }));
  o->set("insulation_power_factor",
         list(s->insulation_power_factor, [](Object& x, const analytics::InsulationPowerFactorResult& r) {
           x.set("insulation", text(r.insulation));
           x.set("power_factor_pct", num(r.power_factor_pct));
           x.set("temp_c", num(r.temp_c));
           x.set("test_kv", num(r.test_kv));
           x.set("correction_factor", num(r.correction_factor));
           x.set("pf20_pct", num(r.pf20_pct));
           x.set("corrected", r.corrected);
           x.set("nameplate_pf_pct", num(r.nameplate_pf_pct));
           x.set("capacitance_pf", num(r.capacitance_pf));
           x.set("capacitance_change_pct", num(r.capacitance_change_pct));
           x.set("limit_pct", num(r.limit_pct));
           x.set("within_limit", flag(r.within_limit));
           x.set("source", r.source);
         }));
  o->set("bushings", list(s->bushings, [](Object& x, const analytics::BushingResult& r) {
    x.set("bushing", r.bushing);
    x.set("insulation", text(r.insulation));
    x.set("power_factor_pct", num(r.power_factor_pct));
    x.set("reference_power_factor_pct", num(r.reference_power_factor_pct));
    x.set("power_factor_basis", text(r.power_factor_basis));
    x.set("capacitance_pf", num(r.capacitance_pf));
    x.set("reference_capacitance_pf", num(r.reference_capacitance_pf));
    x.set("capacitance_basis", text(r.capacitance_basis));
    x.set("capacitance_change_pct", num(r.capacitance_change_pct));
    x.set("temp_c", num(r.temp_c));
    x.set("verdict", r.verdict);
    x.set("within_limit", r.within_limit);
    x.set("source", r.source);
  }));
  o->set("insulation_resistance",
         list(s->insulation_resistance, [](Object& x, const analytics::InsulationResistanceResult& r) {
           x.set("insulation", text(r.insulation));
           x.set("one_minute_megohm", num(r.one_minute_megohm));
           x.set("ten_minute_megohm", num(r.ten_minute_megohm));
           x.set("polarization_index", num(r.polarization_index));
           x.set("reading", text(r.reading));
           x.set("temp_c", num(r.temp_c));
           x.set("source", r.source);
         }));
  o->set("excitation_current",
         list(s->excitation_current, [](Object& x, const analytics::ExcitationCurrentResult& r) {
           x.set("tap", num(r.tap));
           x.set("test_kv", num(r.test_kv));
           x.set("a_ma", num(r.a_ma));
           x.set("b_ma", num(r.b_ma));
           x.set("c_ma", num(r.c_ma));
           x.set("single_ma", num(r.single_ma));
           x.set("pattern_expected", flag(r.pattern_expected));
           x.set("outer_difference_pct", num(r.outer_difference_pct));
           x.set("change_pct", num(r.change_pct));
           x.set("change_basis", text(r.change_basis));
           x.set("within_limit", flag(r.within_limit));
           x.set("source", r.source);
         }));
  o->set("leakage_reactance",
         list(s->leakage_reactance, [](Object& x, const analytics::LeakageReactanceResult& r) {
           x.set("phase", text(r.phase));
           x.set("measured_pct", num(r.measured_pct));
           x.set("nameplate_pct", num(r.nameplate_pct));
           x.set("nameplate_basis", text(r.nameplate_basis));
           x.set("change_pct", num(r.change_pct));
           x.set("limit_pct", num(r.limit_pct));
           x.set("within_limit", flag(r.within_limit));
           x.set("source", r.source);
         }));
  Array::Ptr notes = new Array;
  for (const auto& n : s->notes) notes->add(n);
  o->set("notes", notes);
  return o;
}

}  // namespace ferrum::assess
