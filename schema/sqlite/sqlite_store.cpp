// SQLite implementation of the store, on the SQLite C API: the hot ingest path
// needs prepared statements reused across a whole file (see docs/implementation-notes.md: Poco's
// Data layer re-parses SQL on every execute), and one code path is simpler
// than two.
#include <sqlite3.h>

#include <algorithm>
#include <cmath>
#include <climits>
#include <filesystem>
#include <map>
#include <span>
#include <sstream>
#include <unordered_map>

#include "schema/load_runs.h"
#include "schema/migrations.h"
#include "schema/sqlite/sqlite_statement.h"
#include "schema/store.h"
#include "schema/store_rows.h"

namespace ferrum::store {
namespace {

using analytics::LabValue;
using sqlite::exec;
using sqlite::Statement;

// Load points per multi-row INSERT. Measured on 1M rows: one row per
// statement spends most of its time in statement overhead (step, reset,
// bind); 64 rows per statement roughly halve SQLite's share of an import,
// 256 take off another ~0.2 s CPU per million rows.
constexpr int kLoadStatementRows = 256;
// Page cache of a write transaction (KiB; SQLite's default is 2,000 KiB).
// The rows of one queue touch one leaf page of each unit in it: 5,000 units
// need 5,000 pages (20 MiB at 4 KiB) to stay cached between queues, instead
// of being written out and read back for each. Bounded, so that a 10M-row
// file needs no more memory than a 1M-row one.
constexpr int kWriteCacheKiB = 32 * 1024;

// INSERT of `rows` load points; ?1 is the file, then 6 parameters per row.
// An earlier file's point for the same time is replaced; a second point for
// the same time in the same file is left alone (and found by the caller).
std::string load_insert_sql(int rows) {
  std::string sql = "INSERT INTO load_points(unit_key, ts, load_pu, ambient_c, top_oil_c, file_id, line) VALUES";
  for (int r = 0; r < rows; ++r) {
    const int p = 2 + r * 6;
    sql += r ? ",(" : "(";
    for (int c = 0; c < 5; ++c) sql += "?" + std::to_string(p + c) + ",";
    sql += "?1,?" + std::to_string(p + 5) + ")";
  }
  sql += " ON CONFLICT(unit_key, ts) DO UPDATE SET load_pu=excluded.load_pu, ambient_c=excluded.ambient_c,"
         " top_oil_c=excluded.top_oil_c, file_id=excluded.file_id, line=ferrum_replaced(excluded.line)"
         " WHERE load_points.file_id <> excluded.file_id";
  return sql;
}

// Where the load queue's sorted runs are kept: beside the database, on the
// same disk (a file database), or the system's temporary folder.
std::string runs_folder(const std::string& db_path) {
  if (db_path.empty() || db_path == ":memory:") return std::filesystem::temp_directory_path().string();
  const std::filesystem::path dir = std::filesystem::path(db_path).parent_path();
  return dir.empty() ? "." : dir.string();
}

class SqliteStore final : public Store {
 public:
  SqliteStore(const std::string& path, int load_batch)
      : path_(path), load_batch_size_(std::max(1, load_batch)), runs_(runs_folder(path)) {
    // NOMUTEX: a Store is used by one thread at a time (store.h), so the
    // connection's own mutex only costs time (~5 % of a load import).
    const int flags = SQLITE_OPEN_READWRITE | SQLITE_OPEN_CREATE | SQLITE_OPEN_NOMUTEX;
    if (sqlite3_open_v2(path.c_str(), &db_, flags, nullptr) != SQLITE_OK) {
      std::string msg = db_ ? sqlite3_errmsg(db_) : "out of memory";
      sqlite3_close(db_);
      throw StoreError("cannot open database " + path + ": " + msg);
    }
    sqlite3_busy_timeout(db_, 5000);
    sqlite3_extended_result_codes(db_, 1);
    // ferrum_replaced(x) returns x and counts one load point that replaced an
    // earlier file's point: the upsert's DO UPDATE runs it once per replaced
    // row, so a multi-row INSERT still tells new rows from replaced ones
    // (sqlite3_changes counts both). Not deterministic: it has an effect.
    sqlite3_create_function_v2(
        db_, "ferrum_replaced", 1, SQLITE_UTF8 | SQLITE_DIRECTONLY, &replaced_points_,
        [](sqlite3_context* ctx, int, sqlite3_value** argv) {
          ++*static_cast<long long*>(sqlite3_user_data(ctx));
          sqlite3_result_value(ctx, argv[0]);
        },
        nullptr, nullptr, nullptr);
    try {
      check_is_ferrum_db(path);
      // synchronous=FULL: a commit is on disk before the pipeline moves the
      // file into archive/ (a durable rename). With NORMAL a power loss could
      // keep the move but lose the commit: a file archived with no rows.
      exec(db_, "PRAGMA journal_mode=WAL; PRAGMA synchronous=FULL; PRAGMA foreign_keys=ON;");
      migrate();
    } catch (...) {
      sqlite3_close(db_);
      throw;
    }
  }
  ~SqliteStore() override {
    load_batch_.reset();
    statements_.clear();
    sqlite3_close(db_);
  }

  void begin() override {
    write_queued_load();
    exec(db_, "BEGIN IMMEDIATE");
    exec(db_, ("PRAGMA cache_size=-" + std::to_string(kWriteCacheKiB)).c_str());
    written_points_ = replaced_points_ = 0;
  }
  void commit() override {
    write_queued_load();
    if (unreported_duplicate_)
      throw StoreError("refusing to commit: load point of line " + std::to_string(unreported_duplicate_->line) +
                       " is a second reading in the same file and was never reported");
    exec(db_, "COMMIT");
    exec(db_, "PRAGMA cache_size=-2000");  // SQLite's default: a reader needs no more
  }
  void rollback() override {
    queue_.clear();
    runs_.clear();
    last_written_.reset();
    unreported_duplicate_.reset();
    if (!sqlite3_get_autocommit(db_)) exec(db_, "ROLLBACK");
    exec(db_, "PRAGMA cache_size=-2000");
    written_points_ = replaced_points_ = 0;
    unit_keys_.clear();  // keys of units inserted in the rolled-back transaction
    unit_cycle_.clear();
    last_unit_key_ = 0;
  }

