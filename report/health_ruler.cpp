#include "report/health_ruler.h"

#include <algorithm>

#include "analytics/health_index.h"
#include "report/pdf_draw.h"
#include "report/report_format.h"

namespace ferrum::report {

// The bands and their names come from the health-index method itself, so
// that the ruler always shows the names the assessment uses.
const std::vector<BandSegment>& health_index_bands() {
  static const std::vector<BandSegment> bands = [] {
    std::vector<BandSegment> out;
    auto defs = analytics::HealthIndexOptions{}.bands;  // best first
    std::sort(defs.begin(), defs.end(), [](const auto& a, const auto& b) { return a.lower < b.lower; });
    for (std::size_t i = 0; i < defs.size(); ++i)
      out.push_back({defs[i].lower, i + 1 < defs.size() ? defs[i + 1].lower : 100.0, defs[i].name});
    return out;
  }();
  return bands;
}

double health_ruler_height() { return 58; }

void draw_health_ruler(HPDF_Page page, const PdfDocument& doc, const Box& box, std::optional<double> hi,
                       std::optional<double> previous_hi) {
  FontRef regular = doc.font(FontFace::regular);
  FontRef bold = doc.font(FontFace::bold);
  const double bar_h = 9;
  const double bar_y = box.y + 24;  // room below for numbers and band names
  const AxisScale scale{0, 100, false, box.x, box.w};
  // Segments: darker grey for worse condition, thin white gaps between them.
  const float shades[] = {0.62f, 0.72f, 0.81f, 0.88f, 0.94f};
  const auto& bands = health_index_bands();
  for (size_t i = 0; i < bands.size(); ++i) {
    const double x0 = *scale.position(bands[i].from);
    const double x1 = *scale.position(bands[i].to);
    fill_rect(page, x0, bar_y, x1 - x0, bar_h, Color::gray(shades[i]));
    if (i > 0) draw_line(page, x0, bar_y - 3, x0, bar_y + bar_h, palette::white, 1.2);
    draw_text(page, regular, 6.8, (x0 + x1) / 2, box.y + 4, bands[i].name, palette::muted, Align::center);
  }
  stroke_rect(page, box.x, bar_y, box.w, bar_h, palette::muted, 0.4);
  std::vector<double> ticks{0.0};
  for (const auto& b : bands) ticks.push_back(b.to);
  for (double v : ticks) {
    const double x = *scale.position(v);
    draw_line(page, x, bar_y - 3, x, bar_y, palette::muted, 0.4);
    draw_text(page, regular, 6.2, x, bar_y - 9.5, fmt_number(v, 0), palette::muted, Align::center);
  }
  if (previous_hi) {
    // Hollow marker under the bar: where the unit stood in the previous report.
    const double x = *scale.position(std::clamp(*previous_hi, 0.0, 100.0));
    set_stroke(page, palette::ink);
    set_fill(page, palette::white);
    HPDF_Page_SetLineWidth(page, 0.8f);
    HPDF_Page_MoveTo(page, static_cast<HPDF_REAL>(x), static_cast<HPDF_REAL>(bar_y + bar_h + 1));
    HPDF_Page_LineTo(page, static_cast<HPDF_REAL>(x - 4), static_cast<HPDF_REAL>(bar_y + bar_h + 8));
    HPDF_Page_LineTo(page, static_cast<HPDF_REAL>(x + 4), static_cast<HPDF_REAL>(bar_y + bar_h + 8));
    HPDF_Page_ClosePath(page);
    HPDF_Page_FillStroke(page);
  }
  if (!hi) {
    draw_text(page, regular, 8, box.x + box.w / 2, bar_y + bar_h + 6, "no index: not enough data",
              palette::muted, Align::center);
    return;
  }
  const double x = *scale.position(std::clamp(*hi, 0.0, 100.0));
  // Filled marker pointing down onto the bar, the value above it.
  set_fill(page, palette::accent);
  HPDF_Page_MoveTo(page, static_cast<HPDF_REAL>(x), static_cast<HPDF_REAL>(bar_y + bar_h + 1));
  HPDF_Page_LineTo(page, static_cast<HPDF_REAL>(x - 5.5), static_cast<HPDF_REAL>(bar_y + bar_h + 11));
  HPDF_Page_LineTo(page, static_cast<HPDF_REAL>(x + 5.5), static_cast<HPDF_REAL>(bar_y + bar_h + 11));
  HPDF_Page_ClosePath(page);
  HPDF_Page_Fill(page);
  draw_line(page, x, bar_y - 1, x, bar_y + bar_h + 1, palette::accent, 1.6);
  const std::string label = fmt_health_index(hi);
  const double lx = std::clamp(x, box.x + 8, box.x + box.w - 8);
  draw_text(page, bold, 10, lx, bar_y + bar_h + 14, label, palette::ink, Align::center);
}

}  // namespace ferrum::report
