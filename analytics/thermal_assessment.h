// Thermal, infrared and inspection part of a unit's assessment: runs the
// chosen hot-spot model over the load history, summarises loading and
// insulation ageing over the last `summary_days` before as_of, classifies the
// latest infrared survey, reviews inspections, and writes the findings,
// methods, assumptions, missing data and actions into the assessment.
//
// Methods and sources: iec60076_7_difference.h, ieee_c57_91_clause7.h,
// ageing_rate.h, load_indicators.h, infrared_severity.h,
// inspection_findings.h. Pure: no I/O, no clock.
#pragma once

#include <array>
#include <span>
#include <vector>

#include "analytics/ageing_rate.h"
#include "analytics/assessment.h"
#include "analytics/infrared_severity.h"
#include "analytics/inspection_findings.h"
#include "analytics/load_indicators.h"
#include "analytics/thermal_simulation.h"
#include "analytics/unit_data.h"

namespace ferrum::analytics {

struct ThermalOptions {
  ThermalMethod method = ThermalMethod::iec60076_7;  // per site or unit
  GapOptions gaps;               // expected interval, longest bridged gap, monthly ambient profile
  LoadingLimits limits;          // IEC 60076-7 hot-spot limits 120/140/160 °C, nameplate 1.0 p.u.
  InfraredOptions infrared;      // load-correction exponent 2 (1.6..2.0), low load below 40 %
  InspectionOptions inspection;  // interval 365 days
  int summary_days = 365;        // window before as_of summarised in the assessment
  double discrepancy_threshold_k = 5;  // mean measured-minus-model top oil above this: cooling problem
  // Mean measured-minus-model top oil above this ([analysis]
  // measured_top_oil_above_k): hot spot and ageing from the measured top oil
  // (IEC 60076-7:2018 §8.2.3: measured top oil may be the model's input).
  double measured_top_oil_above_k = 5;
  double normal_life_h = c57_91_normal_life_hours();  // IEEE C57.91-2011 Table 1, for % loss of life
  double min_growth_span_days = 365;   // shortest history for a load-growth trend
  std::size_t chart_points = 400;      // most points per reduced chart series
  // Days until an infrared repair is due, by severity 1..4 (NETA priority 4..1).
  std::array<int, 4> infrared_due_days = {365, 180, 30, 7};
  int cooling_check_due_days = 30;
  int worse_item_due_days = 90;          // an item rated worse than before: job due within at most this
  // Inspection findings become maintenance jobs, by rating fair, poor, very
  // poor, unsafe (common practice, no published source): at the next routine
  // maintenance, within a quarter, within a month, at once. Counted from the
  // inspection that last reported a fair item, and from the first of the
  // unbroken run of inspections that found a poor or worse item.
  std::array<int, 4> inspection_job_due_days = {365, 90, 30, 0};
  // Items whose repair needs the unit out of service (common practice, no
  // published source).
  std::vector<std::string> outage_items{"bushings",       "gaskets_and_leaks",      "on_load_tap_changer",
                                        "off_circuit_tap_changer", "buchholz_relay", "pressure_relief_device",
                                        "surge_arresters", "connectors_and_clamps"};
};

// Fills out.thermal, out.infrared, out.inspection, out.unsafe_inspection and
// appends to out.methods, out.assumptions, out.missing and out.actions
// (unsafe-item actions are inserted at the front).
void assess_thermal(const UnitData& data, Day as_of, const ThermalOptions& options, UnitAssessment& out);

// The full computed series for `ferrum thermal --csv`: one point per accepted
// load point (duplicates, backward jumps and invalid loads are left out).
std::vector<ThermalPoint> thermal_series(const UnitInfo& unit, std::span<const LoadPoint> load,
                                         const ThermalOptions& options);

// Chart reduction: the maximum of each bucket of whole days, with as many
// days per bucket as keep the result at or below max_points.
std::vector<SeriesPoint> reduce_to_bucket_maxima(std::span<const ThermalPoint> points, std::size_t max_points,
                                                 double ThermalPoint::*field);

}  // namespace ferrum::analytics
