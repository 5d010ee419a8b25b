// PostgreSQL implementation of the store, on libpq: one database shared by
// several site roots (README, "When one machine is not enough"). The same
// rules as the SQLite store (store.h); what differs:
//  * load points are queued, then each batch is sent with COPY straight into
//    load_points inside a savepoint; a batch that meets a stored point or
//    holds a second reading (a unique violation) is rolled back to the
//    savepoint and sent with COPY into a temporary staging table, then
//    written by one INSERT ... ON CONFLICT;
//  * load_points is partitioned by month; a missing month's partition is
//    created on demand on a second connection (CREATE TABLE, then ATTACH
//    PARTITION, which does not block the readers and writers of the table),
//    so that a rolled-back file does not take the partition with it;
//  * a unit's load points are read from load_packs, its months packed into
//    one value each, and from the rows only where a month has no current
//    pack (migration 012; load_points, "Load packs" below). Any statement
//    that writes load_points must note the (unit, month) in
//    written_months_, so that the commit marks those packs stale;
//  * files and daemon_state rows carry the root that wrote them.
#include <algorithm>
#include <charconv>
#include <cmath>
#include <cstring>
#include <map>
#include <memory>
#include <set>
#include <unordered_map>

#include "analytics/calendar.h"
#include "schema/migrations.h"
#include "schema/postgresql/pg_connection.h"
#include "schema/store.h"
#include "schema/store_rows.h"

namespace ferrum::store {
namespace {

using analytics::Timestamp;

using analytics::LabValue;
using pg::Connection;
using pg::Params;
using pg::Result;

// Advisory lock keys (pg_advisory_lock takes one bigint): the letters of
// "ferrum" and a small number, so that they do not collide with another
// application's keys by chance.
constexpr std::int64_t kLockMigrate = 0x666572726d0001;
constexpr std::int64_t kLockPartitions = 0x666572726d0002;
constexpr std::int64_t kLockFleetLead = 0x666572726d0003;

// Month index (year * 12 + month - 1) of a UTC time, and its first second.
int month_of(std::int64_t ts) {
  const auto c = analytics::civil_from_days(analytics::day_of(ts));
  return c.year * 12 + c.month - 1;
}
std::int64_t month_start(int month_index) {
  return analytics::start_of(analytics::days_from_civil(month_index / 12, month_index % 12 + 1, 1));
}

std::vector<FileRecord> read_files(const Result& r) {
  std::vector<FileRecord> out;
  for (int i = 0; i < r.rows(); ++i) out.push_back(read_file_row(r.row(i)));
  return out;
}

std::optional<FileRecord> first_file(const Result& r) {
  auto files = read_files(r);
  if (files.empty()) return std::nullopt;
  return files.front();
}

class PgStore final : public Store {
 public:
  // `must_connect` false: a server that cannot be reached yet is no error;
  // the first call that finds it up connects and migrates.
  PgStore(std::string conninfo, std::string root, int load_batch, bool must_connect = true)
      : conninfo_(std::move(conninfo)), root_(std::move(root)), load_batch_size_(std::max(1, load_batch)),
        db_(conninfo_, must_connect) {
    if (db_.ok()) migrate();
  }
  ~PgStore() override = default;

  void begin() override {
    if (in_transaction_) throw StoreError("begin(): a transaction is already open");
    reconnect_if_lost();
    db_.exec("BEGIN");
    in_transaction_ = true;
    written_points_ = replaced_points_ = 0;
  }
  void commit() override {
    write_queued_load();
    if (unreported_duplicate_)
      throw StoreError("refusing to commit: load point of line " + std::to_string(unreported_duplicate_->line) +
                       " is a second reading in the same file and was never reported");
    stale_written_packs();
    db_.exec("COMMIT");
    in_transaction_ = false;
  }
  void rollback() override {
    queue_.clear();
    written_months_.clear();
    written_points_ = replaced_points_ = 0;
    unreported_duplicate_.reset();
    unit_keys_.clear();
    last_unit_key_ = 0;
    stage_ready_ = false;  // a staging table created in the transaction is gone with it
    if (!in_transaction_) return;
    in_transaction_ = false;
    if (db_.ok()) {
      try {
        db_.exec("ROLLBACK");
      } catch (const StoreError&) {
        // The connection went away: the server rolled the transaction back.
      }
    }
  }

  std::int64_t add_file(const FileRecord& f) override {
    reconnect_if_lost();
    Params p;
    p.add(root_).add(f.sha256).add(f.party).add(f.original_name).text_or_null(f.kind).add(f.status).add(f.rows)
        .add(f.problem_count).add(f.received_at).text_or_null(f.stored_as).add(f.receipt_json);
    auto r = db_.run("INSERT INTO files(root, sha256, party, original_name, kind, status, rows, problem_count,"
                     " received_at, stored_as, receipt_json) VALUES($1,$2,$3,$4,$5,$6,$7,$8,$9,$10,$11) RETURNING id",
                     p);
    return r.row(0).i64(0);
  }

  void update_file(const FileRecord& f) override {
    reconnect_if_lost();
    Params p;
    p.text_or_null(f.kind).add(f.status).add(f.rows).add(f.problem_count).text_or_null(f.stored_as)
        .add(f.receipt_json).add(f.id);
    db_.run("UPDATE files SET kind=$1, status=$2, rows=$3, problem_count=$4, stored_as=$5, receipt_json=$6 WHERE id=$7",
            p);
  }

  std::optional<FileRecord> accepted_file_with_hash(const std::string& sha) override {
    reconnect_if_lost();
    return first_file(db_.run("SELECT " FILE_COLUMNS " FROM files WHERE sha256=$1 AND status='accepted'"
                              " ORDER BY id LIMIT 1", Params().add(sha)));
  }
  // The lock's key: the digest's first 60 bits (a collision only makes two
  // imports of different content wait for each other), in the two-key space
  // of advisory locks, apart from the single-key locks above.
  void hold_content(const std::string& sha) override {
    if (!in_transaction_) throw StoreError("hold_content(): no transaction is open");
    const std::uint64_t bits = sha.size() >= 15 ? std::stoull(sha.substr(0, 15), nullptr, 16) : 0;
    db_.run("SELECT pg_advisory_xact_lock($1, $2)",
            Params().add(static_cast<std::int64_t>(bits >> 30)).add(static_cast<std::int64_t>(bits & 0x3fffffff)));
  }
  std::optional<FileRecord> latest_file_with_hash(const std::string& sha) override {
    reconnect_if_lost();
    return first_file(db_.run("SELECT " FILE_COLUMNS " FROM files WHERE sha256=$1 AND root=$2 ORDER BY id DESC LIMIT 1",
                              Params().add(sha).add(root_)));
  }
  std::vector<FileRecord> recent_files(int limit, const std::string& status) override {
    reconnect_if_lost();
    return read_files(db_.run("SELECT " FILE_COLUMNS " FROM files WHERE root=$3 AND ($1 = '' OR status = $1)"
                              " ORDER BY id DESC LIMIT $2", Params().add(status).add(limit).add(root_)));
  }
  std::optional<FileRecord> newest_file_in_database() override {
    reconnect_if_lost();
    return first_file(db_.run("SELECT " FILE_COLUMNS " FROM files ORDER BY id DESC LIMIT 1", Params()));
  }

