#include "daemon/ingest/header_map.h"

#include <algorithm>

#include "daemon/ingest/csv_reader.h"
#include "daemon/ingest/field_parsers.h"

namespace ferrum::ingest {

HeaderMap HeaderMap::parse(std::istream& in) {
  HeaderMap map;
  ProblemLog problems(1);
  CsvReader reader(in);
  if (!reader.read_header(problems)) {
    const std::int64_t line = problems.kept().empty() ? 1 : problems.kept().front().line;
    throw HeaderMapError(line, problems.kept().empty() ? "the map is empty: its first line must be "
                                                         "their_column,ferrum_column"
                                                       : problems.kept().front().reason);
  }
  const auto& h = reader.header();
  if (h.size() != 2 || normalise_column_name(h[0]) != "their_column" ||
      normalise_column_name(h[1]) != "ferrum_column") {
    throw HeaderMapError(reader.header_line(), "the first line must be their_column,ferrum_column");
  }
  for (;;) {
    const RecordStatus status = reader.next(problems);
    if (status == RecordStatus::end) break;
    if (status == RecordStatus::malformed) {
      const Problem& p = problems.kept().front();
      throw HeaderMapError(p.line, p.reason + " (each line: their column, then ferrum's column)");
    }
    const auto f = reader.fields();
    const std::string their(trim(f[0])), ferrum = normalise_column_name(f[1]);
    const std::int64_t line = reader.record_line();
    if (their.empty() && ferrum.empty()) continue;
    if (their.empty()) throw HeaderMapError(line, "their_column is empty");
    if (ferrum.empty()) throw HeaderMapError(line, "ferrum_column is empty for '" + their + "'");
    if (!is_known_column(ferrum)) {
      throw HeaderMapError(line, "'" + std::string(trim(f[1])) +
                                     "' is not a ferrum column (schema/drop-files.md lists them)");
    }
    std::string key = normalise_column_name(their);
    const auto seen = std::find(map.keys_.begin(), map.keys_.end(), key);
    if (seen != map.keys_.end()) {
      const Entry& first = map.entries_[static_cast<std::size_t>(seen - map.keys_.begin())];
      throw HeaderMapError(line, "'" + their + "' is listed twice (first on line " +
                                     std::to_string(first.line) + ")");
    }
    map.entries_.push_back({their, ferrum, line});
    map.keys_.push_back(std::move(key));
  }
  return map;
}

std::string_view HeaderMap::ferrum_name(std::string_view header_name) const {
  if (entries_.empty()) return {};
  const std::string key = normalise_column_name(header_name);
  const auto it = std::find(keys_.begin(), keys_.end(), key);
  return it == keys_.end() ? std::string_view() : std::string_view(entries_[it - keys_.begin()].ferrum_column);
}

std::vector<std::string> HeaderMap::translate(std::span<const std::string> header) const {
  std::vector<std::string> out(header.begin(), header.end());
  for (std::string& name : out) {
    const std::string_view mapped = ferrum_name(name);
    if (!mapped.empty()) name = std::string(mapped);
  }
  return out;
}

bool HeaderMap::operator==(const HeaderMap& other) const {
  if (entries_.size() != other.entries_.size()) return false;
  for (std::size_t i = 0; i < entries_.size(); ++i) {
    if (entries_[i].their_column != other.entries_[i].their_column ||
        entries_[i].ferrum_column != other.entries_[i].ferrum_column) {
      return false;
    }
  }
  return true;
}

KindDetection detect_kind(std::span<const std::string> header, const HeaderMap& map) {
  if (map.empty()) return detect_kind(header);
  const std::vector<std::string> translated = map.translate(header);
  KindDetection d = detect_kind(translated);
  // Bindings and notes name the file's own columns, as the contractor wrote them.
  for (const auto& [field, binding] : d.columns.entries()) {
    ColumnBinding own = binding;
    if (own.present()) own.header_name = header[static_cast<std::size_t>(own.index)];
    d.columns.set(field, own);
  }
  for (ConversionNote& note : d.conversions) {
    for (std::size_t i = 0; i < header.size(); ++i) {
      if (translated[i] == note.column) note.column = header[i];
    }
  }
  for (std::size_t i = 0; i < header.size(); ++i) {
    if (translated[i] != header[i]) {
      const std::string quoted = "(" + translated[i] + ")";
      const std::string own = "(" + header[i] + ")";
      for (std::size_t at = d.reason.find(quoted); at != std::string::npos; at = d.reason.find(quoted, at + own.size())) {
        d.reason.replace(at, quoted.size(), own);
      }
    }
  }
  return d;
}

std::string describe_unmatched_header(std::span<const std::string> header, const HeaderMap& map,
                                      std::span<const FileKind> kinds, const std::string& party,
                                      const std::string& closest) {
  std::string known, unknown;
  for (const std::string& name : header) {
    if (trim(name).empty()) continue;
    const std::string_view mapped = map.ferrum_name(name);
    const std::string ferrum = mapped.empty() ? normalise_column_name(name) : std::string(mapped);
    std::string& list = is_known_column(ferrum) ? known : unknown;
    if (!list.empty()) list += ", ";
    list += "'" + name + "'";
    if (&list == &known && ferrum != name) list += " (" + ferrum + ")";
  }
  std::string kinds_text;
  for (std::size_t i = 0; i < kinds.size(); ++i) kinds_text += (i ? ", " : "") + std::string(describe(kinds[i]));
  std::string out = "the header matches no kind of file party '" + party + "' delivers (" + kinds_text + ")";
  if (!closest.empty()) out += " " + closest;
  out += ". Recognised: " + (known.empty() ? std::string("none") : known) + ".";
  if (!unknown.empty()) out += " Not recognised: " + unknown + ".";
  out += " " + describe_required_columns(kinds) +
         ". The columns are listed in the site's drop-file contract (schema/drop-files.md, \"The five kinds\"); "
         "the site can map your own column names (columns/" + party + ".csv).";
  return out;
}

}  // namespace ferrum::ingest
