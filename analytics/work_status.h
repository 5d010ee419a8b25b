// Planners close the loop (issue #16): a unit's actions after the planners'
// work-status rows (the work_status drop kind) are applied.
//
// Method: ferrum's own bookkeeping, no published source. Each action is
// matched by its reference "<unit id>/<need>" (action_reference); of a
// reference's rows the latest by date counts (rows arrive sorted by date,
// UnitData::work_status; on the same date the later row counts).
//  * booked: the action stays on the list with status "booked", its
//    work_date the booking date, and is not overdue (the planner has it in
//    hand); its due date is kept.
//  * done: the work was carried out on that date; the action leaves the
//    list, unless its evidence is newer than that date (Action::found >
//    done date): then the finding was made after the work and the action
//    stays open, its work_note saying so.
//  * cancelled: the planner decided not to do the work; the action leaves
//    the list by the same rule as done, so newer evidence raises it again.
//    The tool advises; a qualified engineer decides, and a cancellation is
//    that decision.
// Actions that leave the list are returned in `closed` (status "done" or
// "cancelled", work_date and work_note from the row), so that reports and
// receipts can still name them. An action without a reference gets
// action_reference(unit_id, need) here; an action without a need key (a
// producer that sets none) gets fallback_need(text) as its need. Inputs: dates as Day (days since
// 1970-01-01). Pure.
#pragma once

#include <string>
#include <vector>

#include "analytics/assessment.h"
#include "analytics/unit_data.h"

namespace ferrum::analytics {

// Applies `rows` (sorted by date) to `actions` of unit `unit_id`; the
// actions that leave the list are appended to `closed`.
void apply_work_status(const std::vector<WorkStatus>& rows, const std::string& unit_id, std::vector<Action>& actions,
                       std::vector<Action>& closed);

// The text in lower case, runs of other characters as one '-', at most 48
// characters: "Take an oil sample" -> "take-an-oil-sample".
std::string fallback_need(const std::string& text);

// The latest row of `reference` in `rows` (sorted by date), or nullptr.
const WorkStatus* latest_work_status(const std::vector<WorkStatus>& rows, const std::string& reference);

}  // namespace ferrum::analytics
