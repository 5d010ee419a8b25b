// Options shared by every ferrum PDF (unit, fleet, weekly index, alert).
#pragma once

#include <string>

namespace ferrum::report {

struct ReportOptions {
  enum class Paper { a4, letter };
  Paper paper = Paper::a4;         // page size; A4 by default
  std::string utility_name;        // printed in the page header when not empty
  std::string utc_offset_note;     // e.g. "times without an offset were taken as UTC+01:00"
  // PDF creation date, ISO 8601 UTC ("2026-12-01T10:00:00Z"). Empty: the
  // current time. Tests fix it so that output bytes are reproducible.
  std::string creation_date;
  std::string author = "ferrum";   // PDF metadata author
};

}  // namespace ferrum::report
