// The store: everything ferrum keeps, behind one interface, with one folder
// per backend: SQLite (schema/sqlite/, the default, one database per site
// root) and PostgreSQL (schema/postgresql/, one database several site roots
// share). All SQL lives in schema/.
//
// Thread-safety: a Store is used by one thread at a time. Errors are thrown
// as StoreError with the database's message.
#pragma once

#include <cstdint>
#include <memory>
#include <optional>
#include <stdexcept>
#include <string>
#include <string_view>
#include <vector>

#include "analytics/load_history.h"
#include "analytics/unit_data.h"

namespace ferrum::store {

// A unit's id and site (Store::unit_sites).
struct UnitSite {
  std::string unit_id, site;
};

class StoreError : public std::runtime_error {
 public:
  using std::runtime_error::runtime_error;
};

// The database was written by a newer ferrum, or is not a ferrum database.
class IncompatibleStore : public StoreError {
 public:
  using StoreError::StoreError;
};

// The database cannot be reached (server down or restarted, connection
// lost): not the file's fault. The transaction is gone; the caller leaves
// the file in work/ and tries again later. The next call reconnects.
class StoreUnavailable : public StoreError {
 public:
  using StoreError::StoreError;
};

struct FileRecord {
  std::int64_t id = 0;
  std::string sha256;
  std::string party;
  std::string original_name;
  std::string kind;          // empty when the kind could not be recognised
  std::string status;        // "accepted", "rejected", "duplicate"
  long rows = 0;
  long problem_count = 0;
  std::string received_at;   // UTC ISO 8601
  std::string stored_as;     // relative to the site root
  std::string receipt_json;
};

struct Alert {
  std::int64_t id = 0;
  std::string unit_id, kind, raised_at, text;
  bool open = true;
};

// Outcome of adding one row (add_* below): new; in place of a row with the
// same key that an earlier file delivered ("already on file": the row equals
// or corrects it, and the new one now stands); or a second row for that key
// in the same file (a load point is then not written; other kinds replace the
// file's earlier row, and their parsers already reject such a file).
enum class RowInsert { added, replaced_earlier_file, duplicate_in_file };
using LoadInsert = RowInsert;

// Load points written since the transaction began (begin()), by outcome;
// what queue_load_point / flush_load_points / add_load_point wrote.
struct LoadCounts {
  long long added = 0;
  long long replaced_earlier_file = 0;
};

// A load point that was a second reading of the same unit and time in the
// same file (a file problem), found when queued points were written.
struct LoadDuplicate {
  std::int64_t line = 0;   // the point's line in its file
  std::string unit_id;
};

class Store {
 public:
  virtual ~Store() = default;

  // One transaction per dropped file: all of its rows or none.
  virtual void begin() = 0;
  virtual void commit() = 0;
  virtual void rollback() = 0;

  // Files.
  virtual std::int64_t add_file(const FileRecord& file) = 0;
  virtual void update_file(const FileRecord& file) = 0;
  // Of every root sharing the database: the same content dropped in a
  // second root is a duplicate there.
  virtual std::optional<FileRecord> accepted_file_with_hash(const std::string& sha256) = 0;
  // Inside the open transaction: waits until no other daemon's transaction
  // holds the same content, and holds it until commit or rollback, so that a
  // second look at accepted_file_with_hash decides for good (the same content
  // dropped in two roots at once is accepted once, a duplicate in the other).
  // PostgreSQL: a transaction advisory lock on the digest. SQLite: nothing to
  // do (BEGIN IMMEDIATE already lets one writer in at a time).
  virtual void hold_content(const std::string& sha256) = 0;
  // The newest record of a file with this content, whatever its status.
  // This root's records only (recovery of its own work/).
  virtual std::optional<FileRecord> latest_file_with_hash(const std::string& sha256) = 0;
  // This root's records only, newest first.
  virtual std::vector<FileRecord> recent_files(int limit, const std::string& status = "") = 0;
  // The newest record of any root sharing the database (what changes the
  // fleet's ranking).
  virtual std::optional<FileRecord> newest_file_in_database() = 0;
  virtual std::vector<FileRecord> files_for_unit(std::string_view unit_id) = 0;
  // Units touched by the rows of one file.
  virtual std::vector<std::string> units_of_file(std::int64_t file_id) = 0;

  // Units register. upsert_unit returns true when the unit is new or changed;
  // a replaced row is kept in the unit's history.
  virtual std::optional<analytics::UnitInfo> find_unit(std::string_view unit_id) = 0;
  virtual std::vector<analytics::UnitInfo> units() = 0;
  // Id and site of every unit, in unit_id order: what a pass over the whole
  // fleet needs of the register before it assesses (units() holds every
  // field: at 20,000 units its vector and the copies of its growth were
  // most of what `rank` held beyond a small fleet's; bench/results.md).
  virtual std::vector<UnitSite> unit_sites() = 0;
  virtual bool upsert_unit(const analytics::UnitInfo& unit, std::int64_t file_id, int line) = 0;

