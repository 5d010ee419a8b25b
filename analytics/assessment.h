// The assessment document: everything ferrum concludes about one unit on one
// day. It is the single source that the JSON output (`ferrum assess --json`),
// the PDF reports and the fleet ranking read. Absent data is std::nullopt
// (null in JSON), never 0.
//
// Field names follow the JSON keys documented in the README.
#pragma once

#include <optional>
#include <string>
#include <vector>

#include "analytics/calendar.h"
#include "analytics/electrical/electrical_results.h"
#include "analytics/unit_data.h"

namespace ferrum::analytics {

// One factor of the health index.
struct FactorScore {
  std::string name;              // "dga", "oil_quality", "paper", "thermal", "infrared", "inspection", "age"
  std::optional<double> score;   // 0..4 factor rating (4 = best), null when no data
  double weight = 0;             // weight K_j (0 when left out for missing data)
  double contribution = 0;       // points of the 0..100 index this factor contributes
  std::string source;            // published method behind the scoring
  std::string detail;            // one line: what drove the score
};

struct LifeEstimate {
  std::string basis;  // "paper", "thermal", "age", "condition"
  std::optional<double> years, low_years, high_years;
  std::string method;  // how it was obtained
  std::string range;   // how low_years/high_years were made
};

struct RemainingLife {
  std::optional<double> years;
  std::optional<double> low_years;
  std::optional<double> high_years;
  std::string limiting_factor;          // "paper", "thermal", "age", "condition", or "" when unknown
  std::vector<LifeEstimate> estimates;  // every estimate, the limiting one included
  std::string range_method;             // how low_years/high_years were made, in words
  bool beyond_horizon = false;          // years reached the horizon: "more than horizon_years"
  double horizon_years = 40;            // [ranking] life_horizon_years
};

// One gas reading of the latest sample, with per-gas trend.
struct GasReading {
  std::string gas;                       // "H2", "CH4", ...
  std::optional<double> ppm;             // null when not measured or below limit
  bool below_limit = false;
  std::optional<int> c57104_2008_condition;  // level reached by this gas (1..4)
  std::optional<double> rate_ppm_per_year;   // µL/L per year, least-squares over recent samples
};

struct DuvalPoint {
  Day date = 0;
  double pct_ch4 = 0, pct_c2h4 = 0, pct_c2h2 = 0;
  std::string zone;  // published zone code
};

struct DgaSummary {
  std::optional<Day> sample_date;
  std::optional<double> tdcg_ppm;
  std::optional<int> c57104_2008_condition;  // 1..4, the guide's: highest of single gases and TDCG
  std::optional<int> c57104_2008_tdcg_condition;   // 1..4, TDCG alone (Table 3 is keyed on it)
  // Highest of TDCG and the fault gases, CO and CO2 left out (they mark paper
  // ageing): what decisions, caps and alerts read.
  std::optional<int> c57104_2008_fault_condition;
  std::string c57104_2008_table3_basis;            // "TDCG 615 ppm (Condition 1)"
  // Single gases whose condition is above TDCG's, most severe first, each with
  // its own follow-up: "CO2 4200 ppm (Condition 3): paper ageing, ...".
  std::vector<std::string> c57104_2008_single_gases;
  std::optional<int> c57104_2019_status;     // 1..3
  // The status from the fault gases alone (CO and CO2 left out, as for the
  // 2008 fault condition): what decisions and caps read.
  std::optional<int> c57104_2019_fault_status;
  std::optional<std::string> duval_triangle_1;     // "PD","T1","T2","T3","D1","D2","DT"
  std::optional<std::string> duval_pentagon_1;
  std::optional<std::string> iec60599_ratio_fault; // "PD","D1","D2","T1","T2","T3"
  std::optional<double> co2_co_ratio;
  std::optional<double> tdcg_rate_ppm_per_day;     // µL/L per day, last two samples (Table 3's unit)
  std::string c57104_2008_interval;   // sampling interval from the standard's procedure
  std::optional<int> c57104_2008_interval_days;  // the same, in days
  std::string c57104_2008_action;     // operating procedure from the standard
  std::string c57104_2019_reason;     // which gas/rate decided the status
  std::string key_gas;                // key-gas reading, plain words
  bool key_gas_indicative_only = false;  // disagrees with Duval Triangle 1 / IEC 60599 ratios
  std::string co2_co_reading;         // plain words
  std::string iec60599_reading;       // fault name, or why no diagnosis
  std::string duval_reading;          // fault name, or why no diagnosis
  bool active_arcing = false;         // acetylene appearing or rising / D1-D2 signature
  // Acetylene in the latest sample: "appeared" (first detection), "rising"
  // (detected before, higher than the previous sample), "present" (detected
  // before, not higher), "" (not detected).
  std::string acetylene_trend;
  std::optional<Day> acetylene_first_detected;  // first main-tank sample with C2H2 detected
  std::vector<GasReading> gases;
  std::vector<DuvalPoint> duval_history;  // recent samples, for the triangle plot
};

struct OilCheck {
  std::string test;                 // "moisture", "breakdown", "acidity", "ift", "pf25", "pf100", "color"
  std::optional<double> value;
  std::optional<double> limit;
  std::string limit_kind;           // "max" or "min"
  std::string unit;                 // "mg/kg", "kV", ...
  std::optional<bool> within_limit;
  std::string source;               // e.g. "IEEE C57.106-2015 Table 5, 69-230 kV"
};

struct OilSummary {
  std::optional<Day> sample_date;
  std::vector<OilCheck> checks;
  std::optional<double> relative_saturation_pct;
  std::optional<double> water_solubility_ppm;   // at the sampling temperature
  std::optional<double> paper_moisture_pct;
  std::string moisture_method;
  std::string oil_class;                          // C57.106 clause 7 class reading
  std::vector<std::string> notes;                 // warnings: cold sample, missing temperature, ...
};

struct PaperSummary {
  std::optional<Day> sample_date;
  std::optional<double> furan_2fal_ppb;
  // 2-FAL reported below detection ("ND", "<x"): the paper is in good
  // condition; scored as such, not as missing. The stated limit, if any.
  bool furan_below_detection = false;
  std::optional<double> furan_detection_limit_ppb;
  std::optional<double> dp_estimate;
  std::string dp_method;
  std::optional<double> dp_alternative;   // second correlation, for comparison
  std::string dp_alternative_method;
  std::optional<double> life_used_pct;
  // DP fall per year fitted (least squares, Chendong DP) over the furan
  // samples since the last oil treatment; null with fewer than 3 samples over
  // less than 2 years. Feeds the range of the paper life estimate.
  std::optional<double> dp_fall_per_year_history;
  int dp_history_samples = 0;
  bool trustworthy = true;
  std::string note;
};

// A point of the chart series, already reduced for plotting.
struct SeriesPoint {
  Timestamp t = 0;
  double value = 0;
};

struct ThermalSummary {
  std::optional<Timestamp> from, to;
  std::string method;                          // "IEC 60076-7 difference equations" / "IEEE C57.91 clause 7"
  std::optional<double> peak_hot_spot_c;
  std::optional<double> peak_top_oil_c;
  std::optional<double> equivalent_ageing_factor;  // F_EQA (IEEE) or mean V (IEC)
  std::optional<double> loss_of_life_hours;
  std::optional<double> loss_of_life_pct;
  std::optional<double> hours_above_nameplate;
  std::optional<double> peak_load_pu, p99_load_pu;
  std::optional<double> hours_above_normal_cyclic;     // hot spot above the normal cyclic limit
  std::optional<double> hours_above_long_emergency;
  std::optional<double> hours_above_short_emergency;
  std::optional<double> load_growth_pct_per_year;
  std::optional<double> top_oil_discrepancy_k;      // measured minus model, mean, when measured data exist
  // Measured top oil above the model by more than [analysis]
  // measured_top_oil_above_k: hot spot and ageing are taken from the measured
  // top oil plus the model's hot-spot gradient (IEC 60076-7:2018 §8.2.3
  // allows measured top oil as input) at the points that carry one.
  bool hot_spot_from_measured_top_oil = false;
  std::size_t measured_top_oil_points = 0;   // points whose hot spot came from the measurement
  double measured_top_oil_above_k = 5;       // the threshold in force
  // Long-time emergency capability, p.u.: the steady load at which the hot
  // spot reaches long_emergency_limit_c at the ambient of the peak-load point
  // (IEC 60076-7 steady-state equations; measured top-oil offset included when
  // hot_spot_from_measured_top_oil). Read by the site view (N-1).
  std::optional<double> emergency_load_pu;
  std::optional<double> emergency_ambient_c;
  double covered_hours = 0;
  double bridged_hours = 0;
  bool ambient_from_profile = false;
  std::vector<std::string> parameter_sources;   // "x = 0.8 (IEC 60076-7 Table 5, ONAF)", ...
  std::vector<std::string> notes;
  double normal_cyclic_limit_c = 120, long_emergency_limit_c = 140, short_emergency_limit_c = 160;
  std::vector<SeriesPoint> load_series;      // per unit, reduced (e.g. daily max)
  std::vector<SeriesPoint> hot_spot_series;  // °C, reduced (e.g. daily max)
};

struct InfraredFinding {
  Day date = 0;
  std::string component;
  std::optional<double> rise_over_reference_k;
  std::optional<double> rise_over_ambient_k;
  std::optional<double> corrected_rise_k;   // corrected to rated load
  std::optional<int> severity;              // 1 least .. 4 most severe
  std::string severity_text;
  bool low_load = false;                    // scan below the reliable load, correction unreliable
  std::string source;
  std::optional<double> load_pct;           // load at survey time, % of rated, as recorded
  std::string image_ref;                    // thermogram reference, as recorded ("" when none)
  std::string note;                         // the thermographer's note, as recorded
};

struct InspectionFinding {
  std::string item;
  Rating rating = Rating::good;
  Day date = 0;
  std::optional<Rating> previous;
  bool worse = false;
  std::string note;
};

// One recommended action. The due date is counted from the date the evidence
// was found (the sample, survey, inspection or test), not from the report
// date, so it holds from week to week and falls overdue (issue #16).
struct Action {
  int priority = 3;     // 1 = most urgent
  Day due = 0;
  std::string text;
  std::string reason;
  Day found = 0;        // date of the evidence the due date counts from (0: not dated)
  std::string source;   // kSource* below: what the evidence is
  std::string need;     // stable key of the need ("oil-resample", "outage", ...): one need is one action
  std::string reference;  // stable action reference "<unit id>/<need>" (action_reference), set by finalize_actions
  bool outage = false;  // the work needs the unit out of service
  std::string crew;     // kCrew* below
  bool overdue = false;  // due < as_of and not booked; set by finalize_actions
  // Planners' work status (the work-status drop kind), set by finalize_actions:
  // "" (open), "booked" (work_date = booking date); done actions leave the list
  // until newer evidence (found > done date) raises them again.
  std::string status;
  Day work_date = 0;
  std::string work_note;
};

// Action::source values.
inline constexpr const char* kSourceOilSample = "oil sample";
inline constexpr const char* kSourceInfrared = "infrared survey";
inline constexpr const char* kSourceInspection = "inspection";
inline constexpr const char* kSourceElectrical = "electrical test";
inline constexpr const char* kSourceLoad = "load record";
inline constexpr const char* kSourceRegister = "register";       // age, decision on the whole unit
inline constexpr const char* kSourceDataAge = "data on record";  // missing or stale data
// Action::crew values.
inline constexpr const char* kCrewOilSampling = "oil sampling";
inline constexpr const char* kCrewThermography = "thermography";
inline constexpr const char* kCrewMaintenance = "maintenance";
inline constexpr const char* kCrewProtection = "protection";
inline constexpr const char* kCrewCivil = "civil";
inline constexpr const char* kCrewEngineering = "engineering";  // studies, procurement, decisions: no field crew

// "<unit id>/<need>": the reference planners quote in a work-status file.
inline std::string action_reference(const std::string& unit_id, const std::string& need) {
  return unit_id + "/" + need;
}

// One piece of evidence behind a decision, in words. End-of-life kinds:
// "paper", "thermal", "age", "chronic"; correctable-defect kinds: "gassing",
// "hot_joint", "oil", "unsafe_item", "cooling", "bushing", "fitting",
// "winding_test", "insulation_test" (electrical field tests).
struct Evidence {
  std::string kind;
  std::string text;
};

// The recommended action of one unit (analytics/decision/decision.h).
struct Decision {
  std::string action;             // "replace", "refurbish", "repair", "investigate", "monitor", "routine"
  std::optional<int> year;        // year the action is due (a replacement: in service by)
  std::string reason;             // in words, for a manager
  std::string treatment;          // refurbishment scope ("dry out the active part", ...), else ""
  // The refurbishment dries out the active part (the paper), which slows its
  // ageing; an oil treatment alone (drying or reclaiming the oil) restores the
  // oil, not the paper, and the ten-year plan gives it no years (plan.h).
  bool treats_paper = false;
  std::string index_note;         // capped and uncapped index in words, when they differ
  std::vector<Evidence> end_of_life;
  std::vector<Evidence> defects;
  std::optional<Action> first_action;  // the unit's most urgent action
};

// Where the fleet's budget-constrained plan (analytics/plan) puts a unit's
// replace or refurbish action, as the ranking and the reports show it beside
// the decision's year (analytics::apply_plan). The plan may fund an
// action later than the decision's year when the yearly budget does not
// reach it sooner.
struct PlanSchedule {
  enum class State {
    none,      // no budget plan is configured, or the action is not one the plan funds
    not_known, // a plan is configured but was not computed for this output
    on_time,   // the plan funds the action in the first year it could
    later,     // the plan funds it in `year`, later than the decision's year
    unfunded,  // the plan does not fund it by `last_year`, its last year
  };
  State state = State::none;
  std::optional<int> year;
  int last_year = 0;
};

struct DataFreshness {
  std::string kind;                  // "oil", "infrared", "inspection", "load"
  std::optional<Day> latest;
  std::optional<double> age_years;
};

// A table of a standard behind the assessment, with its audit status
// (analytics/standard_tables.h).
struct TableNote {
  std::string title;   // standard, edition, table or clause
  std::string status;  // "unverified", "checked against a public reproduction (...)", ...
  std::string origin;  // "embedded" or the site's copy, e.g. "tables/iec60599.csv"
  bool unverified = false;
};

struct UnitAssessment {
  UnitInfo unit;
  Day as_of = 0;
  std::optional<double> health_index;  // 0..100
  // The index without the caps of correctable findings (an unsafe inspection
  // item, a hot connection): the unit's condition once they are repaired.
  // Replacement and refurbishment advice reads this; risk reads health_index.
  std::optional<double> condition_index;
  std::string band;                    // plain band name
  std::string band_expected_life;      // expected-life range of the band
  std::string confidence;              // "4 of 7 factors, last oil sample 3 years old"
  std::vector<FactorScore> factors;
  RemainingLife remaining_life;
  DgaSummary dga;
  OilSummary oil;
  PaperSummary paper;
  ThermalSummary thermal;
  std::vector<InfraredFinding> infrared;
  std::vector<InspectionFinding> inspection;
  std::optional<ElectricalSummary> electrical;  // null when the unit has no electrical tests
  std::vector<Action> actions;
  // Planners' work-status rows of the unit (UnitData::work_status), and the
  // actions they closed (done or cancelled; analytics/work_status.h).
  std::vector<WorkStatus> work_status;
  std::vector<Action> closed_actions;
  Decision decision;
  std::vector<std::string> missing;
  std::vector<DataFreshness> freshness;
  std::vector<std::string> methods;      // every method applied, with its source
  // Methods not applied to this unit and why ("IEEE C57.104-2008 Table 1: ...
  // valid for mineral oil only; the unit is filled with ester").
  std::vector<std::string> methods_not_applied;
  std::vector<std::string> assumptions;  // defaulted parameters, missing ambient, ...
  std::vector<TableNote> tables;         // the standard tables in force, with their status
  // Gas history for the trend chart: one entry per sample.
  struct GasHistoryPoint {
    Day date = 0;
    std::optional<double> h2, ch4, c2h6, c2h4, c2h2, co, co2;
  };
  std::vector<GasHistoryPoint> gas_history;
  bool unsafe_inspection = false;
  bool active_arcing = false;
  // One line on the unit's site: load against capacity and N-1
  // (analytics/site_view.h, apply_site_view); empty when not computed.
  std::string site_summary;
  // Rejected files holding newer results than the store (analytics/held_back.h).
  std::vector<HeldBack> held_back;
  // The fleet's budget plan for the decision's action (set by the caller that
  // made the plan; State::none when none).
  PlanSchedule budget_plan;
};

// One row of the fleet ranking.
struct RankedUnit {
  int rank = 0;                  // 1 = highest risk; equal risks share a rank
  bool tied = false;
  std::string unit_id, site;
  double rated_mva = 0;
  std::optional<double> health_index;
  std::string band;
  std::optional<double> remaining_life_years;
  bool beyond_horizon = false;   // remaining life more than horizon_years
  double horizon_years = 40;
  std::string limiting_factor;
  std::optional<double> probability_of_failure;  // per year, from the documented mapping
  std::optional<double> failures_per_1000_unit_years;  // probability_of_failure x 1000
  double consequence = 0;
  std::optional<double> risk;
  std::string recommended_action;  // Decision::action
  std::optional<int> action_year;
  std::string action_reason;       // Decision::reason
  bool treats_paper = false;       // Decision::treats_paper
  std::optional<Action> first_action;  // the unit's most urgent action
  PlanSchedule budget_plan;        // the fleet's budget plan for that action (analytics::apply_plan)
  bool insufficient_data = false;
  std::string note;
};

struct FleetRanking {
  Day as_of = 0;
  std::vector<RankedUnit> units;              // ranked first, then units without enough data
  struct YearMva { int year = 0; double mva = 0; int units = 0; };
  std::vector<YearMva> mva_due_by_year;       // next ten years
  // Every unit whose remaining life ends within the outlook (ten years),
  // soonest first, whatever its action this year.
  struct LifeEnd {
    std::string unit_id, site;
    double rated_mva = 0;
    double remaining_life_years = 0;
    int life_ends_year = 0;
    std::string limiting_factor, action;
    std::optional<int> action_year;
  };
  std::vector<LifeEnd> outlook;
  std::string risk_calibration;               // how risk is calibrated, in words
};

}  // namespace ferrum::analytics
