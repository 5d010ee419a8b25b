#include "analytics/thermal_simulation.h"

#include <algorithm>
#include <array>
#include <cmath>
#include <cstdint>
#include <cstring>
#include <limits>

#include "analytics/ageing_rate.h"

namespace ferrum::analytics {
namespace {

constexpr std::size_t kIntervalSample = 63;
// The standard's limit (half the smallest time constant) keeps the forward
// difference stable, but at that step the ONAF hot-spot overshoot is off by
// almost 1 K; a fifth of it (a tenth of the time constant) keeps the error
// near 0.1 K and still needs a single step for one-minute data on most units.
constexpr double kStepFractionOfLimit = 0.2;

bool valid_load(double k) { return std::isfinite(k) && k >= 0; }

Timestamp infer_interval(std::span<const LoadPoint> load) {
  std::array<Timestamp, kIntervalSample> sample{};
  std::size_t n = 0;
  for (std::size_t i = 1; i < load.size() && n < sample.size(); ++i) {
    const Timestamp d = load[i].t - load[i - 1].t;
    if (d > 0) sample[n++] = d;
  }
  if (n == 0) return 60;
  std::nth_element(sample.begin(), sample.begin() + n / 2, sample.begin() + n);
  return sample[n / 2];
}

// The ageing integral ∫V dt of a sub-stepped interval is taken between
// nodes every kSubStepsPerNode sub-steps, i.e. at most the standard's
// largest step apart, by the logarithmic mean of V at the nodes (exact for a
// hot-spot that moves linearly between them; mean_ageing_rate). Evaluating
// V at every sub-step cost most of an hourly series (profiled,
// bench/results.md §2); nodes are 7 min apart on ONAF, and the sub-steps
// between them are taken in one go (iec_steps, the same numbers).
constexpr int kSubStepsPerNode = static_cast<int>(1.0 / kStepFractionOfLimit + 0.5);

// Thermal state of either model, advanced in place, with the ageing integral.
// Runs of equal loads and equal step lengths (the usual case: a fixed
// sampling interval) reuse the load terms and the step factors, and the
// ageing rate at the current hot-spot is kept for the output point, so a
// step costs two powers and one exp2 at most (profiled, bench/results.md §3).
class Integrator {
 public:
  explicit Integrator(const ThermalModel& m)
      : m_(m), max_step_min_(kStepFractionOfLimit * iec_max_step_min(m.iec)) {}

  void start(double k, double ambient) {
    if (m_.method == ThermalMethod::iec60076_7) {
      iec_ = iec_steady_state(m_.iec, k, ambient);
    } else {
      ieee_ = ieee_steady_state(m_.ieee, k);
    }
    ambient_ = ambient;
    rate_ = ageing_rate(m_.paper, hot_spot());
  }

  // Advances by dt_s at constant k and ambient; returns Σ V·Δt in hours.
  double advance(double k, double ambient, double dt_s) {
    ambient_ = ambient;
    const double dt_min = dt_s / 60.0;
    if (m_.method == ThermalMethod::ieee_c57_91) {
      // Exact exponential: one step, ageing on the end temperature.
      ieee_step(m_.ieee, k, dt_min, ieee_);
      rate_ = ageing_rate(m_.paper, hot_spot());
      return rate_ * dt_min / 60.0;
    }
    if (!(k == targets_k_)) {
      targets_ = targets_for(k);
      targets_k_ = k;
    }
    if (!(dt_min == steps_dt_min_)) plan_sub_steps(dt_min);
    double aged_h = 0;
    double theta0 = iec_.hot_spot_c(), v0 = rate_;
    for (int i = 0; i < nodes_; ++i) {
      const bool last = i + 1 == nodes_;
      if (sub_steps_ == 1) iec_step(m_.iec, targets_, factors_, ambient, iec_);
      else iec_steps(m_.iec, targets_, last ? last_decay_ : node_decay_, ambient, iec_);
      const double theta1 = iec_.hot_spot_c(), v1 = ageing_rate(m_.paper, theta1);
      aged_h += mean_ageing_rate(m_.paper, theta0, v0, theta1, v1) * (last ? last_node_h_ : node_h_);
      theta0 = theta1;
      v0 = v1;
    }
    rate_ = v0;
    return aged_h;
  }