  std::int64_t add_file(const FileRecord& f) override {
    auto& s = stmt("INSERT INTO files(sha256, party, original_name, kind, status, rows, problem_count,"
                   " received_at, stored_as, receipt_json) VALUES(?,?,?,?,?,?,?,?,?,?)");
    s.bind(1, f.sha256).bind(2, f.party).bind(3, f.original_name).bind_text_or_null(4, f.kind)
        .bind(5, f.status).bind(6, f.rows).bind(7, f.problem_count).bind(8, f.received_at)
        .bind_text_or_null(9, f.stored_as).bind(10, f.receipt_json);
    s.run();
    return sqlite3_last_insert_rowid(db_);
  }

  void update_file(const FileRecord& f) override {
    auto& s = stmt("UPDATE files SET kind=?, status=?, rows=?, problem_count=?, stored_as=?, receipt_json=? WHERE id=?");
    s.bind_text_or_null(1, f.kind).bind(2, f.status).bind(3, f.rows).bind(4, f.problem_count)
        .bind_text_or_null(5, f.stored_as).bind(6, f.receipt_json).bind(7, f.id);
    s.run();
  }

  std::optional<FileRecord> accepted_file_with_hash(const std::string& sha) override {
    return one_file("SELECT " FILE_COLUMNS " FROM files WHERE sha256=? AND status='accepted' ORDER BY id LIMIT 1", sha);
  }
  void hold_content(const std::string&) override {}  // BEGIN IMMEDIATE: one writer at a time already
  std::optional<FileRecord> latest_file_with_hash(const std::string& sha) override {
    return one_file("SELECT " FILE_COLUMNS " FROM files WHERE sha256=? ORDER BY id DESC LIMIT 1", sha);
  }

  std::vector<FileRecord> recent_files(int limit, const std::string& status) override {
    auto& s = stmt("SELECT " FILE_COLUMNS " FROM files WHERE (?1 = '' OR status = ?1) ORDER BY id DESC LIMIT ?2");
    s.bind(1, status).bind(2, limit);
    return read_files(s);
  }

  std::optional<FileRecord> newest_file_in_database() override {
    auto files = recent_files(1, "");
    if (files.empty()) return std::nullopt;
    return files.front();
  }
  bool hold_fleet_lead() override { return true; }  // one daemon per SQLite database (the root lock)
  std::unique_ptr<Store> open_another() const override { return open_sqlite_store(path_, load_batch_size_); }

  std::vector<FileRecord> files_for_unit(std::string_view unit_id) override {
    write_queued_load();
    auto& s = stmt(
        "SELECT " FILE_COLUMNS " FROM files WHERE status='accepted' AND id IN ("
        " SELECT file_id FROM units WHERE unit_id=?1"
        " UNION SELECT replaced_by_file FROM unit_history WHERE unit_id=?1"
        " UNION SELECT s.file_id FROM oil_samples s JOIN units u USING(unit_key) WHERE u.unit_id=?1"
        " UNION SELECT i.file_id FROM infrared_scans i JOIN units u USING(unit_key) WHERE u.unit_id=?1"
        " UNION SELECT n.file_id FROM inspections n JOIN units u USING(unit_key) WHERE u.unit_id=?1"
        " UNION SELECT e.file_id FROM electrical_tests e JOIN units u USING(unit_key) WHERE u.unit_id=?1"
        " UNION SELECT w.file_id FROM work_status w JOIN units u USING(unit_key) WHERE u.unit_id=?1"
        " UNION SELECT DISTINCT l.file_id FROM load_points l JOIN units u USING(unit_key) WHERE u.unit_id=?1"
        ") ORDER BY id");
    s.bind(1, unit_id);
    return read_files(s);
  }

  std::vector<std::string> units_of_file(std::int64_t file_id) override {
    write_queued_load();
    auto& s = stmt(
        "SELECT unit_id FROM units WHERE file_id=?1"
        " UNION SELECT u.unit_id FROM oil_samples s JOIN units u USING(unit_key) WHERE s.file_id=?1"
        " UNION SELECT u.unit_id FROM infrared_scans i JOIN units u USING(unit_key) WHERE i.file_id=?1"
        " UNION SELECT u.unit_id FROM inspections n JOIN units u USING(unit_key) WHERE n.file_id=?1"
        " UNION SELECT u.unit_id FROM electrical_tests e JOIN units u USING(unit_key) WHERE e.file_id=?1"
        " UNION SELECT u.unit_id FROM work_status w JOIN units u USING(unit_key) WHERE w.file_id=?1"
        " UNION SELECT u.unit_id FROM units u WHERE EXISTS (SELECT 1 FROM load_points l"
        "   WHERE l.unit_key = u.unit_key AND l.file_id=?1)"
        " ORDER BY 1");
    s.bind(1, file_id);
    std::vector<std::string> out;
    while (s.step()) out.push_back(s.text(0));
    s.reset();
    return out;
  }

  std::optional<analytics::UnitInfo> find_unit(std::string_view unit_id) override {
    auto& s = stmt("SELECT " UNIT_COLUMNS " FROM units WHERE unit_id=?");
    s.bind(1, unit_id);
    std::optional<analytics::UnitInfo> out;
    if (s.step()) out = read_unit(s);
    s.reset();
    return out;
  }

