// Checks of the IEC 60076-7 difference-equation model.
#include "analytics/iec60076_7_difference.h"

#include <gtest/gtest.h>

#include <algorithm>
#include <cmath>
#include <utility>

namespace ferrum::analytics {
namespace {

IecThermalParameters table(IecCoolingClass c) { return iec_recommended_parameters(c); }

// Runs the difference equations for `minutes` at constant load with step dt.
IecThermalState run(const IecThermalParameters& p, IecThermalState s, double k, double amb, double minutes,
                    double dt) {
  for (double t = 0; t < minutes - 1e-9; t += dt) iec_step(p, k, amb, dt, s);
  return s;
}

// Steady state at K = 1, θa = 20 °C gives θh = 98 °C in every column:
// θa + Δθor + H·gr = 98 °C (IEC 60076-7:2005 Table 5 rated rows, from
// memory; check values computed by hand).
TEST(Iec60076_7Difference, RatedLoadGives98InEveryColumn) {
  const double top_oil[] = {75, 72, 72, 76, 69};  // computed
  for (int c = 0; c < 5; ++c) {
    const auto p = table(static_cast<IecCoolingClass>(c));
    const auto s = iec_steady_state(p, 1.0, 20.0);
    EXPECT_NEAR(s.top_oil_c, top_oil[c], 1e-9) << c;
    EXPECT_NEAR(s.hot_spot_c(), 98.0, 1e-9) << c;
  }
}

// K = 1.3 check values, computed from IEC 60076-7 §8.2 closed form.
TEST(Iec60076_7Difference, OverloadSteadyStateCheckValues) {
  EXPECT_NEAR(iec_steady_state(table(IecCoolingClass::onaf), 1.3, 20).hot_spot_c(), 132.0, 0.05);
  EXPECT_NEAR(iec_steady_state(table(IecCoolingClass::onaf), 1.3, 20).top_oil_c, 95.4, 0.05);
  EXPECT_NEAR(iec_steady_state(table(IecCoolingClass::onan), 1.3, 20).hot_spot_c(), 132.0, 0.05);
  EXPECT_NEAR(iec_steady_state(table(IecCoolingClass::onan_distribution), 1.3, 20).hot_spot_c(), 134.1, 0.05);
  EXPECT_NEAR(iec_steady_state(table(IecCoolingClass::of), 1.3, 20).hot_spot_c(), 140.1, 0.05);
  EXPECT_NEAR(iec_steady_state(table(IecCoolingClass::od), 1.3, 20).hot_spot_c(), 147.0, 0.05);
  EXPECT_NEAR(iec_steady_state(table(IecCoolingClass::onaf), 1.5, 20).hot_spot_c(), 157.2, 0.05);
}

// The difference equations, run long enough from any start, settle on the
// closed-form steady state (IEC 60076-7 §8.2.3 vs §8.2.2, computed).
TEST(Iec60076_7Difference, DifferenceEquationsConvergeToClosedForm) {
  for (int c = 0; c < 5; ++c) {
    const auto p = table(static_cast<IecCoolingClass>(c));
    const auto start = iec_steady_state(p, 0.5, 10.0);
    const auto end = run(p, start, 1.3, 20.0, 48 * 60, 1.0);  // 16 k11·τo at most
    EXPECT_NEAR(end.top_oil_c, iec_steady_state(p, 1.3, 20).top_oil_c, 0.01) << c;
    EXPECT_NEAR(end.hot_spot_c(), iec_steady_state(p, 1.3, 20).hot_spot_c(), 0.01) << c;
  }
}

// Step load 0.7 -> 1.3 on ONAF: the difference equations follow the
// standard's exponential response (IEC 60076-7 §8.2.2 functions f1 and f2)
// with Table 5 time constants, within 0.3 K at a 0.5 min step.
TEST(Iec60076_7Difference, StepLoadFollowsExponentialResponse) {
  const auto p = table(IecCoolingClass::onaf);
  const double amb = 25;
  const auto before = iec_steady_state(p, 0.7, amb);
  const auto after = iec_steady_state(p, 1.3, amb);
  const double g0 = iec_steady_hot_spot_gradient(p, 0.7), g1 = iec_steady_hot_spot_gradient(p, 1.3);
  IecThermalState s = before;
  double t = 0;
  for (double check : {5.0, 15.0, 30.0, 60.0, 120.0, 300.0}) {
    s = run(p, s, 1.3, amb, check - t, 0.5);
    t = check;
    const double top = before.top_oil_c + (after.top_oil_c - before.top_oil_c) * iec_top_oil_step_response(p, t);
    const double grad = g0 + (g1 - g0) * iec_hot_spot_step_response(p, t);
    EXPECT_NEAR(s.top_oil_c, top, 0.3) << "t=" << t;
    EXPECT_NEAR(s.hot_spot_c() - s.top_oil_c, grad, 0.3) << "t=" << t;
  }
}

// ONAN/ONAF (k21 > 1): the hot-spot gradient overshoots its final value
// after a load increase, the behaviour the two-term expression exists for
// (IEC 60076-7 §8.2.2, f2 with k21 = 2).
TEST(Iec60076_7Difference, OnafHotSpotGradientOvershoots) {
  const auto p = table(IecCoolingClass::onaf);
  double peak = 0;
  for (double t = 0; t < 300; t += 1) peak = std::max(peak, iec_hot_spot_step_response(p, t));
  EXPECT_GT(peak, 1.2);
  EXPECT_NEAR(iec_hot_spot_step_response(p, 2000), 1.0, 1e-6);
  // OD (k21 = 1) has no overshoot.
  const auto od = table(IecCoolingClass::od);
  for (double t = 0; t < 300; t += 1) EXPECT_LE(iec_hot_spot_step_response(od, t), 1.0 + 1e-12);
}

// Half the smallest time constant, ONAF: min(75, 14, 75)/2 = 7 min (computed
// from Table 5 values).
TEST(Iec60076_7Difference, MaximumStep) {
  EXPECT_DOUBLE_EQ(iec_max_step_min(table(IecCoolingClass::onaf)), 7.0);
  EXPECT_DOUBLE_EQ(iec_max_step_min(table(IecCoolingClass::onan_distribution)), 4.0);
}


// n steps in one go (iec_steps) give the numbers of n single difference
// steps (IEC 60076-7:2005 §8.2.3 equations, iterated here), after a load
// increase and a decrease, at the largest step the standard allows.
TEST(Iec60076_7Difference, MultiStepEqualsRepeatedSteps) {
  for (int c = 0; c < 5; ++c) {
    const auto p = iec_recommended_parameters(static_cast<IecCoolingClass>(c));
    const double dt = iec_max_step_min(p) * 0.2;
    for (auto [k0, k1] : {std::pair{0.6, 1.3}, std::pair{1.4, 0.3}}) {
      const auto start = iec_steady_state(p, k0, 15.0);
      const auto targets = iec_step_targets(p, k1);
      const auto factors = iec_step_factors(p, dt);
      for (int n : {1, 2, 5, 43}) {
        IecThermalState one_by_one = start, at_once = start;
        for (int i = 0; i < n; ++i) iec_step(p, targets, factors, 25.0, one_by_one);
        iec_steps(p, targets, iec_step_decay(factors, n), 25.0, at_once);
        EXPECT_NEAR(at_once.top_oil_c, one_by_one.top_oil_c, 1e-9) << c << " n=" << n;
        EXPECT_NEAR(at_once.hot_spot_c(), one_by_one.hot_spot_c(), 1e-9) << c << " n=" << n;
      }
    }
  }
}

// The steady terms are evaluated as exp(e·ln b) for speed; they must equal
// the standard's powers Δθ_or·((1 + K²R)/(1 + R))^x and Δθ_hr·K^y
// (IEC 60076-7:2005 §8.2.2) to far below any temperature resolution.
TEST(Iec60076_7Difference, SteadyTermsEqualTheStandardsPowers) {
  for (int c = 0; c < 5; ++c) {
    const auto p = iec_recommended_parameters(static_cast<IecCoolingClass>(c));
    for (double k : {0.0, 1e-6, 0.05, 0.37, 0.8, 1.0, 1.25, 1.5, 2.0, 3.0}) {
      const double rise = p.top_oil_rise_k * std::pow((1 + k * k * p.r) / (1 + p.r), p.x);
      const double grad = p.hot_spot_gradient_k * std::pow(k, p.y);
      EXPECT_NEAR(iec_steady_top_oil_rise(p, k), rise, 1e-12 * std::max(1.0, rise)) << c << " K=" << k;
      EXPECT_NEAR(iec_steady_hot_spot_gradient(p, k), grad, 1e-12 * std::max(1.0, grad)) << c << " K=" << k;
    }
  }
}

}  // namespace
}  // namespace ferrum::analytics
