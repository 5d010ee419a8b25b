// Infrared survey findings: temperature rise of a component over a similar
// component and over ambient, corrected to rated load, and classified on the
// four-step NETA ΔT scale.
//
// Sources:
// * ANSI/NETA MTS (Standard for Maintenance Testing Specifications),
//   thermographic survey table of ΔT criteria (edition not verified; the
//   table as reproduced on public pages; checked against a public reproduction):
//     priority 4: 1–3 °C over similar / 1–10 °C over ambient   possible deficiency
//     priority 3: 4–15 °C / 11–20 °C                           probable deficiency
//     priority 2: — / 21–40 °C                                 monitor until corrected
//     priority 1: >15 °C / >40 °C                              major discrepancy
//   The table's bands are whole degrees; for measured values ferrum reads
//   them as "up to 3, above 3 up to 15, above 15" (and 10/20/40 for ambient),
//   with rises below 1 °C giving no finding.
// * Load correction ΔT_corr = ΔT·(I_rated/I_meas)^n, n 1.6..2.0, default 2
//   (Infraspection Institute practice). Load in % of
//   rated power stands for % of rated current.
// * A measured rise below the camera's resolution (InfraredOptions::resolution_k,
//   default 1 K) is not extrapolated to rated load: the I² correction would
//   magnify the camera's error into a job (issue #16; common practice, no
//   published source).
// * Scans below about 40 % load are unreliable for correction (common
//   practice, from memory).
//
// ferrum's JSON severity runs the other way: severity = 5 − NETA priority
// (1 least .. 4 most severe).
//
// ferrum's reading of the table (its own choice, stated in the README):
// * when a similar component under similar load was recorded, the rise over
//   it (corrected to rated load) decides; the rise over ambient is reported
//   but classified only when no similar component was recorded, because a
//   sound connection under load runs a few kelvin above ambient and the
//   ambient column would flag every one of them;
// * oil-heated parts (tank, radiator, cooler, conservator, fan, pump) are not
//   classified: the table and the I² correction are for current-carrying
//   connections.
#pragma once

#include <optional>
#include <span>
#include <vector>

#include "analytics/assessment.h"
#include "analytics/unit_data.h"

namespace ferrum::analytics {

struct InfraredOptions {
  double load_exponent = 2.0;  // n in the load correction; accepted range 1.6..2.0, clamped into it
  double low_load_pct = 40;    // scans below this load (% of rated) are flagged unreliable
  // Rises below this (K) are within the camera's resolution and accuracy: they are
  // neither corrected to rated load nor classified (ferrum.ini [analysis]
  // infrared_resolution_k; common practice, no published source: a camera's
  // stated accuracy is about ±1..2 K).
  double resolution_k = 1.0;
};

// NETA priority 1..4 (1 most severe), or 0 for no finding (rise below 1 °C).
int neta_priority_over_reference(double rise_k);
int neta_priority_over_ambient(double rise_k);
// 1 least .. 4 most severe; 0 stays 0.
inline int severity_from_neta_priority(int priority) { return priority == 0 ? 0 : 5 - priority; }

// True when a measured rise is below the camera's resolution (not corrected, not classified).
bool below_resolution(double rise_k, double resolution_k);

// Rise corrected to rated load. REQUIRES: load_pct > 0.
double rise_at_rated_load(double rise_k, double load_pct, double exponent);

// True for parts warmed by the oil rather than by their own current.
bool is_oil_heated_part(const std::string& component);

// One scan. Without any rise (no reference and no ambient) severity is null
// and severity_text says why.
InfraredFinding assess_infrared_scan(const InfraredScan& scan, const InfraredOptions& options);

// The latest scan of each component on or before as_of, most severe first.
std::vector<InfraredFinding> assess_infrared_survey(std::span<const InfraredScan> scans, Day as_of,
                                                    const InfraredOptions& options);

}  // namespace ferrum::analytics