  std::vector<analytics::UnitInfo> units() override {
    auto& s = stmt("SELECT " UNIT_COLUMNS " FROM units ORDER BY unit_id");
    std::vector<analytics::UnitInfo> out;
    while (s.step()) out.push_back(read_unit(s));
    s.reset();
    return out;
  }

  std::vector<UnitSite> unit_sites() override {
    std::vector<UnitSite> out;
    out.reserve(static_cast<std::size_t>(count_rows("units")));  // grown by doubling, it held twice the register
    auto& s = stmt("SELECT unit_id, site FROM units ORDER BY unit_id");
    while (s.step()) out.push_back({s.text(0), s.text(1)});
    s.reset();
    return out;
  }

  bool upsert_unit(const analytics::UnitInfo& u, std::int64_t file_id, int line) override {
    const auto old = find_unit(u.unit_id);
    const std::string new_json = unit_json(u);
    if (old && unit_json(*old) == new_json) return false;
    if (old) {
      auto& h = stmt("INSERT INTO unit_history(unit_id, replaced_at, replaced_by_file, old_row_json)"
                     " VALUES(?, strftime('%Y-%m-%dT%H:%M:%SZ','now'), ?, ?)");
      h.bind(1, u.unit_id).bind(2, file_id).bind(3, unit_json(*old));
      h.run();
    }
    auto& s = stmt(
        "INSERT INTO units(unit_id, site, serial, rated_mva, hv_kv, lv_kv, cooling, year_built, phases,"
        " vector_group, oil_type, paper, oil_volume_l, criticality, customers_served, top_oil_rise_k,"
        " hot_spot_gradient_k, load_loss_ratio, oil_treated_day, file_id, line, replacement_cost, refurbishment_cost)"
        " VALUES(?1,?2,?3,?4,?5,?6,?7,?8,?9,?10,?11,?12,?13,?14,?15,?16,?17,?18,?19,?20,?21,?22,?23)"
        " ON CONFLICT(unit_id) DO UPDATE SET site=?2, serial=?3, rated_mva=?4, hv_kv=?5, lv_kv=?6,"
        " cooling=?7, year_built=?8, phases=?9, vector_group=?10, oil_type=?11, paper=?12,"
        " oil_volume_l=?13, criticality=?14, customers_served=?15, top_oil_rise_k=?16,"
        " hot_spot_gradient_k=?17, load_loss_ratio=?18, oil_treated_day=?19, file_id=?20, line=?21,"
        " replacement_cost=?22, refurbishment_cost=?23");
    s.bind(1, u.unit_id).bind(2, u.site).bind_text_or_null(3, u.serial).bind(4, u.rated_mva)
        .bind(5, u.hv_kv).bind(6, u.lv_kv).bind(7, u.cooling).bind(8, u.year_built).bind(9, u.phases)
        .bind_text_or_null(10, u.vector_group).bind(11, analytics::to_string(u.oil))
        .bind(12, analytics::to_string(u.paper)).bind(13, u.oil_volume_l).bind(14, u.criticality)
        .bind(15, u.customers_served).bind(16, u.top_oil_rise_k).bind(17, u.hot_spot_gradient_k)
        .bind(18, u.load_loss_ratio).bind(19, u.oil_treated).bind(20, file_id).bind(21, line)
        .bind(22, u.replacement_cost).bind(23, u.refurbishment_cost);
    s.run();
    auto& e = stmt("UPDATE units SET conductor=?, tap_positions=?, tap_nominal=?, tap_step_pct=?, impedance_pct=?,"
                   " oltc=? WHERE unit_id=?");
    e.bind_text_or_null(1, u.conductor).bind(2, u.tap_positions).bind(3, u.tap_nominal).bind(4, u.tap_step_pct)
        .bind(5, u.impedance_pct).bind_text_or_null(6, analytics::to_string(u.oltc)).bind(7, u.unit_id);
    e.run();
    unit_keys_.erase(u.unit_id);
    unit_cycle_.clear();
    last_unit_key_ = 0;
    return true;
  }

  RowInsert add_oil_sample(const std::string& unit_id, const analytics::OilSample& o, std::int64_t file_id,
                           int line) override {
    const std::int64_t key = unit_key(unit_id);
    auto& ins = stmt("INSERT INTO oil_samples(unit_key, sample_day, lab_ref, sample_point, breakdown_method,"
                     " file_id, line) VALUES(?,?,?,?,?,?,?)");
    ins.bind(1, key).bind(2, o.date).bind(3, o.lab_ref).bind(4, o.sample_point).bind(5, o.breakdown_method)
        .bind(6, file_id).bind(7, line);
    ins.run();
    const std::int64_t id = sqlite3_last_insert_rowid(db_);
    // A corrected re-issue (same unit, day, lab reference and sample point)
    // supersedes the earlier sample, which stays as history.
    auto& sup = stmt("UPDATE oil_samples SET superseded_by=?1 WHERE unit_key=?2 AND sample_day=?3 AND lab_ref=?4"
                     " AND sample_point=?5 AND id<>?1 AND superseded_by IS NULL RETURNING file_id");
    sup.bind(1, id).bind(2, key).bind(3, o.date).bind(4, o.lab_ref).bind(5, o.sample_point);
    const RowInsert outcome = replaced_rows(sup, file_id);
    auto& val = stmt("INSERT INTO oil_values(sample_id, test, state, value) VALUES(?,?,?,?)");
    for (const auto& f : kOilFields) {
      const LabValue& v = o.*(f.member);
      if (!v.present()) continue;
      val.bind(1, id).bind(2, f.test).bind(3, v.is_measured() ? 1 : 2).bind(4, v.value);
      val.run();
    }
    return outcome;
  }

