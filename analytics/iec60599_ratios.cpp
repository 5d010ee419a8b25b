#include "analytics/iec60599_ratios.h"


#include "analytics/dga_gases.h"
#include "analytics/standard_tables.h"

namespace ferrum::analytics {
namespace {

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
  const Iec60599RatioRow* chosen = nullptr;
  for (const Iec60599RatioRow& row : standard_tables().iec60599.ratios) {
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
  out.reading = chosen->code + ": " + chosen->name;
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
