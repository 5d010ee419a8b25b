// A fresh database per test, on each backend (the tests are parametrized by
// backend), and the small records most store tests need (a unit of the
// register, a file record). PostgreSQL: a real server that
// tests/pgserver.py starts once (initdb + pg_ctl in a folder of the build
// tree, Unix socket only; as the postgres user when run as root) and a
// schema of its own per test. Without the server packages the PostgreSQL
// cases skip with the reason.
#pragma once

#include <gtest/gtest.h>
#include <libpq-fe.h>
#include <pwd.h>
#include <sys/file.h>
#include <unistd.h>

#include <array>
#include <cctype>
#include <cstdio>
#include <filesystem>
#include <memory>
#include <string>

#include "schema/store.h"

namespace ferrum::testing {

enum class Backend { sqlite, postgresql };

inline std::string backend_name(const ::testing::TestParamInfo<Backend>& info) {
  return info.param == Backend::sqlite ? "SQLite" : "PostgreSQL";
}

// The connection string of the shared test server's database, starting the
// server when it is not running; "" with `why` set when it cannot run here.
inline std::string test_postgresql(std::string& why) {
  static std::string conninfo, reason;
  static bool tried = false;
  if (!tried) {
    tried = true;
    const std::string folder = std::string(FERRUM_TEST_PG_FOLDER);
    // Already running (started by an earlier test process): use it as it is.
    const std::string expected = "host=" + folder + " dbname=ferrum user=" +
                                 (::geteuid() == 0 ? std::string("postgres")
                                                    : std::string(::getpwuid(::geteuid()) ? ::getpwuid(::geteuid())->pw_name : ""));
    if (PGconn* c = PQconnectdb(expected.c_str())) {
      const bool up = PQstatus(c) == CONNECTION_OK;
      PQfinish(c);
      if (up) {
        conninfo = expected;
        why = reason;
        return conninfo;
      }
    }
    std::filesystem::create_directories(std::filesystem::path(folder).parent_path());
    const int lock = ::open((folder + ".lock").c_str(), O_CREAT | O_RDWR, 0600);
    if (lock >= 0) ::flock(lock, LOCK_EX);  // one starter at a time (ctest runs tests in parallel)
    const std::string cmd = "python3 '" FERRUM_SOURCE_ROOT "/tests/pgserver.py' start '" + folder + "' 2>&1";
    std::string out;
    if (FILE* p = ::popen(cmd.c_str(), "r")) {
      std::array<char, 512> buf{};
      while (std::fgets(buf.data(), buf.size(), p)) out += buf.data();
      const int status = ::pclose(p);
      while (!out.empty() && out.back() == '\n') out.pop_back();
      if (WIFEXITED(status) && WEXITSTATUS(status) == 0) conninfo = out;
      else reason = out.empty() ? "tests/pgserver.py failed" : out;
    }
    if (lock >= 0) ::close(lock);
  }
  why = reason;
  return conninfo;
}

class StoreFixture : public ::testing::TestWithParam<Backend> {
 protected:
  void SetUp() override {
    const auto* info = ::testing::UnitTest::GetInstance()->current_test_info();
    std::string name = info->name();
    for (char& c : name) if (!std::isalnum(static_cast<unsigned char>(c))) c = '_';
    dir_ = std::filesystem::temp_directory_path() / ("ferrum-store-" + std::to_string(::getpid()) + "-" + name);
    std::filesystem::remove_all(dir_);
    std::filesystem::create_directories(dir_);
    db_ = (dir_ / "ferrum.db").string();
    if (GetParam() == Backend::postgresql) {
      std::string why;
      const std::string server = test_postgresql(why);
      if (server.empty()) GTEST_SKIP() << "PostgreSQL: " << why;
      schema_ = "t" + std::to_string(::getpid()) + "_" + name;
      for (char& c : schema_) c = static_cast<char>(std::tolower(static_cast<unsigned char>(c)));
      if (schema_.size() > 60) schema_ = schema_.substr(0, 60);
      sql(server, "DROP SCHEMA IF EXISTS " + schema_ + " CASCADE; CREATE SCHEMA " + schema_);
      server_ = server;
      conninfo_ = server + " options='-csearch_path=" + schema_ + "' application_name=" + schema_;
    }
  }
  void TearDown() override {
    if (!schema_.empty()) sql(server_, "DROP SCHEMA IF EXISTS " + schema_ + " CASCADE");
    std::filesystem::remove_all(dir_);
  }

  // A new connection to this test's database, on the test's backend.
  std::unique_ptr<store::Store> open_store(int load_batch = store::kSqliteLoadBatch) {
    if (GetParam() == Backend::sqlite) return store::open_sqlite_store(db_, load_batch);
    return store::open_postgresql_store(conninfo_, "test:/root", load_batch);
  }

  // Runs SQL on the test server (setup, or to play a newer ferrum).
  static void sql(const std::string& conninfo, const std::string& text) {
    PGconn* c = PQconnectdb(conninfo.c_str());
    ASSERT_EQ(PQstatus(c), CONNECTION_OK) << PQerrorMessage(c);
    PQsetNoticeProcessor(c, [](void*, const char*) {}, nullptr);
    PGresult* r = PQexec(c, text.c_str());
    const auto st = PQresultStatus(r);
    EXPECT_TRUE(st == PGRES_COMMAND_OK || st == PGRES_TUPLES_OK) << PQresultErrorMessage(r);
    PQclear(r);
    PQfinish(c);
  }

  static analytics::UnitInfo unit(const std::string& id) {
    analytics::UnitInfo u;
    u.unit_id = id;
    u.site = "North";
    u.rated_mva = 40;
    u.hv_kv = 132;
    u.lv_kv = 33;
    u.cooling = "ONAF";
    u.year_built = 1985;
    return u;
  }

  // An accepted file record with this content hash.
  static store::FileRecord record(const std::string& sha) {
    store::FileRecord f;
    f.sha256 = sha;
    f.party = "planning";
    f.original_name = "units.csv";
    f.status = "accepted";
    f.received_at = "2026-12-01T00:00:00Z";
    f.receipt_json = "{}";
    return f;
  }
  static std::int64_t file(store::Store& s, const std::string& sha = "abc") { return s.add_file(record(sha)); }

  std::filesystem::path dir_;
  std::string db_;
  std::string server_, schema_, conninfo_;  // PostgreSQL
};

// A store whose load queue holds `Batch` points (small, so that few rows
// cross batch boundaries), two file records and the units T1 and T2.
template <int Batch>
class TwoFilesFixture : public StoreFixture {
 protected:
  static constexpr int kBatch = Batch;
  void SetUp() override {
    StoreFixture::SetUp();
    s_ = open_store(kBatch);
    f1_ = file(*s_, "a");
    f2_ = file(*s_, "b");
    s_->upsert_unit(unit("T1"), f1_, 2);
    s_->upsert_unit(unit("T2"), f1_, 3);
  }
  void TearDown() override {
    s_.reset();
    StoreFixture::TearDown();
  }

  std::unique_ptr<store::Store> s_;
  std::int64_t f1_ = 0, f2_ = 0;
};

// Both backends, for a fixture deriving from StoreFixture.
#define FERRUM_ON_BOTH_BACKENDS(Fixture)                                                                    \
  INSTANTIATE_TEST_SUITE_P(Backends, Fixture,                                                               \
                           ::testing::Values(ferrum::testing::Backend::sqlite,                              \
                                             ferrum::testing::Backend::postgresql),                         \
                           ferrum::testing::backend_name)

}  // namespace ferrum::testing
