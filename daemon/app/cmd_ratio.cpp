// ratio: the expected turns ratio per phase and tap, for a crew on site (no
// database needed). The computation is analytics/electrical/turns_ratio.h.

#include <Poco/JSON/Array.h>
#include <Poco/JSON/Object.h>

#include <iomanip>
#include <iostream>

#include "analytics/electrical/turns_ratio.h"
#include "daemon/app/commands_impl.h"
#include "daemon/assess/assessment_json.h"
#include "report/safety_text.h"

namespace ferrum::app {
namespace {

double number_option(const Invocation& inv, const std::string& name) {
  const std::string text = inv.get(name);
  std::size_t used = 0;
  double v = 0;
  try {
    v = std::stod(text, &used);
  } catch (const std::exception&) {
    used = 0;
  }
  if (used == 0 || used != text.size() || !(v > 0) || v > 1e6)
    throw UsageError("--" + name + ": '" + text + "' is not a positive number");
  return v;
}

int int_option(const Invocation& inv, const std::string& name) {
  const double v = number_option(inv, name);
  if (v != static_cast<int>(v) || v > 1000) throw UsageError("--" + name + ": '" + inv.get(name) + "' is not a whole number up to 1000");
  return static_cast<int>(v);
}

}  // namespace

int cmd_ratio(const Invocation& inv) {
  using namespace analytics::electrical;
  if (!inv.has("hv-kv") || !inv.has("lv-kv") || !inv.has("vector-group"))
    throw UsageError("give --hv-kv, --lv-kv and --vector-group, e.g. --hv-kv 132 --lv-kv 33 --vector-group Dyn11");
  const double hv = number_option(inv, "hv-kv");
  const double lv = number_option(inv, "lv-kv");
  const auto group = parse_vector_group(inv.get("vector-group"));
  if (!group) throw UsageError("--vector-group: '" + inv.get("vector-group") + "' is not a vector group (e.g. Dyn11, YNd1, Yy0, 1ph)");
  std::optional<TapChanger> taps;
  if (inv.has("tap-positions") || inv.has("tap-step-pct") || inv.has("tap-nominal")) {
    if (!inv.has("tap-positions") || !inv.has("tap-step-pct") || !inv.has("tap-nominal"))
      throw UsageError("a tap changer needs --tap-positions, --tap-nominal and --tap-step-pct");
    taps = TapChanger{int_option(inv, "tap-positions"), int_option(inv, "tap-nominal"), number_option(inv, "tap-step-pct")};
    if (taps->nominal > taps->positions) throw UsageError("--tap-nominal is beyond --tap-positions");
  }
  std::optional<int> tap;
  if (inv.has("tap")) {
    if (!taps) throw UsageError("--tap needs the tap changer: --tap-positions, --tap-nominal and --tap-step-pct");
    tap = int_option(inv, "tap");
    if (*tap > taps->positions) throw UsageError("--tap is beyond --tap-positions");
  }
  const auto table = ratio_table(hv, lv, *group, taps, tap);
  if (!table.why.empty()) throw UsageError(table.why);
  if (inv.has("json")) {
    Poco::JSON::Object::Ptr doc = new Poco::JSON::Object;
    doc->set("hv_kv", hv);
    doc->set("lv_kv", lv);
    doc->set("vector_group", inv.get("vector-group"));
    doc->set("limit_pct", kRatioLimitPct);
    doc->set("source", kTurnsRatioSource);
    Poco::JSON::Array::Ptr rows = new Poco::JSON::Array;
    for (const auto& r : table.rows) {
      Poco::JSON::Object::Ptr o = new Poco::JSON::Object;
      if (r.tap) o->set("tap", *r.tap);
      else o->set("tap", Poco::Dynamic::Var());
      o->set("hv_kv", r.hv_kv);
      o->set("phase_ratio", r.ratio);
      o->set("low", r.low);
      o->set("high", r.high);
      rows->add(o);
    }
    doc->set("taps", rows);
    doc->set("caution", report::one_line_caution());
    std::cout << assess::stringify(doc) << "\n";
    return kOk;
  }
  std::cout << "Expected turns ratio per phase (the same on each phase of a three-phase unit),\n"
            << "HV phase winding over LV phase winding, " << inv.get("vector-group") << ", limit ±" << kRatioLimitPct << " %\n"
            << "tap   HV kV      ratio       low        high\n"
            << std::fixed;
  for (const auto& r : table.rows)
    std::cout << std::setw(3) << (r.tap ? std::to_string(*r.tap) : "-") << "  " << std::setw(8) << std::setprecision(3) << r.hv_kv
              << "  " << std::setw(9) << std::setprecision(4) << r.ratio << "  " << std::setw(9) << r.low << "  " << std::setw(9)
              << r.high << "\n";
  std::cout << "\nSource: " << kTurnsRatioSource << ".\n"
            << "Taps are numbered so that position 1 gives the highest HV voltage; check the nameplate.\n"
            << "Test only a de-energised unit, isolated and earthed; test voltages are hazardous.\n"
            << report::one_line_caution() << "\n";
  return kOk;
}

}  // namespace ferrum::app
