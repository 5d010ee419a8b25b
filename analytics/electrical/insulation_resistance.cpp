#include "analytics/electrical/insulation_resistance.h"

namespace ferrum::analytics::electrical {

double polarization_index(double one_minute_megohm, double ten_minute_megohm) {
  return ten_minute_megohm / one_minute_megohm;
}

PiReading read_polarization_index(double pi) {
  if (pi < 1.0) return PiReading::dangerous;
  if (pi < 1.1) return PiReading::poor;
  if (pi < 1.25) return PiReading::questionable;
  if (pi <= 2.0) return PiReading::fair;
  return PiReading::good;
}

std::string_view pi_reading_name(PiReading reading) {
  switch (reading) {
    case PiReading::dangerous: return "dangerous";
    case PiReading::poor: return "poor";
    case PiReading::questionable: return "questionable";
    case PiReading::fair: return "fair";
    case PiReading::good: return "good";
  }
  return "unknown";
}

}  // namespace ferrum::analytics::electrical
