// Recommended thermal characteristics of IEC 60076-7:2005 (Tables 4 and 5),
// by cooling class, and their replacement by a unit's register data.
//
// Source: IEC 60076-7:2005 "Loading guide for oil-immersed power
// transformers", Table 5, kept as data with its audit status in
// analytics/data/iec60076_7.csv (ONAN distribution and ONAF columns and ONAN
// medium/large k21 = 2.0 checked against a public reproduction, the rest from
// memory). The 2018 edition changed some k21 values for restricted /
// non-restricted oil flow; those are not held here.
//
// Units: exponents dimensionless; time constants in minutes; rises and
// gradients in kelvin; R = load losses at rated current / no-load losses.
// Validity: oil-immersed transformers, mineral oil, cooling classes ON/OF/OD.
#pragma once

#include <string>
#include <vector>

#include "analytics/unit_data.h"

namespace ferrum::analytics {

// The five columns of IEC 60076-7 Table 5.
enum class IecCoolingClass { onan_distribution, onan, onaf, of, od };

const char* to_string(IecCoolingClass c);

struct IecThermalParameters {
  double x = 0.8;            // oil exponent
  double y = 1.3;            // winding exponent
  double r = 6;              // ratio of load losses at rated current to no-load losses
  double k11 = 0.5;          // thermal model constant (top oil)
  double k21 = 2.0;          // thermal model constant (hot-spot overshoot)
  double k22 = 2.0;          // thermal model constant
  double tau_o_min = 150;    // average oil time constant, min
  double tau_w_min = 7;      // winding time constant, min
  double top_oil_rise_k = 52;      // Δθ_or, rated top-oil rise over ambient, K
  double hot_spot_gradient_k = 26; // Δθ_hr = H·g_r, rated hot-spot to top-oil gradient, K
};

// Parameters with the origin of each one, in the form
// "x = 0.8 (IEC 60076-7:2005 Table 5, ONAF)" or "R = 4.5 (unit register)".
struct ResolvedIecParameters {
  IecCoolingClass cooling_class = IecCoolingClass::onan;
  IecThermalParameters p;
  std::vector<std::string> sources;
  std::vector<std::string> defaulted;  // names of parameters taken from the table
  bool cooling_known = true;           // false: cooling string not recognised
};

// Column of Table 5 for a cooling string ("ONAN", "KNAN", "ONAF", "OFAF",
// "ODAF", ...) and rating: ONAN up to 2.5 MVA is "distribution". An
// unrecognised string gives medium/large ONAN and cooling_known = false.
IecCoolingClass iec_cooling_class(const std::string& cooling, double rated_mva, bool* known = nullptr);

// The table's recommended values for one column (the tables in force).
IecThermalParameters iec_recommended_parameters(IecCoolingClass c);

// Table values, replaced by the unit's register data where given
// (UnitInfo::top_oil_rise_k, hot_spot_gradient_k, load_loss_ratio). Register
// values outside plausible ranges (rise 10..100 K, gradient 1..60 K,
// R 0.5..50) are ignored and the reason recorded in sources.
ResolvedIecParameters resolve_iec_parameters(const UnitInfo& unit);

}  // namespace ferrum::analytics
