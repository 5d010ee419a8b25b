// Weighted health index (HI) of one transformer, 0..100 (100 = as new).
//
// Method: the weighted factor-scoring form of Jahromi, Piercy, Cress, Service
// and Fan, "An approach to power transformer asset management using health
// index", IEEE Electrical Insulation Magazine 25(2), 2009:
//
//     HI = 100 * sum_j(K_j * HIF_j) / sum_j(4 * K_j)
//
// over the factors j that have data, each HIF_j in 0..4 (rating A..E ->
// 4..0) and K_j its weight. Units carry no on-load tap-changer data in ferrum,
// so the paper's separate 40 % LTC term is not used (100 % main tank).
// The DGA factor follows the paper's per-gas scoring DGAF = sum(S_i W_i) /
// sum(W_i) with S_i in 1..6; the oil-quality factor likewise with S_i in 1..4.
//
// Aggregation guard: CIGRE TB 761 (2019, "Condition assessment of power
// transformers") requires that one severe indicator is not averaged away.
// ferrum adds a worst-indicator cap: a listed severe finding (unsafe
// inspection item, DGA condition 4, active arcing, ...) limits the index to
// the top of a band; the contributions are scaled so that they still sum to
// the index, and the triggering factor's detail says so.
//
// The weights and score cuts are data with their audit status
// (analytics/data/health_index.csv, from memory of the paper: verify against
// the paper before relying on them).
// Where the paper has no table for a factor ferrum scores (thermal history,
// infrared, inspection, age as a separate factor), the default is ferrum's own
// and its source string says so. A site overrides any value in ferrum.ini.
//
// Inputs: the filled parts of a UnitAssessment (gases in ppm, oil checks in
// their stated units, 2-FAL in ppb, DP, thermal ageing factor and hours above
// limits, infrared severities 1..4, inspection ratings, unit age in years).
// Outputs: health_index, band, band_expected_life, confidence, factors,
// freshness of the assessment. Valid for mineral-oil power transformers.
#pragma once

#include <array>
#include <map>
#include <optional>
#include <string>
#include <vector>

#include "analytics/assessment.h"

namespace ferrum::analytics {

// Per-gas scoring row: score S = k+1 for the first k with ppm <= upper[k],
// S = 6 above upper[4]. Weight W_i.
struct GasScoreBands {
  std::string gas;             // "H2", "CH4", ... as in GasReading::gas
  double weight = 1;
  std::array<double, 5> upper{};
};

// Oil-test scoring row for one voltage class: score 1..4. For a "max" test a
// value <= limits[k] scores k+1; for a "min" test a value >= limits[k] does;
// beyond limits[2] scores 4.
struct OilScoreBands {
  std::string test;              // OilCheck::test ("moisture", "breakdown", ...)
  double weight = 1;
  bool higher_is_better = false;
  std::array<double, 3> le69kv{};     // HV <= 69 kV
  std::array<double, 3> kv69to230{};  // 69 < HV < 230 kV
  std::array<double, 3> ge230kv{};    // HV >= 230 kV
};

// Rating cut points A|B, B|C, C|D, D|E. Lower-is-better values: value < a ->
// A (HIF 4), < b -> B (3), < c -> C (2), < d -> D (1), else E (0). For
// higher-is-better values (DP) the comparisons are ">".
using RatingCuts = std::array<double, 4>;

// The data of analytics/data/health_index.csv; the defaults of
// HealthIndexOptions are read from the tables in force.
struct HealthIndexTables {
  std::map<std::string, double> weights;     // by factor name
  std::vector<GasScoreBands> gas_bands;
  std::vector<OilScoreBands> oil_bands;
  std::map<std::string, RatingCuts> cuts;    // "dga", "oil", "furan_ppm", "dp", "ageing_factor", "age"
};
double health_index_weight(const char* factor);
RatingCuts health_index_cuts(const char* factor);
const std::vector<GasScoreBands>& health_index_gas_bands();
const std::vector<OilScoreBands>& health_index_oil_bands();

// A condition band of the index.
struct HealthBand {
  double lower = 0;            // HI > lower (the bottom band also includes 0). Edges
                               // belong to the worse band, so that a cap at the
                               // top of the worst band (30) lands in that band.
  std::string name;            // plain name, ferrum's own wording
  std::string expected_life;   // expected-life range from the published method
  std::string requirement;     // what the method asks for in this band
};

// A worst-indicator cap (CIGRE TB 761 gating).
struct SevereCap {
  std::string trigger;   // "unsafe_inspection", "dga_condition_4", "dga_status_3",
                         // "active_arcing", "infrared_severity_4", "paper_end_of_life"
  double cap = 30;       // the index is limited to this value
};

struct HealthIndexOptions {
  std::string source =
      "Jahromi et al., IEEE Electrical Insulation Magazine 25(2), 2009, weighted health index; "
      "worst-indicator cap per CIGRE TB 761 (2019)";

  // Factor weights K_j. Jahromi's main-tank weights: DGA 10, load history 10,
  // oil quality 6, infrared 8, overall condition 8, furan/age 5.
  double weight_dga = health_index_weight("dga");
  double weight_thermal = health_index_weight("thermal");      // the paper's "load history"
  double weight_oil_quality = health_index_weight("oil_quality");
  double weight_paper = health_index_weight("paper");         // the paper's "furan/age", furans used here
  double weight_infrared = health_index_weight("infrared");
  double weight_inspection = health_index_weight("inspection");    // the paper's "overall condition"
  // The paper folds age into "furan/age". ferrum scores age separately with a
  // small weight of its own so that furans keep their published weight.
  double weight_age = health_index_weight("age");

