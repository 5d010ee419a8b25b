#include "report/pdf_draw.h"

#include <string>

namespace ferrum::report {
namespace {
HPDF_REAL r(double v) { return static_cast<HPDF_REAL>(v); }
}  // namespace

void set_fill(HPDF_Page page, Color c) { HPDF_Page_SetRGBFill(page, c.r, c.g, c.b); }
void set_stroke(HPDF_Page page, Color c) { HPDF_Page_SetRGBStroke(page, c.r, c.g, c.b); }

void set_dash(HPDF_Page page, Dash dash) {
  static const HPDF_UINT16 dashed[] = {4, 2};
  static const HPDF_UINT16 dotted[] = {1, 2};
  static const HPDF_UINT16 dash_dot[] = {5, 2, 1, 2};
  switch (dash) {
    case Dash::solid: HPDF_Page_SetDash(page, nullptr, 0, 0); break;
    case Dash::dashed: HPDF_Page_SetDash(page, dashed, 2, 0); break;
    case Dash::dotted: HPDF_Page_SetDash(page, dotted, 2, 0); break;
    case Dash::dash_dot: HPDF_Page_SetDash(page, dash_dot, 4, 0); break;
  }
}

double text_width(HPDF_Page page, FontRef font, double size, std::string_view text) {
  if (text.empty()) return 0;
  HPDF_Page_SetFontAndSize(page, font.font, r(size));
  // The synthetic bold stroke widens each glyph by its line width.
  const double extra = font.bold ? size * 0.05 : 0;
  return HPDF_Page_TextWidth(page, std::string(text).c_str()) + extra;
}

void draw_text(HPDF_Page page, FontRef font, double size, double x, double y, std::string_view text,
               Color color, Align align) {
  if (text.empty()) return;
  const std::string s(text);
  HPDF_Page_SetFontAndSize(page, font.font, r(size));
  double left = x;
  if (align != Align::left) {
    const double w = HPDF_Page_TextWidth(page, s.c_str());
    left = align == Align::right ? x - w : x - w / 2;
  }
  set_fill(page, color);
  if (font.bold) {
    set_stroke(page, color);
    set_dash(page, Dash::solid);
    HPDF_Page_SetLineWidth(page, r(size * 0.05));
  }
  HPDF_Page_BeginText(page);
  HPDF_Page_SetTextRenderingMode(page, font.bold ? HPDF_FILL_THEN_STROKE : HPDF_FILL);
  HPDF_Page_TextOut(page, r(left), r(y), s.c_str());
  HPDF_Page_EndText(page);
}

void draw_line(HPDF_Page page, double x0, double y0, double x1, double y1, Color color, double width,
               Dash dash) {
  set_stroke(page, color);
  set_dash(page, dash);
  HPDF_Page_SetLineWidth(page, r(width));
  HPDF_Page_MoveTo(page, r(x0), r(y0));
  HPDF_Page_LineTo(page, r(x1), r(y1));
  HPDF_Page_Stroke(page);
  if (dash != Dash::solid) set_dash(page, Dash::solid);
}

void draw_polyline(HPDF_Page page, const std::vector<std::pair<double, double>>& points, Color color,
                   double width, Dash dash) {
  if (points.size() < 2) return;
  set_stroke(page, color);
  set_dash(page, dash);
  HPDF_Page_SetLineWidth(page, r(width));
  HPDF_Page_SetLineJoin(page, HPDF_ROUND_JOIN);  // a miter join spikes at a sharp turn of a dense series
  HPDF_Page_MoveTo(page, r(points[0].first), r(points[0].second));
  for (std::size_t i = 1; i < points.size(); ++i) HPDF_Page_LineTo(page, r(points[i].first), r(points[i].second));
  HPDF_Page_Stroke(page);
  HPDF_Page_SetLineJoin(page, HPDF_MITER_JOIN);
  if (dash != Dash::solid) set_dash(page, Dash::solid);
}

void fill_rect(HPDF_Page page, double x, double y, double w, double h, Color color) {
  set_fill(page, color);
  HPDF_Page_Rectangle(page, r(x), r(y), r(w), r(h));
  HPDF_Page_Fill(page);
}

void stroke_rect(HPDF_Page page, double x, double y, double w, double h, Color color, double width) {
  set_stroke(page, color);
  set_dash(page, Dash::solid);
  HPDF_Page_SetLineWidth(page, r(width));
  HPDF_Page_Rectangle(page, r(x), r(y), r(w), r(h));
  HPDF_Page_Stroke(page);
}

void draw_marker(HPDF_Page page, Marker marker, double x, double y, double size, Color color) {
  const double h = size / 2;
  set_fill(page, color);
  set_stroke(page, color);
  set_dash(page, Dash::solid);
  HPDF_Page_SetLineWidth(page, 0.8f);
  switch (marker) {
    case Marker::none: return;
    case Marker::circle:
      HPDF_Page_Circle(page, r(x), r(y), r(h));
      HPDF_Page_Fill(page);
      return;
    case Marker::ring:
      set_fill(page, palette::white);
      HPDF_Page_Circle(page, r(x), r(y), r(h));
      HPDF_Page_FillStroke(page);
      return;
    case Marker::square:
      HPDF_Page_Rectangle(page, r(x - h * 0.85), r(y - h * 0.85), r(size * 0.85), r(size * 0.85));
      HPDF_Page_Fill(page);
      return;
    case Marker::triangle:
      HPDF_Page_MoveTo(page, r(x), r(y + h));
      HPDF_Page_LineTo(page, r(x + h), r(y - h * 0.8));
      HPDF_Page_LineTo(page, r(x - h), r(y - h * 0.8));
      HPDF_Page_ClosePath(page);
      HPDF_Page_Fill(page);
      return;
    case Marker::diamond:
      HPDF_Page_MoveTo(page, r(x), r(y + h));
      HPDF_Page_LineTo(page, r(x + h), r(y));
      HPDF_Page_LineTo(page, r(x), r(y - h));
      HPDF_Page_LineTo(page, r(x - h), r(y));
      HPDF_Page_ClosePath(page);
      HPDF_Page_Fill(page);
      return;
    case Marker::cross:
      HPDF_Page_MoveTo(page, r(x - h), r(y - h));
      HPDF_Page_LineTo(page, r(x + h), r(y + h));
      HPDF_Page_MoveTo(page, r(x - h), r(y + h));
      HPDF_Page_LineTo(page, r(x + h), r(y - h));
      HPDF_Page_Stroke(page);
      return;
    case Marker::plus:
      HPDF_Page_MoveTo(page, r(x - h), r(y));
      HPDF_Page_LineTo(page, r(x + h), r(y));
      HPDF_Page_MoveTo(page, r(x), r(y - h));
      HPDF_Page_LineTo(page, r(x), r(y + h));
      HPDF_Page_Stroke(page);
      return;
  }
}

}  // namespace ferrum::report