  std::vector<FileRecord> files_for_unit(std::string_view unit_id) override {
    write_queued_load();
    return read_files(db_.run(
        "SELECT " FILE_COLUMNS " FROM files WHERE status='accepted' AND id IN ("
        " SELECT file_id FROM units WHERE unit_id=$1"
        " UNION SELECT replaced_by_file FROM unit_history WHERE unit_id=$1"
        " UNION SELECT s.file_id FROM oil_samples s JOIN units u USING(unit_key) WHERE u.unit_id=$1"
        " UNION SELECT i.file_id FROM infrared_scans i JOIN units u USING(unit_key) WHERE u.unit_id=$1"
        " UNION SELECT n.file_id FROM inspections n JOIN units u USING(unit_key) WHERE u.unit_id=$1"
        " UNION SELECT e.file_id FROM electrical_tests e JOIN units u USING(unit_key) WHERE u.unit_id=$1"
        " UNION SELECT w.file_id FROM work_status w JOIN units u USING(unit_key) WHERE u.unit_id=$1"
        " UNION SELECT DISTINCT l.file_id FROM load_points l JOIN units u USING(unit_key) WHERE u.unit_id=$1"
        ") ORDER BY id", Params().add(unit_id)));
  }

  std::vector<std::string> units_of_file(std::int64_t file_id) override {
    write_queued_load();
    auto r = db_.run(
        "SELECT unit_id FROM units WHERE file_id=$1"
        " UNION SELECT u.unit_id FROM oil_samples s JOIN units u USING(unit_key) WHERE s.file_id=$1"
        " UNION SELECT u.unit_id FROM infrared_scans i JOIN units u USING(unit_key) WHERE i.file_id=$1"
        " UNION SELECT u.unit_id FROM inspections n JOIN units u USING(unit_key) WHERE n.file_id=$1"
        " UNION SELECT u.unit_id FROM electrical_tests e JOIN units u USING(unit_key) WHERE e.file_id=$1"
        " UNION SELECT u.unit_id FROM work_status w JOIN units u USING(unit_key) WHERE w.file_id=$1"
        " UNION SELECT u.unit_id FROM units u WHERE EXISTS (SELECT 1 FROM load_points l"
        "   WHERE l.unit_key = u.unit_key AND l.file_id=$1)"
        " ORDER BY 1", Params().add(file_id));
    std::vector<std::string> out;
    for (int i = 0; i < r.rows(); ++i) out.push_back(r.row(i).text(0));
    return out;
  }

  std::optional<analytics::UnitInfo> find_unit(std::string_view unit_id) override {
    reconnect_if_lost();
    auto r = db_.run("SELECT " UNIT_COLUMNS " FROM units WHERE unit_id=$1", Params().add(unit_id));
    if (r.rows() == 0) return std::nullopt;
    return read_unit(r.row(0));
  }

  std::vector<analytics::UnitInfo> units() override {
    reconnect_if_lost();
    auto r = db_.run("SELECT " UNIT_COLUMNS " FROM units ORDER BY unit_id COLLATE \"C\"", Params());
    std::vector<analytics::UnitInfo> out;
    for (int i = 0; i < r.rows(); ++i) out.push_back(read_unit(r.row(i)));
    return out;
  }

  std::vector<UnitSite> unit_sites() override {
    reconnect_if_lost();
    auto r = db_.run("SELECT unit_id, site FROM units ORDER BY unit_id COLLATE \"C\"", Params());
    std::vector<UnitSite> out;
    out.reserve(static_cast<std::size_t>(r.rows()));
    for (int i = 0; i < r.rows(); ++i) out.push_back({r.row(i).text(0), r.row(i).text(1)});
    return out;
  }

  bool upsert_unit(const analytics::UnitInfo& u, std::int64_t file_id, int line) override {
    write_queued_load();
    const auto old = find_unit(u.unit_id);
    const std::string new_json = unit_json(u);
    if (old && unit_json(*old) == new_json) return false;
    if (old) {
      db_.run("INSERT INTO unit_history(unit_id, replaced_at, replaced_by_file, old_row_json)"
              " VALUES($1, to_char(now() AT TIME ZONE 'UTC', 'YYYY-MM-DD\"T\"HH24:MI:SS\"Z\"'), $2, $3)",
              Params().add(u.unit_id).add(file_id).add(unit_json(*old)));
    }
    Params p;
    p.add(u.unit_id).add(u.site).text_or_null(u.serial).add(u.rated_mva).add(u.hv_kv).add(u.lv_kv).add(u.cooling)
        .add(u.year_built).add(u.phases).text_or_null(u.vector_group).add(analytics::to_string(u.oil))
        .add(analytics::to_string(u.paper)).add(u.oil_volume_l).add(u.criticality).add(u.customers_served)
        .add(u.top_oil_rise_k).add(u.hot_spot_gradient_k).add(u.load_loss_ratio).add(u.oil_treated).add(file_id)
        .add(line).add(u.replacement_cost).add(u.refurbishment_cost).text_or_null(u.conductor).add(u.tap_positions)
        .add(u.tap_nominal).add(u.tap_step_pct).add(u.impedance_pct).text_or_null(analytics::to_string(u.oltc));
    db_.run("INSERT INTO units(unit_id, site, serial, rated_mva, hv_kv, lv_kv, cooling, year_built, phases,"
            " vector_group, oil_type, paper, oil_volume_l, criticality, customers_served, top_oil_rise_k,"
            " hot_spot_gradient_k, load_loss_ratio, oil_treated_day, file_id, line, replacement_cost,"
            " refurbishment_cost, conductor, tap_positions, tap_nominal, tap_step_pct, impedance_pct, oltc)"
            " VALUES($1,$2,$3,$4,$5,$6,$7,$8,$9,$10,$11,$12,$13,$14,$15,$16,$17,$18,$19,$20,$21,$22,$23,$24,$25,$26,$27,$28,$29)"
            " ON CONFLICT(unit_id) DO UPDATE SET site=$2, serial=$3, rated_mva=$4, hv_kv=$5, lv_kv=$6,"
            " cooling=$7, year_built=$8, phases=$9, vector_group=$10, oil_type=$11, paper=$12,"
            " oil_volume_l=$13, criticality=$14, customers_served=$15, top_oil_rise_k=$16,"
            " hot_spot_gradient_k=$17, load_loss_ratio=$18, oil_treated_day=$19, file_id=$20, line=$21,"
            " replacement_cost=$22, refurbishment_cost=$23, conductor=$24, tap_positions=$25, tap_nominal=$26,"
            " tap_step_pct=$27, impedance_pct=$28, oltc=$29",
            p);
    unit_keys_.erase(u.unit_id);
    last_unit_key_ = 0;
    return true;
  }

