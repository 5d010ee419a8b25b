#include "analytics/ageing_rate.h"

#include <gtest/gtest.h>

#include <utility>

namespace ferrum::analytics {
namespace {

// IEC 60076-7:2005 eq. (2): V = 1 at 98 °C, doubling every 6 K; check values
// computed by hand from the equations.
TEST(AgeingRate, IecKraftReferenceAndDoubling) {
  EXPECT_DOUBLE_EQ(iec_ageing_rate_kraft(98), 1.0);
  EXPECT_DOUBLE_EQ(iec_ageing_rate_kraft(104), 2.0);
  EXPECT_DOUBLE_EQ(iec_ageing_rate_kraft(92), 0.5);
  EXPECT_DOUBLE_EQ(iec_ageing_rate_kraft(110), 4.0);
  EXPECT_DOUBLE_EQ(iec_ageing_rate_kraft(80), 0.125);
  EXPECT_DOUBLE_EQ(iec_ageing_rate_kraft(122), 16.0);
  EXPECT_DOUBLE_EQ(iec_ageing_rate_kraft(140), 128.0);
  for (double t = 60; t < 160; t += 7.3)
    EXPECT_NEAR(iec_ageing_rate_kraft(t + 6) / iec_ageing_rate_kraft(t), 2.0, 1e-12);
}

// Check (computed from IEC 60076-7:2005 §8.2): K = 1.3 ONAF gives θh = 131.98 °C and
// V = 50.7; K = 1.5 gives 157.16 °C and V = 929. The unrounded temperatures
// are used because V doubles every 6 K (157.2 would give 934).
TEST(AgeingRate, IecKraftOverloadCheckValues) {
  EXPECT_NEAR(iec_ageing_rate_kraft(131.98), 50.7, 0.1);
  EXPECT_NEAR(iec_ageing_rate_kraft(157.16), 929, 1);
}

// IEEE C57.91-2011 eq. for F_AA: 1 at 110 °C; check values computed by hand.
TEST(AgeingRate, IeeeAgeingAccelerationFactor) {
  EXPECT_NEAR(ageing_acceleration_factor(110), 1.0, 1e-12);
  EXPECT_NEAR(ageing_acceleration_factor(80), 0.0358, 0.0005);
  EXPECT_NEAR(ageing_acceleration_factor(98), 0.282, 0.001);
  EXPECT_NEAR(ageing_acceleration_factor(120), 2.709, 0.002);
  EXPECT_NEAR(ageing_acceleration_factor(130), 6.98, 0.01);
  EXPECT_NEAR(ageing_acceleration_factor(140), 17.2, 0.1);
  EXPECT_NEAR(ageing_acceleration_factor(160), 92.1, 0.2);
}

TEST(AgeingRate, PaperTypeSelectsRelation) {
  EXPECT_DOUBLE_EQ(ageing_rate(PaperType::kraft, 98), 1.0);
  EXPECT_NEAR(ageing_rate(PaperType::upgraded, 110), 1.0, 1e-12);
  EXPECT_NE(ageing_rate_source(PaperType::kraft), ageing_rate_source(PaperType::upgraded));
}

// IEEE C57.91 clause 5 (computed): 24 h at 120 °C = 65.0
// equivalent hours = 0.0361 % of 180 000 h (Table 1, from memory).
TEST(AgeingRate, LossOfLifeOverADay) {
  const auto s = summarise_ageing(24, 24 * ageing_acceleration_factor(120), 180000);
  EXPECT_NEAR(s.loss_of_life_h, 65.0, 0.05);
  EXPECT_NEAR(s.loss_of_life_pct, 0.0361, 0.0001);
  EXPECT_NEAR(s.equivalent_factor, 2.709, 0.002);
  // IEC: 24 h at a constant 110 °C on non-upgraded paper = 96 h (computed).
  EXPECT_DOUBLE_EQ(summarise_ageing(24, 24 * iec_ageing_rate_kraft(110), 180000).loss_of_life_h, 96.0);
  EXPECT_EQ(summarise_ageing(0, 0, 180000).equivalent_factor, 0);
}

// The mean rate over a linear hot-spot ramp equals the integral of the
// rate equations (IEC 60076-7:2005 eq. 2 and 3, integrated numerically here
// with 100 000 midpoints): exact for kraft over any ramp; for upgraded paper
// (ln V not linear in θ) within 0.5 % over 10 K, about the largest move of
// the hot-spot between the thermal kernel's nodes (a step 0.6 -> 1.3 pu on
// ONAF), and visibly off over 20 K.
TEST(AgeingRate, MeanOverALinearRampIsTheIntegral) {
  for (auto paper : {PaperType::kraft, PaperType::upgraded}) {
    const bool kraft = paper == PaperType::kraft;
    for (auto [t0, t1] : {std::pair{90.0, kraft ? 110.0 : 100.0}, std::pair{120.0, kraft ? 100.0 : 110.0},
                          std::pair{98.0, 98.0 + 1e-9}}) {
      constexpr int n = 100000;
      double sum = 0;
      for (int i = 0; i < n; ++i) sum += ageing_rate(paper, t0 + (t1 - t0) * (i + 0.5) / n);
      const double expected = sum / n;
      const double got = mean_ageing_rate(paper, t0, ageing_rate(paper, t0), t1, ageing_rate(paper, t1));
      EXPECT_NEAR(got / expected, 1.0, kraft ? 1e-8 : 5e-3) << t0 << " -> " << t1;
    }
  }
  const double v0 = ageing_rate(PaperType::upgraded, 90), v1 = ageing_rate(PaperType::upgraded, 110);
  EXPECT_GT(std::abs(mean_ageing_rate(PaperType::upgraded, 90, v0, 110, v1) / ((v0 + v1) / 2) - 1), 0.1);
}

}  // namespace
}  // namespace ferrum::analytics
