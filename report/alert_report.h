// The alert document: one page telling who receives it which unit, what
// happened, when, and what to do first, with the safety cautions.
#pragma once

#include <string>

#include "report/render_error.h"
#include "report/report_options.h"

namespace ferrum::report {

struct AlertInfo {
  std::string unit_id, site;
  std::string kind;        // short name of the alert, e.g. "acetylene rising"
  std::string raised_at;   // as printed, e.g. "2026-11-30 06:10 UTC"
  std::string text;        // what happened, plain words
  std::string first_step;  // what to do first
};

// The alert's title in words, e.g. "Unsafe item found at inspection" for the
// kind "unsafe_inspection"; an unknown kind is spelled out with spaces. The
// kind itself stays in file names and in CSV/JSON keys.
std::string alert_title(const std::string& kind);

// Written atomically; throws RenderError.
void render_alert(const AlertInfo& alert, const ReportOptions& options, const std::string& path);

}  // namespace ferrum::report
