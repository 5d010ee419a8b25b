#include "analytics/unit_data.h"

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

}  // namespace ferrum::analytics
