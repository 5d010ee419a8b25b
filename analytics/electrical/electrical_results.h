// Results of the electrical field-test checks of one unit, as they appear
// in the assessment document (analytics/assessment.h, UnitAssessment::
// electrical) and under the `electrical` key of `ferrum assess --json`.
// Every list is in test-date order; absent values are std::nullopt (null).
// The checks and their sources: analytics/electrical/*.h.
#pragma once

#include <optional>
#include <string>
#include <vector>

#include "analytics/calendar.h"

namespace ferrum::analytics {

struct TurnsRatioResult {
  Day date = 0;
  std::optional<int> tap;
  std::string phase;
  double measured = 0;
  std::optional<double> nameplate;      // expected phase ratio at this tap
  std::string nameplate_basis;          // "register (...)" or "nameplate_value of the row"
  std::optional<double> deviation_pct;  // (measured − nameplate)/nameplate·100
  std::optional<bool> within_limit;     // |deviation| ≤ 0.5 %
  std::string source;
  std::string note;                     // why there is no nameplate ratio
};

struct WindingResistanceResult {
  Day date = 0;
  std::string winding;  // HV, LV, TV
  std::optional<int> tap;
  std::string phase;
  double measured_ohm = 0;
  std::optional<double> temp_c;
  std::optional<double> corrected_ohm;    // at reference_c
  double reference_c = 75;
  std::optional<double> phase_spread_pct; // over the phases of this date, winding and tap
  std::optional<double> change_pct;       // against change_basis
  std::string change_basis;               // "nameplate_value", "previous test <date>", ""
  std::optional<bool> within_limit;
  std::string source;
};

struct InsulationPowerFactorResult {
  Day date = 0;
  std::string insulation;  // CH, CL, CHL
  double power_factor_pct = 0;
  std::optional<double> temp_c;
  std::optional<double> test_kv;
  std::optional<double> correction_factor;  // K applied, PF20 = PF·K
  std::optional<double> pf20_pct;
  bool corrected = false;
  std::optional<double> nameplate_pf_pct;
  std::optional<double> capacitance_pf;
  std::optional<double> capacitance_change_pct;  // against the previous test of the same insulation
  double limit_pct = 1.0;
  std::optional<bool> within_limit;  // null when no 20 °C value is known
  std::string source;
};

struct BushingResult {
  Day date = 0;
  std::string bushing;     // H1, X2, ...
  std::string insulation;  // C1, C2
  std::optional<double> power_factor_pct;
  std::optional<double> reference_power_factor_pct;
  std::string power_factor_basis;  // "nameplate" or "first test <date>"
  std::optional<double> capacitance_pf;
  std::optional<double> reference_capacitance_pf;
  std::string capacitance_basis;
  std::optional<double> capacitance_change_pct;
  std::optional<double> temp_c;
  std::string verdict;  // "acceptable", "investigate", "out of service"
  bool within_limit = true;
  std::string source;
};

struct InsulationResistanceResult {
  Day date = 0;
  std::string insulation;  // HV-LV, HV-GROUND, ...
  std::optional<double> one_minute_megohm, ten_minute_megohm;
  std::optional<double> polarization_index;
  std::string reading;  // "dangerous" .. "good"; empty without both readings
  std::optional<double> temp_c;
  std::string source;
};

struct ExcitationCurrentResult {
  Day date = 0;
  std::optional<int> tap;
  std::optional<double> test_kv;
  std::optional<double> a_ma, b_ma, c_ma, single_ma;  // single_ma: a reading without a phase
  std::optional<bool> pattern_expected;  // outer phases similar and above the middle one
  std::optional<double> outer_difference_pct;
  std::optional<double> change_pct;      // largest |change| of a phase against the previous test
  std::string change_basis;
  std::optional<bool> within_limit;      // = pattern_expected (no published limit on the change)
  std::string source;
};

struct LeakageReactanceResult {
  Day date = 0;
  std::string phase;  // empty: three-phase equivalent
  double measured_pct = 0;
  std::optional<double> nameplate_pct;
  std::string nameplate_basis;  // "nameplate_value of the row" or "register impedance_pct"
  std::optional<double> change_pct;
  std::optional<double> limit_pct;
  std::optional<bool> within_limit;
  std::string source;
};

struct ElectricalSummary {
  std::optional<Day> latest;  // newest test date
  std::vector<TurnsRatioResult> turns_ratio;
  std::vector<WindingResistanceResult> winding_resistance;
  std::vector<InsulationPowerFactorResult> insulation_power_factor;
  std::vector<BushingResult> bushings;
  std::vector<InsulationResistanceResult> insulation_resistance;
  std::vector<ExcitationCurrentResult> excitation_current;
  std::vector<LeakageReactanceResult> leakage_reactance;
  std::vector<std::string> notes;  // assumptions: conductor assumed copper, no PF table, ...
};

// The results of the newest date of one list (the latest test).
template <class R>
std::vector<const R*> latest_of(const std::vector<R>& list) {
  std::vector<const R*> out;
  if (list.empty()) return out;
  Day last = list.front().date;
  for (const auto& r : list) last = r.date > last ? r.date : last;
  for (const auto& r : list)
    if (r.date == last) out.push_back(&r);
  return out;
}

}  // namespace ferrum::analytics
