// The heading of the first page, shared by every ferrum PDF: a small accent
// line (utility and document kind), the date on the right, and the title.
#pragma once

#include <string>

#include "report/page_flow.h"
#include "report/report_options.h"

namespace ferrum::report {

void draw_title_block(PageFlow& flow, const ReportOptions& options, const std::string& kind,
                      const std::string& title, const std::string& right_note);

}  // namespace ferrum::report
