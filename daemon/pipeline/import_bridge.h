// Joins the pure parsing (csv_reader, file_kinds, row_parsers) to the store:
// streams one file's rows into the open transaction, checking the party's
// permissions row by row. Nothing here commits; the pipeline decides.
#pragma once

#include <atomic>
#include <functional>
#include <istream>
#include <optional>
#include <stdexcept>
#include <map>
#include <set>
#include <string>
#include <vector>

#include "daemon/config/site_config.h"
#include "daemon/ingest/problems.h"
#include "schema/store.h"

namespace ferrum::ingest {

struct ImportSettings {
  const config::Party* party = nullptr;   // null: permissions not checked (ferrum check without --party)
  const config::SiteConfig* config = nullptr;
  std::int64_t now = 0;                    // UTC seconds, for "date in the future"
  std::int64_t file_id = 0;                // provenance of every row
  bool units_must_exist = true;            // false: `ferrum check` without a site database
  std::string file_name;                   // as dropped, to explain a misnamed workbook
  // Set by the daemon's stop request: the import stops between rows by
  // throwing ImportCancelled, the caller rolls back and the file stays in
  // work/ to be imported whole at the next start.
  const std::atomic<bool>* cancel = nullptr;
  // Called every 4,096 rows (progress of a long file); may be empty.
  std::function<void()> tick;
};

class ImportCancelled : public std::runtime_error {
 public:
  ImportCancelled() : std::runtime_error("import interrupted by a stop request") {}
};

struct ImportResult {
  std::string kind;              // recognised kind, "" when the header matched none
  long long rows = 0;            // good rows seen
  ProblemLog problems{100};
  WarningLog warnings;
  std::set<std::string> units;   // units touched
  // Units the file's rows name (good rows and rows with a problem), at most
  // kMaxNamedUnits: whose results a rejected file holds up.
  std::set<std::string> named_units;
  static constexpr std::size_t kMaxNamedUnits = 200;
  // Per named unit, the newest date of its measurement rows whose unit id and
  // date could be read (good rows and rows with a problem; at most
  // kMaxNamedUnits units): what a rejected file holds back.
  std::map<std::string, analytics::Day> newest_day;
  std::optional<std::int64_t> first_day, last_day;  // date range of the rows taken (days since 1970-01-01)
  // Of the rows taken, how many were new and how many were already on file
  // (an earlier file delivered the same key; see store::RowInsert). Set when
  // the file has no problem and every row went to the store (not by `ferrum
  // check` away from a site).
  std::optional<long long> rows_new, rows_on_file;
  std::vector<std::string> unsafe_items;
  // Work status: the references of the rows taken that match an action the
  // unit's assessment raises (open, booked or closed), and those it does not.
  std::vector<std::string> work_matched, work_not_raised;
  bool offset_assumed = false;   // some times had no UTC offset
  char declared_delimiter = 0;   // from a "sep=X" first line, 0 when none
  std::string source_note;       // the worksheet and date system of a workbook, "" for a CSV
  std::string format_note;       // the party's column map and formats that were applied, "" when none
  std::string file_reason;       // whole-file reason (e.g. kind not allowed for the party)
};

ImportResult import_stream(std::istream& in, const ImportSettings& settings, store::Store& store);

}  // namespace ferrum::ingest
