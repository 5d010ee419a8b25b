#include "analytics/health_index.h"

#include <algorithm>
#include <cmath>
#include <cstdio>
#include <map>

#include "analytics/words.h"

namespace ferrum::analytics {

namespace {

constexpr const char* kLetters = "EDCBA";  // HIF 0..4 -> rating letter

// One factor before weighting: its HIF (0..4) or why it has none.
struct RawFactor {
  std::string name;
  double weight = 0;
  std::optional<int> hif;
  std::string detail;   // what drove the score, or why there is none
  std::string source;
};

std::string fmt(double v, int decimals = 2) {
  char buf[64];
  std::snprintf(buf, sizeof buf, "%.*f", decimals, v);
  return buf;
}

std::string rating_text(int hif) {
  return std::string("rating ") + kLetters[std::clamp(hif, 0, 4)] + " (" + std::to_string(hif) + " on 0–4, 4 = best)";
}

// Per-gas score S 1..6 of one reading; nullopt when not measured.
std::optional<int> gas_score(const GasReading& g, const GasScoreBands& b) {
  if (g.below_limit && !g.ppm) return 1;  // tested, nothing found: best score
  if (!g.ppm || !std::isfinite(*g.ppm)) return std::nullopt;
  for (int k = 0; k < 5; ++k)
    if (*g.ppm <= b.upper[k]) return k + 1;
  return 6;
}

const GasReading* find_gas(const std::vector<GasReading>& gases, const std::string& name) {
  for (const auto& g : gases)
    if (g.gas == name) return &g;
  return nullptr;
}

RawFactor score_dga(const HealthIndexOptions& o, const UnitAssessment& a) {
  RawFactor f{"dga", o.weight_dga, std::nullopt, "", o.source + "; DGA factor DGAF = sum(S_i W_i)/sum(W_i)"};
  // The factor's gas bands are mineral-oil values, as every DGA
  // interpretation ferrum applies (oil_assessment.cpp withholds them for other
  // fluids): another fluid's gases are trended, not scored.
  if (a.unit.oil != OilType::mineral) {
    f.detail = std::string("not scored: the gas bands are for mineral oil; this unit is filled with ") +
               to_string(a.unit.oil);
    return f;
  }
  auto dgaf = dga_factor_value(a.dga.gases, o.gas_bands);
  if (!dgaf) {
    f.detail = "no dissolved-gas result";
    return f;
  }
  f.hif = rating_from_cuts(*dgaf, o.dga_cuts);
  f.detail = "DGAF " + fmt(*dgaf) + " (gas scores 1–6, 1 = best) -> " + rating_text(*f.hif);
  // Name the worst-scoring gas: the reader's first question.
  int worst = 0;
  std::string worst_gas;
  for (const auto& b : o.gas_bands) {
    const GasReading* g = find_gas(a.dga.gases, b.gas);
    auto s = g ? gas_score(*g, b) : std::nullopt;
    if (s && *s > worst) {
      worst = *s;
      worst_gas = b.gas + " " + (g->ppm ? fmt(*g->ppm, 0) + " ppm" : std::string("below limit"));
    }
  }
  if (worst > 1) f.detail += "; highest gas score " + std::to_string(worst) + " (1–6, 1 = best): " + worst_gas;
  return f;
}

const std::array<double, 3>& oil_limits_for(const OilScoreBands& b, double hv_kv) {
  if (hv_kv <= 69) return b.le69kv;
  if (hv_kv < 230) return b.kv69to230;
  return b.ge230kv;
}

int oil_test_score(double v, const OilScoreBands& b, const std::array<double, 3>& lim) {
  for (int k = 0; k < 3; ++k)
    if (b.higher_is_better ? v >= lim[k] : v <= lim[k]) return k + 1;
  return 4;
}

bool names_2mm_gap(const OilCheck& c) {
  for (const char* s : {"2 mm", "2mm", "2.0 mm"})
    if (c.source.find(s) != std::string::npos || c.unit.find(s) != std::string::npos) return true;
  return false;
}

RawFactor score_oil(const HealthIndexOptions& o, const UnitAssessment& a) {
  RawFactor f{"oil_quality", o.weight_oil_quality, std::nullopt, "",
              o.source + "; oil-quality factor sum(S_i W_i)/sum(W_i)"};
  // A voltage-less unit is scored in the middle class, and the detail says so.
  double hv = a.unit.hv_kv > 0 ? a.unit.hv_kv : 138;
  double sum_sw = 0, sum_w = 0;
  std::string used, skipped;
  for (const auto& b : o.oil_bands) {
    for (const auto& c : a.oil.checks) {
      if (c.test != b.test || !c.value || !std::isfinite(*c.value)) continue;
      if (b.test == "breakdown" && o.breakdown_needs_2mm_gap && !names_2mm_gap(c)) {
        skipped += " breakdown (not a D1816 2 mm result)";
        break;
      }
      int s = oil_test_score(*c.value, b, oil_limits_for(b, hv));
      sum_sw += s * b.weight;
      sum_w += b.weight;
      used += (used.empty() ? "" : ", ") + b.test + " " + std::to_string(s);
      break;
    }
  }
  if (sum_w <= 0) {
    f.detail = "no scorable oil-quality test" + (skipped.empty() ? std::string() : ";" + skipped);
    return f;
  }
  double oqf = sum_sw / sum_w;
  f.hif = rating_from_cuts(oqf, o.oil_cuts);
  f.detail = "OQF " + fmt(oqf) + " (test scores 1–4, 1 = best: " + used + ") -> " + rating_text(*f.hif);
  if (a.unit.hv_kv <= 0) f.detail += "; HV unknown, 69-230 kV limits used";
  if (!skipped.empty()) f.detail += "; left out:" + skipped;
  return f;
}

RawFactor score_paper(const HealthIndexOptions& o, const UnitAssessment& a) {
  RawFactor f{"paper", o.weight_paper, std::nullopt, "", o.source + "; furan factor on 2-FAL (ppm)"};
  const auto& p = a.paper;
  if (p.furan_2fal_ppb && std::isfinite(*p.furan_2fal_ppb)) {
    double ppm = *p.furan_2fal_ppb / 1000.0;
    f.hif = rating_from_cuts(ppm, o.furan_ppm_cuts);
    f.detail = "2-FAL " + fmt(ppm, 3) + " ppm -> " + rating_text(*f.hif);
  } else if (p.furan_below_detection) {
    // 2-FAL below detection ("ND"): the paper is in good condition. Scored
    // at the detection limit (0 when none was stated): the best band.
    const double ppm = p.furan_detection_limit_ppb.value_or(0) / 1000.0;
    f.hif = rating_from_cuts(ppm, o.furan_ppm_cuts);
    f.detail = "2-FAL below detection -> " + rating_text(*f.hif);
  } else if (p.dp_estimate && std::isfinite(*p.dp_estimate)) {
    f.hif = rating_from_cuts(*p.dp_estimate, o.dp_cuts, true);
    f.detail = "DP " + fmt(*p.dp_estimate, 0) + " -> " + rating_text(*f.hif);
    f.source = o.source + "; furan cuts translated to DP with Chendong (1991)";
  } else {
    f.detail = "no furan or DP result";
    return f;
  }
  if (!p.trustworthy)
    f.detail += "; furans may have been reset by oil treatment, score may be optimistic";
  return f;
}

RawFactor score_thermal(const HealthIndexOptions& o, const UnitAssessment& a) {
  RawFactor f{"thermal", o.weight_thermal, std::nullopt, "",
              "ferrum scale on the equivalent ageing factor (in place of Jahromi's load-history table)"};
  const auto& t = a.thermal;
  if (!t.equivalent_ageing_factor || !std::isfinite(*t.equivalent_ageing_factor)) {
    f.detail = "no load record";
    return f;
  }
  int hif = rating_from_cuts(*t.equivalent_ageing_factor, o.ageing_factor_cuts);
  f.detail = "equivalent ageing factor " + significant_figures(*t.equivalent_ageing_factor, 3);
  if (t.hours_above_normal_cyclic.value_or(0) > 0) {
    hif = std::min(hif, 3);
    f.detail += ", " + fmt(*t.hours_above_normal_cyclic, 1) + " h above the normal cyclic limit";
  }
  if (t.hours_above_long_emergency.value_or(0) > 0) {
    hif = std::min(hif, 2);
    f.detail += ", " + fmt(*t.hours_above_long_emergency, 1) + " h above the long-time emergency limit";
  }
  if (t.hours_above_short_emergency.value_or(0) > 0) {
    hif = std::min(hif, 1);
    f.detail += ", " + fmt(*t.hours_above_short_emergency, 1) + " h above the short-time emergency limit";
  }
  f.hif = hif;
  f.detail += " -> " + rating_text(hif);
  return f;
}

std::optional<Day> latest_infrared(const UnitAssessment& a) {
  std::optional<Day> d;
  for (const auto& i : a.infrared) d = std::max(d.value_or(i.date), i.date);
  return d;
}

// Worst severity within the window before the latest survey; 0 when none.
int worst_infrared_severity(const UnitAssessment& a, int window_days, std::string* component) {
  auto last = latest_infrared(a);
  int worst = 0;
  for (const auto& i : a.infrared) {
    if (!last || i.date < *last - window_days || !i.severity) continue;
    if (*i.severity > worst) {
      worst = *i.severity;
      if (component) *component = i.component;
    }
  }
  return worst;
}

RawFactor score_infrared(const HealthIndexOptions& o, const UnitAssessment& a) {
  RawFactor f{"infrared", o.weight_infrared, std::nullopt, "",
              "ferrum mapping of the worst infrared severity (1..4) to ratings B..E"};
  if (a.infrared.empty()) {
    f.detail = "no infrared survey";
    return f;
  }
  std::string comp;
  int worst = worst_infrared_severity(a, o.infrared_window_days, &comp);
  f.hif = 4 - std::clamp(worst, 0, 4);
  f.detail = worst == 0 ? "no deficiency in the latest surveys"
                        : "worst severity " + std::to_string(worst) + "/4 on " + comp;
  f.detail += " -> " + rating_text(*f.hif);
  return f;
}

// Latest finding per inspection item.
std::map<std::string, const InspectionFinding*> latest_per_item(const UnitAssessment& a) {
  std::map<std::string, const InspectionFinding*> latest;
  for (const auto& i : a.inspection) {
    auto& slot = latest[i.item];
    if (!slot || i.date >= slot->date) slot = &i;
  }
  return latest;
}

RawFactor score_inspection(const HealthIndexOptions& o, const UnitAssessment& a) {
  RawFactor f{"inspection", o.weight_inspection, std::nullopt, "",
              "ferrum mapping of the worst inspection rating good..unsafe to A..E "
              "(Jahromi's overall-condition factor)"};
  auto latest = latest_per_item(a);
  if (latest.empty()) {
    f.detail = "no inspection record";
    return f;
  }
  const InspectionFinding* worst = nullptr;
  for (const auto& [item, fnd] : latest)
    if (!worst || static_cast<int>(fnd->rating) > static_cast<int>(worst->rating)) worst = fnd;
  f.hif = 5 - static_cast<int>(worst->rating);
  f.detail = std::to_string(latest.size()) + " items, worst " + words(worst->item) + " " +
             words(to_string(worst->rating)) + " -> " + rating_text(*f.hif);
  return f;
}

std::optional<int> unit_age_years(const UnitAssessment& a) {
  int year = civil_from_days(a.as_of).year;
  if (a.unit.year_built <= 0 || a.unit.year_built > year) return std::nullopt;
  return year - a.unit.year_built;
}

RawFactor score_age(const HealthIndexOptions& o, const UnitAssessment& a) {
  RawFactor f{"age", o.weight_age, std::nullopt, "", "ferrum age bands (Jahromi folds age into furan/age)"};
  auto age = unit_age_years(a);
  if (!age) {
    f.detail = "year built unknown";
    return f;
  }
  f.hif = rating_from_cuts(*age, o.age_cuts);
  f.detail = std::to_string(*age) + " years -> " + rating_text(*f.hif);
  return f;
}

// Which factor a cap trigger speaks about, and whether it fires.
struct CapHit {
  std::string factor;
  std::string what;
  double cap;
  bool correctable = false;  // repaired (make safe, retighten, find and repair a gassing fault), not ageing
};

std::vector<CapHit> triggered_caps(const HealthIndexOptions& o, const UnitAssessment& a) {
  std::vector<CapHit> hits;
  bool unsafe = a.unsafe_inspection;
  for (const auto& [item, f] : latest_per_item(a)) unsafe = unsafe || f->rating == Rating::unsafe;
  for (const auto& c : o.caps) {
    if (c.trigger == "unsafe_inspection" && unsafe)
      hits.push_back({"inspection", "an inspection item rated unsafe", c.cap, true});
    else if (c.trigger == "dga_condition_4" && a.dga.c57104_2008_fault_condition == 4)
      hits.push_back({"dga", "DGA fault-gas condition 4 (IEEE C57.104-2008, CO and CO2 left out)", c.cap, true});
    else if (c.trigger == "dga_status_3" && a.dga.c57104_2019_fault_status == 3)
      hits.push_back({"dga", "DGA status 3 from fault gases (IEEE C57.104-2019)", c.cap, true});
    else if (c.trigger == "active_arcing" && (a.active_arcing || a.dga.active_arcing))
      hits.push_back({"dga", "active arcing", c.cap, true});
    else if (c.trigger == "infrared_severity_4" &&
             worst_infrared_severity(a, o.infrared_window_days, nullptr) >= 4)
      hits.push_back({"infrared", "infrared severity 4", c.cap, true});
    else if (c.trigger == "paper_end_of_life" && a.paper.dp_estimate &&
             *a.paper.dp_estimate <= o.paper_end_of_life_dp)
      hits.push_back({"paper", "paper DP at or below " + fmt(o.paper_end_of_life_dp, 0), c.cap});
  }
  return hits;
}

std::string freshness_text(const UnitAssessment& a, double stale_after) {
  std::string out;
  for (const auto& f : a.freshness) {
    if (!f.age_years || *f.age_years <= stale_after) continue;
    std::string what = f.kind == "oil" ? "oil sample" : f.kind == "load" ? "load data" : f.kind;
    out += ", last " + what + " " + fmt(*f.age_years, 1) + " years old";
  }
  return out;
}

void add_freshness_kind(std::vector<DataFreshness>& out, const char* kind, std::optional<Day> latest,
                        Day as_of) {
  DataFreshness f{kind, latest, std::nullopt};
  if (latest) f.age_years = years_between(*latest, as_of);
  out.push_back(f);
}

}  // namespace

std::optional<double> dga_factor_value(const std::vector<GasReading>& gases,
                                       const std::vector<GasScoreBands>& bands) {
  double sum_sw = 0, sum_w = 0;
  for (const auto& b : bands) {
    const GasReading* g = find_gas(gases, b.gas);
    auto s = g ? gas_score(*g, b) : std::nullopt;
    if (!s) continue;
    sum_sw += *s * b.weight;
    sum_w += b.weight;
  }
  if (sum_w <= 0) return std::nullopt;
  return sum_sw / sum_w;
}

int rating_from_cuts(double value, const RatingCuts& cuts, bool higher_is_better) {
  for (int k = 0; k < 4; ++k)
    if (higher_is_better ? value > cuts[k] : value < cuts[k]) return 4 - k;
  return 0;
}

const HealthBand* band_of(double hi, const std::vector<HealthBand>& bands) {
  if (!std::isfinite(hi)) return nullptr;
  for (const auto& b : bands)
    if (hi > b.lower) return &b;
  return bands.empty() ? nullptr : &bands.back();
}

std::vector<DataFreshness> data_freshness(const UnitAssessment& a) {
  std::optional<Day> oil;
  for (auto d : {a.dga.sample_date, a.oil.sample_date, a.paper.sample_date})
    if (d) oil = std::max(oil.value_or(*d), *d);
  for (const auto& g : a.gas_history) oil = std::max(oil.value_or(g.date), g.date);
  std::optional<Day> insp;
  for (const auto& i : a.inspection) insp = std::max(insp.value_or(i.date), i.date);
  std::optional<Day> load;
  if (a.thermal.to) load = day_of(*a.thermal.to);
  std::vector<DataFreshness> out;
  add_freshness_kind(out, "oil", oil, a.as_of);
  add_freshness_kind(out, "infrared", latest_infrared(a), a.as_of);
  add_freshness_kind(out, "inspection", insp, a.as_of);
  add_freshness_kind(out, "load", load, a.as_of);
  return out;
}

void score_health(const HealthIndexOptions& o, UnitAssessment& a) {
  a.freshness = data_freshness(a);
  std::vector<RawFactor> raw{score_dga(o, a),     score_oil(o, a),        score_paper(o, a),
                             score_thermal(o, a), score_infrared(o, a),   score_inspection(o, a),
                             score_age(o, a)};
  for (auto& e : score_electrical_factors(o.electrical_factors, a))
    raw.push_back({e.name, e.weight, e.hif, e.detail, e.source});
  double denom = 0;  // sum of 4*K_j over scored factors
  int scored = 0;
  std::string missing_names;
  bool no_electrical_named = false;
  for (const auto& f : raw) {
    if (f.hif && f.weight > 0) {
      denom += 4 * f.weight;
      ++scored;
    } else if (f.detail == kNoElectricalTests) {  // one mention for all electrical factors
      if (no_electrical_named) continue;
      no_electrical_named = true;
      missing_names += (missing_names.empty() ? "" : ", ") + std::string("electrical tests");
      a.missing.push_back("health index factors from electrical tests: no electrical tests on record");
    } else {
      missing_names += (missing_names.empty() ? "" : ", ") + words(f.name);
      a.missing.push_back("health index factor " + words(f.name) + ": " + f.detail);
    }
  }
  a.factors.clear();
  double total = 0;
  for (const auto& f : raw) {
    FactorScore s{f.name, std::nullopt, 0, 0, f.source, f.detail};
    if (f.hif && f.weight > 0) {
      s.score = *f.hif;
      s.weight = f.weight;
      s.contribution = 100.0 * f.weight * *f.hif / denom;
      total += s.contribution;
    }
    a.factors.push_back(s);
  }
  a.methods.push_back("health index: " + o.source);

  std::string count = std::to_string(scored) + " of " + std::to_string(raw.size()) + " factors";
  if (!missing_names.empty()) count += " (no " + missing_names + ")";
  if (scored < o.min_factors || denom <= 0) {
    a.health_index.reset();
    a.band.clear();
    a.band_expected_life.clear();
    for (auto& s : a.factors) s.contribution = 0;
    a.confidence = count + ": too few for an index (needs " + std::to_string(o.min_factors) + ")" +
                   freshness_text(a, o.stale_after_years);
    a.missing.push_back("health index: fewer than " + std::to_string(o.min_factors) + " factors with data");
    return;
  }

  // CIGRE TB 761: a severe indicator must not be averaged away.
  double hi = total;
  auto hits = triggered_caps(o, a);
  double cap = 100;
  for (const auto& h : hits) cap = std::min(cap, h.cap);
  for (const auto& h : hits) {
    for (auto& s : a.factors) {
      if (s.name != h.factor) continue;
      bool binding = total > h.cap && h.cap <= cap;
      s.detail += "; worst-indicator cap (CIGRE TB 761): " + h.what + " limits the index to " + fmt(h.cap, 0) +
                  (binding ? " (weighted score " + fmt(total, 1) + ")" : " (not binding)");
    }
  }
  // Correctable findings lower the index (the unit is at risk until they are
  // repaired) but not the condition the replacement advice reads.
  double ageing_cap = 100;
  for (const auto& h : hits)
    if (!h.correctable) ageing_cap = std::min(ageing_cap, h.cap);
  a.condition_index = std::min(total, ageing_cap);
  if (hi > cap) {
    double scale = cap / hi;
    for (auto& s : a.factors) s.contribution *= scale;
    hi = cap;
    a.methods.push_back("worst-indicator cap applied: weighted score " + fmt(total, 1) + " limited to " +
                        fmt(cap, 0) + ", contributions scaled by " + fmt(scale, 3));
  }
  a.health_index = hi;
  if (const HealthBand* b = band_of(hi, o.bands)) {
    a.band = b->name;
    a.band_expected_life = b->expected_life;
  }
  a.confidence = count + freshness_text(a, o.stale_after_years);
}

}  // namespace ferrum::analytics
