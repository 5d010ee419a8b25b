// The standard tables behind a unit report, said once: the sources page lists
// each table with its audit status and origin (embedded or the site's copy),
// and page 1 carries one line when any of them is unverified.
#pragma once

#include "analytics/assessment.h"
#include "report/page_flow.h"

namespace ferrum::report {

// "Standard tables behind this report" subsection of the sources page.
void standard_tables_subsection(PageFlow& flow, const analytics::UnitAssessment& a);

// The page-1 line; nothing when every table is checked or verified.
void unverified_tables_line(PageFlow& flow, const analytics::UnitAssessment& a);

}  // namespace ferrum::report