  RowInsert add_oil_sample(const std::string& unit_id, const analytics::OilSample& o, std::int64_t file_id,
                           int line) override {
    write_queued_load();
    const std::int64_t key = unit_key(unit_id);
    // One statement, one round trip: the sample, its values (arrays through
    // unnest) and the supersession of an earlier issue. The UPDATE runs on the
    // statement's snapshot, which does not hold the new sample, so it marks
    // earlier samples only (PostgreSQL documentation, "WITH Queries",
    // "Data-Modifying Statements in WITH"). Row by row it was about 17 round
    // trips a sample.
    std::string tests = "{", states = "{", values = "{";
    for (const auto& f : kOilFields) {
      const LabValue& v = o.*(f.member);
      if (!v.present()) continue;
      if (tests.size() > 1) tests += ',', states += ',', values += ',';
      tests += '"' + std::string(f.test) + '"';
      states += v.is_measured() ? '1' : '2';
      if (std::isnan(v.value)) {
        values += "NULL";
      } else {
        char buf[32];
        const auto end = std::to_chars(buf, buf + sizeof buf, v.value).ptr;  // reads back the same double
        values.append(buf, end);
      }
    }
    tests += '}', states += '}', values += '}';
    auto r = db_.run(
        "WITH s AS (INSERT INTO oil_samples(unit_key, sample_day, lab_ref, sample_point, breakdown_method, file_id, line)"
        "   VALUES($1,$2,$3,$4,$5,$6,$7) RETURNING id),"
        " v AS (INSERT INTO oil_values(sample_id, test, state, value)"
        "   SELECT s.id, x.test, x.state, x.value FROM s,"
        "   unnest($8::text[], $9::integer[], $10::double precision[]) AS x(test, state, value)),"
        " u AS (UPDATE oil_samples SET superseded_by=(SELECT id FROM s) WHERE unit_key=$1 AND sample_day=$2"
        "   AND lab_ref=$3 AND sample_point=$4 AND superseded_by IS NULL RETURNING file_id)"
        " SELECT file_id FROM u",
        Params().add(key).add(o.date).add(o.lab_ref).add(o.sample_point).add(o.breakdown_method).add(file_id)
            .add(line).add(tests).add(states).add(values));
    // A corrected re-issue supersedes the earlier sample (as in SQLite).
    const RowInsert outcome = replaced_rows(r, file_id);
    return outcome;
  }

  LoadInsert add_load_point(const std::string& unit_id, const analytics::LoadPoint& p, std::int64_t file_id,
                            int line) override {
    write_queued_load();
    const std::int64_t key = unit_key(unit_id);
    ensure_partitions({month_of(p.t)});
    // A partitioned table has no xmax to return: whether the upsert replaces
    // an earlier file's point is read first.
    const bool on_file = db_.run("SELECT 1 FROM load_points WHERE unit_key=$1 AND ts=$2 AND file_id<>$3",
                                 Params().add(key).add(p.t).add(file_id)).rows() > 0;
    auto r = db_.run("INSERT INTO load_points(unit_key, ts, load_pu, ambient_c, top_oil_c, file_id, line)"
                     " VALUES($1,$2,$3,$4,$5,$6,$7) ON CONFLICT(unit_key, ts) DO UPDATE SET load_pu=$3, ambient_c=$4,"
                     " top_oil_c=$5, file_id=$6, line=$7 WHERE load_points.file_id <> $6",
                     Params().add(key).add(p.t).add(p.load_pu).add(p.ambient_c).add(p.top_oil_c).add(file_id).add(line));
    if (r.affected() == 0) return LoadInsert::duplicate_in_file;
    written_months_.emplace(key, month_of(p.t));
    if (!in_transaction_) stale_written_packs();
    ++written_points_;
    if (!on_file) return LoadInsert::added;
    ++replaced_points_;
    return LoadInsert::replaced_earlier_file;
  }

  std::optional<LoadDuplicate> queue_load_point(const std::string& unit_id, const analytics::LoadPoint& p,
                                                std::int64_t file_id, std::int64_t line) override {
    if (!queue_.empty() && file_id != queued_file_) write_queued_load();
    if (last_unit_key_ == 0 || unit_id != last_unit_id_) {
      last_unit_key_ = unit_key(unit_id);
      last_unit_id_ = unit_id;
    }
    queued_file_ = file_id;
    queue_.push_back(QueuedPoint{last_unit_key_, p.t, p.load_pu, p.ambient_c, p.top_oil_c, line});
    if (queue_.size() < static_cast<std::size_t>(load_batch_size_)) return std::nullopt;
    write_queued_load();
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
    write_queued_load();
    const std::int64_t key = unit_key(unit_id);
    // The earlier row of the same key goes and the new one comes in one
    // statement (one round trip): the DELETE does not see the new row, both
    // running on the statement's snapshot.
    return replaced_rows(
        db_.run("WITH d AS (DELETE FROM infrared_scans WHERE unit_key=$1 AND survey_day=$2 AND component=$3"
                "   RETURNING file_id),"
                " i AS (INSERT INTO infrared_scans(unit_key, survey_day, component, spot_c, reference_c, ambient_c,"
                "   load_pct, emissivity, image_ref, note, file_id, line)"
                "   VALUES($1,$2,$3,$4,$5,$6,$7,$8,$9,$10,$11,$12))"
                " SELECT file_id FROM d",
                Params().add(key).add(r.date).add(r.component).add(r.spot_c).add(r.reference_c).add(r.ambient_c)
                    .add(r.load_pct).add(r.emissivity).text_or_null(r.image_ref).text_or_null(r.note).add(file_id)
                    .add(line)),
        file_id);
  }

  RowInsert add_work_status(const std::string& unit_id, const analytics::WorkStatus& w, std::int64_t file_id,
                            int line) override {
    write_queued_load();
    const std::int64_t key = unit_key(unit_id);
    return replaced_rows(  // one statement, as add_infrared
        db_.run("WITH d AS (DELETE FROM work_status WHERE unit_key=$1 AND reference=$2 AND status_day=$4"
                "   AND status=$3 RETURNING file_id),"
                " i AS (INSERT INTO work_status(unit_key, reference, status, status_day, note, file_id, line)"
                "   VALUES($1,$2,$3,$4,$5,$6,$7))"
                " SELECT file_id FROM d",
                Params().add(key).add(w.reference).add(w.status).add(w.date).text_or_null(w.note).add(file_id)
                    .add(line)),
        file_id);
  }

