// The unit report: one PDF per transformer, rendered from its assessment
// document (analytics/assessment.h). It computes nothing; it lays out what
// the assessment says, with the sources behind it and the safety cautions on
// the first and last page.
//
// Sections (each with a bookmark): Summary, Dissolved gases, Oil quality and
// paper, Loading and heat, Infrared and inspection, Health index explained,
// Sources, methods and assumptions, SAFETY.
#pragma once

#include <string>
#include <vector>

#include "analytics/assessment.h"
#include "report/render_error.h"
#include "report/report_options.h"

namespace ferrum::report {

// One file behind a report, as imported.
struct SourceFile {
  std::string party;        // contractor or department that delivered it
  std::string file_name;
  std::string kind;         // "oil-lab", "infrared", "inspection", "load", "units"
  std::string imported_at;  // as printed, e.g. "2026-11-28 09:14 UTC"
  long rows = 0;
};

// Renders to `path` atomically (temp file, then rename). `previous` is the
// previous report's assessment of the same unit, or nullptr.
// Throws RenderError on failure (libharu code in the message).
void render_unit_report(const analytics::UnitAssessment& current, const analytics::UnitAssessment* previous,
                        const std::vector<SourceFile>& files, const ReportOptions& options,
                        const std::string& path);

}  // namespace ferrum::report
