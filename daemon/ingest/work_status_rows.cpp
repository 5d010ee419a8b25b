// Planners' work-status rows (issue #16).
#include "analytics/assessment.h"
#include "daemon/ingest/field_parsers.h"
#include "daemon/ingest/row_parsers.h"

namespace ferrum::ingest {

namespace {

constexpr std::string_view kStatuses[] = {"booked", "done", "cancelled"};

bool has_control_character(std::string_view text) {
  for (const char c : text)
    if (static_cast<unsigned char>(c) < 0x20 || c == 0x7f) return true;
  return false;
}

}  // namespace

bool WorkStatusRowParser::parse(std::span<const std::string_view> fields, std::int64_t line, WorkStatusRow& out) {
  out.line = line;
  out.status = analytics::WorkStatus{};
  analytics::WorkStatus& w = out.status;
  begin_row(fields, line);
  bool known = false;
  unit(column("unit_id"), known);
  out.unit_id = cell(column("unit_id"));

  const ColumnBinding& status = column("status");
  if (!required_text(status, "status").empty()) {
    const std::string name = to_snake_case(cell(status));
    for (std::string_view s : kStatuses)
      if (s == name) w.status = name;
    if (w.status.empty()) report(status, "status must be booked, done or cancelled");
  }

  // A booking lies ahead; work done or cancelled does not.
  const ColumnBinding& date = column("date");
  const std::string_view date_text = cell(date);
  if (date_text.empty()) {
    report(date, date.header_name + " is missing");
  } else if (const Parsed<analytics::Day> d = parse_date(date_text, options_.date_order); !d.ok()) {
    report(date, d.error);
  } else if (w.status != "booked" && in_future(d.value)) {
    report(date, "date " + std::string(date_text) + " is in the future: only a booking may lie ahead");
  } else {
    w.date = d.value;
  }

  const ColumnBinding& action = column("action");
  const std::string_view ref = required_text(action, "action");
  if (!ref.empty()) {
    const std::size_t slash = ref.find('/');
    const std::string_view ref_unit = slash == std::string_view::npos ? out.unit_id : ref.substr(0, slash);
    const std::string_view need = slash == std::string_view::npos ? ref : ref.substr(slash + 1);
    if (has_control_character(ref)) {
      report(action, "the action reference holds a control character");
    } else if (need.empty()) {
      report(action, "the action reference names no action: write UNIT/need, e.g. " +
                         (out.unit_id.empty() ? std::string("T1") : out.unit_id) + "/oil-resample");
    } else if (!out.unit_id.empty() && ref_unit != out.unit_id) {
      report(action, "the action reference is for unit " + std::string(ref_unit) + ", the row for unit " +
                         out.unit_id);
    } else {
      w.reference = analytics::action_reference(out.unit_id, std::string(need));
    }
  }
  w.note = cell(column("note"));
  if (row_ok()) {
    duplicate_key(w.reference + '\x1f' + std::to_string(w.date) + '\x1f' + w.status, "action, status and date");
  }
  return row_ok();
}

}  // namespace ferrum::ingest
