// Health-index factors from the electrical field tests: one factor per test
// (insulation power factor, turns ratio, leakage reactance, winding
// resistance, bushings, insulation resistance), each rated A..E (HIF 4..0)
// from the worst result of its latest test. Weights, cuts and their sources
// are data: analytics/data/health_index_electrical.csv (compiled in).
// Pure. The factors join the index in analytics/health_index.cpp.
#pragma once

#include <array>
#include <optional>
#include <string>
#include <string_view>
#include <vector>

#include "analytics/assessment.h"

namespace ferrum::analytics {

struct ElectricalFactorSpec {
  std::string name;               // "turns_ratio", ...
  double weight = 0;              // K_j
  std::array<double, 4> cuts{};   // measure <= cut: A, B, C, D; else E
  std::string source;
};

// Detail of every electrical factor of a unit without electrical tests.
inline constexpr const char* kNoElectricalTests = "no electrical tests";

// The factors of the standard table in force (analytics/data/
// health_index_electrical.csv, or the site's verified copy: standard_tables.h).
std::vector<ElectricalFactorSpec> default_electrical_factors();

struct ElectricalFactorScore {
  std::string name;
  double weight = 0;
  std::optional<int> hif;  // 0..4; null when the unit has no such result
  std::string detail;
  std::string source;
};

// HIF from a measure (multiple of the check's limit) and cuts.
int electrical_hif(double measure, const std::array<double, 4>& cuts);

std::vector<ElectricalFactorScore> score_electrical_factors(const std::vector<ElectricalFactorSpec>& specs,
                                                            const UnitAssessment& a);

}  // namespace ferrum::analytics
