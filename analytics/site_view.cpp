#include "analytics/site_view.h"

#include <algorithm>
#include <cstdio>

namespace ferrum::analytics {
namespace {

// MVA as written: a rating keeps its digits (7.5, 31.5, 40), a computed
// load one decimal.
std::string mva(double v, bool rating = false) {
  char buf[32];
  std::snprintf(buf, sizeof buf, rating ? "%.4g MVA" : "%.1f MVA", v);
  return buf;
}

std::string pct(double v) {
  char buf[32];
  std::snprintf(buf, sizeof buf, "%.1f %%", v);
  return buf;
}

// The thermal part's load-reduce action (thermal_assessment.cpp), before or
// after this module rewrote it.
const char* kTransferText = "Reduce the load";

SiteUnitView unit_view(const std::string& unit_id, double rated_mva, const SiteInputs& th,
                       const std::string& decision, const SiteViewOptions& o) {
  SiteUnitView u;
  u.unit_id = unit_id;
  u.rated_mva = rated_mva;
  if (th.peak_load_pu) u.peak_load_mva = *th.peak_load_pu * rated_mva;
  if (th.emergency_load_pu) u.emergency_mva = *th.emergency_load_pu * rated_mva;
  if (th.hours_above_normal_cyclic.value_or(0) > 0) {
    u.constrained = true;
    u.limits.push_back("loading limited (hot spot above " + std::to_string(static_cast<int>(th.normal_cyclic_limit_c)) +
                       " °C)");
  }
  if (th.hot_spot_from_measured_top_oil) {
    u.constrained = true;
    u.limits.push_back("top oil runs above the model (cooling suspect)");
  }
  if (th.paper_moisture_pct && *th.paper_moisture_pct > o.wet_paper_pct) {
    u.wet = true;
    u.limits.push_back("wet paper (" + pct(*th.paper_moisture_pct) + " water, above " + pct(o.wet_paper_pct) + ")");
  }
  std::vector<std::string> health;
  if (th.unsafe_inspection) health.push_back("unsafe inspection item");
  if (th.active_arcing) health.push_back("active arcing");
  // The fault-gas condition (IEEE C57.104-2008 Table 1 without CO and CO2):
  // carbon oxides alone are paper ageing, not a fault that bars extra load.
  if (th.c57104_2008_fault_condition && *th.c57104_2008_fault_condition >= 3)
    health.push_back("dissolved gases condition " + std::to_string(*th.c57104_2008_fault_condition));
  if (!health.empty()) {
    u.unhealthy = true;
    std::string s;
    for (const auto& h : health) s += (s.empty() ? "" : ", ") + h;
    u.limits.push_back("unhealthy (" + s + ")");
  }
  // A unit with work decided on takes no extra load either, whatever its
  // index: it is said as pending work, not as ill health (a sound unit whose
  // cooling is to be repaired is not "unhealthy").
  const std::string& d = decision;
  if (d == "replace" || d == "refurbish" || d == "repair") {
    u.unhealthy = true;
    u.limits.push_back("work pending (decision: " + d + ")");
  }
  if (u.can_take_load() && u.peak_load_mva) u.spare_mva = std::max(0.0, u.rated_mva - *u.peak_load_mva);
  return u;
}

void check_n1(SiteView& s) {
  if (s.units.size() < 2) {
    s.n1_ok = false;
    s.n1_text = "N-1 fails: one unit, no other unit at the site carries its load when it is out";
    return;
  }
  // What the other units carry with `out` out of service.
  auto carried = [&](const SiteUnitView* out) {
    double capacity = 0;
    for (const auto& u : s.units) {
      if (&u == out) continue;
      const double cap = u.emergency_mva.value_or(u.rated_mva);
      capacity += u.can_take_load() ? cap : std::min(cap, u.peak_load_mva.value_or(0));
    }
    return capacity;
  };
  // N-1 is the loss of any one unit: the worst single outage decides, the one
  // that leaves the others the least to carry with. That is not always the
  // largest unit: out of two of equal size, losing the one that could take
  // load leaves less. On equal capacity, the larger rating, then the higher
  // peak, then register order.
  const SiteUnitView* out = &s.units.front();
  double capacity = carried(out);
  for (const auto& u : s.units) {
    const double c = carried(&u);
    if (c < capacity ||
        (c == capacity && (u.rated_mva > out->rated_mva ||
                           (u.rated_mva == out->rated_mva && u.peak_load_mva.value_or(0) > out->peak_load_mva.value_or(0))))) {
      out = &u;
      capacity = c;
    }
  }
  s.n1_unit_out = out->unit_id;
  s.n1_unit_out_mva = out->rated_mva;
  if (!s.peak_load_mva) {
    std::string names;
    for (const auto& n : s.without_load) names += (names.empty() ? "" : ", ") + n;
    s.n1_text = "N-1 not assessed: no load data for " + names;
    return;
  }
  std::vector<std::string> at_nameplate;
  for (const auto& u : s.units)
    if (&u != out && !u.emergency_mva) at_nameplate.push_back(u.unit_id);
  s.n1_capacity_mva = capacity;
  s.n1_margin_mva = capacity - *s.peak_load_mva;
  s.n1_ok = *s.n1_margin_mva >= 0;
  s.n1_text = std::string(*s.n1_ok ? "N-1 passes" : "N-1 fails") + ": with " + out->unit_id + " (" +
              mva(out->rated_mva, true) + ") out the other units carry " + mva(capacity) + " against a peak of " +
              mva(*s.peak_load_mva) + " (" + (*s.n1_ok ? "margin " : "short by ") + mva(std::abs(*s.n1_margin_mva)) +
              ")";
  if (!at_nameplate.empty()) {
    std::string names;
    for (const auto& n : at_nameplate) names += (names.empty() ? "" : ", ") + n;
    s.n1_text += "; " + names + " counted at nameplate (no load data)";
  }
}

bool is_transfer_action(const Action& x) {
  return x.need == "load-reduce" || x.text.rfind(kTransferText, 0) == 0;
}

// Adds a unit's view to its site's, in order of first appearance.
void add_unit(std::vector<SiteView>& sites, const std::string& site, SiteUnitView u) {
  auto it = std::find_if(sites.begin(), sites.end(), [&](const SiteView& s) { return s.site == site; });
  if (it == sites.end()) {
    sites.push_back({});
    it = sites.end() - 1;
    it->site = site;
  }
  it->units.push_back(std::move(u));
}

void complete(std::vector<SiteView>& sites) {
  for (auto& s : sites) {
    double peak = 0;
    for (const auto& u : s.units) {
      s.installed_mva += u.rated_mva;
      if (u.peak_load_mva) peak += *u.peak_load_mva;
      else s.without_load.push_back(u.unit_id);
    }
    if (s.without_load.empty()) s.peak_load_mva = peak;
    check_n1(s);
  }
}

void rewrite_transfer(std::optional<Action>& first_action, const SiteView& site, const std::string& unit_id) {
  if (first_action && is_transfer_action(*first_action)) first_action->text = transfer_advice(site, unit_id);
}

const SiteView* site_named(std::span<const SiteView> sites, const std::string& site) {
  const auto it = std::find_if(sites.begin(), sites.end(), [&](const SiteView& s) { return s.site == site; });
  return it == sites.end() ? nullptr : &*it;
}

}  // namespace

std::vector<SiteView> site_view(std::span<const UnitAssessment> units, const SiteViewOptions& options) {
  std::vector<SiteView> sites;
  for (const auto& a : units)
    add_unit(sites, a.unit.site, unit_view(a.unit.unit_id, a.unit.rated_mva, site_inputs(a), a.decision.action, options));
  complete(sites);
  return sites;
}

std::vector<SiteView> site_view(std::span<const RankingInput> units, const SiteViewOptions& options) {
  std::vector<SiteView> sites;
  for (const auto& r : units) add_unit(sites, r.site, unit_view(r.unit_id, r.rated_mva, r.site_inputs, r.action, options));
  complete(sites);
  return sites;
}

std::vector<const SiteUnitView*> transfer_targets(const SiteView& site, const std::string& unit_id) {
  std::vector<const SiteUnitView*> out;
  for (const auto& u : site.units)
    if (u.unit_id != unit_id && u.can_take_load() && u.spare_mva && *u.spare_mva > 0) out.push_back(&u);
  std::stable_sort(out.begin(), out.end(), [](auto* x, auto* y) { return *x->spare_mva > *y->spare_mva; });
  return out;
}

std::string transfer_advice(const SiteView& site, const std::string& unit_id) {
  const auto targets = transfer_targets(site, unit_id);
  if (!targets.empty()) {
    std::string s = "Reduce the load or transfer load to ";
    for (std::size_t i = 0; i < targets.size(); ++i)
      s += (i == 0 ? "" : i + 1 == targets.size() ? " or " : ", ") + targets[i]->unit_id + " (" +
           mva(*targets[i]->spare_mva) + " spare at nameplate)";
    return s;
  }
  std::string why;
  for (const auto& u : site.units) {
    if (u.unit_id == unit_id) continue;
    std::string r;
    for (const auto& l : u.limits) r += (r.empty() ? "" : ", ") + l;
    if (r.empty()) r = u.spare_mva ? "no spare capacity at nameplate" : "no load data";
    why += (why.empty() ? "" : "; ") + u.unit_id + ": " + r;
  }
  return "Reduce the load: no other unit at " + (site.site.empty() ? std::string("the site") : site.site) +
         " can take load" + (why.empty() ? " (the only unit there)" : " (" + why + ")");
}

std::string site_line(const SiteView& s) {
  std::string line = "Site " + (s.site.empty() ? std::string("(none)") : s.site) + ": " +
                     std::to_string(s.units.size()) + (s.units.size() == 1 ? " unit, " : " units, ") +
                     mva(s.installed_mva, true) + " installed, peak load " +
                     (s.peak_load_mva ? mva(*s.peak_load_mva) + " (sum of the units' peaks)" : std::string("unknown")) +
                     ". " + s.n1_text + ".";
  return line;
}

void apply_site_view(UnitAssessment& a, std::span<const SiteView> sites) {
  const SiteView* site = site_named(sites, a.unit.site);
  if (!site) return;
  a.site_summary = site_line(*site);
  const std::string advice = transfer_advice(*site, a.unit.unit_id);
  for (auto& x : a.actions)
    if (is_transfer_action(x)) x.text = advice;
  rewrite_transfer(a.decision.first_action, *site, a.unit.unit_id);
}

void apply_site_view(std::vector<UnitAssessment>& units, std::span<const SiteView> sites) {
  for (auto& a : units) apply_site_view(a, sites);
}

void apply_site_view(std::vector<RankingInput>& units, std::span<const SiteView> sites) {
  for (auto& r : units)
    if (const SiteView* site = site_named(sites, r.site)) rewrite_transfer(r.first_action, *site, r.unit_id);
}

}  // namespace ferrum::analytics
