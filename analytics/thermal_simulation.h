// Runs a thermal model (IEC 60076-7 difference equations or IEEE C57.91
// clause 7 exponentials) through a measured load series, with explicit
// handling of gaps, duplicated timestamps and clock jumps, and integrates
// insulation ageing along the way.
//
// Sources: see iec60076_7_difference.h, ieee_c57_91_clause7.h, ageing_rate.h.
// Gap handling is ferrum's own convention (no published source), stated here:
// * a point whose timestamp is not later than the last accepted one
//   (duplicate, or clock stepped back) is dropped and counted;
// * a point with a missing or negative load is dropped and counted;
// * an interval up to max_bridge_s is simulated: the missing part (beyond one
//   expected interval) at the last known load and ambient, then the last
//   interval at the new point's values; the missing part counts as bridged;
// * a longer interval restarts the model from steady state at the new point
//   and is neither covered nor bridged;
// * a missing ambient takes the month's value of the ambient profile.
// Loads are held constant over the interval that ends at their timestamp.
// Ageing ∫V dt is integrated between nodes at most the standard's largest
// step apart by the logarithmic mean of V (mean_ageing_rate in ageing_rate.h;
// ferrum's rule, exact for a hot-spot moving linearly between nodes).
//
// Units: timestamps UTC s, load per unit, temperatures °C, durations h.
// The kernel does not allocate: it writes into a caller-provided span.
#pragma once

#include <array>
#include <cmath>
#include <limits>
#include <span>
#include <string>
#include <vector>

#include "analytics/calendar.h"
#include "analytics/iec60076_7_difference.h"
#include "analytics/ieee_c57_91_clause7.h"
#include "analytics/unit_data.h"

namespace ferrum::analytics {

enum class ThermalMethod { iec60076_7, ieee_c57_91 };

const char* to_string(ThermalMethod m);

// One computed point; `ferrum thermal --csv` writes these.
struct ThermalPoint {
  Timestamp t = 0;
  double load_pu = 0;
  double ambient_c = 0;      // used by the model (measured or from the profile)
  double top_oil_c = 0;
  double hot_spot_c = 0;
  double ageing_rate = 0;    // V or F_AA at this point, by paper type
  double measured_top_oil_c = std::numeric_limits<double>::quiet_NaN();  // NaN when none
  double step_h = 0;         // time this point stands for (0 at a start or restart)
  double bridged_h = 0;      // part of step_h simulated without data (a gap)
  double ageing_h = 0;       // equivalent hours consumed over step_h (∫V dt)
  bool ambient_from_profile = false;
};

// The resolved model of one unit.
struct ThermalModel {
  ThermalMethod method = ThermalMethod::iec60076_7;
  IecThermalParameters iec;
  IeeeThermalParameters ieee;
  PaperType paper = PaperType::kraft;
  std::vector<std::string> parameter_sources;  // "x = 0.8 (IEC 60076-7:2005 Table 5, ONAF)", ...
  std::vector<std::string> defaulted;          // parameters not from the register
  bool cooling_known = true;
};

ThermalModel resolve_thermal_model(const UnitInfo& unit, ThermalMethod method);

// Default monthly ambient, °C, January first. Common practice, no published
// source: a temperate northern-hemisphere profile whose yearly mean is 20 °C,
// the reference ambient of IEC 60076-7 loading calculations.
inline constexpr std::array<double, 12> kDefaultAmbientProfile = {11, 12, 15, 19, 23, 27,
                                                                  30, 29, 25, 21, 16, 12};

struct GapOptions {
  // Expected sampling interval, s; 0 = inferred as the median of the first
  // (up to 63) positive intervals.
  Timestamp expected_interval_s = 0;
  // Longest interval bridged by holding the last values; longer ones restart
  // the model. Default 6 h: longer than the top-oil time constants, so a
  // restart from steady state loses little.
  Timestamp max_bridge_s = 6 * 3600;
  // Monthly ambient used where a point has none, °C, January first.
  std::array<double, 12> ambient_profile = kDefaultAmbientProfile;
};

struct SimulationStats {
  std::size_t written = 0;             // points written to the output span
  double covered_h = 0;                // time simulated, bridged time included
  double bridged_h = 0;                // time simulated without data
  double unbridged_h = 0;              // gaps too long to bridge (model restarted)
  std::size_t restarts = 0;
  std::size_t duplicates = 0;          // same timestamp as the previous point
  std::size_t backward_jumps = 0;      // earlier than the previous point
  std::size_t invalid_loads = 0;       // missing or negative load
  std::size_t ambient_from_profile = 0;  // points whose ambient came from the profile
  double loss_of_life_h = 0;           // Σ V·Δt, equivalent hours at the reference temperature
  Timestamp expected_interval_s = 0;   // given or inferred
};

// REQUIRES: out.size() >= load.size(). Points are expected sorted by time;
// anything else is handled as the rules above say.
SimulationStats simulate_thermal(const ThermalModel& model, std::span<const LoadPoint> load,
                                 const GapOptions& gaps, std::span<ThermalPoint> out);

// Where a simulation stopped: the model's state after its last accepted
// point and the counts so far, so that a later run goes on exactly as if the
// series had continued (the same numbers, bit for bit). The load history's
// retention keeps this in place of the raw points it removes.
struct SimulationResume {
  bool started = false;        // false: nothing simulated yet
  ThermalMethod method = ThermalMethod::iec60076_7;  // whose state this is (another method starts afresh)
  Timestamp last_t = 0;        // last accepted point
  double last_load_pu = 0, last_ambient_c = 0;
  IecThermalState iec;
  IeeeThermalState ieee;
  double ambient_c = 20;       // the model's ambient
  double ageing_rate = 0;      // V or F_AA at the last hot spot
  SimulationStats stats;       // of everything simulated so far (written: points written)
};

// The same, going on from `resume` (when started) and leaving there the
// state after the last point. The stats returned are the totals.
SimulationStats simulate_thermal(const ThermalModel& model, std::span<const LoadPoint> load,
                                 const GapOptions& gaps, std::span<ThermalPoint> out, SimulationResume& resume);

}  // namespace ferrum::analytics
