// Turns ratio of a power transformer: the ratio a turns-ratio test set reads
// per phase, expected from the nameplate voltages, the vector group and the
// tap position, and the deviation of a measured ratio from it.
//
// Method: the test set energises one HV phase winding and reads the voltage
// of the LV winding on the same limb, so it reads the ratio of phase-winding
// voltages, not of line voltages:
//   Dy (e.g. Dyn11):  √3·U_HV / U_LV   (HV winding sees the line voltage,
//                                         LV winding the phase voltage)
//   Yd, YNd:          U_HV / (√3·U_LV)
//   Yy, Dd, single-phase: U_HV / U_LV
// Zigzag windings are not handled (the result says so).
// Tap position: U_HV(tap) = U_HV·(1 + (tap_nominal − tap)·tap_step_pct/100),
// i.e. ferrum numbers taps so that position 1 gives the highest HV voltage
// (a common convention, not a universal one: stated in schema/drop-files.md).
//
// Sources:
// * Ratio tolerance ±0.5 % of the nameplate (declared) voltage ratio:
//   IEEE C57.12.00 (ratio tolerance clause; edition and clause number from
//   memory, verify) and IEEE C57.152 (field test guide, turns ratio test;
//   from memory, verify).
// * The √3 factors follow from the winding connections (circuit theory).
//
// Units: voltages in kV (line to line), step in % of U_HV per position,
// ratios dimensionless, deviation in %.
// Valid for two-winding units (each HV/LV pair of a three-winding unit is a
// two-winding pair); REQUIRES lv_kv > 0, hv_kv > 0.
#pragma once

#include <optional>
#include <string>
#include <string_view>
#include <vector>

namespace ferrum::analytics::electrical {

// Connection of the HV and LV windings as read from a vector group.
enum class Winding { delta, star, zigzag, single_phase };

struct VectorGroup {
  Winding hv = Winding::star;
  Winding lv = Winding::star;
  int clock = 0;  // phase displacement in hours (not needed for the ratio)
};

// Parses "Dyn11", "YNd1", "Yy0", "Dd0", "YNyn0", "Yzn11", "Ii0" or "1ph"
// (single-phase). std::nullopt when the text is not a vector group.
std::optional<VectorGroup> parse_vector_group(std::string_view text);

struct TapChanger {
  int positions = 1;        // number of positions
  int nominal = 1;          // the position giving the nameplate HV voltage
  double step_pct = 0;      // HV voltage change per position, % of U_HV
};

// HV line voltage at a tap position (kV). Without a tap changer (or tap
// nullopt) the nameplate U_HV.
double hv_kv_at_tap(double hv_kv, const std::optional<TapChanger>& taps, std::optional<int> tap);

// Expected phase ratio; nullopt (with `why`) for zigzag windings.
struct ExpectedRatio {
  std::optional<double> ratio;
  std::string why;  // empty when ratio is set
};
ExpectedRatio expected_phase_ratio(double hv_kv, double lv_kv, const VectorGroup& group);

inline constexpr double kRatioLimitPct = 0.5;  // IEEE C57.12.00, ±0.5 % (from memory; verify)
inline constexpr const char* kTurnsRatioSource =
    "IEEE C57.12.00 ratio tolerance ±0.5 %; IEEE C57.152 turns ratio test (from memory; verify)";

struct RatioCheck {
  double measured = 0;
  double nameplate = 0;
  double deviation_pct = 0;  // (measured − nameplate)/nameplate·100
  bool within_limit = true;  // |deviation| ≤ limit
};
RatioCheck check_ratio(double measured, double nameplate, double limit_pct = kRatioLimitPct);

// The expected phase ratio at each tap (one row without a tap changer, or
// only `only_tap` when given), with the band a reading may lie in.
struct RatioTableRow {
  std::optional<int> tap;
  double hv_kv = 0;
  double ratio = 0;
  double low = 0;   // ratio·(1 − limit/100)
  double high = 0;  // ratio·(1 + limit/100)
};
struct RatioTable {
  std::vector<RatioTableRow> rows;
  std::string why;  // set (and rows empty) when the ratio cannot be computed
};
// REQUIRES: hv_kv > 0, lv_kv > 0; taps->positions ≥ 1.
RatioTable ratio_table(double hv_kv, double lv_kv, const VectorGroup& group,
                       const std::optional<TapChanger>& taps, std::optional<int> only_tap,
                       double limit_pct = kRatioLimitPct);

}  // namespace ferrum::analytics::electrical
