// Insulation resistance and polarization index PI = R10/R1 (resistance after
// 10 minutes over resistance after 1 minute of a DC test voltage), read on
// the common practice scale:
//   PI < 1.0 dangerous; 1.0 ≤ PI < 1.1 poor; 1.1 ≤ PI < 1.25 questionable;
//   1.25 ≤ PI ≤ 2.0 fair; PI > 2.0 good.
// Source: common practice, no published source (the scale is quoted in field
// test guides; ferrum's reading of the band edges is its own choice).
// Units: resistances in MΩ, PI dimensionless.
// Valid for one insulation (e.g. HV-ground) measured at one test voltage; the
// windings must be discharged after the test (they hold a charge).
#pragma once

#include <optional>
#include <string_view>

namespace ferrum::analytics::electrical {

enum class PiReading { dangerous, poor, questionable, fair, good };

inline constexpr const char* kInsulationResistanceSource =
    "polarization index scale: common practice, no published source";

// REQUIRES: one_minute_megohm > 0.
double polarization_index(double one_minute_megohm, double ten_minute_megohm);
PiReading read_polarization_index(double pi);
std::string_view pi_reading_name(PiReading reading);

}  // namespace ferrum::analytics::electrical
