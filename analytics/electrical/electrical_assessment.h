// The electrical field tests of one unit, checked and summarised for the
// assessment: each test row goes through its published check
// (analytics/electrical/*.h, which name the sources), rows of one date are
// combined where the check needs several (phase spread, polarization index,
// excitation pattern), and each result is compared with the nameplate or
// the previous test. Failing results of each item's latest test add actions.
//
// Nameplate values: a row's nameplate_value wins; otherwise the register
// (turns ratio from hv_kv, lv_kv, vector_group and the tap changer; leakage
// reactance from impedance_pct). Tap positions are numbered so that
// position 1 gives the highest HV voltage (schema/drop-files.md).
// Winding resistance: nameplate_value is taken as the factory value at the
// reference temperature. Bushings: a row with a capacitance pairs its
// nameplate_value with the capacitance, a row with only a power factor with
// the power factor; without a nameplate value the first test on record is
// the reference (ferrum's own choice, named in the result).
// Insulation power factor: PF20 = PF·K with K interpolated (linearly, never
// extrapolated) from ElectricalOptions::pf_correction, the site's table;
// ferrum ships no verified IEEE C57.152 table, so without one only tests at
// 20 °C ± 0.5 °C are judged.
//
// Pure: no I/O, no clock.
#pragma once

#include <string>
#include <utility>
#include <vector>

#include "analytics/assessment.h"
#include "analytics/unit_data.h"

namespace ferrum::analytics {

struct ElectricalOptions {
  double reference_c = 75;  // winding-resistance reference temperature, °C
  // (test temperature °C, K) with PF20 = PF·K, increasing temperatures.
  std::vector<std::pair<double, double>> pf_correction;
};

// K at a temperature from the table; nullopt outside its range or when empty.
std::optional<double> pf_correction_factor(const std::vector<std::pair<double, double>>& table, double temp_c);

// The checks of every test of the unit (nullopt when it has none).
std::optional<ElectricalSummary> check_electrical_tests(const UnitData& data, const ElectricalOptions& options);

// A result of an item's latest test outside its limit: the action it calls
// for, and, for the decision (analytics/decision/decision.h), its kind in
// words. Kinds: "bushing" (a bushing's C1/C2 test calling for taking it out
// of service), "bushing_retest" (one to be confirmed first), "winding" (turns ratio,
// winding resistance, leakage reactance, excitation-current pattern: the
// active part), "insulation" (winding insulation power factor, insulation
// resistance poor or dangerous); empty for a result that asks only for a
// retest (insulation resistance "questionable"), which is no defect.
struct ElectricalDefect {
  std::string kind;
  std::string finding;  // short, for the decision's reason
  Action action;
};
std::vector<ElectricalDefect> electrical_defects(const ElectricalSummary& summary, Day as_of);

// Sets a.electrical from the data, appends its actions to a.actions, its
// methods to a.methods and its assumptions to a.assumptions.
void assess_electrical(const UnitData& data, const ElectricalOptions& options, UnitAssessment& a);

}  // namespace ferrum::analytics
