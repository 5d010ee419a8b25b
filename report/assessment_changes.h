// "What changed since the previous report": plain sentences comparing two
// assessments of the same unit. Compares only what the assessments already
// say (index, band, conditions, data dates, actions); computes no diagnosis.
#pragma once

#include <string>
#include <vector>

#include "analytics/assessment.h"

namespace ferrum::report {

// One sentence per change, most important first. With no previous
// assessment: a single sentence saying there is nothing to compare with.
std::vector<std::string> describe_changes(const analytics::UnitAssessment& current,
                                          const analytics::UnitAssessment* previous);

}  // namespace ferrum::report
