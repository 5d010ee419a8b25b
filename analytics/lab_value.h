// One laboratory reading as delivered: not measured, a number, or "below the
// detection limit" (written `<5` or `ND` in a lab file). A value below the
// detection limit is never turned into zero silently: every method decides
// explicitly what it does with one.
#pragma once

#include <cmath>
#include <limits>

namespace ferrum::analytics {

struct LabValue {
  enum class State : unsigned char { missing, measured, below_limit };

  State state = State::missing;
  // The measured value; for below_limit the detection limit, or NaN when the
  // lab did not state one.
  double value = std::numeric_limits<double>::quiet_NaN();

  static LabValue measured(double v) { return {State::measured, v}; }
  static LabValue below(double limit = std::numeric_limits<double>::quiet_NaN()) {
    return {State::below_limit, limit};
  }

  bool is_measured() const { return state == State::measured; }
  bool is_below_limit() const { return state == State::below_limit; }
  // Measured, or reported below its detection limit: the test was done.
  bool present() const { return state != State::missing; }
  // For sums such as TDCG: the measured value, or 0 for a gas below its
  // detection limit. REQUIRES: present().
  double or_zero() const { return is_measured() ? value : 0.0; }
};

}  // namespace ferrum::analytics
