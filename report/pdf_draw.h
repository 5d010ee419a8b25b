// Small drawing primitives over a libharu page, and the report palette.
//
// Palette: greys plus one muted accent (slate teal). Meaning is never carried
// by colour alone: every chart also uses dashes, markers or text labels.
#pragma once

#include <hpdf.h>

#include <string>
#include <string_view>
#include <utility>
#include <vector>

namespace ferrum::report {

struct Color {
  float r = 0, g = 0, b = 0;
  static constexpr Color gray(float v) { return {v, v, v}; }
};

namespace palette {
inline constexpr Color ink = Color::gray(0.12f);       // body text
inline constexpr Color muted = Color::gray(0.40f);     // captions, axis labels
inline constexpr Color rule = Color::gray(0.70f);      // thin lines, grid
inline constexpr Color faint = Color::gray(0.93f);     // table stripes, panels
inline constexpr Color accent = {0.16f, 0.38f, 0.44f}; // slate teal, headings and markers
inline constexpr Color accent_light = {0.86f, 0.91f, 0.92f};
inline constexpr Color white = Color::gray(1.0f);
}  // namespace palette

// A face of the document's font. Bold is synthetic (the regular DejaVu glyphs
// filled and stroked): libharu spends ~24 ms per embedded UTF-8 TrueType face
// (glyph map on load, ToUnicode map on save), so a second TTF would take a
// unit report past its 50 ms budget.
struct FontRef {
  HPDF_Font font = nullptr;
  bool bold = false;
};

enum class Dash { solid, dashed, dotted, dash_dot };
enum class Align { left, right, center };

void set_fill(HPDF_Page page, Color c);
void set_stroke(HPDF_Page page, Color c);
void set_dash(HPDF_Page page, Dash dash);

double text_width(HPDF_Page page, FontRef font, double size, std::string_view text);

// One line of text with its baseline at y; x is the left edge, right edge or
// centre depending on `align`.
void draw_text(HPDF_Page page, FontRef font, double size, double x, double y, std::string_view text,
               Color color = palette::ink, Align align = Align::left);

void draw_line(HPDF_Page page, double x0, double y0, double x1, double y1, Color color,
               double width = 0.5, Dash dash = Dash::solid);
// One stroked path through `points` (at least two), with round joins: a
// chart's series is one path per unbroken run, not a path per segment.
void draw_polyline(HPDF_Page page, const std::vector<std::pair<double, double>>& points, Color color,
                   double width = 0.5, Dash dash = Dash::solid);
void fill_rect(HPDF_Page page, double x, double y, double w, double h, Color color);
void stroke_rect(HPDF_Page page, double x, double y, double w, double h, Color color, double width = 0.5);

// Marker shapes for series points; distinguishable in black and white.
enum class Marker { none, circle, square, triangle, diamond, cross, plus, ring };
void draw_marker(HPDF_Page page, Marker marker, double x, double y, double size, Color color);

}  // namespace ferrum::report
