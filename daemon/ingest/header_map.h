// A party's column map: its own header names -> ferrum's column names, so
// that a laboratory's or survey system's export is taken as it is written.
//
// The map file is ROOT/columns/PARTY.csv, a CSV with the header
// `their_column,ferrum_column` and one pair per line, e.g.
//     their_column,ferrum_column
//     H2 (ppm),h2_ppm
//     Sampled,sample_date
// (schema/drop-files.md, "Delivering your system's export as it is").
// Names compare as header names do everywhere (file_kinds.h,
// normalise_column_name): case-insensitive, surrounding spaces ignored,
// inner spaces and hyphens as underscores. A ferrum column may be named by
// more than one of the party's columns (two export templates); one of the
// party's columns may appear only once.
//
// A file's own columns keep their names in problems and receipts: only the
// kind detection sees ferrum's names.
//
// Pure: parses text; no files. Thread-safe once built (read-only).
#pragma once

#include <cstdint>
#include <istream>
#include <span>
#include <stdexcept>
#include <string>
#include <string_view>
#include <vector>

#include "daemon/ingest/file_kinds.h"

namespace ferrum::ingest {

// A map that cannot be used; line() is the 1-based line of the map file
// (0 for the whole file).
class HeaderMapError : public std::runtime_error {
 public:
  HeaderMapError(std::int64_t line, const std::string& message)
      : std::runtime_error(message), line_(line) {}
  std::int64_t line() const { return line_; }

 private:
  std::int64_t line_;
};

class HeaderMap {
 public:
  struct Entry {
    std::string their_column;   // as written in the map
    std::string ferrum_column;  // normalised ferrum name, e.g. "h2_ppm"
    std::int64_t line = 0;      // line of the map file
  };

  // Reads a map file. Throws HeaderMapError for a missing or wrong header,
  // a line without two values, an empty name, a name that is not a ferrum
  // column (is_known_column) or a column of theirs listed twice.
  static HeaderMap parse(std::istream& in);

  bool empty() const { return entries_.empty(); }
  const std::vector<Entry>& entries() const { return entries_; }
  // The ferrum column a header name maps to; "" when the map does not name it.
  std::string_view ferrum_name(std::string_view header_name) const;
  // The header with mapped names replaced by ferrum's; others unchanged.
  std::vector<std::string> translate(std::span<const std::string> header) const;

  bool operator==(const HeaderMap& other) const;

 private:
  std::vector<Entry> entries_;
  std::vector<std::string> keys_;  // normalised their_column, parallel to entries_
};

// detect_kind on the translated header, with every binding, conversion note
// and reason naming the file's own columns again.
KindDetection detect_kind(std::span<const std::string> header, const HeaderMap& map);

// Why a header that fits no kind was rejected, for a party that delivers
// `kinds`: which of its own columns were recognised (and as what), which
// were not, what the kinds it delivers need, and where the columns are
// listed. `closest` is detect_kind's "(closest: ..., missing ...)" note, or "".
std::string describe_unmatched_header(std::span<const std::string> header, const HeaderMap& map,
                                      std::span<const FileKind> kinds, const std::string& party,
                                      const std::string& closest);

}  // namespace ferrum::ingest
