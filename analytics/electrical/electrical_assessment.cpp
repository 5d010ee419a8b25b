#include "analytics/electrical/electrical_assessment.h"

#include <algorithm>
#include <cmath>
#include <cstdio>
#include <map>
#include <tuple>

#include "analytics/action_plan.h"
#include "analytics/electrical/bushings.h"
#include "analytics/electrical/excitation_current.h"
#include "analytics/electrical/insulation_power_factor.h"
#include "analytics/electrical/insulation_resistance.h"
#include "analytics/electrical/leakage_reactance.h"
#include "analytics/electrical/turns_ratio.h"
#include "analytics/electrical/winding_resistance.h"

namespace ferrum::analytics {

using electrical::Conductor;

namespace {

using K = ElectricalTestKind;

std::string fmt(double v, int decimals) {
  char buf[64];
  std::snprintf(buf, sizeof buf, "%.*f", decimals, v);
  return buf;
}

std::vector<const ElectricalTest*> tests_of(const UnitData& d, K kind) {
  std::vector<const ElectricalTest*> out;
  for (const auto& t : d.electrical)
    if (t.test == kind) out.push_back(&t);
  std::stable_sort(out.begin(), out.end(), [](const auto* x, const auto* y) { return x->date < y->date; });
  return out;
}

// ------------------------------------------------------------ turns ratio

void check_turns_ratio(const UnitData& d, ElectricalSummary& s) {
  const UnitInfo& u = d.info;
  std::optional<electrical::VectorGroup> group = electrical::parse_vector_group(u.vector_group);
  if (!group && u.phases == 1)
    group = electrical::VectorGroup{electrical::Winding::single_phase, electrical::Winding::single_phase, 0};
  std::optional<electrical::TapChanger> taps;
  if (u.tap_positions && u.tap_nominal && u.tap_step_pct)
    taps = electrical::TapChanger{*u.tap_positions, *u.tap_nominal, *u.tap_step_pct};
  for (const ElectricalTest* t : tests_of(d, K::turns_ratio)) {
    if (!t->value) continue;
    TurnsRatioResult r;
    r.date = t->date;
    r.tap = t->tap;
    r.phase = t->phase;
    r.measured = *t->value;
    r.source = electrical::kTurnsRatioSource;
    if (t->nameplate_value) {
      r.nameplate = *t->nameplate_value;
      r.nameplate_basis = "nameplate_value of the row";
    } else if (!group) {
      r.note = u.vector_group.empty()
                   ? "no nameplate ratio: the register has no vector group (give vector_group or nameplate_value)"
                   : "no nameplate ratio for vector group " + u.vector_group +
                         " (three-winding or not handled): give nameplate_value";
    } else if (u.hv_kv <= 0 || u.lv_kv <= 0) {
      r.note = "no nameplate ratio: hv_kv or lv_kv missing in the register";
    } else if (t->tap && !taps) {
      r.note = "no nameplate ratio at tap " + std::to_string(*t->tap) +
               ": the register lacks tap_positions, tap_nominal or tap_step_pct";
    } else {
      const double hv = electrical::hv_kv_at_tap(u.hv_kv, taps, t->tap);
      const auto e = electrical::expected_phase_ratio(hv, u.lv_kv, *group);
      if (e.ratio) {
        r.nameplate = *e.ratio;
        r.nameplate_basis = "register: " + fmt(hv, 3) + " kV / " + fmt(u.lv_kv, 3) + " kV, " + u.vector_group +
                            (t->tap ? ", tap " + std::to_string(*t->tap) + " (position 1 = highest HV voltage)" : "");
      } else {
        r.note = e.why;
      }
    }
    if (r.nameplate && *r.nameplate > 0) {
      const auto c = electrical::check_ratio(r.measured, *r.nameplate);
      r.deviation_pct = c.deviation_pct;
      r.within_limit = c.within_limit;
    }
    s.turns_ratio.push_back(std::move(r));
  }
}

// ----------------------------------------------------- winding resistance

void check_winding_resistance(const UnitData& d, const ElectricalOptions& o, ElectricalSummary& s) {
  const Conductor conductor = d.info.conductor == "al" ? Conductor::aluminium : Conductor::copper;
  const auto tests = tests_of(d, K::winding_resistance);
  if (!tests.empty() && d.info.conductor.empty())
    s.notes.push_back("winding conductor not in the register: copper assumed (T_k 234.5 °C) for the resistance correction");
  // Previous corrected value per (winding, tap, phase).
  std::map<std::tuple<std::string, int, std::string>, std::pair<Day, double>> previous;
  for (std::size_t i = 0; i < tests.size(); ++i) {
    const ElectricalTest& t = *tests[i];
    if (!t.value) continue;
    WindingResistanceResult r;
    r.date = t.date;
    r.winding = t.winding;
    r.tap = t.tap;
    r.phase = t.phase;
    r.measured_ohm = *t.value;
    r.temp_c = t.temp_c;
    r.reference_c = o.reference_c;
    r.source = electrical::kWindingResistanceSource;
    if (t.temp_c && *t.temp_c > -electrical::conductor_tk(conductor))
      r.corrected_ohm = electrical::corrected_resistance(*t.value, *t.temp_c, o.reference_c, conductor);
    const auto key = std::make_tuple(t.winding, t.tap.value_or(0), t.phase);
    if (r.corrected_ohm) {
      if (t.nameplate_value) {
        r.change_pct = electrical::change_pct(*r.corrected_ohm, *t.nameplate_value);
        r.change_basis = "nameplate_value (factory value at " + fmt(o.reference_c, 0) + " °C)";
      } else if (auto it = previous.find(key); it != previous.end() && it->second.second > 0) {
        r.change_pct = electrical::change_pct(*r.corrected_ohm, it->second.second);
        r.change_basis = "previous test " + format_day(it->second.first);
      }
      previous[key] = {t.date, *r.corrected_ohm};
    }
    s.winding_resistance.push_back(std::move(r));
  }
  // Phase spread per (date, winding, tap) over the corrected values.
  std::map<std::tuple<Day, std::string, int>, std::vector<std::size_t>> groups;
  for (std::size_t k = 0; k < s.winding_resistance.size(); ++k) {
    const auto& r = s.winding_resistance[k];
    groups[{r.date, r.winding, r.tap.value_or(0)}].push_back(k);
  }
  for (const auto& [key, members] : groups) {
    std::vector<double> values;
    for (std::size_t k : members) {
      const auto& r = s.winding_resistance[k];
      if (r.corrected_ohm && !r.phase.empty()) values.push_back(*r.corrected_ohm);
    }
    const auto spread = electrical::phase_spread_pct(values);
    for (std::size_t k : members) {
      auto& r = s.winding_resistance[k];
      r.phase_spread_pct = spread;
      if (r.corrected_ohm) r.within_limit = electrical::winding_within_limits(spread, r.change_pct);
    }
  }
}

// -------------------------------------------------- insulation power factor

void check_insulation_pf(const UnitData& d, const ElectricalOptions& o, ElectricalSummary& s) {
  std::map<std::string, double> previous_capacitance;
  bool uncorrected = false;
  for (const ElectricalTest* t : tests_of(d, K::insulation_power_factor)) {
    if (!t->value) continue;
    InsulationPowerFactorResult r;
    r.date = t->date;
    r.insulation = t->insulation;
    r.power_factor_pct = *t->value;
    r.temp_c = t->temp_c;
    r.test_kv = t->test_kv;
    r.nameplate_pf_pct = t->nameplate_value;
    r.capacitance_pf = t->capacitance_pf;
    r.limit_pct = electrical::kPfLimitInServicePct;
    r.source = electrical::kInsulationPfSource;
    if (t->temp_c) r.correction_factor = pf_correction_factor(o.pf_correction, *t->temp_c);
    std::optional<double> previous;
    if (auto it = previous_capacitance.find(t->insulation); it != previous_capacitance.end()) previous = it->second;
    const auto c = electrical::check_insulation_pf(*t->value, t->temp_c.value_or(std::nan("")), r.correction_factor,
                                                   t->capacitance_pf, previous, r.limit_pct);
    r.pf20_pct = c.pf20_pct;
    r.corrected = c.corrected;
    r.capacitance_change_pct = c.capacitance_change_pct;
    r.within_limit = c.within_limit;
    if (!r.pf20_pct) uncorrected = true;
    if (t->capacitance_pf) previous_capacitance[t->insulation] = *t->capacitance_pf;
    s.insulation_power_factor.push_back(std::move(r));
  }
  if (uncorrected)
    s.notes.push_back(
        "insulation power factor: readings away from 20 °C are not judged without a correction table "
        "(ferrum.ini [electrical] pf_correction; ferrum ships no verified IEEE C57.152 table)");
}

// ---------------------------------------------------------------- bushings

void check_bushings(const UnitData& d, ElectricalSummary& s) {
  struct Ref {
    std::optional<double> pf, cap;
    std::string pf_basis, cap_basis;
  };
  std::map<std::pair<std::string, std::string>, Ref> refs;
  const auto tests = tests_of(d, K::bushing_power_factor);
  for (const ElectricalTest* t : tests) {  // nameplate values first, from any row
    Ref& ref = refs[{t->bushing, t->insulation}];
    if (!t->nameplate_value) continue;
    if (t->capacitance_pf) {
      ref.cap = *t->nameplate_value;
      ref.cap_basis = "nameplate";
    } else if (t->value) {
      ref.pf = *t->nameplate_value;
      ref.pf_basis = "nameplate";
    }
  }
  for (const ElectricalTest* t : tests) {
    Ref& ref = refs[{t->bushing, t->insulation}];
    if (!ref.pf && t->value) {
      ref.pf = *t->value;
      ref.pf_basis = "first test " + format_day(t->date) + " (no nameplate value)";
    }
    if (!ref.cap && t->capacitance_pf) {
      ref.cap = *t->capacitance_pf;
      ref.cap_basis = "first test " + format_day(t->date) + " (no nameplate value)";
    }
    BushingResult r;
    r.date = t->date;
    r.bushing = t->bushing;
    r.insulation = t->insulation;
    r.power_factor_pct = t->value;
    r.capacitance_pf = t->capacitance_pf;
    r.temp_c = t->temp_c;
    r.source = electrical::kBushingSource;
    if (t->value) {
      r.reference_power_factor_pct = ref.pf;
      r.power_factor_basis = ref.pf_basis;
    }
    if (t->capacitance_pf) {
      r.reference_capacitance_pf = ref.cap;
      r.capacitance_basis = ref.cap_basis;
    }
    const auto c = electrical::check_bushing(r.power_factor_pct, r.reference_power_factor_pct, r.capacitance_pf,
                                             r.reference_capacitance_pf);
    r.capacitance_change_pct = c.capacitance_change_pct;
    r.verdict = electrical::bushing_verdict_name(c.verdict);
    r.within_limit = c.within_limit;
    s.bushings.push_back(std::move(r));
  }
}

// ---------------------------------------------------- insulation resistance

void check_insulation_resistance(const UnitData& d, ElectricalSummary& s) {
  std::map<std::pair<Day, std::string>, InsulationResistanceResult> by_key;
  for (const ElectricalTest* t : tests_of(d, K::insulation_resistance)) {
    if (!t->value || !t->minutes) continue;
    auto& r = by_key[{t->date, t->insulation}];
    r.date = t->date;
    r.insulation = t->insulation;
    r.source = electrical::kInsulationResistanceSource;
    if (t->temp_c) r.temp_c = t->temp_c;
    (*t->minutes == 1 ? r.one_minute_megohm : r.ten_minute_megohm) = *t->value;
  }
  for (auto& [key, r] : by_key) {
    if (r.one_minute_megohm && r.ten_minute_megohm && *r.one_minute_megohm > 0) {
      r.polarization_index = electrical::polarization_index(*r.one_minute_megohm, *r.ten_minute_megohm);
      r.reading = std::string(electrical::pi_reading_name(electrical::read_polarization_index(*r.polarization_index)));
    }
    s.insulation_resistance.push_back(std::move(r));
  }
}

// ------------------------------------------------------- excitation current

void check_excitation(const UnitData& d, ElectricalSummary& s) {
  using Key = std::tuple<Day, int, double>;
  std::map<Key, ExcitationCurrentResult> by_key;
  for (const ElectricalTest* t : tests_of(d, K::excitation_current)) {
    if (!t->value) continue;
    auto& r = by_key[{t->date, t->tap.value_or(0), t->test_kv.value_or(0)}];
    r.date = t->date;
    r.tap = t->tap;
    r.test_kv = t->test_kv;
    r.source = electrical::kExcitationSource;
    if (t->phase == "A") r.a_ma = t->value;
    else if (t->phase == "B") r.b_ma = t->value;
    else if (t->phase == "C") r.c_ma = t->value;
    else r.single_ma = t->value;
  }
  std::map<std::pair<int, double>, ExcitationCurrentResult> previous;
  for (auto& [key, r] : by_key) {
    if (d.info.phases == 3 && r.a_ma && r.b_ma && r.c_ma && *r.a_ma > 0 && *r.b_ma > 0 && *r.c_ma > 0) {
      const auto p = electrical::check_excitation_pattern(*r.a_ma, *r.b_ma, *r.c_ma);
      r.pattern_expected = p.expected;
      r.outer_difference_pct = p.outer_difference_pct;
      r.within_limit = p.expected;
    }
    const std::pair<int, double> same{std::get<1>(key), std::get<2>(key)};
    if (auto it = previous.find(same); it != previous.end()) {
      const ExcitationCurrentResult& before = it->second;
      std::optional<double> worst;
      auto consider = [&](const std::optional<double>& now, const std::optional<double>& then) {
        if (!now || !then) return;
        const auto c = electrical::excitation_change_pct(*now, *then);
        if (c && (!worst || std::fabs(*c) > std::fabs(*worst))) worst = c;
      };
      consider(r.a_ma, before.a_ma);
      consider(r.b_ma, before.b_ma);
      consider(r.c_ma, before.c_ma);
      consider(r.single_ma, before.single_ma);
      r.change_pct = worst;
      if (worst) r.change_basis = "previous test " + format_day(before.date) + " at the same tap and voltage";
    }
    s.excitation_current.push_back(r);
    previous[same] = r;
  }
}

// ------------------------------------------------------- leakage reactance

void check_leakage_reactance(const UnitData& d, ElectricalSummary& s) {
  for (const ElectricalTest* t : tests_of(d, K::leakage_reactance)) {
    if (!t->value) continue;
    LeakageReactanceResult r;
    r.date = t->date;
    r.phase = t->phase;
    r.measured_pct = *t->value;
    r.source = electrical::kLeakageReactanceSource;
    if (t->nameplate_value) {
      r.nameplate_pct = t->nameplate_value;
      r.nameplate_basis = "nameplate_value of the row";
    } else if (d.info.impedance_pct) {
      r.nameplate_pct = d.info.impedance_pct;
      r.nameplate_basis = "register impedance_pct";
    }
    const bool per_phase = !t->phase.empty();
    r.limit_pct = per_phase ? electrical::kReactancePerPhaseLimitPct : electrical::kReactanceThreePhaseLimitPct;
    if (r.nameplate_pct && *r.nameplate_pct > 0) {
      const auto c = electrical::check_leakage_reactance(r.measured_pct, *r.nameplate_pct, per_phase);
      r.change_pct = c.change_pct;
      r.within_limit = c.within_limit;
    }
    s.leakage_reactance.push_back(std::move(r));
  }
}

// ----------------------------------------------------------------- actions

// An action counted from the test date. Field tests are made with the unit
// out of service by the testing (protection) crew; a bushing taken out of
// service is the maintenance crew's work.
Action test_action(int priority, Day tested, int due_days, std::string need, std::string text, std::string reason,
                   const char* crew = kCrewProtection) {
  return dated_action(priority, tested, due_days, std::move(text), std::move(reason), kSourceElectrical,
                      std::move(need), crew, true);
}

void collect_defects(const ElectricalSummary& s, std::vector<ElectricalDefect>& out) {
  for (const auto* r : latest_of(s.turns_ratio)) {
    if (!r->within_limit || *r->within_limit) continue;
    out.push_back({"winding", "a turns-ratio deviation of " + fmt(*r->deviation_pct, 2) + " % (limit ±0.5 %)" +
                                  (r->phase.empty() ? std::string() : " on phase " + r->phase) +
                                  (r->tap ? " at tap " + std::to_string(*r->tap) : std::string()),
                   test_action(2, r->date, 90, "electrical:turns-ratio",
                         "Investigate the turns-ratio deviation: shorted turns or a tap-changer contact",
                         "turns ratio " + (r->phase.empty() ? std::string() : "phase " + r->phase + " ") +
                             (r->tap ? "tap " + std::to_string(*r->tap) + " " : "") + "on " + format_day(r->date) +
                             ": " + fmt(r->measured, 4) + " against " + fmt(*r->nameplate, 4) + " (" +
                             fmt(*r->deviation_pct, 2) + " %, limit ±0.5 %, IEEE C57.12.00; verify)")});
  }
  // Bushings: the latest test of each bushing.
  std::map<std::pair<std::string, std::string>, const BushingResult*> latest_bushing;
  for (const auto& b : s.bushings) latest_bushing[{b.bushing, b.insulation}] = &b;
  for (const auto& [key, b] : latest_bushing) {
    if (b->within_limit) continue;
    std::string why = "bushing " + b->bushing + " " + b->insulation + " on " + format_day(b->date) + ":";
    if (b->capacitance_change_pct) why += " capacitance change " + fmt(*b->capacitance_change_pct, 1) + " %;";
    if (b->power_factor_pct && b->reference_power_factor_pct)
      why += " power factor " + fmt(*b->power_factor_pct, 2) + " % against " + fmt(*b->reference_power_factor_pct, 2) +
             " % (" + b->power_factor_basis + ");";
    why += " " + b->verdict + " (IEEE C57.152, values from memory; verify)";
    const std::string finding = "bushing " + b->bushing + " " + b->insulation + " test: " + b->verdict;
    if (b->verdict == "out of service")
      out.push_back({"bushing", finding, test_action(1, b->date, 30, "electrical:bushing-" + b->bushing,
                           "Take bushing " + b->bushing + " out of service: repair or replace the bushing, not the unit",
                           why, kCrewMaintenance)});
    else  // to be confirmed by a retest before the bushing is repaired
      out.push_back({"bushing_retest", finding, test_action(2, b->date, 90, "electrical:bushing-" + b->bushing,
                           "Retest and investigate bushing " + b->bushing +
                               "; if confirmed, repair or replace the bushing, not the unit",
                           why)});
  }
  std::map<std::string, const WindingResistanceResult*> worst_winding;
  for (const auto* r : latest_of(s.winding_resistance))
    if (r->within_limit && !*r->within_limit) worst_winding.emplace(r->winding, r);
  for (const auto& [winding, r] : worst_winding)
    out.push_back({"winding", "the " + winding + " winding resistance outside its limits",
                   test_action(2, r->date, 180, "electrical:winding-resistance-" + winding,
                         "Investigate the " + winding +
                             " winding resistance: connections, tap-changer contacts or broken strands",
                         winding + " winding on " + format_day(r->date) +
                             (r->phase_spread_pct ? ": phase spread " + fmt(*r->phase_spread_pct, 1) + " %" : "") +
                             (r->change_pct ? ", change " + fmt(*r->change_pct, 1) + " % against " + r->change_basis : "") +
                             " (limits 2 % spread, 5 % change: common practice, from memory)")});
  for (const auto* r : latest_of(s.insulation_power_factor)) {
    if (!r->within_limit || *r->within_limit) continue;
    out.push_back({"insulation", r->insulation + " insulation power factor " + fmt(*r->pf20_pct, 2) + " % at 20 °C",
                   test_action(2, r->date, 180, "electrical:insulation-pf",
                         "Investigate the winding insulation power factor: moisture or contamination",
                         r->insulation + " power factor " + fmt(*r->pf20_pct, 2) + " % at 20 °C on " +
                             format_day(r->date) + " above " + fmt(r->limit_pct, 1) +
                             " % (IEEE C57.152, from memory; verify)")});
  }
  for (const auto* r : latest_of(s.insulation_resistance)) {
    if (r->reading != "dangerous" && r->reading != "poor" && r->reading != "questionable") continue;
    // "questionable" asks for a retest in a year; only "poor" and "dangerous" are defects of the decision.
    out.push_back({r->reading == "questionable" ? "" : "insulation",
                   r->insulation + " insulation resistance " + r->reading,
                   test_action(r->reading == "questionable" ? 3 : 2, r->date,
                               r->reading == "questionable" ? 365 : 180, "electrical:insulation-resistance",
                         "Investigate the insulation resistance: moisture or contamination of the insulation",
                         r->insulation + " polarization index " + fmt(*r->polarization_index, 2) + " (" + r->reading +
                             ") on " + format_day(r->date) + " (common practice scale, no published source)")});
  }
  for (const auto* r : latest_of(s.excitation_current)) {
    if (!r->pattern_expected || *r->pattern_expected) continue;
    out.push_back({"winding", "an excitation-current pattern not as expected",
                   test_action(3, r->date, 365, "electrical:excitation-current",
                         "Investigate the excitation-current pattern: core or winding fault, or residual magnetism "
                         "(demagnetise and retest)",
                         "excitation current on " + format_day(r->date) +
                             ": the outer phases are not similar and above the middle phase (IEEE C57.152, from "
                             "memory; verify)")});
  }
  for (const auto* r : latest_of(s.leakage_reactance)) {
    if (!r->within_limit || *r->within_limit) continue;
    out.push_back({"winding", "a leakage-reactance change of " + fmt(*r->change_pct, 2) + " % (possible winding movement)",
                   test_action(2, r->date, 180, "electrical:leakage-reactance",
                         "Investigate possible winding movement (leakage reactance change)",
                         "leakage reactance " + (r->phase.empty() ? std::string("three-phase") : "phase " + r->phase) +
                             " on " + format_day(r->date) + ": " + fmt(*r->change_pct, 2) + " % against " +
                             r->nameplate_basis + ", limit ±" + fmt(*r->limit_pct, 0) +
                             " % (IEEE C57.152, from memory; verify)")});
  }
}

}  // namespace

std::optional<double> pf_correction_factor(const std::vector<std::pair<double, double>>& table, double temp_c) {
  if (table.empty() || !std::isfinite(temp_c)) return std::nullopt;
  if (temp_c < table.front().first || temp_c > table.back().first) return std::nullopt;
  for (std::size_t i = 0; i < table.size(); ++i) {
    if (temp_c == table[i].first) return table[i].second;
    if (i + 1 < table.size() && temp_c < table[i + 1].first) {
      const auto& [t0, k0] = table[i];
      const auto& [t1, k1] = table[i + 1];
      return k0 + (k1 - k0) * (temp_c - t0) / (t1 - t0);
    }
  }
  return std::nullopt;
}

std::vector<ElectricalDefect> electrical_defects(const ElectricalSummary& s, Day as_of) {
  std::vector<ElectricalDefect> out;
  (void)as_of;  // due dates count from each test's date
  collect_defects(s, out);
  return out;
}

std::optional<ElectricalSummary> check_electrical_tests(const UnitData& d, const ElectricalOptions& o) {
  if (d.electrical.empty()) return std::nullopt;
  ElectricalSummary s;
  for (const auto& t : d.electrical) s.latest = std::max(s.latest.value_or(t.date), t.date);
  check_turns_ratio(d, s);
  check_winding_resistance(d, o, s);
  check_insulation_pf(d, o, s);
  check_bushings(d, s);
  check_insulation_resistance(d, s);
  check_excitation(d, s);
  check_leakage_reactance(d, s);
  return s;
}

void assess_electrical(const UnitData& data, const ElectricalOptions& options, UnitAssessment& a) {
  a.electrical = check_electrical_tests(data, options);
  if (!a.electrical) return;
  for (auto& d : electrical_defects(*a.electrical, a.as_of)) a.actions.push_back(std::move(d.action));
  a.methods.push_back(std::string("turns ratio: ") + electrical::kTurnsRatioSource);
  a.methods.push_back(std::string("winding resistance: ") + electrical::kWindingResistanceSource);
  a.methods.push_back(std::string("insulation power factor: ") + electrical::kInsulationPfSource);
  a.methods.push_back(std::string("bushings: ") + electrical::kBushingSource);
  a.methods.push_back(std::string("insulation resistance: ") + electrical::kInsulationResistanceSource);
  a.methods.push_back(std::string("excitation current: ") + electrical::kExcitationSource);
  a.methods.push_back(std::string("leakage reactance: ") + electrical::kLeakageReactanceSource);
  for (const auto& n : a.electrical->notes) a.assumptions.push_back(n);
}

}  // namespace ferrum::analytics
