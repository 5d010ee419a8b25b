#include "daemon/pipeline/import_bridge.h"

#include <unordered_map>
#include <memory>

#include "daemon/assess/assessment_service.h"
#include "daemon/ingest/check_stream.h"
#include "daemon/ingest/csv_reader.h"
#include "daemon/ingest/file_kinds.h"
#include "daemon/ingest/open_source.h"
#include "daemon/ingest/row_parsers.h"

namespace ferrum::ingest {
namespace {

// Register entries looked up once per unit and kept for the whole file (the
// row parsers hold pointers into this cache). A hash map: a file that lists
// every unit at one time, then every unit at the next, looks a unit up on
// every row (an ordered map of 5,000 ids spent 15 % of such an import
// comparing ids).
class UnitCache {
 public:
  struct Entry {
    std::unique_ptr<analytics::UnitInfo> info;  // null: not in the register
    bool touched = false;                        // already in ImportResult::units, or checked for the party
    const std::string* id = nullptr;             // the key of this entry in the cache
    Entry* next = nullptr;                       // the entry looked up after this one, last time
  };
  UnitCache(store::Store& store, bool must_exist) : store_(store), must_exist_(must_exist) {}
  Entry& entry(std::string_view id) {
    // The same unit again, or the one that followed it last time: a file
    // listing every unit at one time, then every unit at the next, repeats
    // its order of units, and the hash map was 9 % of such an import.
    if (last_ && *last_->id == id) return *last_;
    if (last_ && last_->next && *last_->next->id == id) return *(last_ = last_->next);
    key_.assign(id);
    auto it = cache_.find(key_);
    if (it == cache_.end()) {
      auto u = store_.find_unit(id);
      it = cache_.emplace(key_, Entry{u ? std::make_unique<analytics::UnitInfo>(*u) : nullptr}).first;
      it->second.id = &it->first;
    }
    if (last_) last_->next = &it->second;
    last_ = &it->second;
    return it->second;
  }
  const analytics::UnitInfo* find(std::string_view id) { return entry(id).info.get(); }
  bool must_exist() const { return must_exist_; }

 private:
  store::Store& store_;
  bool must_exist_;
  std::string key_;  // reused: no allocation per lookup
  std::unordered_map<std::string, Entry> cache_;  // nodes: entries and keys stay in place
  Entry* last_ = nullptr;  // the entry looked up last
};

// Checks a row's unit against the party's sites; logs a whole-row problem.
bool site_allowed(const ImportSettings& s, const std::string& unit_id, const std::string& site, std::int64_t line,
                  ProblemLog& problems) {
  if (!s.party || s.party->serves(site)) return true;
  problems.add(line, "", 0, unit_id,
               "unit " + unit_id + " is at site '" + site + "', which party '" + s.party->name + "' does not serve");
  return false;
}

// Load points go to the store in batches (Store::queue_load_point), so a
// second reading of the same time is found up to a batch after its row. The
// receipt must still be the one a row-by-row import gives: the duplicate is
// logged before any later problem (ProblemLog::before_first_problem), its
// row is taken out of the row count, and the UTC-offset note only counts
// rows before it. Later rows of its batch were written, but a file with a
// problem is rolled back whole.
class LoadWriter {
 public:
  LoadWriter(store::Store& store, ImportResult& r, std::string column, int column_number)
      : store_(store), r_(r), column_(std::move(column)), column_number_(column_number) {
    r_.problems.before_first_problem([this] { flush(); });
  }
  ~LoadWriter() { r_.problems.before_first_problem(nullptr); }
  LoadWriter(const LoadWriter&) = delete;
  LoadWriter& operator=(const LoadWriter&) = delete;