  double top_oil() const {
    return m_.method == ThermalMethod::iec60076_7 ? iec_.top_oil_c : ambient_ + ieee_.top_oil_rise_k;
  }
  double hot_spot() const {
    return m_.method == ThermalMethod::iec60076_7 ? iec_.hot_spot_c()
                                                  : ambient_ + ieee_.top_oil_rise_k + ieee_.hot_spot_rise_k;
  }
  // Ageing rate (V or F_AA) at the current hot-spot.
  double rate() const { return rate_; }

  void save(SimulationResume& r) const {
    r.iec = iec_;
    r.ieee = ieee_;
    r.ambient_c = ambient_;
    r.ageing_rate = rate_;
  }
  void restore(const SimulationResume& r) {
    iec_ = r.iec;
    ieee_ = r.ieee;
    ambient_ = r.ambient_c;
    rate_ = r.ageing_rate;
  }

 private:
  // The load terms of a step (two powers) for load k, remembered by the exact
  // value of k in a small direct-mapped table: loads come as a meter or a
  // historian writes them, to a few decimals, so a year of one-minute steps
  // holds a few hundred distinct values and most steps find theirs here
  // (the same numbers, bit for bit). Unrounded loads miss and cost one
  // comparison more than before.
  IecStepTargets targets_for(double k) {
    std::uint64_t bits;
    std::memcpy(&bits, &k, sizeof bits);
    auto& e = memo_[((bits ^ (bits >> 29)) * 0x9E3779B97F4A7C15ULL) >> (64 - kMemoBits)];
    if (!(e.k == k)) {
      e.k = k;
      e.targets = iec_step_targets(m_.iec, k);
    }
    return e.targets;
  }

  // Sub-steps (see kStepFractionOfLimit) grouped into nodes of
  // kSubStepsPerNode, the last node taking the rest; each node is advanced
  // in one go (iec_steps).
  void plan_sub_steps(double dt_min) {
    sub_steps_ = std::max(1, static_cast<int>(std::ceil(dt_min / max_step_min_)));
    const double sub_step_min = dt_min / sub_steps_;
    factors_ = iec_step_factors(m_.iec, sub_step_min);
    nodes_ = (sub_steps_ + kSubStepsPerNode - 1) / kSubStepsPerNode;
    const int in_last = sub_steps_ - (nodes_ - 1) * kSubStepsPerNode;
    node_decay_ = iec_step_decay(factors_, kSubStepsPerNode);
    last_decay_ = iec_step_decay(factors_, in_last);
    node_h_ = kSubStepsPerNode * sub_step_min / 60.0;
    last_node_h_ = in_last * sub_step_min / 60.0;
    steps_dt_min_ = dt_min;
  }

