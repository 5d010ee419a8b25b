// Excitation (magnetising) current of a three-phase core-form unit, per
// phase at one test voltage and tap: the expected pattern is two similar
// outer phases (A and C) both higher than the middle phase (B), whose
// magnetic path is shorter; and the change against an earlier test at the
// same voltage and tap.
// Source: IEEE C57.152 excitation current test (pattern from memory; verify).
// ferrum's own reading (no published tolerance known to the team): outer
// phases "similar" when they differ by at most 10 % of the larger.
// Units: current in mA, changes in %.
// Not valid for shell-form or single-phase units, nor for readings at
// different test voltages; a residual magnetism after DC tests can distort
// the pattern (demagnetise first).
#pragma once

#include <optional>

namespace ferrum::analytics::electrical {

inline constexpr double kOuterPhasesSimilarPct = 10.0;  // ferrum's own reading, no published source
inline constexpr const char* kExcitationSource =
    "IEEE C57.152 excitation current pattern (from memory; verify); similar = within 10 %: ferrum's own";

struct ExcitationPattern {
  double outer_difference_pct = 0;  // |A − C| / max(A, C)·100
  bool outer_similar = true;
  bool middle_lowest = true;
  bool expected = true;  // outer_similar && middle_lowest
};

// REQUIRES: currents > 0.
ExcitationPattern check_excitation_pattern(double a_ma, double b_ma, double c_ma);

// (now − before)/before·100; nullopt when before ≤ 0.
std::optional<double> excitation_change_pct(double now_ma, double before_ma);

}  // namespace ferrum::analytics::electrical
