// Site view: the units of one site (substation) taken together. For each site
// the sum of the units' peak loads against the installed capacity, and the
// N-1 check: can the site's load still be carried with any one unit out (the
// worst single outage),
// by the other units within their long-time emergency loading capability?
// A unit that is itself loading limited (constrained), wet or unhealthy takes
// no transferred load: it carries at most its own peak.
//
// Sources and conventions:
// * emergency capability per unit: ThermalSummary::emergency_load_pu, the
//   steady load whose hot spot reaches the IEC 60076-7:2005 Table 4
//   long-time emergency limit (140 °C) at the ambient of the unit's peak
//   (thermal_assessment.h); a unit without load data counts at nameplate
//   (1.0 p.u.), said in the result;
// * the site's peak is the sum of the units' peaks over the summary window
//   (not coincident in time, so never below the true site peak: conservative;
//   common practice, no published source);
// * N-1 as the worst single outage: each unit out in turn, the one that leaves
//   the others the least capacity decides (on equal capacity the larger
//   rating, then the higher peak): common planning practice, no published
//   source;
// * wet: water in paper above SiteViewOptions::wet_paper_pct ([analysis]
//   site_wet_paper_pct, 2.5 %: common practice, no published source);
//   constrained: hot spot above the normal cyclic limit in the window, or
//   hot spot taken from a measured top oil running above the model (a cooling
//   problem); unhealthy: an unsafe inspection item, active arcing, a
//   C57.104-2008 fault-gas condition (without CO, CO2) 3 or 4, or work
//   pending (a decision to replace, refurbish or repair, named so in the
//   limits; ferrum's rule, no published source).
//
// Units: MVA, per unit. Pure: no I/O, no clock.
#pragma once

#include <optional>
#include <span>
#include <string>
#include <vector>

#include "analytics/assessment.h"
#include "analytics/ranking_input.h"

namespace ferrum::analytics {

struct SiteViewOptions {
  double wet_paper_pct = 2.5;  // [analysis] site_wet_paper_pct
};

struct SiteUnitView {
  std::string unit_id;
  double rated_mva = 0;
  std::optional<double> peak_load_mva;   // peak_load_pu × rated_mva over the summary window
  std::optional<double> emergency_mva;   // emergency_load_pu × rated_mva
  bool constrained = false, wet = false, unhealthy = false;
  std::vector<std::string> limits;       // why it takes no load, in words
  // Room at nameplate for load moved from a neighbour in normal operation
  // (rated − peak), when it can take load and has load data.
  std::optional<double> spare_mva;
  bool can_take_load() const { return !constrained && !wet && !unhealthy; }
};

struct SiteView {
  std::string site;
  std::vector<SiteUnitView> units;        // register order
  double installed_mva = 0;               // Σ ratings
  std::optional<double> peak_load_mva;    // Σ units' peaks; null when a unit has no load data
  std::vector<std::string> without_load;  // units without load data
  // The unit whose outage leaves the others the least to carry with (the
  // worst single outage; N-1 is the loss of any one unit) and its rating.
  std::string n1_unit_out;
  double n1_unit_out_mva = 0;
  // What the other units can carry with that unit out: Σ emergency
  // capability of the units that can take load (nameplate without load data)
  // + the own peak (at most the capability) of those that cannot.
  std::optional<double> n1_capacity_mva;
  std::optional<double> n1_margin_mva;    // capacity − site peak
  std::optional<bool> n1_ok;              // null: unknown (load data missing)
  std::string n1_text;                    // the N-1 result in words
  bool flagged() const { return n1_ok && !*n1_ok; }
};

// One SiteView per site, in order of first appearance in `units`; the same
// from whole assessments or from their ranking inputs (ranking_input.h).
std::vector<SiteView> site_view(std::span<const UnitAssessment> units, const SiteViewOptions& options);
std::vector<SiteView> site_view(std::span<const RankingInput> units, const SiteViewOptions& options);

// Units of the site that may take load from `unit_id`: others that can take
// load and have spare capacity at nameplate, most spare first.
std::vector<const SiteUnitView*> transfer_targets(const SiteView& site, const std::string& unit_id);

// The load-reduce action's text for `unit_id`: names the valid targets with
// their spare capacity, or says there is none and why.
std::string transfer_advice(const SiteView& site, const std::string& unit_id);

// One line on the unit's site for its report: load against capacity and N-1.
std::string site_line(const SiteView& site);

// Writes each unit's site line (UnitAssessment::site_summary) and names valid
// targets in its load-transfer action (need "load-reduce", or the thermal
// part's text starting "Reduce the load"), in the action list and the
// decision's first action.
void apply_site_view(std::vector<UnitAssessment>& units, std::span<const SiteView> sites);
void apply_site_view(UnitAssessment& unit, std::span<const SiteView> sites);
// Of a ranking input, the first action only (it has no site line or action list).
void apply_site_view(std::vector<RankingInput>& units, std::span<const SiteView> sites);

}  // namespace ferrum::analytics
