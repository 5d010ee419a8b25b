// Inputs of the assessment: everything the store knows about one unit,
// already validated and converted to the units named on each field.
// Built by the daemon from the database; analytics only read it.
#pragma once

#include <cmath>
#include <limits>
#include <memory>
#include <optional>
#include <string>
#include <vector>

#include "analytics/calendar.h"
#include "analytics/lab_value.h"

namespace ferrum::analytics {

enum class PaperType { kraft, upgraded };  // non-upgraded kraft / thermally upgraded
enum class OilType { mineral, ester };
// On-load tap changer as the register gives it: none, sealed (its own oil kept
// apart from the main tank), or communicating (its compartment can exchange
// oil with the main tank, so arcing gases of normal switching may reach it).
enum class OltcType { unknown, none, sealed, communicating };

// Nameplate and register data of one unit (units register file).
struct UnitInfo {
  std::string unit_id;
  std::string site;
  std::string serial;
  double rated_mva = 0;        // MVA
  double hv_kv = 0;            // kV, line-to-line
  double lv_kv = 0;            // kV, line-to-line
  std::string cooling;         // "ONAN", "ONAF", "OFAF", "ODAF", ... upper case
  int year_built = 0;
  int phases = 3;
  std::string vector_group;    // e.g. "Dyn11"
  OilType oil = OilType::mineral;
  PaperType paper = PaperType::kraft;
  std::optional<double> oil_volume_l;
  int criticality = 3;         // 1 lowest .. 5 highest
  std::optional<int> customers_served;
  // Thermal data from the test report, when known.
  std::optional<double> top_oil_rise_k;       // rated top-oil rise over ambient, K
  std::optional<double> hot_spot_gradient_k;  // rated hot-spot to top-oil gradient, K
  std::optional<double> load_loss_ratio;      // load losses at rated current / no-load losses
  // Last oil change or regeneration (resets furans), when recorded.
  std::optional<Day> oil_treated;
  // For the electrical field tests (all optional).
  std::string conductor;                 // winding conductor: "cu", "al", or "" (unknown)
  std::optional<int> tap_positions;      // HV tap changer: number of positions
  std::optional<int> tap_nominal;        // position giving the nameplate HV voltage
  std::optional<double> tap_step_pct;    // HV voltage change per position, % of U_HV
  OltcType oltc = OltcType::unknown;     // register column `oltc`
  std::optional<double> impedance_pct;   // nameplate short-circuit impedance, % on rating
  // The unit's own costs for the budgeted plan (analytics/plan), when given.
  std::optional<double> replacement_cost, refurbishment_cost;
};

// One oil-lab sample (main tank unless sample_point says otherwise).
struct OilSample {
  Day date = 0;
  std::string lab_ref;
  std::string sample_point;  // "main_tank", "oltc", ...
  // Dissolved gases, µL/L (ppm).
  LabValue h2, ch4, c2h6, c2h4, c2h2, co, co2, o2, n2;
  LabValue moisture_ppm;      // mg/kg
  LabValue oil_temp_c;        // oil temperature at sampling, °C
  LabValue breakdown_kv;      // kV
  std::string breakdown_method;  // e.g. "ASTM D1816 2 mm", "ASTM D877", "IEC 60156"
  LabValue acidity_mgkoh_g;   // mg KOH/g
  LabValue ift_mn_m;          // mN/m
  LabValue pf25_pct;          // power factor at 25 °C, %
  LabValue pf100_pct;         // power factor at 100 °C, %
  LabValue color;             // ASTM D1500 colour number
  LabValue furan_2fal_ppb;    // 2-furaldehyde, µg/L (ppb)
};

// One load-series point. Missing optional values are NaN (millions of
// points: no std::optional overhead).
struct LoadPoint {
  Timestamp t = 0;  // UTC seconds
  double load_pu = 0;  // per unit of rated power
  double ambient_c = std::numeric_limits<double>::quiet_NaN();
  double top_oil_c = std::numeric_limits<double>::quiet_NaN();  // measured
};

struct InfraredScan {
  Day date = 0;
  std::string component;
  double spot_c = 0;
  std::optional<double> reference_c;  // similar component under similar load
  std::optional<double> ambient_c;
  std::optional<double> load_pct;     // load at the time of the scan, % of rated
  std::optional<double> emissivity;
  std::string image_ref;
  std::string note;
};

enum class Rating { good = 1, fair = 2, poor = 3, very_poor = 4, unsafe = 5 };

struct InspectionRecord {
  Day date = 0;
  std::string item;   // from the documented vocabulary, e.g. "bushings"
  Rating rating = Rating::good;
  std::string note;
  std::string inspector;
};

// One electrical field test result (electrical tests file). Tap positions
// are numbered so that position 1 gives the highest HV voltage.
enum class ElectricalTestKind {
  turns_ratio,
  winding_resistance,
  insulation_power_factor,
  bushing_power_factor,
  insulation_resistance,
  excitation_current,
  leakage_reactance,
};

struct ElectricalTest {
  Day date = 0;
  ElectricalTestKind test = ElectricalTestKind::turns_ratio;
  std::string phase;                  // "A", "B", "C", or "" (three-phase / not given)
  std::optional<int> tap;
  std::string winding;                // "HV", "LV", "TV" (winding resistance)
  std::optional<double> temp_c;       // winding or insulation temperature, °C
  std::string insulation;             // "CH", "CL", "CHL"; bushings "C1", "C2"; "HV-LV", ...
  std::optional<double> test_kv;
  std::string bushing;                // "H1", "X2", ...
  std::optional<int> minutes;         // insulation resistance: 1 or 10
  // The test's value column: ratio, resistance_ohm, power_factor_pct,
  // resistance_megohm, current_ma or impedance_pct. A bushing row may have
  // only a capacitance (then this is empty).
  std::optional<double> value;
  std::optional<double> capacitance_pf;
  std::optional<double> nameplate_value;  // nameplate/factory value of the same quantity
  std::string note;
  std::string crew;
};

const char* to_string(ElectricalTestKind k);
// "turns_ratio", ... (snake_case); nullopt for other text.
std::optional<ElectricalTestKind> electrical_test_from(const std::string& name);

// Everything known about one unit; series sorted by time.
// One row of a planners' work-status file (issue #16): the state of one
// action, matched by its reference (Action::reference).
struct WorkStatus {
  std::string reference;  // "<unit id>/<need>"
  std::string status;     // "booked", "done", "cancelled"
  Day date = 0;           // booking date, completion date or cancellation date
  std::string note;
};

// A rejected file (quarantine) that named this unit: the newest date its rows
// of one kind carry (analytics/held_back.h).
struct HeldBack {
  std::string kind;         // "oil", "infrared", "inspection", "electrical", "load"
  Day newest = 0;           // newest date in the rejected file's rows for this unit
  std::string rejected_on;  // when the file was rejected, as the receipt says (UTC)
  std::string file;         // the file's name as dropped, PARTY/NAME
};

// An inspection record of another unit at the same site (analytics/site_earth_check.h).
struct SiteInspection {
  std::string unit_id;
  InspectionRecord record;
};

struct LoadHistory;  // load_history.h

struct UnitData {
  UnitInfo info;
  std::vector<OilSample> oil_samples;
  std::vector<LoadPoint> load;
  std::vector<InfraredScan> infrared;
  std::vector<InspectionRecord> inspections;
  std::vector<ElectricalTest> electrical;  // sorted by date
  std::vector<WorkStatus> work_status;     // sorted by date; the latest row per reference wins
  // The "grounding" inspections of the other units at this unit's site, by date
  // (site_earth_check.h: an earth stolen at one unit prompts a check of the others).
  std::vector<SiteInspection> site_inspections;
  std::vector<HeldBack> held_back;  // from rejected files, one per kind (the daemon's record)
  // The load series' days older than `load` that the retention summarised
  // ([store] keep_load_points_years); null when none were.
  std::shared_ptr<const LoadHistory> load_history;
};

const char* to_string(Rating r);
const char* to_string(PaperType p);
const char* to_string(OilType o);
const char* to_string(OltcType o);  // "" for unknown
OltcType oltc_type_from(const std::string& text);  // "none", "sealed", "communicating"; else unknown

}  // namespace ferrum::analytics
