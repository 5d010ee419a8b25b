// Hand-built assessment documents for the report tests: a realistic unit with
// every section filled, a unit with no data at all, and a small fleet
// ranking. Values are plausible for a 1984 132/33 kV ONAF unit; they are
// rendering input only (no method is checked against them here).
#pragma once

#include <cmath>
#include <optional>
#include <vector>

#include "analytics/action_plan.h"
#include "analytics/assessment.h"
#include "report/unit_report.h"

namespace ferrum::report::fixtures {

using namespace ferrum::analytics;

inline UnitAssessment filled_unit() {
  UnitAssessment a;
  a.unit.unit_id = "T-204";
  a.unit.site = "Kelder Road 132 kV";
  a.unit.serial = "84-11772";
  a.unit.rated_mva = 45;
  a.unit.hv_kv = 132;
  a.unit.lv_kv = 33;
  a.unit.cooling = "ONAF";
  a.unit.year_built = 1984;
  a.unit.vector_group = "YNd11";
  a.unit.paper = PaperType::kraft;
  a.unit.oil = OilType::mineral;
  a.as_of = days_from_civil(2026, 11, 30);
  a.health_index = 57.6;
  a.band = "fair";
  a.band_expected_life = "more than 10 years";
  a.confidence = "6 of 7 factors; last oil sample 48 days old";
  a.factors = {
      {"dga", 2.0, 10, 13.9, "IEEE C57.91 / Jahromi 2009 DGA factor", "DGAF 1.72 (C57.104 condition 2, C₂H₂ rising)"},
      {"oil_quality", 3.0, 6, 12.5, "Jahromi 2009 oil-quality factor", "water 19 mg/kg, breakdown 48 kV"},
      {"paper", 2.0, 5, 6.9, "Jahromi 2009 furan factor", "2-FAL 1 420 µg/L"},
      {"thermal", 3.0, 10, 20.8, "load history, IEC 60076-7", "F_EQA 0.41, 12 h above 120 °C"},
      {"infrared", 2.0, 8, 11.1, "NETA MTS ΔT criteria", "HV bushing B-phase connector, ΔT 18 K"},
      {"inspection", 3.0, 8, 16.7, "site inspection vocabulary", "radiator leak worse since last round"},
      {"age", std::nullopt, 0, 0, "", "age not scored separately (in paper factor)"},
  };
  a.remaining_life.years = 11.5;
  a.remaining_life.low_years = 7.0;
  a.remaining_life.high_years = 16.0;
  a.remaining_life.limiting_factor = "paper";
  a.remaining_life.estimates = {
      {"paper", 11.5, 7.0, 16.0, "DP 420 from 2-FAL (Chendong), ageing rate from loading history", ""},
      {"condition", 18.0, 12.0, 24.0, "exponential health-score model (CNAIM form)", ""},
      {"thermal", 40.0, std::nullopt, std::nullopt, "loss of life at present loading, IEC 60076-7", ""}};
  auto& d = a.dga;
  d.sample_date = days_from_civil(2026, 10, 13);
  d.tdcg_ppm = 1012;
  d.c57104_2008_condition = 2;
  d.c57104_2019_status = 2;
  d.duval_triangle_1 = "DT";
  d.duval_pentagon_1 = "D2";
  d.iec60599_ratio_fault = "D2";
  d.co2_co_ratio = 6.8;
  d.tdcg_rate_ppm_per_day = 1.9;
  d.c57104_2008_interval = "quarterly";
  d.c57104_2008_action = "exercise caution; analyse individual gases to find the cause; determine load dependence";
  d.c57104_2019_reason = "C₂H₂ rate above the 90th-percentile rate";
  d.key_gas = "acetylene with hydrogen: arcing suspected";
  d.co2_co_reading = "normal cellulose ageing";
  d.iec60599_reading = "discharges of high energy";
  d.duval_reading = "mixture of thermal and electrical faults";
  d.active_arcing = true;
  d.gases = {{"H2", 310, false, 2, 48.0},  {"CH4", 140, false, 2, 20.5}, {"C2H6", 62, false, 1, 3.1},
             {"C2H4", 118, false, 3, 22.0}, {"C2H2", 9.5, false, 3, 4.2}, {"CO", 372, false, 1, 15.0},
             {"CO2", 2530, false, 1, 110.0}};
  const int sample_months[][2] = {{2022, 3}, {2022, 10}, {2023, 4}, {2023, 11}, {2024, 5}, {2025, 2}, {2025, 9}, {2026, 4}, {2026, 10}};
  for (int i = 0; i < 9; ++i) {
    UnitAssessment::GasHistoryPoint p;
    p.date = days_from_civil(sample_months[i][0], sample_months[i][1], 13);
    p.h2 = 120 + 22.0 * i;
    p.ch4 = 70 + 8.0 * i;
    p.c2h6 = 45 + 2.0 * i;
    p.c2h4 = 40 + 9.5 * i;
    p.c2h2 = i < 3 ? std::optional<double>() : std::optional<double>(0.8 + 1.4 * (i - 3));
    p.co = 260 + 14.0 * i;
    p.co2 = 1900 + 80.0 * i;
    a.gas_history.push_back(p);
    if (p.c2h2) {
      const double s = *p.ch4 + *p.c2h4 + *p.c2h2;
      a.dga.duval_history.push_back({p.date, 100 * *p.ch4 / s, 100 * *p.c2h4 / s, 100 * *p.c2h2 / s, i < 5 ? "T2" : "DT"});
    }
  }
  a.oil.sample_date = days_from_civil(2026, 10, 13);
  a.oil.checks = {
      {"moisture", 19, 25, "max", "mg/kg", true, "IEEE C57.106-2015 Table 5, 69–230 kV"},
      {"breakdown", 48, 40, "min", "kV", true, "IEEE C57.106-2015 Table 5, ASTM D1816 2 mm"},
      {"acidity", 0.21, 0.20, "max", "mg KOH/g", false, "IEEE C57.106-2015 Table 5"},
      {"ift", 24, 25, "min", "mN/m", false, "IEEE C57.106-2015 Table 5"},
      {"pf25", 0.35, 0.5, "max", "%", true, "IEEE C57.106-2015 Table 5"},
      {"color", 3.5, std::nullopt, "max", "", std::nullopt, "no limit in the table; trend only"}};
  a.oil.relative_saturation_pct = 21.4;
  a.oil.water_solubility_ppm = 89;
  a.oil.paper_moisture_pct = 2.6;
  a.oil.moisture_method = "oil–paper equilibrium (Oommen curves), sample at 41 °C";
  a.oil.oil_class = "Class II: reconditioning recommended";
  a.oil.notes = {"Acidity and IFT both outside limits: sludge formation likely; consider reclamation."};
  a.paper.sample_date = days_from_civil(2026, 10, 13);
  a.paper.furan_2fal_ppb = 1420;
  a.paper.dp_estimate = 420;
  a.paper.dp_method = "Chendong (1991)";
  a.paper.dp_alternative = 465;
  a.paper.dp_alternative_method = "De Pablo";
  a.paper.life_used_pct = 68;
  auto& th = a.thermal;
  th.from = start_of(days_from_civil(2025, 12, 1));
  th.to = start_of(days_from_civil(2026, 11, 30));
  th.method = "IEC 60076-7:2018 difference equations";
  th.peak_hot_spot_c = 126.4;
  th.peak_top_oil_c = 88.1;
  th.equivalent_ageing_factor = 0.41;
  th.loss_of_life_hours = 3590;
  th.loss_of_life_pct = 2.39;
  th.hours_above_nameplate = 41;
  th.peak_load_pu = 1.18;
  th.p99_load_pu = 0.97;
  th.hours_above_normal_cyclic = 12;
  th.hours_above_long_emergency = 0;
  th.hours_above_short_emergency = 0;
  th.load_growth_pct_per_year = 1.8;
  th.top_oil_discrepancy_k = 2.4;
  th.covered_hours = 8712;
  th.bridged_hours = 36;
  th.parameter_sources = {"x = 0.8, y = 1.3 (IEC 60076-7 Table 5, ONAF)", "R = 6.0 (test report)", "H = 1.3 (IEC 60076-7 default)"};
  th.notes = {"Ambient from the site's weather file; 36 h of load gaps bridged by interpolation."};
  for (int dday = 0; dday < 365; ++dday) {
    const Timestamp t = start_of(days_from_civil(2025, 12, 1) + dday);
    const double season = std::cos(2 * 3.14159265 * dday / 365.0);  // winter peak
    const double load = 0.78 + 0.18 * season + 0.05 * std::sin(dday / 6.0);
    th.load_series.push_back({t, load});
    th.hot_spot_series.push_back({t, 62 + 48 * load * load + 4 * std::sin(dday / 6.0) - 6 * season});
  }
  a.infrared = {
      {days_from_civil(2026, 7, 2), "HV bushing B-phase connector", 18.0, 31.0, 34.5, 3, "probable deficiency; repair as time permits", false, "NETA MTS Table 100.18",
       80.0, "IR-0103", "connector discoloured"},
      {days_from_civil(2026, 7, 2), "Cooling fan motor 2", 2.5, 9.0, std::nullopt, 1, "possible deficiency", true, "NETA MTS Table 100.18",
       std::nullopt, "", ""}};
  a.inspection = {
      {"radiators", Rating::poor, days_from_civil(2026, 9, 21), Rating::fair, true, "Weeping at the lower header flange of radiator 3; oil on the plinth."},
      {"bushings", Rating::fair, days_from_civil(2026, 9, 21), Rating::fair, false, "Porcelain clean; oil level visible."},
      {"breather", Rating::good, days_from_civil(2026, 9, 21), Rating::poor, false, "Silica gel replaced."}};
  // Dated on their evidence (issue #16); the radiator job is overdue.
  const Day oil_sample = days_from_civil(2026, 10, 13), survey = days_from_civil(2026, 7, 2),
            inspected = days_from_civil(2026, 9, 21);
  auto planned = [&](Action x) {
    x.reference = action_reference(a.unit.unit_id, x.need);
    x.overdue = x.due < a.as_of;
    return x;
  };
  a.actions = {
      planned(dated_action(1, oil_sample, days_from_civil(2026, 12, 15) - oil_sample, "Resample oil for DGA within two weeks and confirm the acetylene trend before any switching of this unit.", "C₂H₂ rising across four samples; IEEE C57.104-2019 status 2", kSourceOilSample, "oil-resample", kCrewOilSampling)),
      planned(dated_action(2, survey, days_from_civil(2027, 1, 31) - survey, "Repair the connector of the HV bushing B-phase during the next outage.", "Infrared ΔT 18 K to reference (NETA priority 2)", kSourceInfrared, "ir-repair:HV bushing B-phase connector", kCrewMaintenance, true)),
      planned(dated_action(3, oil_sample, days_from_civil(2027, 6, 30) - oil_sample, "Plan oil reclamation: acidity and interfacial tension are outside their limits, which points to sludge forming in the windings and cooling ducts.", "IEEE C57.106-2015 Table 5", kSourceOilSample, "oil-reclaim", kCrewMaintenance)),
      planned(dated_action(3, inspected, 60, "Repair the radiator 3 header gasket.", "Inspection: radiators worse", kSourceInspection, "inspection:radiators", kCrewMaintenance, true))};
  a.missing = {"turns-ratio and winding-resistance tests (no field test file)"};
  a.freshness = {{"oil", days_from_civil(2026, 10, 13), 0.13}, {"infrared", days_from_civil(2026, 7, 2), 0.41},
                 {"inspection", days_from_civil(2026, 9, 21), 0.19}, {"load", days_from_civil(2026, 11, 29), 0.0}};
  a.methods = {"IEEE C57.104-2008, Table 1 (TDCG conditions)", "IEEE C57.104-2019, Tables 1–4",
               "Duval Triangle 1 (Akbari et al., Table II)", "IEC 60599:2015 ratios", "IEEE C57.106-2015, Table 5",
               "Chendong 2-FAL to DP correlation", "IEC 60076-7:2018 thermal model", "Jahromi et al. (2009) health index"};
  a.assumptions = {"Hot-spot factor H = 1.3 (IEC 60076-7 default, no test data).",
                   "Oil sample temperature taken from the lab sheet."};
  a.unsafe_inspection = false;
  a.active_arcing = true;
  return a;
}

// The same unit half a year earlier, for the "what changed" block.
inline UnitAssessment previous_of_filled() {
  UnitAssessment p = filled_unit();
  p.as_of = days_from_civil(2026, 5, 31);
  p.health_index = 63.2;
  p.dga.duval_triangle_1 = "T2";
  p.dga.c57104_2008_condition = 1;
  p.active_arcing = false;
  p.freshness[0].latest = days_from_civil(2026, 4, 13);
  p.infrared.clear();
  p.actions.pop_back();
  p.inspection[0].rating = Rating::fair;
  p.remaining_life.years = 12.8;
  return p;
}

// A unit registered yesterday: nothing but its nameplate.
inline UnitAssessment empty_unit() {
  UnitAssessment a;
  a.unit.unit_id = "T-990";
  a.unit.site = "Marsh Lane";
  a.as_of = days_from_civil(2026, 11, 30);
  a.missing = {"oil-lab results (no sample on record)", "load data", "infrared survey", "inspection",
               "nameplate rating and voltages"};
  a.freshness = {{"oil", std::nullopt, std::nullopt}, {"infrared", std::nullopt, std::nullopt},
                 {"inspection", std::nullopt, std::nullopt}, {"load", std::nullopt, std::nullopt}};
  return a;
}

inline std::vector<SourceFile> source_files() {
  return {{"Northline Oil Laboratory", "northline_dga_2026-10-20_batch0412.csv", "oil-lab", "2026-10-21 07:02 UTC", 318},
          {"Thermoscan Services", "ir_survey_2026-07_kelder.csv", "infrared", "2026-07-09 13:45 UTC", 42},
          {"Operations", "load_T-204_2025-12_2026-11.csv", "load", "2026-11-30 00:10 UTC", 35040}};
}

// One ranking row from its printed fields (named, so that new fields of
// RankedUnit keep their defaults).
inline RankedUnit ranked_row(int rank, bool tied, std::string id, std::string site, double mva, std::optional<double> hi,
                             std::string band, std::optional<double> life, std::string limit, std::optional<double> pof,
                             double consequence, std::optional<double> risk, std::string action,
                             std::optional<int> year, bool insufficient, std::string note) {
  RankedUnit u;
  u.rank = rank;
  u.tied = tied;
  u.unit_id = std::move(id);
  u.site = std::move(site);
  u.rated_mva = mva;
  u.health_index = hi;
  u.band = std::move(band);
  u.remaining_life_years = life;
  u.limiting_factor = std::move(limit);
  u.probability_of_failure = pof;
  if (pof) u.failures_per_1000_unit_years = *pof * 1000;
  u.consequence = consequence;
  u.risk = risk;
  u.recommended_action = std::move(action);
  u.action_year = year;
  u.insufficient_data = insufficient;
  u.note = std::move(note);
  return u;
}

inline FleetRanking small_ranking() {
  FleetRanking r;
  r.as_of = days_from_civil(2026, 11, 30);
  r.units = {
      ranked_row(1, false, "T-204", "Kelder Road 132 kV", 45, 57.6, "fair", 11.5, "paper", 0.021, 4, 0.084, "refurbish", 2028, false, ""),
      ranked_row(2, false, "T-117", "Northgate", 30, 34.0, "poor", 6.0, "thermal", 0.035, 2, 0.070, "replace", 2030, false, ""),
      ranked_row(3, false, "T-031", "Harbour West", 60, 81.0, "good", 24.0, "thermal", 0.006, 5, 0.030, "routine", std::nullopt, false, ""),
      ranked_row(4, true, "T-032", "Harbour West", 60, 88.0, "very good", 30.0, "condition", 0.003, 5, 0.015, "routine", std::nullopt, false, ""),
      ranked_row(5, true, "T-033", "Harbour East", 20, 86.0, "very good", 28.0, "condition", 0.003, 5, 0.015, "routine", std::nullopt, false, ""),
      ranked_row(0, false, "T-990", "Marsh Lane", 0, std::nullopt, "", std::nullopt, "", std::nullopt, 3, std::nullopt, "", std::nullopt, true,
                 "no oil, load or inspection data")};
  r.units[0].first_action = dated_action(1, days_from_civil(2026, 11, 23), 14,
                                         "Make safe or take out of service: grounding", "unsafe", kSourceInspection,
                                         "inspection:grounding", kCrewMaintenance);
  r.units[0].first_action->reference = action_reference("T-204", "inspection:grounding");
  r.units[2].beyond_horizon = true;
  r.units[2].remaining_life_years = 40;
  r.outlook.push_back({"T-117", "Northgate", 30, 6.0, 2032, "thermal", "replace", 2030});
  r.risk_calibration = "ferrum's own defaults";
  for (int y = 2027; y <= 2036; ++y) {
    FleetRanking::YearMva m{y, 0, 0};
    if (y == 2028) m = {y, 45, 1};
    if (y == 2030) m = {y, 30, 1};
    if (y == 2035) m = {y, 80, 2};
    r.mva_due_by_year.push_back(m);
  }
  return r;
}

}  // namespace ferrum::report::fixtures