  RowInsert add_inspection(const std::string& unit_id, const analytics::InspectionRecord& r, std::int64_t file_id,
                           int line) override {
    write_queued_load();
    const std::int64_t key = unit_key(unit_id);
    return replaced_rows(  // one statement, as add_infrared
        db_.run("WITH d AS (DELETE FROM inspections WHERE unit_key=$1 AND inspection_day=$2 AND item=$3"
                "   RETURNING file_id),"
                " i AS (INSERT INTO inspections(unit_key, inspection_day, item, rating, note, inspector, file_id, line)"
                "   VALUES($1,$2,$3,$4,$5,$6,$7,$8))"
                " SELECT file_id FROM d",
                Params().add(key).add(r.date).add(r.item).add(analytics::to_string(r.rating)).text_or_null(r.note)
                    .text_or_null(r.inspector).add(file_id).add(line)),
        file_id);
  }

  RowInsert add_electrical_test(const std::string& unit_id, const analytics::ElectricalTest& t,
                                std::int64_t file_id, int line) override {
    write_queued_load();
    const std::int64_t key = unit_key(unit_id);
    return replaced_rows(  // one statement, as add_infrared
        db_.run("WITH d AS (DELETE FROM electrical_tests WHERE unit_key=$1 AND test_day=$2 AND test=$3 AND phase=$4"
                "   AND tap IS NOT DISTINCT FROM $5::integer AND winding=$6 AND insulation=$8 AND bushing=$10"
                "   AND minutes IS NOT DISTINCT FROM $11::integer AND test_kv IS NOT DISTINCT FROM $9::double precision"
                "   RETURNING file_id),"
                " i AS (INSERT INTO electrical_tests(unit_key, test_day, test, phase, tap, winding, temp_c, insulation,"
                "   test_kv, bushing, minutes, value, capacitance_pf, nameplate_value, note, crew, file_id, line)"
                "   VALUES($1,$2,$3,$4,$5,$6,$7,$8,$9,$10,$11,$12,$13,$14,$15,$16,$17,$18))"
                " SELECT file_id FROM d",
                Params().add(key).add(t.date).add(analytics::to_string(t.test)).add(t.phase).add(t.tap).add(t.winding)
                    .add(t.temp_c).add(t.insulation).add(t.test_kv).add(t.bushing).add(t.minutes).add(t.value)
                    .add(t.capacitance_pf).add(t.nameplate_value).text_or_null(t.note).text_or_null(t.crew)
                    .add(file_id).add(line)),
        file_id);
  }

  void add_conversion(std::int64_t file_id, const std::string& column, const std::string& original_unit,
                      const std::string& stored_as) override {
    write_queued_load();
    db_.run("INSERT INTO conversions(file_id, \"column\", original_unit, stored_as) VALUES($1,$2,$3,$4)"
            " ON CONFLICT(file_id, \"column\") DO UPDATE SET original_unit=excluded.original_unit,"
            " stored_as=excluded.stored_as",
            Params().add(file_id).add(column).add(original_unit).add(stored_as));
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
      auto r = db_.run("SELECT survey_day, component, spot_c, reference_c, ambient_c, load_pct, emissivity,"
                       " image_ref, note FROM infrared_scans WHERE unit_key=$1"
                       " ORDER BY survey_day, component COLLATE \"C\"", Params().add(key));
      for (int i = 0; i < r.rows(); ++i) d.infrared.push_back(read_infrared_row(r.row(i)));
    }
    {
      auto r = db_.run("SELECT inspection_day, item, rating, note, inspector FROM inspections WHERE unit_key=$1"
                       " ORDER BY inspection_day, item COLLATE \"C\"", Params().add(key));
      for (int i = 0; i < r.rows(); ++i) d.inspections.push_back(read_inspection_row(r.row(i)));
    }
    {
      // The earth inspections of the other units at this site (site_earth_check.h).
      // The site's units by index units_site, then their inspections.
      auto r = db_.run("SELECT n.inspection_day, n.item, n.rating, n.note, n.inspector, u.unit_id FROM units u"
                       " JOIN inspections n ON n.unit_key = u.unit_key WHERE lower(u.site)=lower($1) AND u.unit_key<>$2 AND"
                       " n.item='grounding' ORDER BY n.inspection_day, u.unit_id COLLATE \"C\"",
                       Params().add(d.info.site).add(key));
      for (int i = 0; i < r.rows(); ++i) d.site_inspections.push_back({r.row(i).text(5), read_inspection_row(r.row(i))});
    }
    read_electrical(key, d.electrical);
    {
      auto r = db_.run("SELECT reference, status, status_day, note FROM work_status WHERE unit_key=$1"
                       " ORDER BY status_day, id", Params().add(key));
      for (int i = 0; i < r.rows(); ++i) {
        const auto row = r.row(i);
        d.work_status.push_back({row.text(0), row.text(1), static_cast<analytics::Day>(row.i64(2)), row.text(3)});
      }
    }
    return d;
  }

  void keep_load_history(const std::string& unit_id, const analytics::LoadHistory& h) override {
    write_queued_load();
    const std::int64_t key = unit_key(unit_id);
    auto r = db_.run("SELECT raw_from FROM load_history WHERE unit_key=$1", Params().add(key));
    const analytics::Timestamp stored_to = r.rows() ? r.row(0).i64(0) : INT64_MIN;  // days before it: stored
    for (const auto& d : h.days) {
      if (analytics::start_of(d.day) < stored_to) continue;
      Params p;
      p.add(key);
      put_load_day(d, [&](auto v) { p.add(v); });
      db_.run("INSERT INTO load_days(unit_key, " LOAD_DAY_COLUMNS ") VALUES($1,$2,$3,$4,$5,$6,$7,$8,$9,$10,$11,$12,"
              "$13,$14,$15,$16,$17,$18,$19,$20,$21,$22,$23,$24) ON CONFLICT DO NOTHING",
              p);
    }
    db_.run("INSERT INTO load_history(unit_key, raw_from, resume) VALUES($1,$2,$3)"
            " ON CONFLICT(unit_key) DO UPDATE SET raw_from=excluded.raw_from, resume=excluded.resume",
            Params().add(key).add(h.raw_from).add(encode_resume(h.resume)));
    // The months whose points go: their packs are stale.
    auto first = db_.run("SELECT min(ts) FROM load_points WHERE unit_key=$1 AND ts<$2", Params().add(key).add(h.raw_from));
    if (first.rows() && !first.row(0).is_null(0))
      for (int m = month_of(first.row(0).i64(0)), last = month_of(h.raw_from - 1); m <= last; ++m)
        written_months_.emplace(key, m);
    db_.run("DELETE FROM load_points WHERE unit_key=$1 AND ts<$2", Params().add(key).add(h.raw_from));
    if (!in_transaction_) stale_written_packs();
  }

