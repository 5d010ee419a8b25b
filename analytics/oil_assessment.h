// Oil-based diagnostics of one unit, assembled into the assessment document:
// dissolved-gas analysis (IEEE C57.104-2008 conditions and Table 3 procedure,
// IEEE C57.104-2019 status, IEC 60599 ratios, Duval Triangle 1, key gases,
// CO2/CO, least-squares gas rates), oil quality (IEEE C57.106 limits and
// classes), moisture (solubility, relative saturation, Fessler paper water)
// and paper ageing (DP from 2-FAL). Each method lives in its own file; this
// one only chooses the samples, applies the methods, and writes findings,
// assumptions, missing data and actions.
//
// Samples: only main-tank samples (sample_point empty or "main_tank") dated
// on or before as_of are used. The unit's age for the 2019 tables is
// as_of year − year_built.
#pragma once

#include <optional>

#include "analytics/assessment.h"
#include "analytics/calendar.h"
#include "analytics/dga_c57104_2008.h"
#include "analytics/dga_c57104_2019.h"
#include "analytics/dga_co2_co_ratio.h"
#include "analytics/dga_fault_evidence.h"
#include "analytics/gas_trend.h"
#include "analytics/key_gas.h"
#include "analytics/moisture_oil_paper.h"
#include "analytics/paper_furan_dp.h"
#include "analytics/unit_data.h"

namespace ferrum::analytics {

struct OilOptions {
  // IEEE C57.104-2019 tables; nullopt = the embedded default
  // (analytics/data/ieee_c57104_2019.csv, or the site's copy in force).
  std::optional<C57104_2019Tables> c57104_2019_tables;
  GasTrendOptions trend;              // recent samples for rates: 3-6 over 4-24 months
  TypicalGasLevels typical;           // precondition of ratio / triangle / key-gas methods
  C57104_2008Table3Options table3;    // EHV threshold for the 6-monthly interval
  MoistureOptions moisture;           // solubility constants, cold-sample threshold (40 °C)
  KeyGasOptions key_gas;
  Co2CoOptions co2_co;                // upper band 10 (IEC) by default; 11 = Reclamation
  PaperDpOptions paper;               // DP new 1000, end of life 200
  double rising_pct_per_month = 10.0; // IEC 60599 significant increase (from memory)
  int duval_history_samples = 5;      // points kept for the triangle plot
  int recondition_due_days = 180;     // Class II oil: recondition within
  int reclaim_due_days = 180;         // Class III oil: reclaim within
  int acetylene_investigate_days = 7; // active arcing: investigate within
  // ferrum's defaults (common practice, no published source), counted from the sample:
  int fault_gas_followup_days = 30;   // a fault gas above the TDCG condition: investigate within
  int status3_investigate_days = 30;  // C57.104-2019 Status 3 from a fault gas: investigate within
  int paper_followup_days = 180;      // CO/CO2 above the TDCG condition: furans within
  int non_mineral_resample_days = 365;  // ester and other fluids: no Table 3, resample within
};

// Fills out.dga, out.oil, out.paper, out.gas_history, out.active_arcing; appends to out.methods
// (one line per method: "name — source"), out.methods_not_applied (mineral-oil methods on an
// ester-filled unit), out.assumptions, out.missing (e.g. "oil sample", "furan test") and
// out.actions (priority 1 most urgent). DGA actions are dated from the latest gas sample:
// the Table 3 interval keyed on TDCG and its rate, and each single gas above the TDCG
// condition with its own follow-up (acetylene: arcing, or first a communicating OLTC's
// leak; CO/CO2: paper ageing).
void assess_oil(const UnitData& data, Day as_of, const OilOptions& options, UnitAssessment& out);

// One sample interpreted alone (for the `ferrum dga` command): fills out.dga only, history = this sample.
DgaSummary interpret_dga_sample(const OilSample& sample, const UnitInfo& unit, Day as_of, const OilOptions& options);

}  // namespace ferrum::analytics
