// IEEE C57.104-2019, "IEEE Guide for the Interpretation of Gases Generated in
// Mineral Oil-Immersed Transformers": DGA status 1/2/3 from gas levels
// against the 90th / 95th percentile tables (chosen by O2/N2 ratio and the
// unit's age) and from the change between consecutive samples and the rate
// of change (structure from memory; the tables are data with their audit
// status in analytics/data/ieee_c57104_2019.csv).
//   Table 1: 90th-percentile concentrations; Table 2: 95th percentiles;
//   Table 3: 95th percentile of the change between consecutive samples;
//   Table 4: 95th percentile of the rate (ppm/year) over 3–6 samples.
// Status logic:
//   Status 3: a gas above Table 2, or above Table 1 with a change/rate above
//             Table 3/4;
//   Status 2: a gas above Table 1 (at most Table 2) without change, or at most
//             Table 1 with a change/rate above Table 3/4;
//   Status 1: otherwise. Any real C2H2 increase is significant ("any").
// The tables are data (analytics/data/ieee_c57104_2019.csv, embedded in the
// binary; a site's corrected copy replaces it, see standard_tables.h).
// Units: ppm, ppm/year.
// Validity: mineral-oil main tanks; O2/N2 unknown → the stricter of the two
// table rows, gas by gas; age unknown → the "unknown age" rows.
#pragma once

#include <array>
#include <optional>
#include <string>
#include <string_view>
#include <vector>

#include "analytics/calendar.h"
#include "analytics/gas_trend.h"
#include "analytics/unit_data.h"

namespace ferrum::analytics {

// One table row: a value per gas in kAllGases order; nullopt = "any
// measurable increase" (C2H2 in Tables 3 and 4).
using C57104_2019Row = std::array<std::optional<double>, 7>;

enum class O2N2Group { low = 0, high = 1 };              // ≤ 0.2 / > 0.2
enum class AgeGroup { unknown = 0, y1_9, y10_30, over30 };  // years

struct C57104_2019Tables {
  std::array<std::array<C57104_2019Row, 4>, 2> table1{};  // [O2N2Group][AgeGroup]
  std::array<std::array<C57104_2019Row, 4>, 2> table2{};
  std::array<C57104_2019Row, 2> table3{};                 // [O2N2Group]
  std::array<C57104_2019Row, 2> table4{};
};

struct C57104_2019TablesParse {
  std::optional<C57104_2019Tables> tables;
  int error_line = 0;    // 1-based line of the first error (0 when fine)
  int error_column = 0;  // 1-based column (field) of the first error
  std::string error;
};

// Parses a whole ieee_c57104_2019.csv in the table-file format
// (standard_tables.h). Every row of every table must be present exactly once.
C57104_2019TablesParse parse_c57104_2019_tables(std::string_view text);
// The text compiled into the binary, and the tables in force.
std::string_view default_c57104_2019_tables_text();
const C57104_2019Tables& default_c57104_2019_tables();

AgeGroup c57104_2019_age_group(std::optional<double> age_years);

struct C57104_2019Status {
  bool applicable = false;
  std::string why_not;
  std::optional<int> status;  // 1..3
  // Every gas that raises the status above 1, most severe first (higher
  // status first, then the larger multiple of the limit it exceeds).
  struct Driver {
    std::string gas;    // "C2H2", ...
    int status = 0;     // 2 or 3
    double times_limit = 0;  // value (or change, rate) / the limit it exceeds
    std::string text;
  };
  std::vector<Driver> drivers;
  std::string reason;         // every driver's text, most severe first, "; " between them
  std::optional<double> o2_n2;
  std::string o2n2_group;     // "<= 0.2", "> 0.2", "unknown (stricter of both)"
  std::string age_group;      // "unknown", "1-9", "10-30", ">30"
  std::string method = "DGA status from 90th/95th percentile norms and rates";
  std::string source = "IEEE C57.104-2019 Tables 1-4";
};

// `history`: main-tank samples, any order; the latest is assessed, the one
// before it gives the Table 3 change, the recent ones the Table 4 rate.
C57104_2019Status c57104_2019_status(const std::vector<OilSample>& history, std::optional<double> age_years,
                                     const C57104_2019Tables& tables, const GasTrendOptions& trend = {});

}  // namespace ferrum::analytics