  // DGA per-gas scores S 1..6 and weights W (Jahromi Table for DGA factor).
  std::vector<GasScoreBands> gas_bands = health_index_gas_bands();
  RatingCuts dga_cuts = health_index_cuts("dga");  // DGAF: A < 1.2, B < 1.5, C < 2.0, D < 3.0, E >= 3.0

  // Oil-quality scores S 1..4 and weights (Jahromi oil-quality table; the
  // score-1 limits are better remembered than the score-2/3 limits; all from memory).
  std::vector<OilScoreBands> oil_bands = health_index_oil_bands();
  RatingCuts oil_cuts = health_index_cuts("oil");  // rating bands as for DGAF (low confidence)
  // The paper's breakdown limits are for ASTM D1816 with a 2 mm gap; a
  // breakdown check whose source does not name a 2 mm gap is left out.
  bool breakdown_needs_2mm_gap = true;

  // Furan factor on 2-FAL in ppm: A < 0.1, B < 0.25, C < 0.5, D < 1.0, E >= 1.0.
  RatingCuts furan_ppm_cuts = health_index_cuts("furan_ppm");
  // Without furans, the DP estimate is rated on the same cuts translated to DP
  // with Chendong's log10(2FAL) = 1.51 - 0.0035 DP: A > 717, B > 603, C > 517,
  // D > 431, E below (computed; Chendong 1991 from memory).
  RatingCuts dp_cuts = health_index_cuts("dp");

  // Thermal history (ferrum's own scale; the paper's load-history table is not
  // used): equivalent ageing factor F_EQA over the load record.
  // A < 0.5, B < 1.0 (below normal ageing), C < 2.0, D < 4.0, E above.
  RatingCuts ageing_factor_cuts = health_index_cuts("ageing_factor");
  // Any hour above the normal cyclic hot-spot limit caps the rating at B, above
  // the long-time emergency limit at C, above the short-time emergency limit
  // at D (ferrum's own rule).

  // Infrared (ferrum's own mapping): worst severity (1 least .. 4 most severe)
  // within the window before the latest survey. None -> A, 1 -> B, 2 -> C,
  // 3 -> D, 4 -> E.
  int infrared_window_days = 730;

  // Inspection (ferrum's own mapping): worst item rating good/fair/poor/
  // very_poor/unsafe -> A/B/C/D/E.

  // Age (ferrum's own bands, years): A < 20, B < 35, C < 45, D < 55, E above.
  RatingCuts age_cuts = health_index_cuts("age");

  // Bands of the index (Jahromi's HI -> condition -> expected life table, plain
  // names of ferrum's own). Ordered best first.
  std::vector<HealthBand> bands{
      {85, "sound", "more than 15 years", "normal maintenance"},
      {70, "serviceable", "more than 15 years", "normal maintenance"},
      {50, "deteriorating", "more than 10 years",
       "more diagnostic testing; remedial work or replacement depending on criticality"},
      {30, "worn", "less than 10 years", "start planning replacement or rebuild, considering risk"},
      {0, "failing", "near the end of life", "assess risk immediately; replace or rebuild"},
  };

  // Worst-indicator caps (CIGRE TB 761 gating; values are ferrum's own: the top
  // of the worst band for the most severe findings, the top of the next band
  // for the others).
  std::vector<SevereCap> caps{
      {"unsafe_inspection", 30},
      {"dga_condition_4", 30},
      {"paper_end_of_life", 30},
      {"dga_status_3", 50},
      {"active_arcing", 50},  // acetylene appearing: serious, may still be small
      {"infrared_severity_4", 50},
  };
  double paper_end_of_life_dp = 200;  // DP at or below which the cap applies (common end-of-life DP)

  // An index needs at least this many factors; below it, no index.
  int min_factors = 3;
  // Data older than this is named in the confidence text.
  double stale_after_years = 1.0;
};

// Fills a.health_index, a.band, a.band_expected_life, a.confidence, a.factors
// and a.freshness; appends to a.missing and a.methods. Never throws on odd
// input: a factor that cannot be scored is left out with a reason.
void score_health(const HealthIndexOptions& options, UnitAssessment& a);

// Building blocks, exposed for tests and for the report's factor table.

// Jahromi DGAF = sum(S_i W_i) / sum(W_i) over gases with a value (a gas below
// its detection limit scores 1); nullopt when no gas has a value.
std::optional<double> dga_factor_value(const std::vector<GasReading>& gases,
                                       const std::vector<GasScoreBands>& bands);

// Rating A..E -> HIF 4..0 from a weighted factor value and cut points.
int rating_from_cuts(double value, const RatingCuts& cuts, bool higher_is_better = false);

// The band an index falls in (bands ordered best first); nullptr for NaN.
const HealthBand* band_of(double health_index, const std::vector<HealthBand>& bands);

// One DataFreshness per kind ("oil", "infrared", "inspection", "load").
std::vector<DataFreshness> data_freshness(const UnitAssessment& a);

}  // namespace ferrum::analytics
