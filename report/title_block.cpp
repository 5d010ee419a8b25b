#include "report/title_block.h"

namespace ferrum::report {

void draw_title_block(PageFlow& flow, const ReportOptions& options, const std::string& kind,
                      const std::string& title, const std::string& right_note) {
  HPDF_Page page = flow.page();
  const double top = flow.y();
  FontRef regular = flow.doc().font(FontFace::regular);
  const double note_w = text_width(page, regular, 8, right_note);
  std::string kicker = options.utility_name.empty() ? kind : options.utility_name + " · " + kind;
  // The kicker shares the line with the note: wrap it rather than collide.
  flow.draw_wrapped(kicker, flow.x(), top, flow.width() - note_w - 16, 8, FontFace::regular, palette::accent);
  draw_text(page, regular, 8, flow.x() + flow.width(), top - 8, right_note, palette::muted, Align::right);
  flow.space(12);
  flow.paragraph(title, 17, FontFace::bold);
  flow.space(2);
}

}  // namespace ferrum::report
