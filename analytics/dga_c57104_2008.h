// IEEE C57.104-2008, "IEEE Guide for the Interpretation of Gases Generated in
// Oil-Immersed Transformers":
//   * Table 1: dissolved-gas concentration limits for the four conditions,
//     per gas and for TDCG (checked against a public reproduction of the
//     table).
//   * The unit's condition is the highest level reached by any individual gas
//     or by TDCG (from memory of the guide's text).
//   * Fault condition (ferrum's reading of the guide, not a term of it): the
//     highest of TDCG and the individual fault gases, CO and CO2 left out.
//     CO and CO2 mark the ageing of paper, which is followed up with furans;
//     alone they do not show a fault that sampling or an outage would find.
//     Decisions and caps read this, the report shows both.
//   * Table 3: sampling interval and operating procedure from the TDCG
//     condition and the TDCG rate (ppm/day) (from memory; the procedure cells span the
//     ">30" and "10-30 ppm/day" rows, checked against a public reproduction).
//
// Inputs: gases in µL/L (ppm); rate in ppm/day = (S_T − S_O)/days between the
// last two samples. Validity: mineral-oil transformers (not OLTC
// compartments); the guide's limits are for units without a specific gassing
// history, so a trend matters more than any single value.
#pragma once

#include <array>
#include <optional>
#include <string>
#include <vector>

#include "analytics/dga_gases.h"
#include "analytics/unit_data.h"

namespace ferrum::analytics {

inline constexpr const char* kC57104_2008Source = "IEEE C57.104-2008";

// Tables 1 and 3 as data (analytics/data/ieee_c57104_2008.csv).
struct C57104_2008Tables {
  // Upper bounds (ppm) of Conditions 1, 2, 3 per gas (kAllGases order) and for TDCG.
  std::array<std::array<double, 3>, 7> gas_bounds{};
  std::array<double, 3> tdcg_bounds{};
  struct Table3Cell {
    std::string interval;  // "monthly", ...
    int days = 0;
    std::string procedure;
  };
  std::array<std::array<Table3Cell, 3>, 4> table3{};  // [condition - 1][rate >30, 10-30, <10]
};

// Condition (1..4) that a gas concentration reaches in Table 1. A value above
// the upper bound of a condition falls in the next (e.g. H2 100 → 1, 100.5 → 2).
int c57104_2008_gas_condition(Gas gas, double ppm);
// Condition (1..4) that a TDCG value reaches in Table 1.
int c57104_2008_tdcg_condition(double tdcg_ppm);

// TDCG of a sample: sum of the six combustible gases, gases below the
// detection limit counted as 0. nullopt when any of the six was not analysed.
std::optional<double> tdcg_ppm(const OilSample& sample);

struct C57104_2008Condition {
  bool applicable = false;
  std::string why_not;                           // when not applicable
  std::optional<double> tdcg_ppm;
  std::optional<int> tdcg_condition;             // 1..4
  std::array<std::optional<int>, 7> gas_condition{};  // indexed by gas_index()
  std::optional<int> condition;                  // highest of gases and TDCG
  std::string deciding;                          // what reached that condition
  std::optional<int> fault_condition;            // highest of TDCG and gases other than CO, CO2
  // Gases whose own condition is above the TDCG condition (all gases above
  // the Table 3 basis when TDCG is undefined), most severe first.
  struct GasAbove {
    Gas gas = Gas::h2;
    double ppm = 0;
    int condition = 0;
  };
  std::vector<GasAbove> gases_above_tdcg;
  std::string method = "Four-condition DGA classification (Table 1)";
  std::string source = "IEEE C57.104-2008 Table 1";
};

// Classifies one sample. Applicable when at least one gas was analysed; TDCG
// is only used when all six combustible gases were.
C57104_2008Condition classify_c57104_2008(const OilSample& sample);

// TDCG rate in ppm/day between two samples (earlier, later); nullopt when
// either TDCG is undefined or the samples are not at least one day apart.
std::optional<double> tdcg_rate_ppm_per_day(const OilSample& earlier, const OilSample& later);

struct C57104_2008Table3Options {
  // Condition 1 with rate < 10 ppm/day: the guide samples annually, but
  // 6-monthly for extra-high-voltage units. Units at or above this HV rating
  // (kV) are taken as EHV. Default 345 kV (lowest ANSI EHV class).
  double ehv_threshold_kv = 345.0;
};

struct C57104_2008Procedure {
  bool applicable = false;
  std::string why_not;
  int condition = 0;
  std::optional<double> rate_ppm_per_day;
  std::string rate_band;   // ">30", "10-30", "<10", or "unknown"
  std::string interval;    // "daily", "weekly", "monthly", "quarterly", "6-monthly", "annual"
  int interval_days = 0;   // 1, 7, 30, 91, 182, 365
  std::string action;      // the operating procedure, imperative
  std::string method = "TDCG sampling interval and operating procedure (Table 3)";
  std::string source = "IEEE C57.104-2008 Table 3";
};

// The condition Table 3 is read with: the TDCG condition (the guide keys
// Table 3 on TDCG and its rate); when TDCG is undefined (a combustible gas not
// analysed), the fault condition, and `basis` says so.
struct C57104_2008Table3Basis {
  std::optional<int> condition;
  std::string basis;  // "TDCG 615 ppm (Condition 1)", ...
};
C57104_2008Table3Basis c57104_2008_table3_basis(const C57104_2008Condition& c);

// Table 3 lookup. `condition` 1..4 (anything else: not applicable). A rate
// exactly 10 or 30 ppm/day falls in the 10-30 band. With no rate (single
// sample) the "<10" column is used and the result says the rate is unknown.
C57104_2008Procedure c57104_2008_table3(int condition, std::optional<double> rate_ppm_per_day,
                                        double hv_kv, const C57104_2008Table3Options& options = {});

}  // namespace ferrum::analytics
