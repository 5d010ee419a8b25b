#include "analytics/paper_furan_dp.h"

#include <algorithm>
#include <cmath>
#include <cstdio>

namespace ferrum::analytics {

std::optional<double> chendong_dp(double fal_ppm) {
  if (!(fal_ppm > 0)) return std::nullopt;
  return (1.51 - std::log10(fal_ppm)) / 0.0035;
}

double de_pablo_dp(double fal_ppm) { return 7100.0 / (8.88 + fal_ppm); }

double paper_life_used_pct(double dp, const PaperDpOptions& o) {
  return std::clamp(100.0 * (o.dp_new - dp) / (o.dp_new - o.dp_end), 0.0, 100.0);
}

namespace {

void add_note(std::string& note, const std::string& text) { note += (note.empty() ? "" : "; ") + text; }

}  // namespace

PaperDpResult estimate_paper_dp(const LabValue& fal, Day sample_date, const UnitInfo& unit,
                                const PaperDpOptions& o) {
  PaperDpResult r;
  if (!fal.present()) {
    r.note = "no 2-FAL result";
    return r;
  }
  if (unit.oil_treated && sample_date >= *unit.oil_treated) {
    r.trustworthy = false;
    add_note(r.note, "oil changed or regenerated on " + format_day(*unit.oil_treated) +
                         ": furans were reset, DP from this sample is not trustworthy");
  }
  if (unit.paper == PaperType::upgraded) {
    r.trustworthy = false;
    add_note(r.note, "thermally upgraded paper produces less 2-FAL: DP likely overstated");
  }
  if (fal.is_below_limit() || !(fal.value > 0)) {
    char buf[160];
    if (fal.is_below_limit() && std::isfinite(fal.value) && fal.value > 0) {
      std::snprintf(buf, sizeof buf, "2-FAL below detection (< %.0f ppb): DP above about %.0f (Chendong)",
                    fal.value, *chendong_dp(fal.value / 1000.0));
      add_note(r.note, buf);
    } else {
      add_note(r.note, "2-FAL not detected: no DP estimate");
    }
    return r;
  }
  r.applicable = true;
  r.fal_ppb = fal.value;
  const double ppm = fal.value / 1000.0;
  r.dp_chendong = chendong_dp(ppm);
  r.dp_de_pablo = de_pablo_dp(ppm);
  if (*r.dp_chendong > o.dp_new) add_note(r.note, "estimate above new-paper DP: paper in new condition");
  if (*r.dp_chendong < o.dp_end) add_note(r.note, "estimate below end-of-life DP");
  r.life_used_pct = paper_life_used_pct(*r.dp_chendong, o);
  return r;
}

}  // namespace ferrum::analytics
