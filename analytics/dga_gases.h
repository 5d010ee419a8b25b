// The dissolved gases that the DGA methods read, and how they are taken from
// an oil sample. Units: µL/L (ppm) throughout.
//
// Conventions (IEEE C57.104-2008): TDCG is H2 + CH4 + C2H2 + C2H4 + C2H6 + CO
// [IEEE C57.104-2008]. A gas reported below its detection limit counts as
// zero in sums, but never as a measured value in a ratio's denominator.
#pragma once

#include <array>
#include <optional>
#include <string>

#include "analytics/lab_value.h"
#include "analytics/unit_data.h"

namespace ferrum::analytics {

enum class Gas { h2, ch4, c2h6, c2h4, c2h2, co, co2 };

inline constexpr std::array<Gas, 7> kAllGases = {Gas::h2,   Gas::ch4, Gas::c2h6, Gas::c2h4,
                                                 Gas::c2h2, Gas::co,  Gas::co2};
// The combustible gases summed into TDCG.
inline constexpr std::array<Gas, 6> kCombustibleGases = {Gas::h2,   Gas::ch4, Gas::c2h6,
                                                         Gas::c2h4, Gas::c2h2, Gas::co};

// Chemical formula as printed: "H2", "CH4", "C2H6", "C2H4", "C2H2", "CO", "CO2".
const char* gas_name(Gas g);
// Index of a gas in kAllGases (0..6).
inline std::size_t gas_index(Gas g) { return static_cast<std::size_t>(g); }

// The reading of one gas in a sample.
const LabValue& gas_value(const OilSample& sample, Gas g);

// Value for sums: the measured value, 0 below the detection limit, nullopt when
// the gas was not analysed.
std::optional<double> gas_ppm_or_zero(const OilSample& sample, Gas g);

// True when the sample was taken from the main tank (sample_point empty or
// "main_tank"): only these feed the main-tank DGA.
bool is_main_tank(const OilSample& sample);

// True when at least one of the seven gases was analysed.
bool has_gas_analysis(const OilSample& sample);

}  // namespace ferrum::analytics
