// Builds the planner's week (report/planner_week.h) for the weekly bundle.
// The bundle keeps week.tsv (unit, site, health index, band, recommended
// action) so that the next week can say what changed.
#pragma once

#include <filesystem>
#include <string>
#include <vector>

#include "analytics/assessment.h"
#include "report/planner_week.h"
#include "schema/store.h"

namespace ferrum::reporting {

struct PlannerWeekInputs {
  std::string week_label;
  analytics::Day as_of = 0;
  const std::vector<analytics::UnitAssessment>* units = nullptr;
  const analytics::FleetRanking* ranking = nullptr;
  std::string previous_week_tsv;            // contents of last week's week.tsv; empty: none
  std::vector<store::Alert> alerts;
  std::vector<store::FileRecord> files;
  int inspection_interval_days = 365;
};

report::PlannerWeek build_planner_week(const PlannerWeekInputs& in);

// week.tsv of a bundle: the caution as a comment line ("# SAFETY: ..."), then
// "unit_id\tsite\thealth_index\tband\taction" per unit. Lines that open with
// '#' are comments.
std::string week_units_tsv(const analytics::FleetRanking& ranking);

// The newest earlier bundle's week.tsv under `reports` (folders YYYY-Www
// before `week_label`), or "".
std::string previous_week_tsv(const std::filesystem::path& reports, const std::string& week_label);

}  // namespace ferrum::reporting
