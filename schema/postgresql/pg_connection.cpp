#include "schema/postgresql/pg_connection.h"

#include <algorithm>
#include <charconv>
#include <cstdlib>
#include <cstring>

namespace ferrum::store::pg {

Params& Params::add(double v) {
  if (std::isnan(v)) return null();
  char buf[32];
  const auto r = std::to_chars(buf, buf + sizeof buf, v);  // shortest text that reads back the same double
  return text(std::string(buf, r.ptr));
}

std::vector<const char*> Params::pointers() const {
  std::vector<const char*> p(values_.size());
  for (std::size_t i = 0; i < values_.size(); ++i) p[i] = is_null_[i] ? nullptr : values_[i].c_str();
  return p;
}

std::vector<int> Params::lengths() const {
  if (binary_.empty()) return {};
  std::vector<int> n(values_.size());
  for (std::size_t i = 0; i < values_.size(); ++i) n[i] = static_cast<int>(values_[i].size());
  return n;
}

std::vector<int> Params::formats() const {
  if (binary_.empty()) return {};
  std::vector<int> f(values_.size(), 0);
  for (std::size_t i = 0; i < binary_.size(); ++i) f[i] = binary_[i] ? 1 : 0;
  return f;
}

long Result::affected() const {
  const char* n = r_ ? PQcmdTuples(r_) : "";
  return *n ? std::strtol(n, nullptr, 10) : 0;
}

std::int64_t Result::Row::i64(int c) const { return std::strtoll(PQgetvalue(r_, row_, c), nullptr, 10); }

double Result::Row::real(int c) const {
  const char* v = PQgetvalue(r_, row_, c);
  double d = 0;
  std::from_chars(v, v + PQgetlength(r_, row_, c), d);
  return d;
}

std::int64_t Result::Row::be_i64(int c) const {
  if (PQgetlength(r_, row_, c) != 8) throw StoreError("database error: a binary column is not 8 bytes wide");
  const auto* b = reinterpret_cast<const unsigned char*>(PQgetvalue(r_, row_, c));
  std::uint64_t v = 0;
  for (int i = 0; i < 8; ++i) v = (v << 8) | b[i];
  return static_cast<std::int64_t>(v);
}

double Result::Row::be_f64(int c) const {
  const std::int64_t bits = be_i64(c);
  double d;
  std::memcpy(&d, &bits, sizeof d);
  return d;
}

Connection::Connection(std::string conninfo, bool must_connect) : conninfo_(std::move(conninfo)) {
  conn_ = PQconnectdb(conninfo_.c_str());
  if (PQstatus(conn_) != CONNECTION_OK && !must_connect) return;  // reconnect_if_lost() tries again
  if (PQstatus(conn_) != CONNECTION_OK) {
    std::string msg = conn_ ? PQerrorMessage(conn_) : "out of memory";
    while (!msg.empty() && (msg.back() == '\n' || msg.back() == ' ')) msg.pop_back();
    PQfinish(conn_);
    conn_ = nullptr;
    throw StoreUnavailable("cannot connect to PostgreSQL: " + msg);
  }
  // Quiet notices (IF NOT EXISTS ...); times and numbers as the store writes them.
  PQsetNoticeProcessor(conn_, [](void*, const char*) {}, nullptr);
  exec("SET client_encoding = 'UTF8'; SET TIME ZONE 'UTC'; SET extra_float_digits = 3");
}

Connection::~Connection() { PQfinish(conn_); }

bool Connection::reconnect_if_lost() {
  if (PQstatus(conn_) == CONNECTION_OK) return false;
  if (conn_) PQreset(conn_);
  else conn_ = PQconnectdb(conninfo_.c_str());
  prepared_.clear();
  if (PQstatus(conn_) != CONNECTION_OK) fail("cannot reconnect to PostgreSQL");
  PQsetNoticeProcessor(conn_, [](void*, const char*) {}, nullptr);
  exec("SET client_encoding = 'UTF8'; SET TIME ZONE 'UTC'; SET extra_float_digits = 3");
  return true;
}

void Connection::fail(const std::string& what, const PGresult* r) {
  std::string msg = r ? PQresultErrorMessage(r) : "";
  if (msg.empty()) msg = PQerrorMessage(conn_);
  while (!msg.empty() && (msg.back() == '\n' || msg.back() == ' ')) msg.pop_back();
  if (PQstatus(conn_) != CONNECTION_OK) throw StoreUnavailable("database unreachable: " + what + ": " + msg);
  // Server shutting down or restarting, but the socket not yet closed: the
  // same for the caller (SQLSTATE class 57P: operator intervention; 08:
  // connection). No SQLSTATE at all: libpq's own error, such as "server
  // closed the connection unexpectedly" before it marks the connection bad.
  const char* state = r ? PQresultErrorField(r, PG_DIAG_SQLSTATE) : nullptr;
  if (!state || std::string(state).rfind("57P", 0) == 0 || std::string(state).rfind("08", 0) == 0)
    throw StoreUnavailable("database unreachable: " + what + ": " + msg);
  throw StoreError("database error: " + what + ": " + msg);
}

Result Connection::check(PGresult* r, const std::string& what) {
  Result out(r);
  const auto st = PQresultStatus(r);
  if (st != PGRES_COMMAND_OK && st != PGRES_TUPLES_OK) fail(what, r);
  return out;
}

void Connection::exec(const std::string& sql) { check(PQexec(conn_, sql.c_str()), sql.substr(0, 80)); }

Result Connection::query(const std::string& sql) { return check(PQexec(conn_, sql.c_str()), sql.substr(0, 80)); }

Result Connection::run(const char* sql, const Params& params, bool binary_results) {
  auto it = prepared_.find(sql);
  const bool fresh = it == prepared_.end();
  if (fresh) it = prepared_.emplace(sql, Prepared{}).first;
  Prepared& p = it->second;
  if (fresh || ++p.runs == p.replan_at) {
    try {
      if (!fresh) {
        exec("DEALLOCATE " + p.name);
        p.replan_at *= 4;
      }
      p.name = "f" + std::to_string(++statements_named_);
      check(PQprepare(conn_, p.name.c_str(), sql, 0, nullptr), std::string("prepare ") + sql);
    } catch (...) {
      prepared_.erase(it);  // prepared afresh on the next run
      throw;
    }
  }
  const auto values = params.pointers();
  const auto lengths = params.lengths();
  const auto formats = params.formats();
  return check(PQexecPrepared(conn_, p.name.c_str(), params.size(), values.data(),
                              lengths.empty() ? nullptr : lengths.data(), formats.empty() ? nullptr : formats.data(),
                              binary_results ? 1 : 0),
               std::string(sql).substr(0, 80));
}

bool Connection::copy_in(const std::string& copy_sql, const std::string& data, bool unique_violation_ok) {
  {
    PGresult* start = PQexec(conn_, copy_sql.c_str());
    const bool ready = PQresultStatus(start) == PGRES_COPY_IN;
    Result hold(start);
    if (!ready) fail(copy_sql, start);
  }
  constexpr std::size_t kChunk = 1 << 20;
  for (std::size_t at = 0; at < data.size(); at += kChunk) {
    const std::size_t n = std::min(kChunk, data.size() - at);
    if (PQputCopyData(conn_, data.data() + at, static_cast<int>(n)) != 1) break;  // the result says why
  }
  PQputCopyEnd(conn_, nullptr);
  Result bad;  // the first result that is not success, if any
  bool got = false;
  while (PGresult* r = PQgetResult(conn_)) {
    got = true;
    if (PQresultStatus(r) != PGRES_COMMAND_OK && !bad.get()) bad = Result(r);
    else PQclear(r);
  }
  if (bad.get() && unique_violation_ok && ok()) {
    const char* state = PQresultErrorField(bad.get(), PG_DIAG_SQLSTATE);
    if (state && std::string(state) == "23505") return false;  // unique_violation
  }
  if (bad.get() || !got) fail(copy_sql, bad.get());
  return true;
}

}  // namespace ferrum::store::pg
