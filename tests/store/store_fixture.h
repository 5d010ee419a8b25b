// A fresh database folder per test, and the small records most store tests
// need (a unit of the register, a file record).
#pragma once

#include <gtest/gtest.h>
#include <unistd.h>

#include <filesystem>
#include <memory>
#include <string>

#include "schema/store.h"

namespace ferrum::testing {

class StoreFixture : public ::testing::Test {
 protected:
  void SetUp() override {
    dir_ = std::filesystem::temp_directory_path() /
           ("ferrum-store-" + std::to_string(::getpid()) + "-" +
            ::testing::UnitTest::GetInstance()->current_test_info()->name());
    std::filesystem::remove_all(dir_);
    std::filesystem::create_directories(dir_);
    db_ = (dir_ / "ferrum.db").string();
  }
  void TearDown() override { std::filesystem::remove_all(dir_); }

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

  static std::int64_t file(store::Store& s, const std::string& sha = "abc") {
    store::FileRecord f;
    f.sha256 = sha;
    f.party = "planning";
    f.original_name = "units.csv";
    f.status = "accepted";
    f.received_at = "2026-12-01T00:00:00Z";
    f.receipt_json = "{}";
    return s.add_file(f);
  }

  std::filesystem::path dir_;
  std::string db_;
};

// A store whose load queue holds `Batch` points (small, so that few rows
// cross batch boundaries), two file records and the units T1 and T2.
template <int Batch>
class TwoFilesFixture : public StoreFixture {
 protected:
  static constexpr int kBatch = Batch;
  void SetUp() override {
    StoreFixture::SetUp();
    s_ = store::open_sqlite_store(db_, kBatch);
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

}  // namespace ferrum::testing
