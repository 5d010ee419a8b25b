#include "report/safety_block.h"

#include "report/text_wrap.h"

namespace ferrum::report {
namespace {

constexpr double kSize = 6.9;
constexpr double kPad = 6;
constexpr double kHeadingSize = 8.6;

// Wraps "lead text" so that the lead, set in bold, is measured in bold.
std::vector<std::string> wrap_caution(PageFlow& flow, const Caution& c, double width) {
  HPDF_Page page = flow.page();
  FontRef bold = flow.doc().font(FontFace::bold);
  FontRef regular = flow.doc().font(FontFace::regular);
  const std::string whole = c.lead + " " + c.text;
  const double lead_extra = text_width(page, bold, kSize, c.lead) - text_width(page, regular, kSize, c.lead);
  return wrap_text(whole, width, [&](std::string_view s) { return text_width(page, regular, kSize, s); },
                   lead_extra);
}

double line_height() { return kSize * 1.25; }

}  // namespace

double safety_block_height(PageFlow& flow) {
  const double inner = flow.width() - 2 * kPad - 4;
  double h = kPad + kHeadingSize * 1.5 + kPad;
  for (const auto& c : safety_cautions())
    h += static_cast<double>(wrap_caution(flow, c, inner).size()) * line_height() + 1.5;
  return h;
}

void draw_safety_block(PageFlow& flow, double top) {
  HPDF_Page page = flow.page();
  const double x = flow.x();
  const double w = flow.width();
  const double h = safety_block_height(flow);
  const double inner = w - 2 * kPad - 4;
  fill_rect(page, x, top - h, w, h, palette::white);
  stroke_rect(page, x, top - h, w, h, palette::ink, 1.2);
  fill_rect(page, x, top - h, 4, h, palette::ink);  // heavy left edge: readable in B&W
  double y = top - kPad - kHeadingSize;
  draw_text(page, flow.doc().font(FontFace::bold), kHeadingSize, x + kPad + 4, y, safety_heading(),
            palette::ink);
  y -= kHeadingSize * 0.5;
  FontRef bold = flow.doc().font(FontFace::bold);
  FontRef regular = flow.doc().font(FontFace::regular);
  for (const auto& c : safety_cautions()) {
    bool first = true;
    for (const auto& line : wrap_caution(flow, c, inner)) {
      y -= line_height();
      const double lx = x + kPad + 4;
      if (first && line.size() >= c.lead.size() && line.compare(0, c.lead.size(), c.lead) == 0) {
        draw_text(page, bold, kSize, lx, y, c.lead, palette::ink);
        draw_text(page, regular, kSize, lx + text_width(page, bold, kSize, c.lead), y,
                  line.substr(c.lead.size()), palette::ink);
      } else {
        draw_text(page, regular, kSize, lx, y, line, palette::ink);
      }
      first = false;
    }
    y -= 1.5;
  }
}

void add_safety_block(PageFlow& flow) {
  const double h = safety_block_height(flow);
  flow.space(6);
  const double top = flow.take(h);
  draw_safety_block(flow, top);
  flow.space(6);
}

}  // namespace ferrum::report