  LoadInsert add_load_point(const std::string& unit_id, const analytics::LoadPoint& p, std::int64_t file_id,
                            int line) override {
    write_queued_load();
    const std::int64_t key = unit_key(unit_id);
    // An earlier file's point for the same time is replaced; a second point
    // for the same time in the same file is left alone and reported.
    auto& s = stmt(
        "INSERT INTO load_points(unit_key, ts, load_pu, ambient_c, top_oil_c, file_id, line)"
        " VALUES(?1,?2,?3,?4,?5,?6,?7) ON CONFLICT(unit_key, ts) DO UPDATE SET load_pu=?3, ambient_c=?4,"
        " top_oil_c=?5, file_id=?6, line=ferrum_replaced(?7) WHERE load_points.file_id <> ?6");
    s.bind(1, key).bind(2, p.t).bind(3, p.load_pu).bind(4, p.ambient_c).bind(5, p.top_oil_c)
        .bind(6, file_id).bind(7, line);
    const long long replaced_before = replaced_points_;
    const sqlite3_int64 before = sqlite3_total_changes64(db_);
    s.run();
    if (sqlite3_total_changes64(db_) == before) return LoadInsert::duplicate_in_file;
    ++written_points_;
    return replaced_points_ != replaced_before ? LoadInsert::replaced_earlier_file : LoadInsert::added;
  }

  std::optional<LoadDuplicate> queue_load_point(const std::string& unit_id, const analytics::LoadPoint& p,
                                                std::int64_t file_id, std::int64_t line) override {
    if (file_id != queued_file_) {
      write_queued_load();
      last_written_.reset();
    }
    if (last_unit_key_ == 0 || unit_id != last_unit_id_) {  // rows often come in runs of one unit
      last_unit_key_ = cycled_unit_key(unit_id);
      last_unit_id_ = unit_id;
    }
    queued_file_ = file_id;
    if (queue_.capacity() == 0) queue_.reserve(static_cast<std::size_t>(load_batch_size_));
    queue_.push_back(QueuedPoint{last_unit_key_, p.t, p.load_pu, p.ambient_c, p.top_oil_c, line});
    if (queue_.size() < static_cast<std::size_t>(load_batch_size_)) return std::nullopt;
    // A full queue that came in key order and continues what this file
    // wrote (a file sorted by unit) is written at once; any other is kept as
    // a sorted run on file until the queue is written (write_queued_load).
    const bool came_sorted = sort_queue();
    if (came_sorted && runs_.empty() && (!last_written_ || key_less(*last_written_, queue_.front()))) {
      write_queued_load();
    } else {
      runs_.add(queue_);
      queue_.clear();
    }
    return take_duplicate();
  }

  std::optional<LoadDuplicate> flush_load_points() override {
    write_queued_load();
    return take_duplicate();
  }

  LoadCounts load_counts() override {
    write_queued_load();
    return {written_points_ - replaced_points_, replaced_points_};
  }

  RowInsert add_infrared(const std::string& unit_id, const analytics::InfraredScan& r, std::int64_t file_id,
                         int line) override {
    const std::int64_t key = unit_key(unit_id);
    auto& del = stmt("DELETE FROM infrared_scans WHERE unit_key=? AND survey_day=? AND component=? RETURNING file_id");
    del.bind(1, key).bind(2, r.date).bind(3, r.component);
    const RowInsert outcome = replaced_rows(del, file_id);
    auto& s = stmt("INSERT INTO infrared_scans(unit_key, survey_day, component, spot_c, reference_c, ambient_c,"
                   " load_pct, emissivity, image_ref, note, file_id, line) VALUES(?,?,?,?,?,?,?,?,?,?,?,?)");
    s.bind(1, key).bind(2, r.date).bind(3, r.component).bind(4, r.spot_c).bind(5, r.reference_c)
        .bind(6, r.ambient_c).bind(7, r.load_pct).bind(8, r.emissivity).bind_text_or_null(9, r.image_ref)
        .bind_text_or_null(10, r.note).bind(11, file_id).bind(12, line);
    s.run();
    return outcome;
  }

  RowInsert add_inspection(const std::string& unit_id, const analytics::InspectionRecord& r,
                           std::int64_t file_id, int line) override {
    const std::int64_t key = unit_key(unit_id);
    auto& del = stmt("DELETE FROM inspections WHERE unit_key=? AND inspection_day=? AND item=? RETURNING file_id");
    del.bind(1, key).bind(2, r.date).bind(3, r.item);
    const RowInsert outcome = replaced_rows(del, file_id);
    auto& s = stmt("INSERT INTO inspections(unit_key, inspection_day, item, rating, note, inspector, file_id, line)"
                   " VALUES(?,?,?,?,?,?,?,?)");
    s.bind(1, key).bind(2, r.date).bind(3, r.item).bind(4, analytics::to_string(r.rating))
        .bind_text_or_null(5, r.note).bind_text_or_null(6, r.inspector).bind(7, file_id).bind(8, line);
    s.run();
    return outcome;
  }

  RowInsert add_electrical_test(const std::string& unit_id, const analytics::ElectricalTest& t,
                                std::int64_t file_id, int line) override {
    const std::int64_t key = unit_key(unit_id);
    auto& del = stmt("DELETE FROM electrical_tests WHERE unit_key=? AND test_day=? AND test=? AND phase=?"
                     " AND tap IS ? AND winding=? AND insulation=? AND bushing=? AND minutes IS ? AND test_kv IS ?"
                     " RETURNING file_id");
    del.bind(1, key).bind(2, t.date).bind(3, analytics::to_string(t.test)).bind(4, t.phase).bind(5, t.tap)
        .bind(6, t.winding).bind(7, t.insulation).bind(8, t.bushing).bind(9, t.minutes).bind(10, t.test_kv);
    const RowInsert outcome = replaced_rows(del, file_id);
    auto& s = stmt("INSERT INTO electrical_tests(unit_key, test_day, test, phase, tap, winding, temp_c, insulation,"
                   " test_kv, bushing, minutes, value, capacitance_pf, nameplate_value, note, crew, file_id, line)"
                   " VALUES(?,?,?,?,?,?,?,?,?,?,?,?,?,?,?,?,?,?)");
    s.bind(1, key).bind(2, t.date).bind(3, analytics::to_string(t.test)).bind(4, t.phase).bind(5, t.tap)
        .bind(6, t.winding).bind(7, t.temp_c).bind(8, t.insulation).bind(9, t.test_kv).bind(10, t.bushing)
        .bind(11, t.minutes).bind(12, t.value).bind(13, t.capacitance_pf).bind(14, t.nameplate_value)
        .bind_text_or_null(15, t.note).bind_text_or_null(16, t.crew).bind(17, file_id).bind(18, line);
    s.run();
    return outcome;
  }

