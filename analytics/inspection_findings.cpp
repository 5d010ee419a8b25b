#include "analytics/inspection_findings.h"

#include <algorithm>
#include <map>

namespace ferrum::analytics {
namespace {

struct ItemHistory {
  const InspectionRecord* latest = nullptr;
  const InspectionRecord* previous = nullptr;  // latest of an earlier day
};

bool worse_than(Rating a, Rating b) { return static_cast<int>(a) > static_cast<int>(b); }

void add(ItemHistory& h, const InspectionRecord& r) {
  if (!h.latest || r.date > h.latest->date) {
    h.previous = h.latest;
    h.latest = &r;
  } else if (r.date == h.latest->date) {
    if (worse_than(r.rating, h.latest->rating)) h.latest = &r;
  } else if (!h.previous || r.date > h.previous->date ||
             (r.date == h.previous->date && worse_than(r.rating, h.previous->rating))) {
    h.previous = &r;
  }
}

}  // namespace

InspectionReview review_inspections(std::span<const InspectionRecord> records, Day as_of,
                                    const InspectionOptions& options) {
  std::map<std::string, ItemHistory> items;
  InspectionReview out;
  for (const auto& r : records) {
    if (r.date > as_of) continue;
    add(items[r.item], r);
    out.latest = std::max(out.latest.value_or(r.date), r.date);
  }
  for (const auto& [item, h] : items) {
    InspectionFinding f;
    f.item = item;
    f.rating = h.latest->rating;
    f.date = h.latest->date;
    f.note = h.latest->note;
    if (h.previous) {
      f.previous = h.previous->rating;
      f.worse = worse_than(f.rating, *f.previous);
    }
    if (f.worse) out.worse_items.push_back(item);
    if (f.rating == Rating::unsafe) out.unsafe_items.push_back(item);
    if (as_of - f.date > options.interval_days) out.overdue_items.push_back(item);
    out.findings.push_back(std::move(f));
  }
  std::stable_sort(out.findings.begin(), out.findings.end(),
                   [](const auto& a, const auto& b) { return worse_than(a.rating, b.rating); });
  return out;
}

}  // namespace ferrum::analytics
