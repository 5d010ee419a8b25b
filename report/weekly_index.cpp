// render_weekly_index: the cover page of a week's bundle of unit reports.
#include <algorithm>

#include "report/fleet_report.h"
#include "report/pdf_document.h"
#include "report/report_format.h"
#include "report/safety_block.h"
#include "report/title_block.h"

namespace ferrum::report {

void render_weekly_index(const std::string& week_label, const analytics::FleetRanking& ranking,
                         const std::vector<std::pair<std::string, std::string>>& unit_report_files,
                         const ReportOptions& options, const std::string& path) {
  const std::string title = "Unit reports of week " + week_label;
  PdfDocument doc(options, title, "Weekly bundle index");
  PageFlow flow(doc, title);
  draw_title_block(flow, options, "Weekly bundle", title, std::to_string(unit_report_files.size()) + " reports");
  flow.section("Reports in this bundle", 40);
  if (unit_report_files.empty()) {
    flow.paragraph("No unit report was produced this week.", type::body, FontFace::regular, palette::muted);
  } else {
    // Ranking order first (highest risk on top), then units the ranking does not know.
    auto position = [&](const std::string& id) {
      const auto it = std::find_if(ranking.units.begin(), ranking.units.end(),
                                   [&](const analytics::RankedUnit& u) { return u.unit_id == id; });
      return std::pair{it - ranking.units.begin(), it};
    };
    auto files = unit_report_files;
    std::stable_sort(files.begin(), files.end(),
                     [&](const auto& a, const auto& b) { return position(a.first).first < position(b.first).first; });
    Table t;
    t.columns = {{"Unit", 0.9}, {"Site", 1.6}, {"HI", 0.5, Align::right}, {"Band", 0.9}, {"Report file", 3.0}};
    for (const auto& [id, file] : files) {
      const auto it = position(id).second;
      const bool known = it != ranking.units.end();
      t.rows.push_back({id, known ? it->site : kNoValue, known ? fmt_health_index(it->health_index) : kNoValue,
                        known && !it->band.empty() ? it->band : kNoValue, file});
    }
    flow.table(t);
  }
  flow.paragraph("Each unit report carries the safety cautions on its first and last page.", type::small,
                 FontFace::regular, palette::muted);
  flow.ensure(safety_block_height(flow) + 12);
  doc.add_bookmark("SAFETY", flow.page(), flow.y());
  add_safety_block(flow);
  doc.draw_footers("ferrum · weekly bundle " + week_label);
  doc.save(path);
}

}  // namespace ferrum::report
