#include "analytics/dga_gases.h"

namespace ferrum::analytics {

const char* gas_name(Gas g) {
  switch (g) {
    case Gas::h2: return "H2";
    case Gas::ch4: return "CH4";
    case Gas::c2h6: return "C2H6";
    case Gas::c2h4: return "C2H4";
    case Gas::c2h2: return "C2H2";
    case Gas::co: return "CO";
    case Gas::co2: return "CO2";
  }
  return "?";
}

const LabValue& gas_value(const OilSample& s, Gas g) {
  switch (g) {
    case Gas::h2: return s.h2;
    case Gas::ch4: return s.ch4;
    case Gas::c2h6: return s.c2h6;
    case Gas::c2h4: return s.c2h4;
    case Gas::c2h2: return s.c2h2;
    case Gas::co: return s.co;
    case Gas::co2: return s.co2;
  }
  return s.h2;
}

std::optional<double> gas_ppm_or_zero(const OilSample& s, Gas g) {
  const LabValue& v = gas_value(s, g);
  if (!v.present()) return std::nullopt;
  if (v.is_measured() && !std::isfinite(v.value)) return std::nullopt;
  return v.or_zero();
}

bool is_main_tank(const OilSample& s) {
  return s.sample_point.empty() || s.sample_point == "main_tank";
}

bool has_gas_analysis(const OilSample& s) {
  for (Gas g : kAllGases)
    if (gas_value(s, g).present()) return true;
  return false;
}

}  // namespace ferrum::analytics
