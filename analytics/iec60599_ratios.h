// IEC 60599 basic gas ratios: fault type from C2H2/C2H4, CH4/H2 and
// C2H4/C2H6.
//
// Source: IEC 60599 (2015/2022 editions) Table 1 (checked against a public
// reproduction; the table is data in analytics/data/iec60599.csv):
//   PD  partial discharges          C2H2/C2H4 NS       CH4/H2 < 0.1     C2H4/C2H6 < 0.2
//   D1  low-energy discharges       > 1                0.1 – 0.5        > 1
//   D2  high-energy discharges      0.6 – 2.5          0.1 – 1          > 2
//   T1  thermal < 300 °C            NS                 > 1 (NS)         < 1
//   T2  thermal 300 – 700 °C        < 0.1              > 1              1 – 4
//   T3  thermal > 700 °C            < 0.2              > 1              > 4
// NS = not significant. Range ends are inclusive ("0.1 – 0.5" holds 0.1 and 0.5).
// D1 and D2 overlap (C2H2/C2H4 1 – 2.5, CH4/H2 0.1 – 0.5, C2H4/C2H6 > 2):
// there ferrum reports D2, the more severe, and names both.
//
// Inputs: gases in µL/L. A ratio is undefined when its denominator gas is
// not measured above the detection limit; a numerator below the detection
// limit counts as 0. Validity: only when a fault is indicated (gases above
// typical values or rising, see dga_fault_evidence.h); otherwise "no
// diagnosis". Cases outside every row stay unclassified ("no ratio match").
#pragma once

#include <optional>
#include <string>
#include <vector>

#include "analytics/dga_fault_evidence.h"
#include "analytics/unit_data.h"

namespace ferrum::analytics {

// One row of Table 1: each ratio's closed range [lo, hi]; a strict bound of
// the table ("< 0.1") is held as the next representable value, NS as
// [-inf, +inf].
struct RatioRange {
  double lo = 0, hi = 0;
  bool holds(double v) const { return v >= lo && v <= hi; }
};
struct Iec60599RatioRow {
  std::string code, name;
  RatioRange c2h2_c2h4, ch4_h2, c2h4_c2h6;
};

// The data of analytics/data/iec60599.csv.
struct Iec60599Tables {
  std::vector<Iec60599RatioRow> ratios;   // in table order
  std::vector<TypicalGasSet> typical_sets;
  std::string typical_in_force;           // id of the set in force
};

struct Iec60599Ratios {
  std::optional<double> c2h2_c2h4, ch4_h2, c2h4_c2h6;
};

struct Iec60599Result {
  bool applicable = false;           // preconditions held and the ratios were formed
  Iec60599Ratios ratios;
  std::optional<std::string> fault;  // "PD","D1","D2","T1","T2","T3"; nullopt: no match / n.a.
  std::vector<std::string> matches;  // every row the ratios satisfy
  std::string reading;               // fault name, "no ratio match", or why no diagnosis
  std::string method = "IEC 60599 basic gas ratios";
  std::string source = "IEC 60599 Table 1";
};

// Table lookup alone, for given ratios (all three required).
Iec60599Result iec60599_classify(const Iec60599Ratios& ratios);

// Forms the ratios of a sample and classifies them, when a fault is indicated.
Iec60599Result iec60599_ratios(const OilSample& sample, const TypicalGasLevels& typical,
                               bool gases_rising);

}  // namespace ferrum::analytics
