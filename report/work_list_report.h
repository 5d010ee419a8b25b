// The fleet work list (analytics/work_list.h) laid out: CSV for
// `ferrum worklist --csv`, plain text for the terminal, and the PDF section
// of the fleet report and of the weekly cover. Computes nothing.
#pragma once

#include <string>
#include <vector>

#include "analytics/work_list.h"
#include "report/page_flow.h"

namespace ferrum::report {

// Header row first, RFC 4180 quoting, "\n" line ends; dates YYYY-MM-DD,
// absent dates empty; overdue and outage "yes"/"no".
std::string work_list_csv(const std::vector<analytics::WorkListRow>& rows);

// One line per row, for a terminal.
std::string work_list_text(const std::vector<analytics::WorkListRow>& rows, analytics::Day as_of);

// "Work list": every open action, due first, with found, due (overdue or
// booked date), outage, crew, unit, site, reference and text. At most
// `max_rows` rows (0: all); a note says how many more the CSV holds.
void work_list_section(PageFlow& flow, const std::vector<analytics::WorkListRow>& rows, analytics::Day as_of,
                       std::size_t max_rows = 0);

}  // namespace ferrum::report
