// Key-gas reading: the dominant combustible gas points to the likely fault.
// Source: IEEE C57.104-2008 key-gas method (typical relative proportions of
// the combustible gases; from memory, medium confidence):
//   overheated oil        C2H4 dominant (about 63 %, with C2H6 about 20 %)
//   overheated cellulose  CO dominant (about 92 %)
//   partial discharge     H2 dominant (about 85 %, CH4 about 13 %)
//   arcing                H2 (about 60 %) with large C2H2 (about 30 %)
// Inputs: H2, CH4, C2H6, C2H4, C2H2, CO in µL/L. Output: each gas as % of
// their sum, the key gas and the reading in plain words.
// Validity: a secondary cue only (C57.104-2019 reports frequent
// misidentification). Applied only when IEC 60599's precondition holds (at
// least one fault gas above its typical value, or the gases rising:
// dga_fault_evidence), the same as the ratio and triangle methods; otherwise
// the reading says the concentrations are too low. Where it disagrees with
// Duval Triangle 1 or the IEC 60599 ratios it is indicative only
// (key_gas_agrees).
#pragma once

#include <array>
#include <optional>
#include <string>

#include "analytics/dga_fault_evidence.h"
#include "analytics/unit_data.h"

namespace ferrum::analytics {

struct KeyGasOptions {
  // H2-dominant patterns: C2H2 share (%) at or above which arcing is read
  // instead of partial discharge; midway between the corona (≈0 %) and
  // arcing (≈30 %) proportions. Default 15 %.
  double arcing_c2h2_share_pct = 15.0;
};

struct KeyGasResult {
  bool applicable = false;
  std::array<double, 6> share_pct{};  // H2, CH4, C2H6, C2H4, C2H2, CO (% of their sum)
  std::string key_gas;                // "C2H4", ...
  // The reading's fault family, for comparing with the zone codes of the
  // other methods: "PD" (partial discharge), "D" (arcing), "T" (overheated
  // oil), "C" (overheated cellulose), "" (no published pattern / no reading).
  std::string fault_family;
  std::string reading;                // plain words, or why no reading
  std::string method = "Key-gas method (dominant combustible gas)";
  std::string source = "IEEE C57.104-2008 key gases (proportions from memory)";
};

// Whether a key-gas fault family agrees with a Duval Triangle 1 zone or an
// IEC 60599 ratio code (PD; D1, D2; T1, T2, T3; DT agrees with D and T).
// Cellulose ("C") has no zone in either method and agrees with none.
bool key_gas_agrees(const std::string& fault_family, const std::string& zone);

KeyGasResult key_gas_reading(const OilSample& sample, const TypicalGasLevels& typical, bool gases_rising,
                             const KeyGasOptions& options = {});

}  // namespace ferrum::analytics