  RowInsert add_work_status(const std::string& unit_id, const analytics::WorkStatus& w, std::int64_t file_id,
                            int line) override {
    const std::int64_t key = unit_key(unit_id);
    auto& del = stmt("DELETE FROM work_status WHERE unit_key=? AND reference=? AND status_day=? AND status=?"
                     " RETURNING file_id");
    del.bind(1, key).bind(2, w.reference).bind(3, w.date).bind(4, w.status);
    const RowInsert outcome = replaced_rows(del, file_id);
    auto& s = stmt("INSERT INTO work_status(unit_key, reference, status, status_day, note, file_id, line)"
                   " VALUES(?,?,?,?,?,?,?)");
    s.bind(1, key).bind(2, w.reference).bind(3, w.status).bind(4, w.date).bind_text_or_null(5, w.note)
        .bind(6, file_id).bind(7, line);
    s.run();
    return outcome;
  }

  void add_conversion(std::int64_t file_id, const std::string& column, const std::string& original_unit,
                      const std::string& stored_as) override {
    auto& s = stmt("INSERT OR REPLACE INTO conversions(file_id, column, original_unit, stored_as) VALUES(?,?,?,?)");
    s.bind(1, file_id).bind(2, column).bind(3, original_unit).bind(4, stored_as);
    s.run();
  }

  analytics::UnitData unit_data(std::string_view unit_id) override {
    write_queued_load();
    analytics::UnitData d;
    auto info = find_unit(unit_id);
    if (!info) return d;
    d.info = *info;
    const std::int64_t key = unit_key(std::string(unit_id));
    read_oil(key, d.oil_samples);
    d.load = load_points(unit_id, INT64_MIN, INT64_MAX);
    d.load_history = load_history(key, unit_id);
    {
      auto& s = stmt("SELECT survey_day, component, spot_c, reference_c, ambient_c, load_pct, emissivity,"
                     " image_ref, note FROM infrared_scans WHERE unit_key=? ORDER BY survey_day, component");
      s.bind(1, key);
      while (s.step()) d.infrared.push_back(read_infrared_row(s));
      s.reset();
    }
    {
      auto& s = stmt("SELECT inspection_day, item, rating, note, inspector FROM inspections WHERE unit_key=?"
                     " ORDER BY inspection_day, item");
      s.bind(1, key);
      while (s.step()) d.inspections.push_back(read_inspection_row(s));
      s.reset();
    }
    {
      // The earth inspections of the other units at this site (site_earth_check.h).
      // The site's units first (index units_site), then their inspections
      // (inspections_unit): CROSS JOIN keeps SQLite's planner to that order,
      // which otherwise scans every inspection of the fleet for each unit.
      auto& s = stmt("SELECT n.inspection_day, n.item, n.rating, n.note, n.inspector, u.unit_id FROM units u"
                     " CROSS JOIN inspections n ON n.unit_key = u.unit_key WHERE lower(u.site)=lower(?)"
                     " AND u.unit_key<>? AND n.item='grounding' ORDER BY n.inspection_day, u.unit_id");
      s.bind(1, d.info.site).bind(2, key);
      while (s.step()) d.site_inspections.push_back({s.text(5), read_inspection_row(s)});
      s.reset();
    }
    read_electrical(key, d.electrical);
    {
      auto& s = stmt("SELECT reference, status, status_day, note FROM work_status WHERE unit_key=?"
                     " ORDER BY status_day, id");
      s.bind(1, key);
      while (s.step()) d.work_status.push_back({s.text(0), s.text(1), static_cast<analytics::Day>(s.i64(2)), s.text(3)});
      s.reset();
    }
    return d;
  }

  void keep_load_history(const std::string& unit_id, const analytics::LoadHistory& h) override {
    write_queued_load();
    const std::int64_t key = unit_key(unit_id);
    analytics::Timestamp stored_to = INT64_MIN;  // days before the earlier cut are stored already
    {
      auto& s = stmt("SELECT raw_from FROM load_history WHERE unit_key=?");
      s.bind(1, key);
      if (s.step()) stored_to = s.i64(0);
      s.reset();
    }
    for (const auto& d : h.days) {
      if (analytics::start_of(d.day) < stored_to) continue;
      auto& s = stmt("INSERT OR IGNORE INTO load_days(unit_key, " LOAD_DAY_COLUMNS
                     ") VALUES(?,?,?,?,?,?,?,?,?,?,?,?,?,?,?,?,?,?,?,?,?,?,?,?)");
      int i = 1;
      s.bind(i++, key);
      put_load_day(d, [&](auto v) { s.bind(i++, v); });
      s.run();
    }
    auto& s = stmt("INSERT OR REPLACE INTO load_history(unit_key, raw_from, resume) VALUES(?,?,?)");
    s.bind(1, key).bind(2, h.raw_from).bind(3, encode_resume(h.resume));
    s.run();
    auto& del = stmt("DELETE FROM load_points WHERE unit_key=? AND ts<?");
    del.bind(1, key).bind(2, h.raw_from);
    del.run();
  }

