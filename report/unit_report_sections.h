// Internal to unit_report.cpp: one function per report section.
#pragma once

#include <vector>

#include "analytics/assessment.h"
#include "report/page_flow.h"
#include "report/unit_report.h"

namespace ferrum::report {

void summary_section(PageFlow& flow, const analytics::UnitAssessment& a, const analytics::UnitAssessment* previous,
                     const ReportOptions& options);
void gases_section(PageFlow& flow, const analytics::UnitAssessment& a);
void oil_paper_section(PageFlow& flow, const analytics::UnitAssessment& a);
void thermal_section(PageFlow& flow, const analytics::UnitAssessment& a);
void findings_section(PageFlow& flow, const analytics::UnitAssessment& a);
// Electrical field tests, with their own cautions (report/electrical_section.cpp).
void electrical_section(PageFlow& flow, const analytics::UnitAssessment& a);
void health_index_section(PageFlow& flow, const analytics::UnitAssessment& a);
void sources_section(PageFlow& flow, const analytics::UnitAssessment& a, const std::vector<SourceFile>& files,
                     const ReportOptions& options);

// A muted sentence saying that a section has no data.
void no_data_note(PageFlow& flow, const std::string& what);

}  // namespace ferrum::report
