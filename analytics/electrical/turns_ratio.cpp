#include "analytics/electrical/turns_ratio.h"

#include <cctype>
#include <cmath>

namespace ferrum::analytics::electrical {

namespace {

// Reads one winding letter (and an optional neutral 'n'/'N') at text[pos].
std::optional<Winding> read_winding(std::string_view text, std::size_t& pos, bool upper) {
  if (pos >= text.size()) return std::nullopt;
  const char c = text[pos];
  const char want_d = upper ? 'D' : 'd', want_y = upper ? 'Y' : 'y', want_z = upper ? 'Z' : 'z';
  std::optional<Winding> w;
  if (c == want_d) w = Winding::delta;
  else if (c == want_y) w = Winding::star;
  else if (c == want_z) w = Winding::zigzag;
  else return std::nullopt;
  ++pos;
  if (*w != Winding::delta && pos < text.size() && (text[pos] == 'n' || text[pos] == 'N')) ++pos;
  return w;
}

}  // namespace

std::optional<VectorGroup> parse_vector_group(std::string_view text) {
  if (text == "1ph" || text == "Ii0" || text == "Ii6") return VectorGroup{Winding::single_phase, Winding::single_phase, 0};
  std::size_t pos = 0;
  const auto hv = read_winding(text, pos, true);
  if (!hv) return std::nullopt;
  const auto lv = read_winding(text, pos, false);
  if (!lv) return std::nullopt;
  if (pos >= text.size() || text.size() - pos > 2) return std::nullopt;
  int clock = 0;
  for (; pos < text.size(); ++pos) {
    if (!std::isdigit(static_cast<unsigned char>(text[pos]))) return std::nullopt;
    clock = clock * 10 + (text[pos] - '0');
  }
  if (clock > 11) return std::nullopt;
  return VectorGroup{*hv, *lv, clock};
}

double hv_kv_at_tap(double hv_kv, const std::optional<TapChanger>& taps, std::optional<int> tap) {
  if (!taps || !tap) return hv_kv;
  return hv_kv * (1.0 + (taps->nominal - *tap) * taps->step_pct / 100.0);
}

ExpectedRatio expected_phase_ratio(double hv_kv, double lv_kv, const VectorGroup& group) {
  if (group.hv == Winding::zigzag || group.lv == Winding::zigzag)
    return {std::nullopt, "zigzag windings: the phase ratio depends on the winding split, not handled"};
  const double line_ratio = hv_kv / lv_kv;
  const double root3 = std::sqrt(3.0);
  if (group.hv == Winding::delta && group.lv == Winding::star) return {line_ratio * root3, {}};
  if (group.hv == Winding::star && group.lv == Winding::delta) return {line_ratio / root3, {}};
  return {line_ratio, {}};
}

RatioCheck check_ratio(double measured, double nameplate, double limit_pct) {
  RatioCheck c;
  c.measured = measured;
  c.nameplate = nameplate;
  c.deviation_pct = (measured - nameplate) / nameplate * 100.0;
  c.within_limit = std::fabs(c.deviation_pct) <= limit_pct;
  return c;
}

RatioTable ratio_table(double hv_kv, double lv_kv, const VectorGroup& group,
                       const std::optional<TapChanger>& taps, std::optional<int> only_tap,
                       double limit_pct) {
  RatioTable table;
  auto add = [&](std::optional<int> tap) {
    const double hv = hv_kv_at_tap(hv_kv, taps, tap);
    const auto r = expected_phase_ratio(hv, lv_kv, group);
    if (!r.ratio) {
      table.why = r.why;
      return false;
    }
    table.rows.push_back({tap, hv, *r.ratio, *r.ratio * (1 - limit_pct / 100), *r.ratio * (1 + limit_pct / 100)});
    return true;
  };
  if (only_tap || !taps) {
    add(only_tap);
  } else {
    for (int tap = 1; tap <= taps->positions; ++tap)
      if (!add(tap)) break;
  }
  if (!table.why.empty()) table.rows.clear();
  return table;
}

}  // namespace ferrum::analytics::electrical
