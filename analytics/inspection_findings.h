// Review of visual inspection records: the latest rating per item, items
// rated worse than at their previous inspection, overdue items and unsafe
// items. No published method: ratings are the register's five-step scale
// (good .. unsafe) and the default interval of 365 days is common utility
// practice (no published source).
#pragma once

#include <span>
#include <string>
#include <vector>

#include "analytics/assessment.h"
#include "analytics/unit_data.h"

namespace ferrum::analytics {

struct InspectionOptions {
  int interval_days = 365;  // an item not inspected for longer is overdue
};

struct InspectionReview {
  std::vector<InspectionFinding> findings;  // one per item, unsafe and worst first
  std::vector<std::string> overdue_items;
  std::vector<std::string> worse_items;
  std::vector<std::string> unsafe_items;
  std::optional<Day> latest;                // latest inspection on or before as_of
};

// Records after as_of are ignored. Same-day records of one item: the worst
// rating of that day counts.
InspectionReview review_inspections(std::span<const InspectionRecord> records, Day as_of,
                                    const InspectionOptions& options);

}  // namespace ferrum::analytics