  std::shared_ptr<const analytics::LoadHistory> load_history(std::int64_t key, std::string_view unit_id) {
    auto r = db_.run("SELECT raw_from, resume FROM load_history WHERE unit_key=$1", Params().add(key));
    if (r.rows() == 0) return nullptr;
    auto h = std::make_shared<analytics::LoadHistory>();
    h->raw_from = r.row(0).i64(0);
    const auto resume = decode_resume(r.row(0).text(1));
    if (!resume) throw StoreError("the summarised load history of unit " + std::string(unit_id) + " cannot be read");
    h->resume = *resume;
    auto days = db_.run("SELECT " LOAD_DAY_COLUMNS " FROM load_days WHERE unit_key=$1 ORDER BY day", Params().add(key));
    for (int i = 0; i < days.rows(); ++i) h->days.push_back(read_load_day_row(days.row(i)));
    return h;
  }

  std::vector<analytics::LoadPoint> load_points(std::string_view unit_id, analytics::Timestamp from,
                                                analytics::Timestamp to) override {
    write_queued_load();
    std::vector<analytics::LoadPoint> out;
    if (!find_unit(unit_id) || from > to) return out;
    const std::int64_t key = unit_key(std::string(unit_id));
    // Load packs (migration 012): the current packs and every month's gen,
    // read before the rows, so that a pack made from rows that a writer
    // changes meanwhile is never stored (the writer's gen differs).
    auto packs = db_.run("SELECT month::bigint, gen, points FROM load_packs WHERE unit_key=$1 ORDER BY month",
                         Params().add(key), true);
    std::map<int, std::int64_t> gen_of;  // month -> gen, of the months without a current pack
    struct Segment {
      int pack_row;       // >= 0: this row's pack; -1: rows from lo to hi
      Timestamp lo, hi;
    };
    std::vector<Segment> segments;  // in time order
    Timestamp cursor = from;        // the first time not covered by a segment yet
    bool covered = false;           // up to `to`
    for (int i = 0; i < packs.rows(); ++i) {
      const auto row = packs.row(i);
      const int m = static_cast<int>(row.be_i64(0));
      const bool current = !row.is_null(2) && !written_months_.count({key, m});
      if (!current) gen_of[m] = row.be_i64(1);
      const Timestamp lo = month_start(m), hi = month_start(m + 1) - 1;
      if (!current || covered || hi < cursor || lo > to) continue;
      if (lo > cursor) segments.push_back({-1, cursor, lo - 1});
      segments.push_back({i, lo, hi});
      if (hi >= to) covered = true;
      else cursor = hi + 1;
    }
    if (!covered) segments.push_back({-1, cursor, to});
    for (const auto& g : segments) {
      if (g.pack_row >= 0) {
        unpack_load_points(packs.row(g.pack_row).text(2), from, to, unit_id, out);
        continue;
      }
      const std::size_t first = out.size();
      read_load_rows(key, g.lo, g.hi, out);
      pack_load_months(key, g.lo, g.hi, gen_of, out, first);
    }
    if (!std::is_sorted(out.begin(), out.end(), [](const auto& a, const auto& b) { return a.t < b.t; }))
      throw StoreError("database error: the load points of unit " + std::string(unit_id) + " are not in time order");
    return out;
  }

  long count_rows(const std::string& table) override {
    write_queued_load();
    for (const char* t : kCountedTables)
      if (table == t) return static_cast<long>(db_.query("SELECT count(*) FROM " + table).row(0).i64(0));
    throw StoreError("no table named " + table);
  }

  std::int64_t add_alert(const Alert& a) override {
    reconnect_if_lost();
    return db_.run("INSERT INTO alerts(unit_id, kind, raised_at, text) VALUES($1,$2,$3,$4) RETURNING id",
                   Params().add(a.unit_id).add(a.kind).add(a.raised_at).add(a.text)).row(0).i64(0);
  }

  std::vector<Alert> open_alerts() override {
    reconnect_if_lost();
    auto r = db_.run("SELECT id, unit_id, kind, raised_at, text FROM alerts WHERE acknowledged_at IS NULL ORDER BY id",
                     Params());
    std::vector<Alert> out;
    for (int i = 0; i < r.rows(); ++i) {
      const auto s = r.row(i);
      out.push_back(Alert{s.i64(0), s.text(1), s.text(2), s.text(3), s.text(4), true});
    }
    return out;
  }

  std::optional<std::string> state(const std::string& key) override {
    reconnect_if_lost();
    auto r = db_.run("SELECT value FROM daemon_state WHERE root=$1 AND key=$2", Params().add(root_).add(key));
    if (r.rows() == 0) return std::nullopt;
    return r.row(0).text(0);
  }
  void set_state(const std::string& key, const std::string& value) override {
    reconnect_if_lost();
    db_.run("INSERT INTO daemon_state(root, key, value) VALUES($1,$2,$3)"
            " ON CONFLICT(root, key) DO UPDATE SET value=excluded.value",
            Params().add(root_).add(key).add(value));
  }

  bool hold_fleet_lead() override {
    if (in_transaction_) return has_lead_ && db_.ok();
    reconnect_if_lost();
    if (has_lead_) return true;
    has_lead_ = db_.run("SELECT pg_try_advisory_lock($1)", Params().add(kLockFleetLead)).row(0).text(0) == "t";
    return has_lead_;
  }

  std::unique_ptr<Store> open_another() const override {
    return std::make_unique<PgStore>(conninfo_, root_, load_batch_size_);
  }

 private:
  struct QueuedPoint {
    std::int64_t unit_key, ts;
    double load_pu, ambient_c, top_oil_c;
    std::int64_t line;
  };

  // Outside a transaction, a lost connection is made again (the server was
  // restarted); inside one, the transaction is gone and the caller's next
  // statement fails with StoreUnavailable, and rollback() follows.
  void reconnect_if_lost() {
    if (in_transaction_) return;
    if (db_.reconnect_if_lost()) {
      stage_ready_ = false;
      has_lead_ = false;
      known_months_.clear();
    }
    if (!migrated_) migrate();  // opened while the server was down
  }

  std::optional<LoadDuplicate> take_duplicate() {
    auto d = std::move(unreported_duplicate_);
    unreported_duplicate_.reset();
    return d;
  }

