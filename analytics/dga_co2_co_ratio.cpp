#include "analytics/dga_co2_co_ratio.h"

#include <cstdio>

namespace ferrum::analytics {

Co2CoResult co2_co_reading(const OilSample& s, const Co2CoOptions& o) {
  Co2CoResult r;
  if (!s.co.is_measured() || !(s.co.value > 0) || !s.co2.present()) {
    r.reading = "no reading: CO and CO2 both needed, CO above detection";
    return r;
  }
  const double co2 = s.co2.or_zero();
  r.ratio = co2 / s.co.value;
  if (s.co.value <= o.min_co_ppm && co2 <= o.min_co2_ppm) {
    r.reading = "no reading: carbon oxides at background levels";
    return r;
  }
  r.applicable = true;
  char lo[16], hi[16];
  std::snprintf(lo, sizeof lo, "%g", o.lower);
  std::snprintf(hi, sizeof hi, "%g", o.upper);
  if (*r.ratio < o.lower) {
    r.band = std::string("<") + lo;
    r.reading = "paper involved in a fault (rapid cellulose degradation, possibly carbonisation)";
  } else if (*r.ratio > o.upper) {
    r.band = std::string(">") + hi;
    r.reading = "possible cellulose overheating, if other gases also show abnormal degradation";
  } else {
    r.band = std::string(lo) + "-" + hi;
    r.reading = "normal ageing of cellulose";
  }
  return r;
}

}  // namespace ferrum::analytics
