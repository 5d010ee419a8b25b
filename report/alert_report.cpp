#include "report/alert_report.h"

#include "report/page_flow.h"
#include "report/pdf_document.h"
#include "report/report_format.h"
#include "report/safety_block.h"
#include "report/title_block.h"

namespace ferrum::report {
namespace {
std::string or_dash(const std::string& s) { return s.empty() ? std::string(kNoValue) : s; }
}  // namespace

void render_alert(const AlertInfo& alert, const ReportOptions& options, const std::string& path) {
  const std::string title = "Alert: " + or_dash(alert.kind) + " on " + or_dash(alert.unit_id);
  PdfDocument doc(options, title, "Condition alert");
  PageFlow flow(doc, title);
  draw_title_block(flow, options, "Condition alert", title, "raised " + or_dash(alert.raised_at));
  flow.key_values({{"Unit", or_dash(alert.unit_id)}, {"Site", or_dash(alert.site)}, {"Alert", or_dash(alert.kind)},
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