  // Queues a counted row's point.
  void add(const LoadRow& row, std::int64_t file_id) {
    report(store_.queue_load_point(row.unit_id, row.point, file_id, row.line));
  }
  // Writes what is queued; false when it held a duplicate.
  bool flush() { return report(store_.flush_load_points()); }
  void note_offset_assumed(std::int64_t line) {
    if (first_offset_line_ == 0) first_offset_line_ = line;
  }
  // Call after the last row.
  void finish() {
    if (r_.problems.empty()) flush();
    r_.problems.before_first_problem(nullptr);
    r_.offset_assumed = first_offset_line_ != 0 && (duplicate_line_ == 0 || first_offset_line_ < duplicate_line_);
  }

 private:
  bool report(std::optional<store::LoadDuplicate> d) {
    if (!d) return true;
    duplicate_line_ = d->line;  // still a data row read: the rejected file's receipt counts it
    r_.problems.add(d->line, column_, column_number_, "",
                    "a second reading for unit " + d->unit_id + " at the same time");
    return false;
  }

  store::Store& store_;
  ImportResult& r_;
  std::string column_;
  int column_number_;
  std::int64_t first_offset_line_ = 0, duplicate_line_ = 0;
};

// Sorts the references of a work-status file into those that match an
// action of their unit (open, booked, or closed by a work-status row) and
// those the unit's assessment does not raise. The assessment reads the rows
// of this file (the transaction is still open).
void match_references(store::Store& store, const config::SiteConfig& config, std::int64_t now,
                      const std::vector<std::string>& references, ImportResult& r) {
  const analytics::AssessmentOptions options = assess::options_from_config(config, nullptr);
  std::set<std::string> raised;
  for (const std::string& unit : r.units) {
    const analytics::UnitAssessment a = assess::assess_unit(store, unit, analytics::day_of(now), options);
    for (const auto* list : {&a.actions, &a.closed_actions})
      for (const analytics::Action& act : *list) raised.insert(act.reference);
  }
  std::set<std::string> seen;
  for (const std::string& ref : references) {
    if (!seen.insert(ref).second) continue;
    (raised.count(ref) ? r.work_matched : r.work_not_raised).push_back(ref);
  }
}

// New rows and rows already on file, as the store reports them row by row.
struct RowCounts {
  long long added = 0, on_file = 0;
  void note(store::RowInsert outcome) {
    if (outcome == store::RowInsert::added) ++added;
    else if (outcome == store::RowInsert::replaced_earlier_file) ++on_file;
    // duplicate_in_file: the parsers reject such a file (a duplicate key)
  }
};

void note_day(ImportResult& r, analytics::Day d) {
  if (!r.first_day || d < *r.first_day) r.first_day = d;
  if (!r.last_day || d > *r.last_day) r.last_day = d;
}

template <class Parser, class Row, class Store>
void run_rows(RecordSource& reader, Parser& parser, ImportResult& r, const ImportSettings& settings,
              Store&& store_row) {
  Row row;
  std::string last_unit;
  const int unit_index = parser.unit_column();
  for (std::uint64_t n = 1;; ++n) {
    if ((n & 4095) == 0) {
      if (settings.cancel && settings.cancel->load(std::memory_order_relaxed)) throw ImportCancelled();
      if (settings.tick) settings.tick();
    }
    const RecordStatus st = reader.next(r.problems);
    if (st == RecordStatus::end) break;
    // A rejected file's receipt counts every data row read, bad ones too.
    if (st == RecordStatus::malformed) {
      ++r.rows;
      continue;
    }
    if (is_empty_row(reader.fields())) {
      r.warnings.add(reader.record_line(), "", "row with only empty values ignored");
      continue;
    }
    if (unit_index >= 0 && static_cast<std::size_t>(unit_index) < reader.fields().size()) {
      const std::string_view id = trim(reader.fields()[static_cast<std::size_t>(unit_index)]);
      if (!id.empty() && id != last_unit) {  // rows come in runs of one unit
        last_unit = id;
        if (r.named_units.size() < ImportResult::kMaxNamedUnits) r.named_units.insert(last_unit);
      }
    }
    if (!parser.parse(reader.fields(), reader.record_line(), row)) {
      ++r.rows;
      continue;
    }
    // Once a file has a problem nothing of it will be kept: stop writing,
    // go on validating to report more problems.
    if (!r.problems.empty()) {
      ++r.rows;
      continue;
    }
    if (store_row(row) || !r.problems.empty()) ++r.rows;
  }
  parser.finish();
}

}  // namespace

namespace {

// What of the party's own conventions was applied, for the receipt.
std::string describe_formats(const config::Party& party, const config::PartyFormats& p,
                             std::span<const std::string> header) {
  int renamed = 0;
  for (const auto& name : header) renamed += !p.columns.ferrum_name(name).empty();
  std::string out;
  if (renamed > 0)
    out = "your column map (columns/" + party.name + ".csv) named " + std::to_string(renamed) + " of your columns";
  if (p.date_order != DateOrder::iso)
    out += (out.empty() ? "" : "; ") + std::string("dates read as ") + p.date_format + " (ISO 8601 also accepted)";
  if (p.decimal != DecimalMark::automatic)
    out += (out.empty() ? "" : "; ") + std::string("decimal ") + (p.decimal == DecimalMark::comma ? "comma" : "point");
  return out;
}

void import_source(RecordSource& reader, const ImportSettings& s, store::Store& store, ImportResult& r);

}  // namespace

ImportResult import_stream(std::istream& in, const ImportSettings& s, store::Store& store) {
  ImportResult r;
  SourceOptions options;
  options.file_name = s.file_name;
  // A workbook's sheet named after a kind the party delivers is preferred.
  if (s.party) options.workbook.preferred_sheets.assign(s.party->kinds.begin(), s.party->kinds.end());
  else options.workbook.preferred_sheets = kind_sheet_names();
  const std::unique_ptr<RecordSource> source = open_record_source(in, options);
  RecordSource& reader = *source;
  r.problems.set_locator([&reader](std::int64_t line, int column) { return reader.locate(line, column); });
  try {
    import_source(reader, s, store, r);
  } catch (...) {
    r.problems.set_locator(nullptr);
    throw;
  }
  r.problems.set_locator(nullptr);  // the source ends here
  return r;
}

namespace {

void import_source(RecordSource& reader, const ImportSettings& s, store::Store& store, ImportResult& r) {
  if (!reader.read_header(r.problems)) return;
  r.declared_delimiter = reader.declared_delimiter();
  r.source_note = describe_source(reader);
  static const config::PartyFormats kNone;
  const config::PartyFormats& formats = s.party && s.config ? s.config->formats_of(s.party->name) : kNone;
  const KindDetection kind = detect_kind(reader.header(), formats.columns);
  if (!kind.recognised) {
    std::string reason = kind.reason;
    if (s.party && reason.starts_with("the header matches no kind of file")) {
      // Only the kinds this party delivers, what of its own header was recognised, and where to look.
      std::vector<FileKind> kinds;
      for (FileKind k : all_kinds())
        if (s.party->may_deliver(to_string(k))) kinds.push_back(k);
      const auto open = reason.find(" (closest: "), close = reason.find(')', open);
      const std::string closest = open == std::string::npos ? "" : reason.substr(open + 1, close - open);
      reason = describe_unmatched_header(reader.header(), formats.columns, kinds, s.party->name, closest);
    }
    r.problems.add(reader.header_line(), kind.reason_column >= 0 ? reader.header()[kind.reason_column] : "",
                   kind.reason_column + 1, "", reason);
    return;
  }
  r.kind = to_string(kind.kind);
  if (s.party && !s.party->may_deliver(r.kind)) {
    r.file_reason = "party '" + s.party->name + "' may not deliver " + describe(kind.kind) +
                    " files (ferrum.ini [party." + s.party->name + "] kinds)";
    return;
  }
  if (s.party) r.format_note = describe_formats(*s.party, formats, reader.header());
  for (int c : kind.unknown_columns)
    r.warnings.add(reader.header_line(), reader.header()[c], "unknown column, ignored");
  if (s.file_id)
    for (const auto& c : stored_conversions(kind))
      store.add_conversion(s.file_id, c.column, c.original_unit, c.stored_as);

  UnitCache units(store, s.units_must_exist);
  ParseOptions po;
  po.now = s.now;
  po.site_utc_offset_min = s.config ? s.config->utc_offset_minutes : 0;
  if (s.units_must_exist) po.lookup_unit = [&units](std::string_view id) { return units.find(id); };
  if (s.config)
    for (const auto& item : s.config->extra_inspection_items) po.inspection_items.push_back(item);
  po.date_order = formats.date_order;
  po.on_dated_row = [&r](std::string_view unit, analytics::Day day) {
    auto it = r.newest_day.find(std::string(unit));
    if (it == r.newest_day.end()) {
      if (r.newest_day.size() < ImportResult::kMaxNamedUnits) r.newest_day.emplace(unit, day);
    } else if (day > it->second) {
      it->second = day;
    }
  };
  const bool comma = uses_decimal_comma(formats.decimal, reader.decimal_comma());
  RowCounts counts;

  switch (kind.kind) {
    case FileKind::units_register: {
      UnitRowParser p(kind.columns, po, comma, r.problems, r.warnings);
      run_rows<UnitRowParser, UnitRow>(reader, p, r, s, [&](const UnitRow& row) {
        if (!site_allowed(s, row.unit.unit_id, row.unit.site, row.line, r.problems)) return false;
        // A unit listed twice is a problem of the file (UnitRowParser), so a
        // unit found here came from an earlier file.
        counts.note(store.find_unit(row.unit.unit_id) ? store::RowInsert::replaced_earlier_file
                                                      : store::RowInsert::added);
        if (store.upsert_unit(row.unit, s.file_id, static_cast<int>(row.line))) r.units.insert(row.unit.unit_id);
        return true;
      });
      break;
    }
    case FileKind::oil_lab: {
      OilRowParser p(kind.columns, po, comma, r.problems, r.warnings);
      run_rows<OilRowParser, OilRow>(reader, p, r, s, [&](const OilRow& row) {
        const auto* u = units.find(row.unit_id);
        if (u && !site_allowed(s, row.unit_id, u->site, row.line, r.problems)) return false;
        if (!u) return true;  // `ferrum check` away from a site
        counts.note(store.add_oil_sample(row.unit_id, row.sample, s.file_id, static_cast<int>(row.line)));
        note_day(r, row.sample.date);
        r.units.insert(row.unit_id);
        return true;
      });
      break;
    }
    case FileKind::infrared: {
      InfraredRowParser p(kind.columns, po, comma, r.problems, r.warnings);
      run_rows<InfraredRowParser, InfraredRow>(reader, p, r, s, [&](const InfraredRow& row) {
        const auto* u = units.find(row.unit_id);
        if (u && !site_allowed(s, row.unit_id, u->site, row.line, r.problems)) return false;
        if (!u) return true;
        counts.note(store.add_infrared(row.unit_id, row.scan, s.file_id, static_cast<int>(row.line)));
        note_day(r, row.scan.date);
        r.units.insert(row.unit_id);
        return true;
      });
      break;
    }
    case FileKind::inspection: {
      InspectionRowParser p(kind.columns, po, comma, r.problems, r.warnings);
      run_rows<InspectionRowParser, InspectionRow>(reader, p, r, s, [&](const InspectionRow& row) {
        const auto* u = units.find(row.unit_id);
        if (u && !site_allowed(s, row.unit_id, u->site, row.line, r.problems)) return false;
        if (!u) return true;
        counts.note(store.add_inspection(row.unit_id, row.record, s.file_id, static_cast<int>(row.line)));
        note_day(r, row.record.date);
        r.units.insert(row.unit_id);
        if (row.record.rating == analytics::Rating::unsafe)
          r.unsafe_items.push_back(row.unit_id + ": " + row.record.item + " (" +
                                   analytics::format_day(row.record.date) + ")" +
                                   (row.record.note.empty() ? "" : " - " + row.record.note));
        return true;
      });
      break;
    }
    case FileKind::electrical_tests: {
      ElectricalRowParser p(kind.columns, po, comma, r.problems, r.warnings);
      run_rows<ElectricalRowParser, ElectricalRow>(reader, p, r, s, [&](const ElectricalRow& row) {
        const auto* u = units.find(row.unit_id);
        if (u && !site_allowed(s, row.unit_id, u->site, row.line, r.problems)) return false;
        if (!u) return true;
        counts.note(store.add_electrical_test(row.unit_id, row.test, s.file_id, static_cast<int>(row.line)));
        note_day(r, row.test.date);
        r.units.insert(row.unit_id);
        return true;
      });
      break;
    }
    case FileKind::work_status: {
      WorkStatusRowParser p(kind.columns, po, comma, r.problems, r.warnings);
      std::vector<std::string> references;
      run_rows<WorkStatusRowParser, WorkStatusRow>(reader, p, r, s, [&](const WorkStatusRow& row) {
        const auto* u = units.find(row.unit_id);
        if (u && !site_allowed(s, row.unit_id, u->site, row.line, r.problems)) return false;
        if (!u) return true;
        counts.note(store.add_work_status(row.unit_id, row.status, s.file_id, static_cast<int>(row.line)));
        note_day(r, row.status.date);
        r.units.insert(row.unit_id);
        references.push_back(row.status.reference);
        return true;
      });
      if (r.problems.empty() && s.config) match_references(store, *s.config, s.now, references, r);
      break;
    }
    case FileKind::load_series: {
      LoadRowParser p(kind.columns, po, comma, r.problems, r.warnings);
      const int ts_index = kind.columns["timestamp"].index;
      LoadWriter writer(store, r, std::string(reader.column_name(static_cast<std::size_t>(ts_index))), ts_index + 1);
      std::string last_checked;
      const analytics::UnitInfo* u = nullptr;
      const store::LoadCounts before = store.load_counts();
      run_rows<LoadRowParser, LoadRow>(reader, p, r, s, [&](const LoadRow& row) {
        if (row.unit_id != last_checked) {  // a new run of rows of one unit
          UnitCache::Entry& e = units.entry(row.unit_id);
          u = e.info.get();
          if (u && s.party && !s.party->serves(u->site)) {
            // A row-by-row import would not get here after a duplicate in
            // the queued rows: report that one instead.
            if (!writer.flush()) return true;
            site_allowed(s, row.unit_id, u->site, row.line, r.problems);
            return false;
          }
          last_checked = row.unit_id;
          if (!e.touched) {  // checked and noted once per unit, whatever the row order
            e.touched = true;
            r.units.insert(row.unit_id);
          }
        }
        if (row.offset_assumed) writer.note_offset_assumed(row.line);
        if (u) {
          writer.add(row, s.file_id);
          note_day(r, analytics::day_of(row.point.t));
        }
        return true;
      });
      writer.finish();
      if (r.problems.empty()) {
        const store::LoadCounts after = store.load_counts();
        counts.added = after.added - before.added;
        counts.on_file = after.replaced_earlier_file - before.replaced_earlier_file;
      }
      break;
    }
  }
  if (!r.problems.empty()) r.units.clear();
  if (r.rows == 0 && r.problems.empty()) r.file_reason = "the file has a header but no data rows";
  if (r.problems.empty() && counts.added + counts.on_file == r.rows) {
    r.rows_new = counts.added;
    r.rows_on_file = counts.on_file;
  }
}

}  // namespace

}  // namespace ferrum::ingest
