#include "report/alert_report.h"

#include <cctype>
#include <utility>

#include "report/page_flow.h"
#include "report/pdf_document.h"
#include "report/report_format.h"
#include "report/safety_block.h"
#include "report/title_block.h"

namespace ferrum::report {
namespace {
std::string or_dash(const std::string& s) { return s.empty() ? std::string(kNoValue) : s; }
}  // namespace

std::string alert_title(const std::string& kind) {
  static const std::pair<const char*, const char*> titles[] = {
      {"acetylene", "Acetylene appeared or rising"},
      {"gas_condition", "Gas condition high or worse (IEEE C57.104-2008)"},
      {"dga_status", "DGA status high or worse (IEEE C57.104-2019)"},
      {"hot_spot", "Hot spot above the emergency limit"},
      {"unsafe_inspection", "Unsafe item found at inspection"},
      {"infrared_priority_1", "Infrared finding: repair immediately (priority 1)"},
  };
  for (const auto& [k, title] : titles)
    if (kind == k) return title;
  if (kind.empty()) return "Condition alert";
  std::string words = kind;
  for (char& c : words)
    if (c == '_') c = ' ';
  words[0] = static_cast<char>(std::toupper(static_cast<unsigned char>(words[0])));
  return words;
}

void render_alert(const AlertInfo& alert, const ReportOptions& options, const std::string& path) {
  const std::string title = alert_title(alert.kind) + " on " + or_dash(alert.unit_id);
  PdfDocument doc(options, title, "Condition alert");
  PageFlow flow(doc, title);
  draw_title_block(flow, options, "Condition alert", title, "raised " + or_dash(alert.raised_at));
  flow.key_values({{"Unit", or_dash(alert.unit_id)}, {"Site", or_dash(alert.site)}, {"Alert", alert_title(alert.kind)},
                   {"Raised", or_dash(alert.raised_at)}},
                  4);
  flow.section("What happened", 30);
  flow.paragraph(or_dash(alert.text), 9.6);
  flow.section("What to do first", 30);
  flow.paragraph(or_dash(alert.first_step), 9.6, FontFace::bold);
  flow.paragraph("The full unit report gives the data, methods and sources behind this alert.", type::small,
                 FontFace::regular, palette::muted);
  flow.ensure(safety_block_height(flow) + 12);
  doc.add_bookmark("SAFETY", flow.page(), flow.y());
  add_safety_block(flow);
  doc.draw_footers("ferrum · alert · " + or_dash(alert.unit_id) + " · " + or_dash(alert.raised_at));
  doc.save(path);
}

}  // namespace ferrum::report
