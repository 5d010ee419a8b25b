// Fleet ranking on risk = likelihood of failure x consequence.
//
// Likelihood: probability of failure per year from the health index with the
// exponential form in common asset-management practice (the form CNAIM and
// similar indices use, stated here as common practice, not taken from a
// standard): PoF(HI) = P100 * (P0 / P100)^((100 - HI) / 100), i.e. P100 for an
// as-new unit rising exponentially to P0 at HI 0. Calibrate P100 and P0 on the
// fleet's own failure statistics.
// Consequence (0..1): weighted mean of criticality / 5, customers served /
// reference and rated MVA / reference (each capped at 1); a component with no
// data is left out and the weights of the others renormalised. Keeping the
// consequence apart from the index until this step follows CIGRE TB 761.
//
// Ranking: descending risk; equal risk (within a relative tolerance) shares a
// rank (1, 2, 2, 4), is marked tied and is ordered by unit_id with a note.
// Units without a health index are listed after the ranked ones, by unit_id,
// with insufficient_data set, rank 0 and a note naming what is missing.
// Recommended action, year, reason and the unit's most urgent action
// (first_action): the assessment's one decision (analytics/decision/
// decision.h), copied, so that the ranking and the unit report agree.
// Risk for people: probability of failure as expected failures per 1,000
// unit-years (2 at HI 100 to 200 at HI 0 with the defaults), times the
// consequence. The calibration is ferrum's own (risk_calibration says so).
// Ten-year outlook: replacements per year (mva_due_by_year) and every unit
// whose remaining life ends within the ten years (outlook).
#pragma once

#include <cstddef>
#include <cstdint>
#include <functional>
#include <string>
#include <utility>
#include <vector>

#include "analytics/assessment.h"
#include "analytics/ranking_input.h"

namespace ferrum::analytics {

struct RankingOptions {
  // Likelihood.
  double pof_as_new = 0.002;   // per year at HI 100 (ferrum default)
  double pof_at_zero = 0.2;    // per year at HI 0 (ferrum default)
  std::string pof_source =
      "exponential PoF(HI) = P100 (P0/P100)^((100-HI)/100), common practice; the defaults (2 failures per "
      "1,000 unit-years at HI 100, 200 at HI 0) are ferrum's own, not calibrated on failure statistics";
  // Consequence weights and references.
  double weight_criticality = 0.5;
  double weight_customers = 0.3;
  double weight_mva = 0.2;
  double customers_reference = 10000;  // customers at which the component reaches 1
  double mva_reference = 100;          // MVA at which the component reaches 1
  // Equal risk: |r1 - r2| <= tie_tolerance * max(r1, r2).
  double tie_tolerance = 1e-9;
  int horizon_years = 10;              // MVA-due summary and life-end outlook
};

// Ranks every unit; never drops one. REQUIRES nothing: empty input gives an
// empty ranking with the ten-year summary at zero. The rows are taken by
// value: a caller done with them moves them in, and their text moves into
// the ranking instead of being copied (the whole fleet's rows and ranking
// are held at once).
FleetRanking rank_fleet(std::vector<RankingInput> units, Day as_of, const RankingOptions& options);
// The same from whole assessments (ranking_inputs of them).
FleetRanking rank_fleet(const std::vector<UnitAssessment>& units, Day as_of, const RankingOptions& options);

// A ranking's rows handed to `each` one at a time, in order: a
// FleetRanking's own (rows_of) or rows kept in a file
// (daemon/assess/spilled_ranking.h), for outputs that write a row at a time.
using RankedUnitSink = std::function<void(const RankedUnit&)>;
using RankedRows = std::function<void(const RankedUnitSink& each)>;
RankedRows rows_of(const FleetRanking& ranking);  // REQUIRES ranking outlives the result

// One unit's row before its place in the fleet is known: risk and its
// factors, the decision, the note on missing data; rank, tied and the tie
// note are left for RankingOrder::place.
RankedUnit ranked_row(RankingInput&& unit, const RankingOptions& options);

// The order of a ranking without its rows: what the order, the ranks, the
// ties and the ten-year summaries need of each row (a few dozen bytes), so
// that a caller can keep the rows elsewhere (rank_fleet keeps them in a
// vector; `ferrum rank` in a file, so that its memory does not grow with the
// fleet) and fetch each one when its turn comes. rank_fleet is this with
// the rows in memory: both give the same ranking.
//   RankingOrder order(as_of, options);
//   order.add(ranked_row(...)) for each unit;      // rows numbered 0, 1, ...
//   order.finish();
//   for p in [0, size): row = the row numbered row_at(p); place(p, row);
class RankingOrder {
 public:
  RankingOrder(Day as_of, const RankingOptions& options);
  void reserve(std::size_t rows) { entries_.reserve(rows); }
  // Adds the next row (numbered in the order added). REQUIRES !finished().
  void add(const RankedUnit& row);
  // Sorts and ranks; fills the summaries. REQUIRES !finished().
  void finish();
  bool finished() const { return finished_; }
  std::size_t size() const { return entries_.size(); }
  // Number of the row at `position` (0 = first) of the ranking. REQUIRES finished().
  std::size_t row_at(std::size_t position) const { return entries_[position].row; }
  // Sets rank, tied and the tie note of the row at `position`. REQUIRES finished().
  void place(std::size_t position, RankedUnit& row) const;
  // The ranking without its units: as_of, MVA due per year, the outlook and
  // the calibration. REQUIRES finished().
  const FleetRanking& summary() const { return summary_; }

 private:
  struct Entry {  // 72 bytes: one per unit of the fleet
    double risk = 0;
    double rated_mva = 0;
    std::string unit_id;
    std::uint32_t row = 0;
    std::uint32_t group_begin = 0, group_end = 0;  // positions of its group of equal risk (rank: begin + 1)
    std::int32_t replace_year = 0;                 // of a replacement (replaces)
    bool ranked = false;
    bool replaces = false;
  };
  Day as_of_;
  RankingOptions options_;
  std::vector<Entry> entries_;
  std::vector<std::pair<std::size_t, FleetRanking::LifeEnd>> outlook_;  // by row number
  FleetRanking summary_;
  bool finished_ = false;
};

// The two factors of risk, exposed for tests and reports.
double probability_of_failure(double health_index, const RankingOptions& options);
double consequence_of(const UnitInfo& unit, const RankingOptions& options);

}  // namespace ferrum::analytics