  std::shared_ptr<const analytics::LoadHistory> load_history(std::int64_t key, std::string_view unit_id) {
    auto& s = stmt("SELECT raw_from, resume FROM load_history WHERE unit_key=?");
    s.bind(1, key);
    if (!s.step()) {
      s.reset();
      return nullptr;
    }
    auto h = std::make_shared<analytics::LoadHistory>();
    h->raw_from = s.i64(0);
    const auto resume = decode_resume(s.text(1));
    s.reset();
    if (!resume) throw StoreError("the summarised load history of unit " + std::string(unit_id) + " cannot be read");
    h->resume = *resume;
    auto& d = stmt("SELECT " LOAD_DAY_COLUMNS " FROM load_days WHERE unit_key=? ORDER BY day");
    d.bind(1, key);
    while (d.step()) h->days.push_back(read_load_day_row(d));
    d.reset();
    return h;
  }

  std::vector<analytics::LoadPoint> load_points(std::string_view unit_id, analytics::Timestamp from,
                                                analytics::Timestamp to) override {
    write_queued_load();
    std::vector<analytics::LoadPoint> out;
    auto info = find_unit(unit_id);
    if (!info) return out;
    auto& s = stmt("SELECT ts, load_pu, ambient_c, top_oil_c FROM load_points WHERE unit_key=? AND ts BETWEEN ? AND ?"
                   " ORDER BY ts");
    s.bind(1, unit_key(std::string(unit_id))).bind(2, from).bind(3, to);
    while (s.step()) out.push_back(read_load_point_row(s));
    s.reset();
    return out;
  }

  long count_rows(const std::string& table) override {
    write_queued_load();
    for (const char* t : kCountedTables) {
      if (table == t) {
        Statement s(db_, ("SELECT count(*) FROM " + table).c_str());
        s.step();
        return static_cast<long>(s.i64(0));
      }
    }
    throw StoreError("no table named " + table);
  }

  std::int64_t add_alert(const Alert& a) override {
    auto& s = stmt("INSERT INTO alerts(unit_id, kind, raised_at, text) VALUES(?,?,?,?)");
    s.bind(1, a.unit_id).bind(2, a.kind).bind(3, a.raised_at).bind(4, a.text);
    s.run();
    return sqlite3_last_insert_rowid(db_);
  }

  std::vector<Alert> open_alerts() override {
    auto& s = stmt("SELECT id, unit_id, kind, raised_at, text FROM alerts WHERE acknowledged_at IS NULL ORDER BY id");
    std::vector<Alert> out;
    while (s.step()) out.push_back(Alert{s.i64(0), s.text(1), s.text(2), s.text(3), s.text(4), true});
    s.reset();
    return out;
  }

  std::optional<std::string> state(const std::string& key) override {
    auto& s = stmt("SELECT value FROM daemon_state WHERE key=?");
    s.bind(1, key);
    std::optional<std::string> out;
    if (s.step()) out = s.text(0);
    s.reset();
    return out;
  }
  void set_state(const std::string& key, const std::string& value) override {
    auto& s = stmt("INSERT INTO daemon_state(key, value) VALUES(?,?) ON CONFLICT(key) DO UPDATE SET value=excluded.value");
    s.bind(1, key).bind(2, value);
    s.run();
  }

 private:
  // Runs a DELETE/UPDATE ... RETURNING file_id that takes rows with the new
  // row's key out of the current data: none, the new row is new; rows of an
  // earlier file, it was already on file; of this file, a second row.
  static RowInsert replaced_rows(Statement& s, std::int64_t file_id) {
    RowInsert outcome = RowInsert::added;
    while (s.step())
      if (outcome != RowInsert::duplicate_in_file)
        outcome = s.i64(0) == file_id ? RowInsert::duplicate_in_file : RowInsert::replaced_earlier_file;
    s.reset();
    return outcome;
  }

  std::optional<LoadDuplicate> take_duplicate() {
    auto d = std::move(unreported_duplicate_);
    unreported_duplicate_.reset();
    return d;
  }

  // Writes the queued load points in key order (unit, time, line): rows of
  // a file that lists every unit at one time, then every unit at the next
  // (or in any order) then touch each unit's pages once instead of once per
  // row, which is what made such files 13x slower than the same rows sorted
  // by unit. A full queue that does not continue the file in key order was
  // kept as a sorted run on file (queue_load_point); the runs and the queue
  // are merged here, so that the table is written in one pass in key order
  // however the file was ordered (with one pass per queue, a time-major
  // file touched every unit's last page once per queue, and SQLite's cache
  // wrote and read those pages back each time). Sorting keeps, of two points
  // of one unit and time in the file, the earlier line first, so it is the
  // one kept, as in file order.
  void write_queued_load() {
    if (queue_.empty() && runs_.empty()) return;
    sort_queue();
    if (runs_.empty()) {
      write_points(queue_);
    } else {
      LoadRuns::Merge merge(runs_, queue_);
      // sort_queue's scratch is free here: it holds each chunk to write
      // (resized only upwards: resizing value-initialises).
      constexpr std::size_t kChunk = 256 * kLoadStatementRows;
      if (sorted_.size() < kChunk) sorted_.resize(kChunk);
      std::size_t k = 0;
      while (merge.next(sorted_[k]))
        if (++k == kChunk) {
          write_points(std::span<const QueuedPoint>(sorted_.data(), k));
          k = 0;
        }
      write_points(std::span<const QueuedPoint>(sorted_.data(), k));
      runs_.clear();
    }
    queue_.clear();
  }

