// Precondition shared by the fault-typing methods (IEC 60599 ratios, Duval
// Triangle 1, key gases): ratio and graphical methods classify a fault, they
// do not detect one, so they are applied only when at least one fault gas is
// above its typical concentration or the gases are rising.
//
// Source: IEC 60599 (2015/2022) clause on the application of ratios, and its
// Annex A typical (90 %) concentrations. Two sets are commonly reproduced;
// both are data in analytics/data/iec60599.csv with their provenance, the one
// in force is named there, and a site may set its own (ROOT/tables/). The
// lower end of each range is the default, so that a method is applied rather
// than withheld when in doubt.
// Inputs in µL/L (ppm).
#pragma once

#include <array>
#include <string>

#include "analytics/unit_data.h"

namespace ferrum::analytics {

// One set of typical concentrations (ppm), gases in kAllGases order.
struct TypicalGasSet {
  std::string id;     // table id in iec60599.csv, e.g. "typical_values_b"
  std::string label;  // its clause and edition, for sources
  std::array<double, 7> low{}, high{};
};

// The set in force (iec60599.csv "typical_values_in_force").
const TypicalGasSet& typical_gas_set_in_force();

struct TypicalGasLevels {
  // Lower end of the 90 % range of the set in force.
  double h2 = typical_gas_set_in_force().low[0];
  double ch4 = typical_gas_set_in_force().low[1];
  double c2h6 = typical_gas_set_in_force().low[2];
  double c2h4 = typical_gas_set_in_force().low[3];
  double c2h2 = typical_gas_set_in_force().low[4];
  std::string source = "IEC 60599 typical concentrations, lower end of " + typical_gas_set_in_force().label;
};

struct FaultEvidence {
  bool present = false;
  std::string reason;  // which gas is above typical, "gases rising", or why not
};

// `rising`: the caller's finding that fault gases increase significantly
// (e.g. a rate check). Gases below the detection limit or not analysed never
// count as above typical.
FaultEvidence dga_fault_evidence(const OilSample& sample, const TypicalGasLevels& typical,
                                 bool rising);

// True when any fault gas (H2, CH4, C2H6, C2H4, C2H2) rose from `earlier` to
// `later` by more than `pct_per_month` of its earlier value per 30 days
// (IEC 60599 speaks of an increase of about 10 %/month as significant; from
// memory). A gas absent before and measured now counts as rising. Samples
// less than one day apart never show a rise.
bool fault_gases_rising(const OilSample& earlier, const OilSample& later, double pct_per_month = 10.0);

}  // namespace ferrum::analytics
