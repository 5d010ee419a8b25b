// Oil quality of service-aged mineral oil against IEEE C57.106-2015
// "Guide for Acceptance and Maintenance of Insulating Mineral Oil in
// Electrical Equipment": suggested limits for continued use of service-aged
// oil by voltage class (≤ 69 kV, > 69 to < 230 kV, ≥ 230 kV), and the
// clause 7 class reading:
//   Class I   satisfactory;
//   Class II  fails dielectric breakdown and/or water → recondition (filter,
//             vacuum dehydration);
//   Class III fails IFT, power factor and/or neutralization number → reclaim.
// Sources: limit values from memory of the C57.106 table, kept as data with
// their audit status in analytics/data/ieee_c57106.csv; footnotes and classes
// checked against public reproductions.
// Breakdown limits depend on method and gap:
//   ASTM D1816 1 mm / 2 mm  → C57.106 (from memory);
//   ASTM D877               → US Bureau of Reclamation minimum, 25 kV below
//                             287.5 kV and 30 kV at or above (checked against a public reproduction);
//   IEC 60156 (2.5 mm)      → IEC 60422:2013 Table 5 "poor" bound by
//                             category (from memory);
//   anything else           → value reported with no limit, and why.
// Units: water mg/kg, breakdown kV, acidity mg KOH/g, IFT mN/m, power factor
// %, colour ASTM D1500 number. Validity: mineral oil only; a limit says when
// to act on the oil, it does not measure the paper's dryness.
#pragma once

#include <array>
#include <optional>
#include <string>
#include <vector>

#include "analytics/assessment.h"
#include "analytics/unit_data.h"

namespace ferrum::analytics {

// One row of the limits table (analytics/data/ieee_c57106.csv).
struct C57106Limit {
  std::string test;  // "moisture", "acidity", "ift", "pf25", "pf100", "color",
                     // "breakdown_d1816_1mm", "breakdown_d1816_2mm"
  std::string unit;
  bool is_min = false;
  std::array<double, 3> by_class{};  // ≤69, 69–230, ≥230 kV
};
using C57106Limits = std::vector<C57106Limit>;

enum class BreakdownMethod { astm_d1816_1mm, astm_d1816_2mm, astm_d877, iec60156, unknown };

// Recognises "ASTM D1816 2 mm", "D1816-1mm", "astm d877", "IEC 60156", ...
// A D1816 result without a gap is unknown: the two gaps have different limits.
BreakdownMethod parse_breakdown_method(const std::string& text);

// C57.106 voltage class index: 0 = ≤ 69 kV, 1 = > 69 to < 230 kV, 2 = ≥ 230 kV;
// nullopt when the HV rating is unknown (≤ 0).
std::optional<int> c57106_voltage_class(double hv_kv);

struct OilQualityResult {
  std::vector<OilCheck> checks;   // one per test present in the sample
  std::string oil_class;          // "Class I", "Class II", "Class III", or "not determined"
  std::string class_reason;       // which tests decided
  std::vector<std::string> notes;
  std::string method = "Suggested limits for continued use of service-aged oil; oil classes (clause 7)";
  std::string source = "IEEE C57.106-2015";
};

// Checks every test present in the sample against the limit for the unit's
// voltage class. A value equal to a limit is within it.
OilQualityResult assess_oil_quality_c57106(const OilSample& sample, double hv_kv);

}  // namespace ferrum::analytics
