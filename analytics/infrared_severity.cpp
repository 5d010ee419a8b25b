#include "analytics/infrared_severity.h"

#include <algorithm>
#include <cctype>
#include <string>
#include <cmath>
#include <cstdio>
#include <map>

#include "analytics/standard_tables.h"

namespace ferrum::analytics {
namespace {

constexpr const char* kSource =
    "ANSI/NETA MTS thermographic ΔT criteria (priorities 1-4); load correction exponent per "
    "Infraspection Institute practice";

const char* neta_text(int priority) {
  switch (priority) {
    case 1: return "priority 1: repair immediately (major discrepancy)";
    case 2: return "priority 2: monitor until corrective measures are taken";
    case 3: return "priority 3: repair as time permits (probable deficiency)";
    case 4: return "priority 4: investigate (possible deficiency)";
  }
  return "no deficiency (rise below 1 °C)";
}

struct Reading {
  std::optional<double> measured, corrected;
};

// A rise below the resolution is measured but never corrected to rated load.
Reading reading(double spot, const std::optional<double>& base, const std::optional<double>& load_pct,
                double n, double resolution_k) {
  Reading r;
  if (!base) return r;
  r.measured = spot - *base;
  if (load_pct && *load_pct > 0 && !below_resolution(*r.measured, resolution_k))
    r.corrected = rise_at_rated_load(*r.measured, *load_pct, n);
  return r;
}

// The rise that is classified: corrected when the load is known.
std::optional<double> classified(const Reading& r) { return r.corrected ? r.corrected : r.measured; }

std::string lower(std::string s) {
  for (char& c : s) c = static_cast<char>(std::tolower(static_cast<unsigned char>(c)));
  return s;
}

}  // namespace

namespace {
// First row of the ΔT table (tables in force) whose upper end holds the rise;
// 0 below the first row.
int priority_from_rows(const std::vector<DeltaTRow>& rows, double rise) {
  if (rows.empty() || !(rise >= rows.front().rise_from_c)) return 0;
  for (const DeltaTRow& r : rows)
    if (rise <= r.rise_to_c) return r.priority;
  return rows.back().priority;
}
}  // namespace

int neta_priority_over_reference(double rise) {
  return priority_from_rows(standard_tables().delta_t_reference, rise);
}

bool below_resolution(double rise_k, double resolution_k) { return rise_k < resolution_k; }

int neta_priority_over_ambient(double rise) { return priority_from_rows(standard_tables().delta_t_ambient, rise); }

double rise_at_rated_load(double rise_k, double load_pct, double exponent) {
  return rise_k * std::pow(100.0 / load_pct, exponent);
}

bool is_oil_heated_part(const std::string& component) {
  const std::string c = lower(component);
  for (const char* word : {"tank", "radiator", "cooler", "conservator", "fan", "pump", "oil"})
    if (c.find(word) != std::string::npos) return true;
  return false;
}

InfraredFinding assess_infrared_scan(const InfraredScan& scan, const InfraredOptions& options) {
  InfraredFinding f;
  f.date = scan.date;
  f.component = scan.component;
  f.load_pct = scan.load_pct;
  f.image_ref = scan.image_ref;
  f.note = scan.note;
  f.source = kSource;
  const double n = std::clamp(options.load_exponent, 1.6, 2.0);
  const Reading ref = reading(scan.spot_c, scan.reference_c, scan.load_pct, n, options.resolution_k);
  const Reading amb = reading(scan.spot_c, scan.ambient_c, scan.load_pct, n, options.resolution_k);
  f.rise_over_reference_k = ref.measured;
  f.rise_over_ambient_k = amb.measured;
  f.corrected_rise_k = ref.corrected ? ref.corrected : amb.corrected;
  f.low_load = scan.load_pct && *scan.load_pct < options.low_load_pct;
  if (!ref.measured && !amb.measured) {
    f.severity_text = "not classified: neither a reference component nor ambient temperature recorded";
    return f;
  }
  if (is_oil_heated_part(scan.component)) {
    // Tanks, radiators and coolers are warmed by the oil, not by their own
    // I²R losses: the NETA ΔT table (electrical connections) and the I²
    // load correction do not apply. Report the rises only.
    f.corrected_rise_k.reset();
    f.severity_text = "oil-heated part: NETA ΔT criteria apply to current-carrying connections; compare with "
                      "similar parts and the thermal model";
    return f;
  }
  // A similar component under similar load is the better comparison: when
  // one was recorded it decides; the ambient criterion is used only without
  // one (a component a few kelvin above ambient under load is normal).
  int p_ref = 0, p_amb = 0;
  std::string basis;
  const Reading& decisive = ref.measured ? ref : amb;
  if (below_resolution(*decisive.measured, options.resolution_k)) {
    char buf[200];
    std::snprintf(buf, sizeof buf,
                  "no finding: rise of %.1f K %s is below the camera resolution of %.1f K, not corrected to rated load",
                  *decisive.measured, ref.measured ? "over a similar component" : "over ambient",
                  options.resolution_k);
    f.severity_text = buf;
    f.corrected_rise_k.reset();  // nothing is extrapolated from the decisive rise
    return f;
  }
  if (classified(ref)) {
    p_ref = neta_priority_over_reference(*classified(ref));
    basis = "over a similar component";
  } else if (classified(amb)) {
    p_amb = neta_priority_over_ambient(*classified(amb));
    basis = "over ambient (no similar component recorded)";
  }
  const int severity = std::max(severity_from_neta_priority(p_ref), severity_from_neta_priority(p_amb));
  std::string text = (severity == 0 ? neta_text(0) : neta_text(5 - severity)) + std::string(", ") + basis;
  if (severity > 0) f.severity = severity;
  if (!scan.load_pct) text += "; load not recorded, rise not corrected";
  if (f.low_load) {
    char buf[96];
    std::snprintf(buf, sizeof buf, "; scanned at %.0f %% load, correction to rated load unreliable",
                  *scan.load_pct);
    text += buf;
  }
  f.severity_text = text;
  return f;
}

std::vector<InfraredFinding> assess_infrared_survey(std::span<const InfraredScan> scans, Day as_of,
                                                    const InfraredOptions& options) {
  std::map<std::string, const InfraredScan*> latest;
  for (const auto& s : scans) {
    if (s.date > as_of) continue;
    auto& slot = latest[s.component];
    if (!slot || s.date >= slot->date) slot = &s;
  }
  std::vector<InfraredFinding> out;
  for (const auto& [component, scan] : latest) out.push_back(assess_infrared_scan(*scan, options));
  std::stable_sort(out.begin(), out.end(),
                   [](const auto& a, const auto& b) { return a.severity.value_or(0) > b.severity.value_or(0); });
  return out;
}

}  // namespace ferrum::analytics
