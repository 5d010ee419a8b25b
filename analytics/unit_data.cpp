#include "analytics/unit_data.h"

#include <array>
#include <utility>

namespace ferrum::analytics {

const char* to_string(Rating r) {
  switch (r) {
    case Rating::good: return "good";
    case Rating::fair: return "fair";
    case Rating::poor: return "poor";
    case Rating::very_poor: return "very_poor";
    case Rating::unsafe: return "unsafe";
  }
  return "?";
}

const char* to_string(PaperType p) { return p == PaperType::kraft ? "kraft" : "upgraded"; }
const char* to_string(OilType o) { return o == OilType::mineral ? "mineral" : "ester"; }
const char* to_string(OltcType o) {
  switch (o) {
    case OltcType::none: return "none";
    case OltcType::sealed: return "sealed";
    case OltcType::communicating: return "communicating";
    case OltcType::unknown: break;
  }
  return "";
}
OltcType oltc_type_from(const std::string& t) {
  if (t == "none") return OltcType::none;
  if (t == "sealed") return OltcType::sealed;
  if (t == "communicating") return OltcType::communicating;
  return OltcType::unknown;
}

// Names of the electrical field tests, as written in the `test` column of an
// electrical tests file and in the JSON.
namespace {
constexpr std::array<std::pair<ElectricalTestKind, const char*>, 7> kNames = {{
    {ElectricalTestKind::turns_ratio, "turns_ratio"},
    {ElectricalTestKind::winding_resistance, "winding_resistance"},
    {ElectricalTestKind::insulation_power_factor, "insulation_power_factor"},
    {ElectricalTestKind::bushing_power_factor, "bushing_power_factor"},
    {ElectricalTestKind::insulation_resistance, "insulation_resistance"},
    {ElectricalTestKind::excitation_current, "excitation_current"},
    {ElectricalTestKind::leakage_reactance, "leakage_reactance"},
}};
}  // namespace

const char* to_string(ElectricalTestKind k) {
  for (const auto& [kind, name] : kNames)
    if (kind == k) return name;
  return "?";
}

std::optional<ElectricalTestKind> electrical_test_from(const std::string& name) {
  for (const auto& [kind, name_of] : kNames)
    if (name == name_of) return kind;
  return std::nullopt;
}

}  // namespace ferrum::analytics
