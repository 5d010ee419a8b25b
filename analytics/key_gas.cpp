#include "analytics/key_gas.h"

#include <cstdio>

#include "analytics/dga_gases.h"

namespace ferrum::analytics {
namespace {

std::string fault_for(Gas key, double c2h2_share, const KeyGasOptions& o) {
  switch (key) {
    case Gas::c2h4: return "overheated oil";
    case Gas::co: return "overheated cellulose";
    case Gas::c2h2: return "arcing";
    case Gas::h2:
      return c2h2_share >= o.arcing_c2h2_share_pct ? "arcing" : "partial discharge (corona)";
    case Gas::c2h6: return "no published key-gas pattern (C2H6 dominant: low-temperature oil heating possible)";
    default: return "no published key-gas pattern (CH4 dominant)";
  }
}

std::string family_for(Gas key, double c2h2_share, const KeyGasOptions& o) {
  switch (key) {
    case Gas::c2h4: return "T";
    case Gas::co: return "C";
    case Gas::c2h2: return "D";
    case Gas::h2: return c2h2_share >= o.arcing_c2h2_share_pct ? "D" : "PD";
    default: return "";
  }
}

}  // namespace

bool key_gas_agrees(const std::string& family, const std::string& zone) {
  if (family.empty() || zone.empty()) return false;
  if (zone == "DT") return family == "D" || family == "T";
  if (family == "PD") return zone == "PD";
  if (family == "D" || family == "T") return zone.size() == 2 && zone[0] == family[0] && zone != "DT";
  return false;
}

KeyGasResult key_gas_reading(const OilSample& s, const TypicalGasLevels& typical, bool rising,
                             const KeyGasOptions& o) {
  KeyGasResult r;
  double sum = 0;
  std::array<double, 6> ppm{};
  for (std::size_t i = 0; i < kCombustibleGases.size(); ++i) {
    auto v = gas_ppm_or_zero(s, kCombustibleGases[i]);
    if (!v) {
      r.reading = std::string("no reading: ") + gas_name(kCombustibleGases[i]) + " not analysed";
      return r;
    }
    ppm[i] = *v;
    sum += *v;
  }
  const FaultEvidence evidence = dga_fault_evidence(s, typical, rising);
  if (!(sum > 0) || !evidence.present) {
    r.reading = evidence.reason;
    return r;
  }
  std::size_t best = 0;
  for (std::size_t i = 0; i < ppm.size(); ++i) {
    r.share_pct[i] = 100 * ppm[i] / sum;
    if (ppm[i] > ppm[best]) best = i;
  }
  r.applicable = true;
  const Gas key = kCombustibleGases[best];
  r.key_gas = gas_name(key);
  char buf[64];
  std::snprintf(buf, sizeof buf, " (%s %.0f %% of combustibles)", r.key_gas.c_str(), r.share_pct[best]);
  r.fault_family = family_for(key, r.share_pct[gas_index(Gas::c2h2)], o);
  r.reading = fault_for(key, r.share_pct[gas_index(Gas::c2h2)], o) + buf;
  return r;
}

}  // namespace ferrum::analytics
