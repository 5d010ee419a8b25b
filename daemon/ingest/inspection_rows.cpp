// Field inspection rows.
#include <algorithm>

#include "daemon/ingest/field_parsers.h"
#include "daemon/ingest/row_parsers.h"

namespace ferrum::ingest {

namespace {

struct RatingName {
  std::string_view name;
  analytics::Rating rating;
};

constexpr RatingName kRatings[] = {
    {"good", analytics::Rating::good},           {"fair", analytics::Rating::fair},
    {"poor", analytics::Rating::poor},           {"very_poor", analytics::Rating::very_poor},
    {"unsafe", analytics::Rating::unsafe},
};

std::string joined(const std::vector<std::string>& items) {
  std::string out;
  for (const auto& i : items) out += (out.empty() ? "" : ", ") + i;
  return out;
}

}  // namespace

bool InspectionRowParser::parse(std::span<const std::string_view> fields, std::int64_t line,
                                InspectionRow& out) {
  out.line = line;
  out.record = analytics::InspectionRecord{};
  analytics::InspectionRecord& r = out.record;
  r.date = begin_measurement_row(fields, line, out.unit_id, "inspection_date").value_or(0);

  const ColumnBinding& item = column("item");
  if (!required_text(item, "item").empty()) {
    r.item = to_snake_case(cell(item));
    const auto& vocabulary = options_.inspection_items;
    if (std::find(vocabulary.begin(), vocabulary.end(), r.item) == vocabulary.end()) {
      report(item, "unknown inspection item; use one of: " + joined(vocabulary));
    }
  }
  const ColumnBinding& rating = column("rating");
  if (!required_text(rating, "rating").empty()) {
    const std::string name = to_snake_case(cell(rating));
    const auto* found = std::find_if(std::begin(kRatings), std::end(kRatings),
                                     [&](const RatingName& n) { return n.name == name; });
    if (found == std::end(kRatings)) {
      report(rating, "rating must be good, fair, poor, very_poor or unsafe");
    } else {
      r.rating = found->rating;
    }
  }
  r.note = cell(column("note"));
  r.inspector = cell(column("inspector"));
  if (row_ok()) {
    duplicate_key(out.unit_id + '\x1f' + std::to_string(r.date) + '\x1f' + r.item,
                  "unit_id, inspection_date and item");
  }
  return row_ok();
}

}  // namespace ferrum::ingest
