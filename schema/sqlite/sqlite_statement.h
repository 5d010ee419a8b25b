// The SQLite C API wrapped for the SQLite store (schema/sqlite/sqlite_store.cpp):
// a prepared statement and a statement run without results.
#pragma once

#include <sqlite3.h>

#include <cmath>
#include <cstdint>
#include <optional>
#include <string>
#include <string_view>

#include "schema/store.h"

namespace ferrum::store::sqlite {

// RAII prepared statement with 1-based binds and 0-based columns.
class Statement {
 public:
  Statement(sqlite3* db, const char* sql) : db_(db) {
    if (sqlite3_prepare_v2(db, sql, -1, &stmt_, nullptr) != SQLITE_OK)
      throw StoreError(std::string("cannot prepare SQL: ") + sqlite3_errmsg(db) + " in: " + sql);
  }
  ~Statement() { sqlite3_finalize(stmt_); }
  Statement(sqlite3* db, const std::string& sql) : Statement(db, sql.c_str()) {}
  Statement(const Statement&) = delete;
  Statement& operator=(const Statement&) = delete;

  Statement& bind(int i, std::int64_t v) { check(sqlite3_bind_int64(stmt_, i, v)); return *this; }
  Statement& bind(int i, int v) { return bind(i, static_cast<std::int64_t>(v)); }
  Statement& bind(int i, long long v) { return bind(i, static_cast<std::int64_t>(v)); }
  Statement& bind(int i, double v) {
    check(std::isnan(v) ? sqlite3_bind_null(stmt_, i) : sqlite3_bind_double(stmt_, i, v));
    return *this;
  }
  Statement& bind(int i, std::string_view v) {
    check(sqlite3_bind_text(stmt_, i, v.data(), static_cast<int>(v.size()), SQLITE_TRANSIENT));
    return *this;
  }
  Statement& bind(int i, const std::string& v) { return bind(i, std::string_view(v)); }
  Statement& bind(int i, const char* v) { return bind(i, std::string_view(v)); }
  Statement& bind_null(int i) { check(sqlite3_bind_null(stmt_, i)); return *this; }
  template <class T>
  Statement& bind(int i, const std::optional<T>& v) {
    if (v) return bind(i, *v);
    return bind_null(i);
  }
  Statement& bind_text_or_null(int i, const std::string& v) {
    return v.empty() ? bind_null(i) : bind(i, v);
  }

  // True while a row is available.
  bool step() {
    const int rc = sqlite3_step(stmt_);
    if (rc == SQLITE_ROW) return true;
    if (rc == SQLITE_DONE) return false;
    StoreError error(std::string("database error: ") + sqlite3_errmsg(db_));
    sqlite3_reset(stmt_);  // usable again (bindings kept) after the caller's rollback
    throw error;
  }
  void run() {
    step();
    reset();
  }
  void reset() {
    sqlite3_reset(stmt_);
    sqlite3_clear_bindings(stmt_);
  }
  // For statements whose every parameter is bound before each use: runs it
  // and rewinds it, without the cost of clearing the bindings.
  void run_keep_bindings() {
    step();
    sqlite3_reset(stmt_);
  }

  bool is_null(int c) const { return sqlite3_column_type(stmt_, c) == SQLITE_NULL; }
  std::int64_t i64(int c) const { return sqlite3_column_int64(stmt_, c); }
  int i32(int c) const { return sqlite3_column_int(stmt_, c); }
  double real(int c) const { return sqlite3_column_double(stmt_, c); }
  double real_or_nan(int c) const { return is_null(c) ? std::nan("") : real(c); }
  std::optional<double> opt_real(int c) const {
    return is_null(c) ? std::nullopt : std::optional<double>(real(c));
  }
  std::string text(int c) const {
    const auto* p = sqlite3_column_text(stmt_, c);
    return p ? std::string(reinterpret_cast<const char*>(p), sqlite3_column_bytes(stmt_, c)) : std::string();
  }

 private:
  void check(int rc) {
    if (rc != SQLITE_OK) throw StoreError(std::string("cannot bind value: ") + sqlite3_errmsg(db_));
  }
  sqlite3* db_;
  sqlite3_stmt* stmt_ = nullptr;
};

inline void exec(sqlite3* db, const char* sql) {
  char* err = nullptr;
  if (sqlite3_exec(db, sql, nullptr, nullptr, &err) != SQLITE_OK) {
    std::string msg = err ? err : "unknown error";
    sqlite3_free(err);
    throw StoreError("database error: " + msg);
  }
}

}  // namespace ferrum::store::sqlite
