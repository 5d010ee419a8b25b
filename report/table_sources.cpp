#include "report/table_sources.h"

#include <algorithm>

namespace ferrum::report {

void standard_tables_subsection(PageFlow& flow, const analytics::UnitAssessment& a) {
  flow.subsection("Standard tables behind this report");
  if (a.tables.empty()) {
    flow.paragraph("No table recorded.", type::body, FontFace::regular, palette::muted);
    return;
  }
  flow.paragraph("The methods above read these tables of the standards. 'unverified' means the values were "
                 "entered from memory and not checked against the standard; a site holding the licensed "
                 "standard can put a corrected copy in tables/ (ferrum tables --export).",
                 type::small, FontFace::regular, palette::muted);
  Table t;
  t.font_size = 7.0;
  t.columns = {{"Table", 3.2}, {"Status", 2.4}, {"Read from", 1.6}};
  for (const auto& n : a.tables) {
    t.rows.push_back({n.title, n.status, n.origin == "embedded" ? "ferrum (embedded)" : "site copy " + n.origin});
    t.emphasis.push_back(n.origin != "embedded");
  }
  flow.table(t);
}

void unverified_tables_line(PageFlow& flow, const analytics::UnitAssessment& a) {
  const auto n = std::count_if(a.tables.begin(), a.tables.end(), [](const auto& t) { return t.unverified; });
  if (n == 0) return;
  flow.paragraph(std::to_string(n) + " of " + std::to_string(a.tables.size()) +
                     " standard tables behind this report are unverified (values from memory); the sources page "
                     "lists each table with its status.",
                 type::small, FontFace::regular, palette::muted);
}

}  // namespace ferrum::report