  // The queue goes by COPY into the session's staging table, then into
  // load_points in one INSERT ... ON CONFLICT: of two points of one unit and
  // time in the batch, the one of the smaller line (DISTINCT ON, ordered by
  // line) is written, as in file order; an earlier file's point is replaced;
  // a point of this file already stored (an earlier batch) is kept. When
  // fewer rows changed than were queued, the duplicate of the smallest line
  // is the staged point whose stored line for its unit and time is not its
  // own (as in the SQLite store).
  // The file_id column of the rows a DELETE/UPDATE ... RETURNING file_id took
  // out of the current data: none, the new row is new; rows of an earlier
  // file, it was already on file; of this file, a second row (as in SQLite).
  static RowInsert replaced_rows(const Result& r, std::int64_t file_id) {
    RowInsert outcome = RowInsert::added;
    for (int i = 0; i < r.rows(); ++i)
      if (outcome != RowInsert::duplicate_in_file)
        outcome = r.row(i).i64(0) == file_id ? RowInsert::duplicate_in_file : RowInsert::replaced_earlier_file;
    return outcome;
  }

  // Rows of the queue in COPY's binary format (PostgreSQL documentation,
  // "COPY", section "Binary Format": a signature, flags and header extension,
  // then per row a 16-bit field count and each field as a 32-bit length and
  // its bytes in network order, -1 for NULL; a trailer of -1): the server
  // reads 64-bit integers and doubles as they are, without parsing text
  // (about a quarter of its time for a million points, bench/results.md).
  // With the file id as the last column for load_points itself, without it
  // for the staging table. `months` gets the month of every point.
  std::string copy_rows(bool with_file_id, std::set<int>* months) const {
    std::string data;
    data.reserve(19 + queue_.size() * (2 + 7 * 12) + 2);
    data.append("PGCOPY\n\377\r\n\0", 11);
    data.append(8, '\0');  // flags, header extension length
    auto put16 = [&](std::uint16_t v) {
      const char b[2] = {static_cast<char>(v >> 8), static_cast<char>(v)};
      data.append(b, 2);
    };
    auto put64 = [&](std::uint64_t v) {
      char b[12] = {0, 0, 0, 8};
      for (int i = 0; i < 8; ++i) b[4 + i] = static_cast<char>(v >> (56 - 8 * i));
      data.append(b, 12);
    };
    auto put_int = [&](std::int64_t v) { put64(static_cast<std::uint64_t>(v)); };
    auto put_real = [&](double v) {
      if (std::isnan(v)) {
        data.append("\377\377\377\377", 4);  // length -1: NULL
        return;
      }
      std::uint64_t bits;
      std::memcpy(&bits, &v, sizeof bits);
      put64(bits);
    };
    std::int64_t month_lo = 1, month_hi = 0;  // [lo, hi) of the last point's month
    for (const auto& q : queue_) {
      if (months && (q.ts < month_lo || q.ts >= month_hi)) {
        const int m = month_of(q.ts);
        month_lo = month_start(m);
        month_hi = month_start(m + 1);
        months->insert(m);
      }
      put16(with_file_id ? 7 : 6);
      put_int(q.unit_key);
      put_int(q.ts);
      put_real(q.load_pu);
      put_real(q.ambient_c);
      put_real(q.top_oil_c);
      put_int(q.line);
      if (with_file_id) put_int(queued_file_);
    }
    put16(0xffff);
    return data;
  }

  // The common batch (new points, no second reading) goes by one COPY
  // straight into load_points: half the server's work of the staging route
  // (bench/results.md). Inside a transaction it runs under a savepoint, so
  // that a unique violation undoes only this COPY; outside one, the failed
  // statement leaves nothing. False: the batch must take the staging route,
  // and so do the file's later batches (an overlapping file).
  bool copy_straight() {
    if (direct_refused_file_ == queued_file_) return false;
    std::set<int> months;
    const std::string data = copy_rows(true, &months);
    ensure_partitions(months);
    if (in_transaction_) db_.exec("SAVEPOINT ferrum_load_batch");
    if (db_.copy_in("COPY load_points(unit_key, ts, load_pu, ambient_c, top_oil_c, line, file_id) FROM STDIN"
                    " (FORMAT binary)", data,
                    true)) {
      if (in_transaction_) db_.exec("RELEASE SAVEPOINT ferrum_load_batch");
      written_points_ += static_cast<long long>(queue_.size());
      return true;
    }
    if (in_transaction_) db_.exec("ROLLBACK TO SAVEPOINT ferrum_load_batch; RELEASE SAVEPOINT ferrum_load_batch");
    direct_refused_file_ = queued_file_;
    return false;
  }

  void write_queued_load() {
    reconnect_if_lost();
    if (queue_.empty()) return;
    note_queued_months();
    write_queue_rows();
    // Outside a transaction (no caller of ferrum's writes points so: imports
    // and retention run in one), after the rows: a pack made meanwhile is
    // refused; a crash between the two statements would leave a stale pack.
    if (!in_transaction_) stale_written_packs();
  }

  void write_queue_rows() {
    if (copy_straight()) {
      queue_.clear();
      return;
    }
    if (!stage_ready_) {
      db_.exec("CREATE TEMPORARY TABLE IF NOT EXISTS ferrum_load_stage(unit_key BIGINT, ts BIGINT,"
               " load_pu DOUBLE PRECISION, ambient_c DOUBLE PRECISION, top_oil_c DOUBLE PRECISION, line BIGINT)");
      stage_ready_ = true;
    }
    std::set<int> months;  // made by copy_straight, unless the file was already refused there
    const std::string data = copy_rows(false, &months);
    ensure_partitions(months);
    const long n = static_cast<long>(queue_.size());
    queue_.clear();
    db_.exec("TRUNCATE ferrum_load_stage");
    db_.copy_in("COPY ferrum_load_stage FROM STDIN (FORMAT binary)", data);
    // The staged points that replace an earlier file's (a partitioned table
    // has no xmax for RETURNING to tell an update from an insert).
    replaced_points_ += db_.run("SELECT count(*) FROM (SELECT DISTINCT unit_key, ts FROM ferrum_load_stage) s"
                                " JOIN load_points l ON l.unit_key = s.unit_key AND l.ts = s.ts WHERE l.file_id <> $1",
                                Params().add(queued_file_))
                             .row(0).i64(0);
    const long changed =
        db_.run("INSERT INTO load_points(unit_key, ts, load_pu, ambient_c, top_oil_c, file_id, line)"
                " SELECT DISTINCT ON (unit_key, ts) unit_key, ts, load_pu, ambient_c, top_oil_c, $1, line"
                " FROM ferrum_load_stage ORDER BY unit_key, ts, line"
                " ON CONFLICT(unit_key, ts) DO UPDATE SET load_pu=excluded.load_pu, ambient_c=excluded.ambient_c,"
                " top_oil_c=excluded.top_oil_c, file_id=excluded.file_id, line=excluded.line"
                " WHERE load_points.file_id <> excluded.file_id",
                Params().add(queued_file_)).affected();
    written_points_ += changed;
    if (changed == n || unreported_duplicate_) return;
    auto r = db_.run("SELECT s.line, u.unit_id FROM ferrum_load_stage s"
                     " JOIN load_points l ON l.unit_key = s.unit_key AND l.ts = s.ts"
                     " JOIN units u ON u.unit_key = s.unit_key"
                     " WHERE l.line <> s.line ORDER BY s.line LIMIT 1", Params());
    if (r.rows() > 0) unreported_duplicate_ = LoadDuplicate{r.row(0).i64(0), r.row(0).text(1)};
  }

