#include "analytics/iec60599_ratios.h"

#include <cmath>
#include <limits>

#include "analytics/dga_gases.h"

namespace ferrum::analytics {
namespace {

constexpr double kInf = std::numeric_limits<double>::infinity();

// Inclusive range; lo = -inf / hi = +inf for open-ended rows.
struct Range {
  double lo = -kInf, hi = kInf;
  bool holds(double v) const { return v >= lo && v <= hi; }
};
// Strict bounds of the table ("< 0.1", "> 1") use the next representable value.
double below(double v) { return std::nextafter(v, -kInf); }
double above(double v) { return std::nextafter(v, kInf); }

struct Row {
  const char* code;
  const char* name;
  Range c2h2_c2h4, ch4_h2, c2h4_c2h6;
};

const Row kRows[] = {
    {"PD", "partial discharges", {}, {-kInf, below(0.1)}, {-kInf, below(0.2)}},
    {"D1", "discharges of low energy", {above(1), kInf}, {0.1, 0.5}, {above(1), kInf}},
    {"D2", "discharges of high energy", {0.6, 2.5}, {0.1, 1}, {above(2), kInf}},
    {"T1", "thermal fault below 300 °C", {}, {above(1), kInf}, {-kInf, below(1)}},
    {"T2", "thermal fault 300-700 °C", {-kInf, below(0.1)}, {above(1), kInf}, {1, 4}},
    {"T3", "thermal fault above 700 °C", {-kInf, below(0.2)}, {above(1), kInf}, {above(4), kInf}},
};

// Ratio of two readings: undefined unless the denominator is measured > 0.
std::optional<double> ratio(const LabValue& num, const LabValue& den) {
  if (!den.is_measured() || !(den.value > 0) || !num.present()) return std::nullopt;
  return num.or_zero() / den.value;
}

}  // namespace

Iec60599Result iec60599_classify(const Iec60599Ratios& r) {
  Iec60599Result out;
  out.ratios = r;
  if (!r.c2h2_c2h4 || !r.ch4_h2 || !r.c2h4_c2h6) {
    out.reading = "no diagnosis: a ratio is undefined (denominator gas not detected or not analysed)";
    return out;
  }
  out.applicable = true;
  const Row* chosen = nullptr;
  for (const Row& row : kRows) {
    if (row.c2h2_c2h4.holds(*r.c2h2_c2h4) && row.ch4_h2.holds(*r.ch4_h2) &&
        row.c2h4_c2h6.holds(*r.c2h4_c2h6)) {
      out.matches.push_back(row.code);
      chosen = &row;  // later rows are the more severe of the only overlap (D1/D2)
    }
  }
  if (!chosen) {
    out.reading = "no ratio match";
    return out;
  }
  out.fault = chosen->code;
  out.reading = std::string(chosen->code) + ": " + chosen->name;
  if (out.matches.size() > 1) out.reading += " (ratios also match D1; D2 reported as the more severe)";
  return out;
}

Iec60599Result iec60599_ratios(const OilSample& s, const TypicalGasLevels& typical, bool rising) {
  FaultEvidence evidence = dga_fault_evidence(s, typical, rising);
  Iec60599Ratios r{ratio(s.c2h2, s.c2h4), ratio(s.ch4, s.h2), ratio(s.c2h4, s.c2h6)};
  if (!evidence.present) {
    Iec60599Result out;
    out.ratios = r;
    out.reading = evidence.reason;
    return out;
  }
  return iec60599_classify(r);
}

}  // namespace ferrum::analytics
