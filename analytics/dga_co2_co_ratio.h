// CO2/CO ratio reading for paper (cellulose) involvement.
// Sources (IEC 60599 and IEEE C57.104, from memory): normal ageing of a conservator unit gives roughly
// 3 to 10–11; below 3 points to rapid paper degradation / paper involved in
// the fault, possibly with carbonisation [US Bureau of Reclamation FIST 3-30;
// IEC 60599 from memory]; above the upper band may mean
// cellulose overheating if other gases also show abnormal degradation. The
// upper band is 10 in IEC 60599 / CIGRE and 11 for the US Bureau of
// Reclamation: configurable, default 10 (IEC).
// Inputs: CO2, CO in µL/L. Validity: only when the carbon oxides are above
// background (default: CO above 350 ppm or CO2 above 2500 ppm, the
// C57.104-2008 Table 1 Condition 1 levels); increments are preferable to
// absolute values where a history exists.
#pragma once

#include <optional>
#include <string>

#include "analytics/unit_data.h"

namespace ferrum::analytics {

struct Co2CoOptions {
  double lower = 3.0;         // below: paper involved (IEC 60599, Reclamation)
  double upper = 10.0;        // above: possible cellulose overheating; 10 IEC/CIGRE, 11 Reclamation
  double min_co_ppm = 350;    // background guard: C57.104-2008 Table 1 Condition 1 CO
  double min_co2_ppm = 2500;  // background guard: C57.104-2008 Table 1 Condition 1 CO2
};

struct Co2CoResult {
  bool applicable = false;
  std::optional<double> ratio;   // computed whenever CO is measured > 0
  std::string band;              // "<3", "3-10", ">10" (with the configured bounds)
  std::string reading;
  std::string method = "CO2/CO ratio";
  std::string source = "IEC 60599 (from memory); US Bureau of Reclamation practice";
};

Co2CoResult co2_co_reading(const OilSample& sample, const Co2CoOptions& options = {});

}  // namespace ferrum::analytics