  // Writes points sorted by key, in full statements of kLoadStatementRows
  // rows, the rest point by point. A statement changes one row per point
  // except a second point for the same time in the same file; when rows are
  // missing, the duplicate with the smallest line is found by the stored
  // lines (the kept point of a unit and time is the file's first one) and
  // kept for take_duplicate() unless one with a smaller line is kept
  // already: the line a row-by-row import reports first.
  void write_points(std::span<const QueuedPoint> points) {
    const int n = static_cast<int>(points.size());
    if (n == 0) return;
    long long changed = 0;
    int r = 0;
    if (n >= kLoadStatementRows) {
      if (!load_batch_) load_batch_ = std::make_unique<Statement>(db_, load_insert_sql(kLoadStatementRows));
      Statement& s = *load_batch_;
      s.bind(1, queued_file_);
      for (; r + kLoadStatementRows <= n; r += kLoadStatementRows) {
        for (int i = 0; i < kLoadStatementRows; ++i) bind_point(s, 2 + i * 6, points[r + i]);
        s.run_keep_bindings();
        changed += sqlite3_changes(db_);
      }
    }
    if (r < n) {
      auto& s = stmt(kLoadInsertOne);
      for (; r < n; ++r) {
        s.bind(1, queued_file_);
        bind_point(s, 2, points[r]);
        s.run_keep_bindings();
        changed += sqlite3_changes(db_);
      }
    }
    written_points_ += changed;
    last_written_ = points.back();
    if (changed == n) return;
    auto& find = stmt("SELECT line FROM load_points WHERE unit_key=? AND ts=?");
    const QueuedPoint* first = nullptr;
    std::int64_t first_line = unreported_duplicate_ ? unreported_duplicate_->line : INT64_MAX;
    for (const auto& q : points) {
      if (q.line >= first_line) continue;
      find.bind(1, q.unit_key).bind(2, q.ts);
      const bool found = find.step();
      const std::int64_t stored_line = found ? find.i64(0) : -1;
      find.reset();
      if (stored_line != q.line) {
        first = &q;
        first_line = q.line;
      }
    }
    if (first) {
      auto& u = stmt("SELECT unit_id FROM units WHERE unit_key=?");
      u.bind(1, first->unit_key);
      unreported_duplicate_ = LoadDuplicate{first->line, u.step() ? u.text(0) : std::string()};
      u.reset();
    }
  }

  // Sorts the queue by (unit, time, line). Unit keys are small dense
  // integers, so a stable counting sort by unit (which keeps file order, and
  // so line order, within a unit) does most of the work in linear time; each
  // unit's run is then sorted by time only where the file did not already
  // give its rows in time order. A general sort of 262,144 points took 11 %
  // of a time-major import.
  // True when the queue was in key order already.
  bool sort_queue() {
    if (std::is_sorted(queue_.begin(), queue_.end(), key_less)) return true;
    const auto [lo, hi] = std::minmax_element(queue_.begin(), queue_.end(),
                                              [](const QueuedPoint& a, const QueuedPoint& b) { return a.unit_key < b.unit_key; });
    const std::int64_t first = lo->unit_key;
    const std::size_t range = static_cast<std::size_t>(hi->unit_key - first) + 1;
    if (range > 4 * queue_.size()) {  // sparse keys: no counting sort
      std::sort(queue_.begin(), queue_.end(), key_less);
      return false;
    }
    std::vector<std::size_t> start(range + 1, 0);
    for (const auto& q : queue_) ++start[static_cast<std::size_t>(q.unit_key - first) + 1];
    for (std::size_t k = 1; k <= range; ++k) start[k] += start[k - 1];
    sorted_.resize(queue_.size());
    std::vector<std::size_t> next(start.begin(), start.end() - 1);
    for (const auto& q : queue_) sorted_[next[static_cast<std::size_t>(q.unit_key - first)]++] = q;
    const auto by_time = [](const QueuedPoint& a, const QueuedPoint& b) { return a.ts != b.ts ? a.ts < b.ts : a.line < b.line; };
    for (std::size_t k = 0; k < range; ++k) {
      auto b = sorted_.begin() + static_cast<std::ptrdiff_t>(start[k]);
      auto e = sorted_.begin() + static_cast<std::ptrdiff_t>(start[k + 1]);
      if (!std::is_sorted(b, e, by_time)) std::sort(b, e, by_time);
    }
    queue_.swap(sorted_);
    return false;
  }

  static void bind_point(Statement& s, int first, const QueuedPoint& p) {
    s.bind(first, p.unit_key).bind(first + 1, p.ts).bind(first + 2, p.load_pu).bind(first + 3, p.ambient_c)
        .bind(first + 4, p.top_oil_c).bind(first + 5, p.line);
  }

  Statement& stmt(const char* sql) {
    auto it = statements_.find(sql);
    if (it == statements_.end()) it = statements_.emplace(sql, std::make_unique<Statement>(db_, sql)).first;
    it->second->reset();
    return *it->second;
  }

  std::optional<FileRecord> one_file(const char* sql, const std::string& sha) {
    auto& s = stmt(sql);
    s.bind(1, sha);
    auto files = read_files(s);
    if (files.empty()) return std::nullopt;
    return files.front();
  }

  static std::vector<FileRecord> read_files(Statement& s) {
    std::vector<FileRecord> out;
    while (s.step()) out.push_back(read_file_row(s));
    s.reset();
    return out;
  }

  void read_electrical(std::int64_t key, std::vector<analytics::ElectricalTest>& out) {
    auto& s = stmt("SELECT test_day, test, phase, tap, winding, temp_c, insulation, test_kv, bushing, minutes, value,"
                   " capacitance_pf, nameplate_value, note, crew FROM electrical_tests WHERE unit_key=?"
                   " ORDER BY test_day, id");
    s.bind(1, key);
    while (s.step())
      if (auto t = read_electrical_row(s)) out.push_back(std::move(*t));
    s.reset();
  }