  const ThermalModel& m_;
  double max_step_min_;
  IecThermalState iec_;
  IeeeThermalState ieee_;
  double ambient_ = 20;
  double rate_ = 0;
  // Caches of the last load and step length (NaN: none yet).
  double targets_k_ = std::numeric_limits<double>::quiet_NaN();
  IecStepTargets targets_;
  double steps_dt_min_ = std::numeric_limits<double>::quiet_NaN();
  int sub_steps_ = 1;
  int nodes_ = 1;
  IecStepFactors factors_;
  IecStepDecay node_decay_, last_decay_;
  static constexpr int kMemoBits = 10;
  struct Memo {
    double k = std::numeric_limits<double>::quiet_NaN();  // NaN: empty (equals nothing)
    IecStepTargets targets;
  };
  std::array<Memo, std::size_t{1} << kMemoBits> memo_{};
  double node_h_ = 0, last_node_h_ = 0;
};

double ambient_for(const LoadPoint& p, const GapOptions& g, bool& from_profile) {
  from_profile = !std::isfinite(p.ambient_c);
  if (!from_profile) return p.ambient_c;
  return g.ambient_profile[civil_from_days(day_of(p.t)).month - 1];
}

}  // namespace

const char* to_string(ThermalMethod m) {
  return m == ThermalMethod::iec60076_7 ? "IEC 60076-7 difference equations" : "IEEE C57.91 clause 7";
}

ThermalModel resolve_thermal_model(const UnitInfo& unit, ThermalMethod method) {
  ThermalModel m;
  m.method = method;
  m.paper = unit.paper;
  const auto iec = resolve_iec_parameters(unit);
  m.iec = iec.p;
  m.cooling_known = iec.cooling_known;
  m.defaulted = iec.defaulted;
  const auto ieee = resolve_ieee_parameters(iec);
  m.ieee = ieee.p;
  m.parameter_sources = method == ThermalMethod::iec60076_7 ? iec.sources : ieee.sources;
  return m;
}

SimulationStats simulate_thermal(const ThermalModel& model, std::span<const LoadPoint> load,
                                 const GapOptions& gaps, std::span<ThermalPoint> out) {
  SimulationResume fresh;
  return simulate_thermal(model, load, gaps, out, fresh);
}

SimulationStats simulate_thermal(const ThermalModel& model, std::span<const LoadPoint> load,
                                 const GapOptions& gaps, std::span<ThermalPoint> out, SimulationResume& resume) {
  SimulationStats st;
  Integrator model_state(model);
  bool started = resume.started && resume.method == model.method;
  Timestamp last_t = 0;
  double last_k = 0, last_amb = 0;
  if (started) {  // go on where an earlier run stopped, with its interval
    st = resume.stats;
    st.written = 0;
    model_state.restore(resume);
    last_t = resume.last_t;
    last_k = resume.last_load_pu;
    last_amb = resume.last_ambient_c;
  } else {
    st.expected_interval_s = gaps.expected_interval_s > 0 ? gaps.expected_interval_s : infer_interval(load);
  }
  const Timestamp expected = st.expected_interval_s;
  // An interval is a gap when more than half an interval is missing.
  const Timestamp gap_from = expected + expected / 2;

  for (const LoadPoint& p : load) {
    if (!valid_load(p.load_pu)) {
      ++st.invalid_loads;
      continue;
    }
    if (started && p.t <= last_t) {
      ++(p.t == last_t ? st.duplicates : st.backward_jumps);
      continue;
    }
    bool from_profile = false;
    const double amb = ambient_for(p, gaps, from_profile);
    st.ambient_from_profile += from_profile;
    double step_h = 0, bridged_h = 0, aged_h = 0;
    if (!started || p.t - last_t > gaps.max_bridge_s) {
      if (started) {
        st.unbridged_h += (p.t - last_t) / 3600.0;
        ++st.restarts;
      }
      model_state.start(p.load_pu, amb);
      started = true;
    } else {
      Timestamp dt = p.t - last_t;
      if (dt >= gap_from) {
        const Timestamp missing = dt - expected;
        bridged_h = missing / 3600.0;
        aged_h += model_state.advance(last_k, last_amb, static_cast<double>(missing));
        dt = expected;
      }
      aged_h += model_state.advance(p.load_pu, amb, static_cast<double>(dt));
      step_h = (p.t - last_t) / 3600.0;
    }
    st.covered_h += step_h;
    st.bridged_h += bridged_h;
    st.loss_of_life_h += aged_h;
    const double hs = model_state.hot_spot();
    out[st.written++] = ThermalPoint{p.t, p.load_pu, amb, model_state.top_oil(), hs, model_state.rate(),
                                     p.top_oil_c, step_h, bridged_h, aged_h, from_profile};
    last_t = p.t;
    last_k = p.load_pu;
    last_amb = amb;
  }
  if (started) {
    resume.started = true;
    resume.method = model.method;
    resume.last_t = last_t;
    resume.last_load_pu = last_k;
    resume.last_ambient_c = last_amb;
    model_state.save(resume);
    resume.stats = st;
  }
  return st;
}

}  // namespace ferrum::analytics
