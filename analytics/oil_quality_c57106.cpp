#include "analytics/oil_quality_c57106.h"

#include <algorithm>
#include <array>
#include <cctype>
#include <stdexcept>

#include "analytics/standard_tables.h"

namespace ferrum::analytics {
namespace {

constexpr const char* kClassNames[3] = {"<= 69 kV", "69-230 kV", ">= 230 kV"};

// The limits row of a test in the tables in force; the loader checks that
// every test below is present.
const C57106Limit& limit_of(const char* test) {
  for (const C57106Limit& l : standard_tables().c57106)
    if (l.test == test) return l;
  throw std::logic_error(std::string("C57.106 limits table has no row for ") + test);
}

std::string normalise(const std::string& s) {
  std::string out;
  for (char c : s)
    if (!std::isspace(static_cast<unsigned char>(c)) && c != '-' && c != '_')
      out += static_cast<char>(std::toupper(static_cast<unsigned char>(c)));
  return out;
}

OilCheck make_check(const char* test, const char* unit, const LabValue& v) {
  OilCheck c;
  c.test = test;
  c.unit = unit;
  if (v.is_measured()) c.value = v.value;
  return c;
}

void apply_limit(OilCheck& c, double limit, bool is_min, std::string source) {
  c.limit = limit;
  c.limit_kind = is_min ? "min" : "max";
  c.source = std::move(source);
  if (c.value) c.within_limit = is_min ? *c.value >= limit : *c.value <= limit;
}

std::string c57106_source(int cls) {
  return std::string("IEEE C57.106-2015 service-aged oil limits, ") + kClassNames[cls];
}

OilCheck tabulated_check(const C57106Limit& l, const LabValue& v, std::optional<int> cls) {
  OilCheck c = make_check(l.test.c_str(), l.unit.c_str(), v);
  if (v.is_below_limit()) {
    // Below the lab's detection limit: within any maximum.
    c.value = std::isfinite(v.value) ? std::optional<double>(v.value) : std::nullopt;
    if (cls && !l.is_min) {
      apply_limit(c, l.by_class[*cls], l.is_min, c57106_source(*cls));
      c.within_limit = true;
      return c;
    }
  }
  if (cls)
    apply_limit(c, l.by_class[*cls], l.is_min, c57106_source(*cls));
  else
    c.source = "no limit: unit voltage unknown";
  return c;
}

OilCheck breakdown_check(const OilSample& s, double hv_kv, std::optional<int> cls) {
  OilCheck c = make_check("breakdown", "kV", s.breakdown_kv);
  switch (parse_breakdown_method(s.breakdown_method)) {
    case BreakdownMethod::astm_d1816_1mm:
    case BreakdownMethod::astm_d1816_2mm: {
      if (!cls) {
        c.source = "no limit: unit voltage unknown";
        break;
      }
      const bool one_mm = parse_breakdown_method(s.breakdown_method) == BreakdownMethod::astm_d1816_1mm;
      apply_limit(c, limit_of(one_mm ? "breakdown_d1816_1mm" : "breakdown_d1816_2mm").by_class[*cls], true,
                  c57106_source(*cls) + (one_mm ? ", ASTM D1816 1 mm gap" : ", ASTM D1816 2 mm gap"));
      break;
    }
    case BreakdownMethod::astm_d877:
      // C57.106 gives no in-service D877 limit that could be verified; the
      // Reclamation minimum is published for D877 (ASTM D877; checked against a public reproduction).
      apply_limit(c, hv_kv >= 287.5 ? 30 : 25, true,
                  "US Bureau of Reclamation minimum for ASTM D877 (25 kV below 287.5 kV, 30 kV at or above)");
      break;
    case BreakdownMethod::iec60156: {
      // IEC 60422:2013 Table 5 categories: C ≤ 72.5 kV, B 72.5–170 kV, A/O > 170 kV.
      const double limit = hv_kv > 170 ? 50 : hv_kv > 72.5 ? 40 : 30;
      apply_limit(c, limit, true, "IEC 60422:2013 Table 5 'poor' bound for IEC 60156 2.5 mm (from memory; verify)");
      break;
    }
    case BreakdownMethod::unknown:
      c.source = "no limit: breakdown method '" + s.breakdown_method +
                 "' not recognised (limits depend on method and gap: ASTM D1816 1 mm/2 mm, ASTM D877, IEC 60156)";
      break;
  }
  return c;
}

bool fails(const OilCheck& c) { return c.within_limit && !*c.within_limit; }

void classify(OilQualityResult& r) {
  std::string dielectric, ageing;
  bool any_limit = false;
  for (const OilCheck& c : r.checks) {
    if (c.within_limit) any_limit = true;
    if (!fails(c)) continue;
    if (c.test == "breakdown" || c.test == "moisture") dielectric += (dielectric.empty() ? "" : ", ") + c.test;
    if (c.test == "ift" || c.test == "pf25" || c.test == "pf100" || c.test == "acidity")
      ageing += (ageing.empty() ? "" : ", ") + c.test;
  }
  if (!any_limit) {
    r.oil_class = "not determined";
    r.class_reason = "no test with a limit";
  } else if (!ageing.empty()) {
    r.oil_class = "Class III";
    r.class_reason = "outside limit: " + ageing + (dielectric.empty() ? "" : "; also " + dielectric) +
                     " -> reclaim (C57.106 clause 7)";
  } else if (!dielectric.empty()) {
    r.oil_class = "Class II";
    r.class_reason = "outside limit: " + dielectric + " -> recondition (C57.106 clause 7)";
  } else {
    r.oil_class = "Class I";
    r.class_reason = "all tests with limits satisfactory";
  }
}

}  // namespace

BreakdownMethod parse_breakdown_method(const std::string& text) {
  const std::string t = normalise(text);
  if (t.find("D1816") != std::string::npos) {
    if (t.find("2MM") != std::string::npos || t.find("2.0MM") != std::string::npos)
      return BreakdownMethod::astm_d1816_2mm;
    if (t.find("1MM") != std::string::npos || t.find("1.0MM") != std::string::npos)
      return BreakdownMethod::astm_d1816_1mm;
    return BreakdownMethod::unknown;
  }
  if (t.find("D877") != std::string::npos) return BreakdownMethod::astm_d877;
  if (t.find("60156") != std::string::npos) return BreakdownMethod::iec60156;
  return BreakdownMethod::unknown;
}

std::optional<int> c57106_voltage_class(double hv_kv) {
  if (!(hv_kv > 0)) return std::nullopt;
  if (hv_kv <= 69) return 0;
  if (hv_kv < 230) return 1;
  return 2;
}

OilQualityResult assess_oil_quality_c57106(const OilSample& s, double hv_kv) {
  OilQualityResult r;
  const std::optional<int> cls = c57106_voltage_class(hv_kv);
  if (!cls) r.notes.push_back("HV rating unknown: C57.106 voltage class cannot be chosen");
  const std::pair<const char*, const LabValue*> tabulated[] = {
      {"moisture", &s.moisture_ppm}, {"acidity", &s.acidity_mgkoh_g}, {"ift", &s.ift_mn_m},
      {"pf25", &s.pf25_pct},         {"pf100", &s.pf100_pct},         {"color", &s.color}};
  for (const auto& [test, value] : tabulated)
    if (value->present()) r.checks.push_back(tabulated_check(limit_of(test), *value, cls));
  if (s.breakdown_kv.present()) r.checks.push_back(breakdown_check(s, hv_kv, cls));
  if (s.moisture_ppm.present())
    r.notes.push_back("water limit is a consensus value; it does not show the paper's dryness (C57.106 footnote)");
  classify(r);
  return r;
}

}  // namespace ferrum::analytics
