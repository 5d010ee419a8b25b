#include "analytics/electrical/electrical_health.h"

#include "analytics/standard_tables.h"

#include <algorithm>
#include <cmath>
#include <cstdio>
#include <map>
#include <stdexcept>

#include "analytics/electrical/bushings.h"
#include "analytics/electrical/insulation_resistance.h"
#include "analytics/electrical/turns_ratio.h"
#include "analytics/electrical/winding_resistance.h"

namespace ferrum::analytics {

namespace {

std::string fmt(double v, int decimals) {
  char buf[64];
  std::snprintf(buf, sizeof buf, "%.*f", decimals, v);
  return buf;
}



// The worst measure of a factor and what gave it; nullopt without results.
struct Measure {
  double value = 0;
  std::string what;
};

void keep_worst(std::optional<Measure>& worst, double value, std::string what) {
  if (!std::isfinite(value)) return;
  if (!worst || value > worst->value) worst = Measure{value, std::move(what)};
}

std::optional<Measure> measure_of(const std::string& name, const ElectricalSummary& s) {
  std::optional<Measure> m;
  if (name == "insulation_power_factor") {
    for (const auto* r : latest_of(s.insulation_power_factor))
      if (r->pf20_pct && r->limit_pct > 0)
        keep_worst(m, *r->pf20_pct / r->limit_pct, r->insulation + " " + fmt(*r->pf20_pct, 2) + " % at 20 °C");
  } else if (name == "turns_ratio") {
    for (const auto* r : latest_of(s.turns_ratio))
      if (r->deviation_pct)
        keep_worst(m, std::fabs(*r->deviation_pct) / electrical::kRatioLimitPct,
                   "deviation " + fmt(*r->deviation_pct, 2) + " %" + (r->phase.empty() ? "" : " phase " + r->phase) +
                       (r->tap ? " tap " + std::to_string(*r->tap) : ""));
  } else if (name == "leakage_reactance") {
    for (const auto* r : latest_of(s.leakage_reactance))
      if (r->change_pct && r->limit_pct)
        keep_worst(m, std::fabs(*r->change_pct) / *r->limit_pct,
                   "change " + fmt(*r->change_pct, 2) + " %" + (r->phase.empty() ? "" : " phase " + r->phase));
  } else if (name == "winding_resistance") {
    for (const auto* r : latest_of(s.winding_resistance)) {
      if (r->phase_spread_pct)
        keep_worst(m, *r->phase_spread_pct / electrical::kPhaseSpreadLimitPct,
                   r->winding + " phase spread " + fmt(*r->phase_spread_pct, 2) + " %");
      if (r->change_pct)
        keep_worst(m, std::fabs(*r->change_pct) / electrical::kChangeLimitPct,
                   r->winding + " change " + fmt(*r->change_pct, 2) + " %");
    }
  } else if (name == "bushings") {
    std::map<std::pair<std::string, std::string>, const BushingResult*> latest;
    for (const auto& b : s.bushings) latest[{b.bushing, b.insulation}] = &b;
    for (const auto& [key, b] : latest) {
      if (b->capacitance_change_pct)
        keep_worst(m, std::fabs(*b->capacitance_change_pct) / electrical::kBushingCapInvestigatePct,
                   b->bushing + " capacitance change " + fmt(*b->capacitance_change_pct, 1) + " %");
      if (b->power_factor_pct && b->reference_power_factor_pct && *b->reference_power_factor_pct > 0)
        keep_worst(m, *b->power_factor_pct / (electrical::kBushingPfFactor * *b->reference_power_factor_pct),
                   b->bushing + " power factor " + fmt(*b->power_factor_pct, 2) + " % (reference " +
                       fmt(*b->reference_power_factor_pct, 2) + " %)");
    }
  }
  return m;
}

}  // namespace

std::vector<ElectricalFactorSpec> default_electrical_factors() {
  std::vector<ElectricalFactorSpec> out;
  for (const auto& e : standard_tables().electrical_factors) out.push_back({e.name, e.weight, e.cuts, e.source});
  return out;
}

int electrical_hif(double measure, const std::array<double, 4>& cuts) {
  for (int k = 0; k < 4; ++k)
    if (measure <= cuts[k]) return 4 - k;
  return 0;
}

std::vector<ElectricalFactorScore> score_electrical_factors(const std::vector<ElectricalFactorSpec>& specs,
                                                            const UnitAssessment& a) {
  static constexpr const char* kLetters = "EDCBA";
  std::vector<ElectricalFactorScore> out;
  for (const auto& spec : specs) {
    ElectricalFactorScore f{spec.name, spec.weight, std::nullopt, "", spec.source};
    if (!a.electrical) {
      f.detail = kNoElectricalTests;
      out.push_back(std::move(f));
      continue;
    }
    if (spec.name == "insulation_resistance") {
      static const std::map<std::string, int> kReading = {
          {"good", 4}, {"fair", 3}, {"questionable", 2}, {"poor", 1}, {"dangerous", 0}};
      for (const auto* r : latest_of(a.electrical->insulation_resistance)) {
        auto it = kReading.find(r->reading);
        if (it == kReading.end()) continue;
        if (!f.hif || it->second < *f.hif) {
          f.hif = it->second;
          f.detail = r->insulation + " polarization index " + fmt(*r->polarization_index, 2) + " (" + r->reading + ")";
        }
      }
    } else if (const auto m = measure_of(spec.name, *a.electrical)) {
      f.hif = electrical_hif(m->value, spec.cuts);
      f.detail = m->what + ", " + fmt(m->value, 2) + " x the limit";
    }
    if (f.hif)
      f.detail += " -> rating " + std::string(1, kLetters[*f.hif]) + " (" + std::to_string(*f.hif) + "/4)";
    else
      f.detail = "no judged " + spec.name + " result";
    out.push_back(std::move(f));
  }
  return out;
}

}  // namespace ferrum::analytics
