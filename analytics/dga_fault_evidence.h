// Precondition shared by the fault-typing methods (IEC 60599 ratios, Duval
// Triangle 1, key gases): ratio and graphical methods classify a fault, they
// do not detect one, so they are applied only when at least one fault gas is
// above its typical concentration or the gases are rising.
//
// Source: IEC 60599 (2015/2022) clause on the application of ratios, and its
// Annex A typical (90 %) concentrations for power transformers without a
// communicating OLTC (IEC 60599:2007 Annex A; values from memory, low
// confidence). The lower end of each published range is
// the default, so that a method is applied rather than withheld when in doubt.
// Inputs in µL/L (ppm).
#pragma once

#include <string>

#include "analytics/unit_data.h"

namespace ferrum::analytics {

struct TypicalGasLevels {
  // IEC 60599:2007 Annex A, no OLTC, lower end of the 90 % range (from memory).
  double h2 = 60;
  double ch4 = 40;
  double c2h6 = 50;
  double c2h4 = 60;
  double c2h2 = 3;
  std::string source = "IEC 60599 Annex A typical concentrations (lower end, no OLTC; from memory)";
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
