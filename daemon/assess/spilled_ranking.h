// The fleet ranking with its rows in a temporary file: `ferrum rank` over a
// fleet of any size holds a few dozen bytes a unit (analytics::RankingOrder)
// instead of every row's text (about 3 KiB a unit; bench/results.md, "Peak
// memory"), and reads each row back when its turn comes to be written.
//
// Units are added in register order, as the assessment or the ranking cache
// gives them. finish() applies the site view one site at a time (it needs
// every unit of a site, and sites need not be contiguous in the register),
// scores each unit and orders the fleet; rows() then hands the rows out in
// ranking order. The ranking is the one analytics::rank_fleet makes of the
// same units after assess::apply_site_view (tests/daemon/spilled_ranking_test.cpp).
//
// The file is unnamed (O_TMPFILE in $TMPDIR, else /tmp) and vanishes with
// the process; where none can be made, the rows stay in memory.
#pragma once

#include <cstdint>
#include <map>
#include <memory>
#include <string>
#include <vector>

#include "analytics/fleet_ranking.h"
#include "analytics/ranking_input.h"
#include "analytics/site_view.h"
#include "daemon/assess/assessment_json.h"

namespace ferrum::assess {

// A unit's row as the file holds it, and back (exposed for tests).
std::string spill_form(const analytics::RankingInput& unit);
analytics::RankingInput of_spill_form(const std::string& bytes);

class SpilledRanking {
 public:
  enum class Storage { temporary_file, memory };  // memory: what happens when no file can be made
  // keep_sites: keep the site views, as the text of `rank --json` gives
  // them (assess::site_element_text), for sites().
  SpilledRanking(analytics::Day as_of, const analytics::RankingOptions& ranking,
                 const analytics::SiteViewOptions& site_view, bool keep_sites,
                 Storage storage = Storage::temporary_file);
  ~SpilledRanking();
  SpilledRanking(const SpilledRanking&) = delete;
  SpilledRanking& operator=(const SpilledRanking&) = delete;

  void add(const analytics::RankingInput& unit);  // REQUIRES !finished
  // Forgets every unit added (a ranking cache found damaged part-way).
  void clear();
  void finish();
  std::size_t size() const { return records_.size(); }
  // REQUIRES finish(). The ranking without its units; its rows in order.
  const analytics::FleetRanking& summary() const;
  analytics::RankedRows rows() const;
  // The site views in order of first appearance, as JSON array elements.
  // REQUIRES finish() and keep_sites.
  TextElements sites() const;
  bool in_file() const { return fd_ >= 0; }

 private:
  struct Record {
    std::uint64_t offset = 0;
    std::uint32_t length = 0;
  };
  Record append(const std::string& line);
  std::string read(Record r) const;

  analytics::Day as_of_;
  analytics::RankingOptions options_;
  analytics::SiteViewOptions site_options_;
  bool keep_sites_;
  int fd_ = -1;
  std::string memory_;      // the file's content when no file could be made
  std::string pending_;     // written at the end of the file before the next read
  std::uint64_t end_ = 0;   // size of the file with pending_
  std::vector<Record> records_;  // register order, then (after finish) the order's row numbers
  std::vector<std::uint32_t> site_of_;
  std::map<std::string, std::uint32_t> site_index_;
  std::vector<std::string> site_names_;  // in order of first appearance
  std::unique_ptr<analytics::RankingOrder> order_;
  std::vector<Record> sites_;  // site views as text, in the file
  bool finished_ = false;
};

}  // namespace ferrum::assess
