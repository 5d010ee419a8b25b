// The tables of published standards that ferrum's methods read, as audited
// data: one file per standard in analytics/data/ (embedded at build time),
// each table with its standard, edition, table or clause and audit status.
// A site may put a corrected copy of a file in ROOT/tables/; the daemon reads
// it as text and hands it to load_standard_tables, which validates it (a
// malformed file is refused with line and column and the embedded tables stay
// in force) and builds the set the methods read.
//
// File format (docs/standard-tables.md): lines "key,value"; '#' comments.
//   standard,TEXT / edition,TEXT / title,TEXT     the file's standard
//   table,ID                                      starts a table
//   clause,TEXT  edition,TEXT  note,TEXT          the table's clause (edition overrides the file's)
//   status,unverified | checked against a public reproduction | verified against the licensed standard
//   where,TEXT (checked)   by,NAME and when,YYYY-MM-DD (verified)
//   columns,NAME,NAME,...                         the table's column names
//   row,CELL,CELL,...                             one row per line
//
// Pure: no I/O. The active set is process-wide: methods read it through
// standard_tables(); install_standard_tables() replaces it (the daemon does so
// before any assessment; an installed set is never freed, so references stay
// valid).
#pragma once

#include <array>
#include <map>
#include <memory>
#include <optional>
#include <string>
#include <string_view>
#include <vector>

#include "analytics/dga_c57104_2008.h"
#include "analytics/dga_c57104_2019.h"
#include "analytics/duval_triangle1.h"
#include "analytics/health_index.h"
#include "analytics/iec60076_7_characteristics.h"
#include "analytics/iec60599_ratios.h"
#include "analytics/infrared_severity.h"
#include "analytics/oil_quality_c57106.h"

namespace ferrum::analytics {

// --- Generic form of a table file ---------------------------------------

inline constexpr const char* kStatusUnverified = "unverified";
inline constexpr const char* kStatusChecked = "checked against a public reproduction";
inline constexpr const char* kStatusVerified = "verified against the licensed standard";

struct TableRow {
  int line = 0;
  std::vector<std::string> cells;  // the fields after "row" (file column 2 onwards)
};

struct DataTable {
  std::string id, clause, edition, status, where, by, when, note;
  int line = 0;          // line of "table,ID"
  int columns_line = 0;  // line of "columns,..."
  std::vector<std::string> columns;
  std::vector<TableRow> rows;
};

struct DataFile {
  std::string standard, edition, title;
  int last_line = 0;
  std::vector<DataTable> tables;
};

// A refusal: 1-based line and column (field) of the first problem.
struct TableError {
  int line = 0, column = 0;
  std::string message;
  std::string text() const;  // "line L, column C: message"
};

struct DataFileParse {
  std::optional<DataFile> file;
  TableError error;  // when !file
};

// Parses the generic form (status fields checked, rows as text).
DataFileParse parse_data_file(std::string_view text);

// --- The typed tables the methods read ------------------------------------

struct C5791Exponents {
  double n = 0, m = 0;
};

struct DeltaTRow {
  double rise_from_c = 0;
  double rise_to_c = 0;  // +inf: no upper end
  int priority = 0;      // NETA 1 (most severe) .. 4
};

// Audit record of one table, as listed by `ferrum tables` and the reports.
struct TableInfo {
  std::string file;      // "ieee_c57104_2008.csv"
  std::string id;        // "table1"
  std::string standard;  // "IEEE C57.104"
  std::string edition, clause, status, where, by, when, note;
  bool site_override = false;  // read from the site's copy
  std::string origin;          // "embedded" or the site file as shown to the user
  std::string status_text() const;  // status with where / by whom, when
  std::string title() const;        // "IEEE C57.104-2008 table1: Table 1 (...)"
};

struct StandardTables {
  C57104_2008Tables c57104_2008;
  C57104_2019Tables c57104_2019;
  Iec60599Tables iec60599;
  std::vector<DuvalZone> duval_zones;
  C57106Limits c57106;
  std::array<IecThermalParameters, 5> iec60076_7_table5{};  // IecCoolingClass order
  std::array<double, 3> hot_spot_limits_c{};                // normal cyclic, long-, short-time emergency
  std::array<C5791Exponents, 5> c57_91_exponents{};         // IecCoolingClass order
  double normal_life_h = 0;
  HealthIndexTables health;
  std::vector<DeltaTRow> delta_t_reference, delta_t_ambient;

  std::vector<TableInfo> info;  // every table, in file order
  bool any_unverified() const;
  // Audit records of the tables of one file ("ieee_c57104_2008.csv").
  std::vector<const TableInfo*> tables_of(std::string_view file) const;
};

// The table files ferrum reads, in listing order.
const std::vector<std::string>& standard_table_files();
// The text of a file as compiled in.
std::string_view embedded_table_text(std::string_view file);

// A site's copy of one file.
struct TableOverride {
  std::string file;   // file name, e.g. "iec60599.csv"
  std::string shown;  // how to name it to the user, e.g. "tables/iec60599.csv"
  std::string text;
  std::string refused;  // not empty: refused unread for this reason (not a regular file, too large)
};

struct TableRefusal {
  std::string shown;
  TableError error;  // line 0 when the file as a whole is refused (unknown name)
  std::string text() const;  // "tables/x.csv: line L, column C: ..."
};

struct TableLoad {
  std::shared_ptr<const StandardTables> tables;
  std::vector<TableRefusal> refused;  // overrides not used; the embedded file stays in force
};

// Parses one file's text into `into` (replacing that file's tables and audit
// records; `origin` empty = embedded). nullopt when it was used; otherwise
// the problem, and `into` may be partly changed (work on a copy).
std::optional<TableError> apply_table_file(std::string_view file, std::string_view text, const std::string& origin,
                                           StandardTables& into);

// The embedded tables with every valid override applied.
TableLoad load_standard_tables(const std::vector<TableOverride>& overrides);

const StandardTables& embedded_standard_tables();
// The set in force (embedded until one is installed).
const StandardTables& standard_tables();
void install_standard_tables(std::shared_ptr<const StandardTables> tables);

// Installs a set for the lifetime of the object and puts the previous one
// back (tests).
class ScopedStandardTables {
 public:
  explicit ScopedStandardTables(std::shared_ptr<const StandardTables> tables);
  ~ScopedStandardTables();
  ScopedStandardTables(const ScopedStandardTables&) = delete;
  ScopedStandardTables& operator=(const ScopedStandardTables&) = delete;

 private:
  const StandardTables* previous_;
};

}  // namespace ferrum::analytics
