// The receipt a party gets for every file it drops, next to where it dropped
// it: drop/PARTY/receipts/NAME.txt (for people) and NAME.json (for machines),
// NAME being the dropped file's full name.
#pragma once

#include <optional>
#include <string>
#include <vector>

#include "daemon/ingest/problems.h"

namespace ferrum::ingest {

struct Receipt {
  std::string file;            // name as dropped
  std::string party;
  std::string sha256;          // empty when the file was refused unread
  std::string status;          // "accepted", "rejected", "duplicate"
  std::string kind;            // file kind, "" when not recognised
  long long rows = 0;          // rows imported (accepted) or every data row read, bad ones too (rejected)
  // Of an accepted file's rows: how many were new, and how many were already
  // on file (an earlier file delivered the same key; this file's row now
  // stands). Absent on other receipts and on receipts of older versions.
  std::optional<long long> rows_new, rows_on_file;
  std::string received_at;     // UTC ISO 8601
  std::string stored_as;       // archive/... or quarantine/..., relative to the site root
  std::string reason;          // file-level reason (permissions, refused unread, ...)
  std::vector<Problem> problems;    // first 100
  long long problem_count = 0;
  std::vector<Warning> warnings;
  std::vector<std::string> units;   // units touched (accepted); units the rows name, held up (rejected)
  std::string data_from, data_to;   // date range of the rows taken (YYYY-MM-DD), "" when none
  std::vector<std::string> unsafe_items;  // "UNIT: item (date)" rated unsafe
  // True when the importer raises an alert for them at once (the daemon);
  // false for `ferrum ingest`, which sends none, and the receipt says so.
  bool unsafe_alerted = false;
  std::string duplicate_of_received_at;  // for duplicates: when the same content was imported
  std::string duplicate_of_stored_as;    // ... and as what
  std::string utc_offset_note;      // "times without an offset were taken as UTC+01:00"
  std::string separator_note;       // "values separated by ';' as the sep= first line says"
  std::string subfolder;            // "2026-10/" when dropped in a sub-folder of the party folder
  std::string source_note;          // "worksheet 'Results' of an .xlsx workbook; ..."
  std::string format_note;          // the party's column map / date format / decimal that were applied
  // Work status (accepted): the action references that match an action the
  // unit has (open, booked, or closed by this file), and those the unit's
  // assessment does not raise (accepted and kept, flagged for the planner).
  std::vector<std::string> work_matched, work_not_raised;

  std::string to_json() const;
  std::string to_text() const;
  // Reads back what to_json() wrote (used to rewrite a receipt after a crash).
  static Receipt from_json(const std::string& json);
};

}  // namespace ferrum::ingest
