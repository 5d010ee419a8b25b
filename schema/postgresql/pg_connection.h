// libpq wrapped for the PostgreSQL store (schema/postgresql/pg_store.cpp):
// one connection, statements prepared once per session, text-format
// parameters and results, COPY FROM STDIN. Errors become StoreError, or
// StoreUnavailable when the connection is gone.
#pragma once

#include <libpq-fe.h>

#include <cmath>
#include <cstdint>
#include <map>
#include <optional>
#include <string>
#include <string_view>
#include <vector>

#include "schema/store.h"

namespace ferrum::store::pg {

// Parameters of one statement, as text ($1, $2, ... in order of add).
class Params {
 public:
  Params& add(std::int64_t v) { return text(std::to_string(v)); }
  Params& add(int v) { return add(static_cast<std::int64_t>(v)); }
  Params& add(long long v) { return add(static_cast<std::int64_t>(v)); }
  Params& add(double v);  // NaN: NULL
  Params& add(std::string_view v) { return text(std::string(v)); }
  Params& add(const std::string& v) { return text(v); }
  Params& add(const char* v) { return text(v); }
  template <class T>
  Params& add(const std::optional<T>& v) {
    if (v) return add(*v);
    return null();
  }
  Params& text_or_null(const std::string& v) { return v.empty() ? null() : text(v); }
  // A bytea parameter sent in binary format: the bytes as they are, without
  // the hex escaping a text parameter would need.
  Params& bytes(std::string v) {
    text(std::move(v));
    if (binary_.size() < values_.size()) binary_.resize(values_.size(), false);
    binary_.back() = true;
    return *this;
  }
  Params& null() {
    values_.emplace_back();
    is_null_.push_back(true);
    return *this;
  }
  int size() const { return static_cast<int>(values_.size()); }
  std::vector<const char*> pointers() const;
  // Lengths and formats for PQexecPrepared; empty when every one is text.
  std::vector<int> lengths() const;
  std::vector<int> formats() const;

 private:
  Params& text(std::string v) {
    values_.push_back(std::move(v));
    is_null_.push_back(false);
    return *this;
  }
  std::vector<std::string> values_;
  std::vector<bool> is_null_;
  std::vector<bool> binary_;  // by index; shorter than values_ when the last ones are text
};

// A query's result; rows by 0-based index, columns 0-based.
class Result {
 public:
  explicit Result(PGresult* r = nullptr) : r_(r) {}
  ~Result() { PQclear(r_); }
  Result(Result&& o) noexcept : r_(o.r_) { o.r_ = nullptr; }
  Result& operator=(Result&& o) noexcept {
    if (this != &o) {
      PQclear(r_);
      r_ = o.r_;
      o.r_ = nullptr;
    }
    return *this;
  }
  Result(const Result&) = delete;
  Result& operator=(const Result&) = delete;

  int rows() const { return r_ ? PQntuples(r_) : 0; }
  long affected() const;  // rows changed by INSERT/UPDATE/DELETE
  const PGresult* get() const { return r_; }

  // One row, read like the SQLite statement's current row (store_rows.h).
  class Row {
   public:
    Row(const PGresult* r, int row) : r_(r), row_(row) {}
    bool is_null(int c) const { return PQgetisnull(r_, row_, c) != 0; }
    std::int64_t i64(int c) const;
    int i32(int c) const { return static_cast<int>(i64(c)); }
    double real(int c) const;
    double real_or_nan(int c) const { return is_null(c) ? std::nan("") : real(c); }
    std::optional<double> opt_real(int c) const { return is_null(c) ? std::nullopt : std::optional<double>(real(c)); }
    // Binary results (PostgreSQL documentation, "Binary Format" of bigint and
    // double precision: 8 bytes in network order). Throw StoreError when the
    // column is not 8 bytes wide.
    std::int64_t be_i64(int c) const;
    double be_f64(int c) const;
    double be_f64_or_nan(int c) const { return is_null(c) ? std::nan("") : be_f64(c); }
    std::string text(int c) const {
      return std::string(PQgetvalue(r_, row_, c), static_cast<std::size_t>(PQgetlength(r_, row_, c)));
    }

   private:
    const PGresult* r_;
    int row_;
  };
  Row row(int i) const { return Row(r_, i); }

 private:
  PGresult* r_;
};

class Connection {
 public:
  // Connects; throws StoreUnavailable when the server cannot be reached,
  // unless `must_connect` is false: then it stays unconnected (ok() false)
  // and reconnect_if_lost() tries again.
  explicit Connection(std::string conninfo, bool must_connect = true);
  ~Connection();
  Connection(const Connection&) = delete;
  Connection& operator=(const Connection&) = delete;

  bool ok() const { return PQstatus(conn_) == CONNECTION_OK; }
  // Reconnects when the connection is gone; true when it was (the session's
  // prepared statements, temporary tables and advisory locks are gone too).
  bool reconnect_if_lost();

  void exec(const std::string& sql);  // no parameters, no result
  Result query(const std::string& sql);  // no parameters
  // A statement with parameters, prepared once per session. With
  // binary_results the columns come in PostgreSQL's binary format (read them
  // with Result::Row::be_i64 / be_f64).
  Result run(const char* sql, const Params& params, bool binary_results = false);
  // COPY ... FROM STDIN with the text format; `data` is its whole input.
  // COPY ... FROM STDIN of `data` (text format). With unique_violation_ok, a
  // duplicate key (SQLSTATE 23505) returns false, and the caller rolls back
  // to its savepoint; any other failure throws.
  bool copy_in(const std::string& copy_sql, const std::string& data, bool unique_violation_ok = false);

  PGconn* raw() { return conn_; }

 private:
  [[noreturn]] void fail(const std::string& what, const PGresult* r = nullptr);
  Result check(PGresult* r, const std::string& what);
  std::string conninfo_;
  PGconn* conn_ = nullptr;
  // A prepared statement keeps the plan it got when prepared. One prepared
  // while a table was nearly empty keeps scanning the whole table as the
  // file fills it (a sequential scan per row: an oil file of 400,000
  // samples never finished, bench/results.md). So each statement is prepared
  // again after 1,024 runs, then after 4 times as many each time, and the
  // server plans it for the table as it now is.
  struct Prepared {
    std::string name;
    std::uint64_t runs = 0;
    std::uint64_t replan_at = 1024;
  };
  std::map<const char*, Prepared> prepared_;  // SQL text -> statement
  std::uint64_t statements_named_ = 0;
};

}  // namespace ferrum::store::pg