  // Measurements. REQUIRES: the unit exists. Each add_* says whether the row
  // was new or already on file (RowInsert); a superseded oil sample counts as
  // replaced.
  virtual RowInsert add_oil_sample(const std::string& unit_id, const analytics::OilSample& sample,
                                   std::int64_t file_id, int line) = 0;
  // One point, written at once (writes the queued points first).
  virtual LoadInsert add_load_point(const std::string& unit_id, const analytics::LoadPoint& point,
                                    std::int64_t file_id, int line) = 0;
  // The bulk path for load series: points are queued and written in
  // multi-row statements when a batch is full (or, when the file is not in
  // key order, kept as sorted runs and written in key order by the flush or
  // the next read, write or commit). Same rules as add_load_point:
  // an earlier file's point for the same unit and time is replaced, a second
  // point for it in the same file is not written and is reported, by line.
  // Each call returns the first duplicate of the batch it wrote, if any
  // (points after it in that batch may have been written: the caller rejects
  // the file and rolls back). flush_load_points writes what is still queued;
  // call it before commit. Every read, write and commit of the store writes
  // the queue first; a duplicate found that way is returned by the next
  // flush_load_points, and commit() throws StoreError while one is
  // unreported. rollback() discards the queue.
  virtual std::optional<LoadDuplicate> queue_load_point(const std::string& unit_id,
                                                        const analytics::LoadPoint& point,
                                                        std::int64_t file_id, std::int64_t line) = 0;
  virtual std::optional<LoadDuplicate> flush_load_points() = 0;
  // Counts of the points written so far in this transaction (writes the
  // queue first). Exact across batches; a caller takes the difference
  // around one file's points.
  virtual LoadCounts load_counts() = 0;
  virtual RowInsert add_infrared(const std::string& unit_id, const analytics::InfraredScan& scan,
                                 std::int64_t file_id, int line) = 0;
  virtual RowInsert add_inspection(const std::string& unit_id, const analytics::InspectionRecord& rec,
                                   std::int64_t file_id, int line) = 0;
  // A re-delivered test (same unit, day, test and reading names) replaces
  // the earlier row.
  virtual RowInsert add_electrical_test(const std::string& unit_id, const analytics::ElectricalTest& test,
                                        std::int64_t file_id, int line) = 0;
  // A planner's work-status row (issue #16). The same unit, reference, day
  // and status delivered again replaces the earlier row.
  virtual RowInsert add_work_status(const std::string& unit_id, const analytics::WorkStatus& row,
                                    std::int64_t file_id, int line) = 0;
  virtual void add_conversion(std::int64_t file_id, const std::string& column,
                              const std::string& original_unit, const std::string& stored_as) = 0;

  // Everything known about a unit, series sorted by time; superseded oil
  // samples left out.
  virtual analytics::UnitData unit_data(std::string_view unit_id) = 0;
  // Only the load points within [from, to] (UTC seconds).
  virtual std::vector<analytics::LoadPoint> load_points(std::string_view unit_id,
                                                        analytics::Timestamp from,
                                                        analytics::Timestamp to) = 0;
  // The retention of the load series ([store] keep_load_points_years): keeps
  // the unit's summarised history (its days not stored yet, and the model's
  // state where the raw points were cut) and deletes its raw load points
  // before history.raw_from. Within the caller's transaction. unit_data()
  // hands the history back in UnitData::load_history.
  virtual void keep_load_history(const std::string& unit_id, const analytics::LoadHistory& history) = 0;
  // Row counts per table, for status and tests.
  virtual long count_rows(const std::string& table) = 0;

  // Alerts.
  virtual std::int64_t add_alert(const Alert& alert) = 0;
  virtual std::vector<Alert> open_alerts() = 0;

  // Small persistent facts of the daemon (last weekly bundle, ...), of this
  // site root.
  virtual std::optional<std::string> state(const std::string& key) = 0;
  virtual void set_state(const std::string& key, const std::string& value) = 0;

  // The fleet lead: true while this store's connection holds it (taking it
  // when free). Whole-database duties that one daemon does for all (the
  // weekly fleet bundle) are done by the holder only. SQLite: always true
  // (one daemon per database). PostgreSQL: a session advisory lock; when
  // the holder's session ends (daemon stopped or killed, connection lost),
  // the next daemon that asks takes it over.
  virtual bool hold_fleet_lead() = 0;

  // A new connection to the same database, for another thread.
  virtual std::unique_ptr<Store> open_another() const = 0;
};

// Load points the SQLite store queues before it writes them, sorted by unit
// and time, in multi-row statements (Store::queue_load_point): 12 MiB. A
// full queue that does not continue the file in key order becomes a sorted
// run in a temporary file; the runs are merged when written.
inline constexpr int kSqliteLoadBatch = 262144;

// Opens (creating if needed) the SQLite database at path, in WAL mode, and
// applies pending migrations. Throws IncompatibleStore for a newer schema or
// a file that is not a ferrum database, StoreError otherwise.
// `load_batch`: load points queued before they are written (kSqliteLoadBatch;
// tests use small batches to cross batch boundaries with few rows).
std::unique_ptr<Store> open_sqlite_store(const std::string& path, int load_batch = kSqliteLoadBatch);

// Opens the PostgreSQL database named by a libpq connection string
// (https://www.postgresql.org/docs/15/libpq-connect.html) and applies
// pending migrations (schema/postgresql/migrations). `root` names the site
// root this store works for ("host:/path"): its files' records, recovery
// and daemon state are kept apart from other roots'. Throws
// IncompatibleStore for a newer schema or a database holding other tables,
// StoreUnavailable when the server cannot be reached.
std::unique_ptr<Store> open_postgresql_store(const std::string& conninfo, const std::string& root,
                                             int load_batch = kSqliteLoadBatch);

// The same, for a daemon that must start while the server is down: a server
// that cannot be reached yet is not an error; every call connects (and
// migrates) first, and throws StoreUnavailable until the server is up.
std::unique_ptr<Store> open_postgresql_store_when_reachable(const std::string& conninfo, const std::string& root);

// Why a libpq connection string cannot be used in ferrum.ini, or "" when
// it can: it does not parse, or it holds a password (passwords come from
// the libpq password file, ~/.pgpass or PGPASSFILE, never from ferrum.ini).
std::string postgresql_conninfo_problem(const std::string& conninfo);

// Schema version this build writes (the same for both backends).
int schema_version();

}  // namespace ferrum::store
