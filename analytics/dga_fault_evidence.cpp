#include "analytics/dga_fault_evidence.h"

#include "analytics/standard_tables.h"

#include <cstdio>

#include "analytics/dga_gases.h"

namespace ferrum::analytics {

const TypicalGasSet& typical_gas_set_in_force() {
  const Iec60599Tables& t = standard_tables().iec60599;
  for (const TypicalGasSet& s : t.typical_sets)
    if (s.id == t.typical_in_force) return s;
  return t.typical_sets.at(0);  // the loader checks that the named set exists
}

FaultEvidence dga_fault_evidence(const OilSample& sample, const TypicalGasLevels& typical,
                                 bool rising) {
  const std::pair<Gas, double> limits[] = {{Gas::h2, typical.h2},     {Gas::ch4, typical.ch4},
                                           {Gas::c2h6, typical.c2h6}, {Gas::c2h4, typical.c2h4},
                                           {Gas::c2h2, typical.c2h2}};
  FaultEvidence e;
  std::string above;
  for (const auto& [gas, limit] : limits) {
    const LabValue& v = gas_value(sample, gas);
    if (v.is_measured() && v.value > limit) {
      char buf[64];
      std::snprintf(buf, sizeof buf, "%s%s %.4g ppm > %.4g", above.empty() ? "" : ", ",
                    gas_name(gas), v.value, limit);
      above += buf;
    }
  }
  if (!above.empty()) {
    e.present = true;
    e.reason = "above typical: " + above;
  } else if (rising) {
    e.present = true;
    e.reason = "gases rising";
  } else {
    e.reason = "no diagnosis: concentrations too low (all fault gases at or below typical values and not rising)";
  }
  return e;
}

bool fault_gases_rising(const OilSample& earlier, const OilSample& later, double pct_per_month) {
  const int days = later.date - earlier.date;
  if (days < 1) return false;
  for (Gas g : {Gas::h2, Gas::ch4, Gas::c2h6, Gas::c2h4, Gas::c2h2}) {
    const auto before = gas_ppm_or_zero(earlier, g);
    const LabValue& now = gas_value(later, g);
    if (!before || !now.is_measured()) continue;
    if (*before <= 0 && now.value > 0) return true;
    if (*before > 0 && (now.value - *before) / *before * 100.0 * 30.0 / days > pct_per_month) return true;
  }
  return false;
}

}  // namespace ferrum::analytics
