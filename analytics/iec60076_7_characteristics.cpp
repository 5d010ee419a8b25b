#include "analytics/iec60076_7_characteristics.h"

#include <algorithm>
#include <array>
#include <cctype>
#include <cstdio>
#include <optional>

#include "analytics/standard_tables.h"

namespace ferrum::analytics {
namespace {

constexpr const char* kTableSource = "IEC 60076-7:2005 Table 5";

constexpr double kDistributionLimitMva = 2.5;

std::string upper(std::string s) {
  std::transform(s.begin(), s.end(), s.begin(), [](unsigned char c) { return std::toupper(c); });
  return s;
}

std::string format_param(const char* name, double value, const std::string& origin) {
  char buf[64];
  std::snprintf(buf, sizeof buf, "%s = %g (", name, value);
  return buf + origin + ")";
}

// A register value used when present and plausible.
std::optional<double> plausible(const std::optional<double>& v, double lo, double hi) {
  if (!v || !(*v >= lo && *v <= hi)) return std::nullopt;
  return v;
}

void take_register_value(ResolvedIecParameters& out, const char* name, double& field,
                         const std::optional<double>& reg, double lo, double hi,
                         const std::string& table_origin) {
  if (auto v = plausible(reg, lo, hi)) {
    field = *v;
    out.sources.push_back(format_param(name, field, "unit register"));
    return;
  }
  out.defaulted.push_back(name);
  std::string origin = table_origin;
  if (reg) origin += "; register value out of range, ignored";
  out.sources.push_back(format_param(name, field, origin));
}

}  // namespace

const char* to_string(IecCoolingClass c) {
  switch (c) {
    case IecCoolingClass::onan_distribution: return "ONAN distribution";
    case IecCoolingClass::onan: return "ONAN medium/large";
    case IecCoolingClass::onaf: return "ONAF";
    case IecCoolingClass::of: return "OF";
    case IecCoolingClass::od: return "OD";
  }
  return "?";
}

IecCoolingClass iec_cooling_class(const std::string& cooling, double rated_mva, bool* known) {
  const std::string c = upper(cooling);
  if (known) *known = true;
  // First two letters: oil circulation (ON natural, OF forced non-directed,
  // OD directed); K.. (esters) follow the same columns. Third letter A/W: air
  // or water; forced air (AF) selects ONAF.
  if (c.size() >= 4 && (c[0] == 'O' || c[0] == 'K')) {
    if (c[1] == 'D') return IecCoolingClass::od;
    if (c[1] == 'F') return IecCoolingClass::of;
    if (c[1] == 'N' && c[3] == 'F') return IecCoolingClass::onaf;
    if (c[1] == 'N' && c[3] == 'N') {
      return rated_mva > 0 && rated_mva <= kDistributionLimitMva ? IecCoolingClass::onan_distribution
                                                                 : IecCoolingClass::onan;
    }
  }
  if (known) *known = false;
  return IecCoolingClass::onan;
}

IecThermalParameters iec_recommended_parameters(IecCoolingClass c) {
  return standard_tables().iec60076_7_table5[static_cast<std::size_t>(c)];
}

ResolvedIecParameters resolve_iec_parameters(const UnitInfo& unit) {
  ResolvedIecParameters out;
  out.cooling_class = iec_cooling_class(unit.cooling, unit.rated_mva, &out.cooling_known);
  out.p = iec_recommended_parameters(out.cooling_class);
  std::string origin = std::string(kTableSource) + ", " + to_string(out.cooling_class);
  if (!out.cooling_known) origin += "; cooling '" + unit.cooling + "' not recognised";
  IecThermalParameters& p = out.p;
  for (auto [name, value] : {std::pair{"x", p.x}, {"y", p.y}, {"k11", p.k11}, {"k21", p.k21},
                             {"k22", p.k22}, {"tau_o_min", p.tau_o_min}, {"tau_w_min", p.tau_w_min}}) {
    out.defaulted.push_back(name);
    out.sources.push_back(format_param(name, value, origin));
  }
  take_register_value(out, "R", p.r, unit.load_loss_ratio, 0.5, 50, origin);
  take_register_value(out, "top_oil_rise_k", p.top_oil_rise_k, unit.top_oil_rise_k, 10, 100, origin);
  take_register_value(out, "hot_spot_gradient_k", p.hot_spot_gradient_k, unit.hot_spot_gradient_k, 1, 60,
                      origin);
  return out;
}

}  // namespace ferrum::analytics