  void read_oil(std::int64_t key, std::vector<analytics::OilSample>& out) {
    auto& s = stmt(
        "SELECT s.id, s.sample_day, s.lab_ref, s.sample_point, s.breakdown_method, v.test, v.state, v.value"
        " FROM oil_samples s LEFT JOIN oil_values v ON v.sample_id = s.id"
        " WHERE s.unit_key=? AND s.superseded_by IS NULL ORDER BY s.sample_day, s.id");
    s.bind(1, key);
    std::int64_t current = -1;
    while (s.step()) read_oil_row(s, current, out);
    s.reset();
  }

  std::int64_t unit_key(const std::string& unit_id) {
    auto it = unit_keys_.find(unit_id);
    if (it != unit_keys_.end()) return it->second;
    auto& s = stmt("SELECT unit_key FROM units WHERE unit_id=?");
    s.bind(1, unit_id);
    if (!s.step()) {
      s.reset();
      throw StoreError("unit " + unit_id + " is not in the register");
    }
    const std::int64_t key = s.i64(0);
    s.reset();
    unit_keys_.emplace(unit_id, key);
    return key;
  }

  // The key of a load point's unit. A file that lists every unit at one
  // time, then every unit at the next, repeats one order of units: units are
  // kept in the order they first came (at most kUnitCycle), and the one after
  // the last is tried before the hash map, whose cold lookups were 9 % of
  // such an import.
  std::int64_t cycled_unit_key(const std::string& unit_id) {
    if (!unit_cycle_.empty()) {
      const std::size_t next = unit_at_ + 1 < unit_cycle_.size() ? unit_at_ + 1 : 0;
      if (unit_cycle_[next].first == unit_id) {
        unit_at_ = next;
        return unit_cycle_[next].second;
      }
    }
    const std::int64_t key = unit_key(unit_id);
    if (unit_cycle_.size() < kUnitCycle && (unit_cycle_.empty() || unit_at_ + 1 == unit_cycle_.size())) {
      unit_cycle_.emplace_back(unit_id, key);
      unit_at_ = unit_cycle_.size() - 1;
    }
    return key;
  }

  void check_is_ferrum_db(const std::string& path) {
    // A file that is not a database at all fails on the first read.
    char* err = nullptr;
    if (sqlite3_exec(db_, "SELECT count(*) FROM sqlite_master", nullptr, nullptr, &err) != SQLITE_OK) {
      std::string msg = err ? err : "unknown error";
      sqlite3_free(err);
      throw IncompatibleStore(path + " is not a usable SQLite database (" + msg + ")");
    }
    Statement v(db_, "PRAGMA user_version");
    v.step();
    const int version = v.i32(0);
    Statement t(db_, "SELECT count(*) FROM sqlite_master WHERE type='table'");
    t.step();
    if (version == 0 && t.i64(0) > 0)
      throw IncompatibleStore(path + " holds tables but is not a ferrum database");
    if (version > schema_version())
      throw IncompatibleStore(path + " was written by a newer ferrum (schema version " + std::to_string(version) +
                              ", this build knows up to " + std::to_string(schema_version()) +
                              "); refusing to touch it");
  }

  void migrate() {
    Statement v(db_, "PRAGMA user_version");
    v.step();
    const int current = v.i32(0);
    for (const Migration& m : embedded_migrations()) {
      if (m.version <= current) continue;
      exec(db_, "BEGIN IMMEDIATE");
      try {
        exec(db_, m.sql);
        exec(db_, ("PRAGMA user_version=" + std::to_string(m.version)).c_str());
        exec(db_, "COMMIT");
      } catch (const StoreError& e) {
        exec(db_, "ROLLBACK");
        throw StoreError(std::string("migration ") + m.name + " failed: " + e.what());
      }
    }
  }

  const std::string path_;
  sqlite3* db_ = nullptr;
  std::map<const char*, std::unique_ptr<Statement>> statements_;
  std::unordered_map<std::string, std::int64_t> unit_keys_;
  // The load-point queue (queue_load_point) and its multi-row statement.
  static constexpr const char* kLoadInsertOne =
      "INSERT INTO load_points(unit_key, ts, load_pu, ambient_c, top_oil_c, file_id, line)"
      " VALUES(?2,?3,?4,?5,?6,?1,?7) ON CONFLICT(unit_key, ts) DO UPDATE SET load_pu=excluded.load_pu,"
      " ambient_c=excluded.ambient_c, top_oil_c=excluded.top_oil_c, file_id=excluded.file_id,"
      " line=ferrum_replaced(excluded.line) WHERE load_points.file_id <> excluded.file_id";
  std::unique_ptr<Statement> load_batch_;
  const int load_batch_size_;       // points queued before they are written (store.h kSqliteLoadBatch)
  std::vector<QueuedPoint> queue_;  // at most load_batch_size_ points, in file order until written
  std::vector<QueuedPoint> sorted_;  // sort_queue's scratch, kept to avoid reallocating
  LoadRuns runs_;                    // full queues kept as sorted runs, merged when written
  std::optional<QueuedPoint> last_written_;  // the last point written of queued_file_ (the greatest)
  std::int64_t queued_file_ = 0;
  std::optional<LoadDuplicate> unreported_duplicate_;
  long long written_points_ = 0;   // load points written since begin()
  long long replaced_points_ = 0;  // of which replaced an earlier file's (counted by ferrum_replaced)
  std::string last_unit_id_;
  std::int64_t last_unit_key_ = 0;  // 0: none (unit keys start at 1)
  static constexpr std::size_t kUnitCycle = 65536;
  std::vector<std::pair<std::string, std::int64_t>> unit_cycle_;  // cycled_unit_key: units in the order they came
  std::size_t unit_at_ = 0;                                       // the last one used
};

}  // namespace

int schema_version() {
  int v = 0;
  for (const Migration& m : embedded_migrations()) v = std::max(v, m.version);
  return v;
}

std::unique_ptr<Store> open_sqlite_store(const std::string& path, int load_batch) {
  return std::make_unique<SqliteStore>(path, load_batch);
}

}  // namespace ferrum::store