  // ---- Load packs (migration 012_load_packs.sql) ----
  // 32 bytes a point, in network order: ts, load_pu, ambient_c, top_oil_c.
  static constexpr std::size_t kPackedPoint = 32;

  static void put_be64(std::string& b, std::uint64_t v) {
    char c[8];
    for (int i = 0; i < 8; ++i) c[i] = static_cast<char>(v >> (56 - 8 * i));
    b.append(c, 8);
  }
  static std::uint64_t get_be64(const char* p) {
    std::uint64_t v = 0;
    for (int i = 0; i < 8; ++i) v = (v << 8) | static_cast<unsigned char>(p[i]);
    return v;
  }
  static std::uint64_t bits_of(double d) {
    std::uint64_t v;
    std::memcpy(&v, &d, sizeof v);
    return v;
  }
  static double double_of(std::uint64_t v) {
    double d;
    std::memcpy(&d, &v, sizeof d);
    return d;
  }

  // Appends a pack's points that lie in [from, to].
  static void unpack_load_points(const std::string& pack, Timestamp from, Timestamp to, std::string_view unit_id,
                                 std::vector<analytics::LoadPoint>& out) {
    if (pack.size() % kPackedPoint != 0)
      throw StoreError("database error: a load pack of unit " + std::string(unit_id) + " is cut short");
    out.reserve(out.size() + pack.size() / kPackedPoint);
    for (std::size_t at = 0; at < pack.size(); at += kPackedPoint) {
      const char* p = pack.data() + at;
      const auto t = static_cast<Timestamp>(get_be64(p));
      if (t < from || t > to) continue;
      out.push_back({t, double_of(get_be64(p + 8)), double_of(get_be64(p + 16)), double_of(get_be64(p + 24))});
    }
  }

  void read_load_rows(std::int64_t key, Timestamp lo, Timestamp hi, std::vector<analytics::LoadPoint>& out) {
    // Binary results: no printing and parsing of doubles as text.
    auto r = db_.run("SELECT ts, load_pu, ambient_c, top_oil_c FROM load_points WHERE unit_key=$1"
                     " AND ts BETWEEN $2 AND $3 ORDER BY ts",
                     Params().add(key).add(lo).add(hi), true);
    out.reserve(out.size() + static_cast<std::size_t>(r.rows()));
    for (int i = 0; i < r.rows(); ++i) {
      const auto row = r.row(i);
      out.push_back({row.be_i64(0), row.be_f64(1), row.be_f64_or_nan(2), row.be_f64_or_nan(3)});
    }
  }

  // Stores a pack of each whole month in [lo, hi] whose points were just
  // read as rows (out[first...]) and whose gen is still the one read before
  // them; a month this transaction wrote is left to its commit.
  void pack_load_months(std::int64_t key, Timestamp lo, Timestamp hi, const std::map<int, std::int64_t>& gen_of,
                        const std::vector<analytics::LoadPoint>& out, std::size_t first) {
    std::map<int, std::string> packs;  // the months with rows, and the stale ones without
    for (const auto& [m, gen] : gen_of)
      if (month_start(m) >= lo && month_start(m + 1) - 1 <= hi) packs[m];
    Timestamp month_lo = 1, month_hi = 0;
    std::string* pack = nullptr;
    for (std::size_t i = first; i < out.size(); ++i) {
      const auto& p = out[i];
      if (p.t < month_lo || p.t > month_hi) {
        const int m = month_of(p.t);
        month_lo = month_start(m);
        month_hi = month_start(m + 1) - 1;
        pack = month_lo >= lo && month_hi <= hi ? &packs[m] : nullptr;
      }
      if (!pack) continue;
      put_be64(*pack, static_cast<std::uint64_t>(p.t));
      put_be64(*pack, bits_of(p.load_pu));
      put_be64(*pack, bits_of(p.ambient_c));
      put_be64(*pack, bits_of(p.top_oil_c));
    }
    for (auto& [m, bytes] : packs) {
      if (written_months_.count({key, m})) continue;
      const auto g = gen_of.find(m);
      db_.run("INSERT INTO load_packs(unit_key, month, gen, points) VALUES($1,$2,$3,$4)"
              " ON CONFLICT (unit_key, month) DO UPDATE SET points = excluded.points"
              " WHERE load_packs.gen = excluded.gen AND load_packs.points IS NULL",
              Params().add(key).add(m).add(g == gen_of.end() ? std::int64_t{0} : g->second).bytes(std::move(bytes)));
    }
  }

  // Marks stale, in the writing transaction, the pack of every month whose
  // points it wrote: gen + 1 and no points (a month never packed gets its
  // row at gen 1, so that a reader's pack made at gen 0 is refused). In key
  // order, so that two writers lock the rows in one order.
  void stale_written_packs() {
    if (written_months_.empty()) return;
    std::string keys = "{", months = "{";
    for (const auto& [k, m] : written_months_) {
      if (keys.size() > 1) {
        keys += ',';
        months += ',';
      }
      keys += std::to_string(k);
      months += std::to_string(m);
    }
    keys += '}';
    months += '}';
    db_.run("INSERT INTO load_packs(unit_key, month, gen) SELECT k, m, 1 FROM unnest($1::bigint[], $2::integer[]) AS w(k, m)"
            " ON CONFLICT (unit_key, month) DO UPDATE SET gen = load_packs.gen + 1, points = NULL",
            Params().add(keys).add(months));
    written_months_.clear();
  }

  // The (unit, month) of every queued point, before the queue is written.
  void note_queued_months() {
    Timestamp month_lo = 1, month_hi = 0;
    int m = 0;
    std::pair<std::int64_t, int> last{0, -1};
    for (const auto& q : queue_) {
      if (q.ts < month_lo || q.ts > month_hi) {
        m = month_of(q.ts);
        month_lo = month_start(m);
        month_hi = month_start(m + 1) - 1;
      }
      if (q.unit_key == last.first && m == last.second) continue;
      last = {q.unit_key, m};
      written_months_.insert(last);
    }
  }

  // Creates the month partitions of load_points that do not exist yet, on a
  // connection of their own, committed at once, one creator at a time
  // across daemons (advisory lock); ATTACH PARTITION takes only a SHARE
  // UPDATE EXCLUSIVE lock on load_points, which this store's open
  // transaction (ROW EXCLUSIVE) does not conflict with.
  void ensure_partitions(const std::set<int>& months) {
    std::vector<int> missing;
    for (int m : months)
      if (!known_months_.count(m)) missing.push_back(m);
    if (missing.empty()) return;
    if (!ddl_ || !ddl_->ok()) ddl_ = std::make_unique<Connection>(conninfo_);
    ddl_->exec("BEGIN");
    try {
      ddl_->run("SELECT pg_advisory_xact_lock($1)", Params().add(kLockPartitions));
      for (int m : missing) {
        char name[40];
        std::snprintf(name, sizeof name, "load_points_p%04d%02d", m / 12, m % 12 + 1);
        const bool exists =
            ddl_->run("SELECT to_regclass($1) IS NOT NULL", Params().add(name)).row(0).text(0) == "t";
        if (exists) continue;
        ddl_->exec(std::string("CREATE TABLE ") + name + " (LIKE load_points INCLUDING DEFAULTS INCLUDING CONSTRAINTS)");
        ddl_->exec(std::string("ALTER TABLE load_points ATTACH PARTITION ") + name + " FOR VALUES FROM (" +
                   std::to_string(month_start(m)) + ") TO (" + std::to_string(month_start(m + 1)) + ")");
      }
      ddl_->exec("COMMIT");
    } catch (...) {
      if (ddl_->ok()) ddl_->exec("ROLLBACK");
      throw;
    }
    known_months_.insert(missing.begin(), missing.end());
  }

  void read_electrical(std::int64_t key, std::vector<analytics::ElectricalTest>& out) {
    auto r = db_.run("SELECT test_day, test, phase, tap, winding, temp_c, insulation, test_kv, bushing, minutes, value,"
                     " capacitance_pf, nameplate_value, note, crew FROM electrical_tests WHERE unit_key=$1"
                     " ORDER BY test_day, id", Params().add(key));
    for (int i = 0; i < r.rows(); ++i)
      if (auto t = read_electrical_row(r.row(i))) out.push_back(std::move(*t));
  }

  void read_oil(std::int64_t key, std::vector<analytics::OilSample>& out) {
    auto r = db_.run("SELECT s.id, s.sample_day, s.lab_ref, s.sample_point, s.breakdown_method, v.test, v.state, v.value"
                     " FROM oil_samples s LEFT JOIN oil_values v ON v.sample_id = s.id"
                     " WHERE s.unit_key=$1 AND s.superseded_by IS NULL ORDER BY s.sample_day, s.id",
                     Params().add(key));
    std::int64_t current = -1;
    for (int i = 0; i < r.rows(); ++i) read_oil_row(r.row(i), current, out);
  }

  std::int64_t unit_key(const std::string& unit_id) {
    auto it = unit_keys_.find(unit_id);
    if (it != unit_keys_.end()) return it->second;
    auto r = db_.run("SELECT unit_key FROM units WHERE unit_id=$1", Params().add(unit_id));
    if (r.rows() == 0) throw StoreError("unit " + unit_id + " is not in the register");
    const std::int64_t key = r.row(0).i64(0);
    unit_keys_.emplace(unit_id, key);
    return key;
  }

  // Applies pending migrations, one daemon at a time (advisory lock).
  // Refuses a database written by a newer ferrum, and a database holding
  // tables of something else.
  void migrate() {
    db_.run("SELECT pg_advisory_lock($1)", Params().add(kLockMigrate));
    try {
      const bool ours = db_.query("SELECT to_regclass('ferrum_schema') IS NOT NULL").row(0).text(0) == "t";
      int current = 0;
      if (ours) {
        current = static_cast<int>(db_.query("SELECT max(version) FROM ferrum_schema").row(0).i64(0));
      } else {
        const long others = static_cast<long>(db_.query("SELECT count(*) FROM pg_tables WHERE schemaname ="
                                                        " current_schema()").row(0).i64(0));
        if (others > 0) throw IncompatibleStore("the PostgreSQL database holds tables but is not a ferrum database");
      }
      if (current > schema_version())
        throw IncompatibleStore("the PostgreSQL database was written by a newer ferrum (schema version " +
                                std::to_string(current) + ", this build knows up to " +
                                std::to_string(schema_version()) + "); refusing to touch it");
      for (const Migration& m : embedded_postgresql_migrations()) {
        if (m.version <= current) continue;
        db_.exec("BEGIN");
        try {
          db_.exec(m.sql);
          db_.exec("UPDATE ferrum_schema SET version = " + std::to_string(m.version));
          db_.exec("COMMIT");
        } catch (const StoreError& e) {
          if (db_.ok()) db_.exec("ROLLBACK");
          throw StoreError(std::string("migration ") + m.name + " failed: " + e.what());
        }
      }
    } catch (...) {
      if (db_.ok()) db_.run("SELECT pg_advisory_unlock($1)", Params().add(kLockMigrate));
      throw;
    }
    db_.run("SELECT pg_advisory_unlock($1)", Params().add(kLockMigrate));
    migrated_ = true;
  }

  const std::string conninfo_;
  const std::string root_;
  const int load_batch_size_;
  Connection db_;
  std::unique_ptr<Connection> ddl_;  // partitions are created on it (ensure_partitions)
  bool in_transaction_ = false;
  bool stage_ready_ = false;
  bool has_lead_ = false;
  bool migrated_ = false;  // migrate() done on this store's first connection
  std::set<int> known_months_;  // partitions known to exist, by month index
  std::unordered_map<std::string, std::int64_t> unit_keys_;
  std::vector<QueuedPoint> queue_;
  std::int64_t queued_file_ = 0;
  std::int64_t direct_refused_file_ = 0;  // a file whose batch met a stored point: the staging route only
  std::optional<LoadDuplicate> unreported_duplicate_;
  long long written_points_ = 0;   // load points written since begin()
  long long replaced_points_ = 0;  // of which replaced an earlier file's (read before the upsert)
  std::string last_unit_id_;
  std::int64_t last_unit_key_ = 0;
  // (unit key, month) of the points written in this transaction, not yet
  // marked stale in load_packs (stale_written_packs, at commit).
  std::set<std::pair<std::int64_t, int>> written_months_;
};

}  // namespace

std::unique_ptr<Store> open_postgresql_store(const std::string& conninfo, const std::string& root, int load_batch) {
  return std::make_unique<PgStore>(conninfo, root, load_batch);
}

std::unique_ptr<Store> open_postgresql_store_when_reachable(const std::string& conninfo, const std::string& root) {
  return std::make_unique<PgStore>(conninfo, root, kSqliteLoadBatch, false);
}

}  // namespace ferrum::store
