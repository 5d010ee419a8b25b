#include "report/page_flow.h"

#include <algorithm>
#include <numeric>

#include "report/text_wrap.h"

namespace ferrum::report {
namespace {
constexpr double kMarginX = 46;
constexpr double kMarginTop = 44;
constexpr double kMarginBottom = 46;  // the footer sits below this
constexpr double kCellPadX = 3;
constexpr double kCellPadY = 2.6;
}  // namespace

PageFlow::PageFlow(PdfDocument& doc, std::string running_title)
    : doc_(doc), running_title_(std::move(running_title)) {
  new_page();
}

void PageFlow::new_page() {
  page_ = doc_.add_page();
  left_ = kMarginX;
  right_ = doc_.page_width() - kMarginX;
  top_ = doc_.page_height() - kMarginTop;
  bottom_ = kMarginBottom;
  y_ = top_;
  if (doc_.pages().size() > 1) draw_running_header();
}

void PageFlow::draw_running_header() {
  draw_text(page_, doc_.font(FontFace::regular), type::small, left_, y_ - type::small, running_title_,
            palette::muted);
  draw_line(page_, left_, y_ - type::small - 4, right_, y_ - type::small - 4, palette::rule, 0.4);
  y_ -= type::small + 16;
}

void PageFlow::ensure(double height) {
  if (y_ - height < bottom_) new_page();
}

double PageFlow::take(double height) {
  ensure(height);
  const double top = y_;
  y_ -= height;
  return top;
}

void PageFlow::section(const std::string& title, double keep_with) {
  const double h = type::section * 1.9;
  ensure(h + keep_with);
  if (y_ < top_ - 1) y_ -= 8;  // air above a heading that is not at the page top
  doc_.add_bookmark(title, page_, y_ + 4);
  const double base = y_ - type::section;
  fill_rect(page_, left_, base - 2, 3, type::section + 2, palette::accent);
  draw_text(page_, doc_.font(FontFace::bold), type::section, left_ + 9, base, title, palette::ink);
  draw_line(page_, left_, base - 6, right_, base - 6, palette::rule, 0.5);
  y_ = base - 14;
}

void PageFlow::subsection(const std::string& title, double keep_with) {
  ensure(type::subsection * 1.6 + keep_with);
  y_ -= 3;
  const double base = y_ - type::subsection;
  draw_text(page_, doc_.font(FontFace::bold), type::subsection, left_, base, title, palette::accent);
  y_ = base - 6;
}

std::vector<std::string> PageFlow::wrap(const std::string& text, double width, double size,
                                        FontFace face) {
  FontRef font = doc_.font(face);
  HPDF_Page page = page_;
  return wrap_text(text, width, [&](std::string_view s) { return text_width(page, font, size, s); });
}

double PageFlow::text_height(const std::string& text, double width, double size, FontFace face) {
  return static_cast<double>(wrap(text, width, size, face).size()) * size * type::leading;
}

double PageFlow::draw_wrapped(const std::string& text, double x, double top, double width, double size,
                              FontFace face, Color color, Align align) {
  double y = top;
  const double ax = align == Align::left ? x : align == Align::right ? x + width : x + width / 2;
  for (const auto& line : wrap(text, width, size, face)) {
    y -= size * type::leading;
    draw_text(page_, doc_.font(face), size, ax, y + size * (type::leading - 1) * 0.9, line, color, align);
  }
  return y;
}

void PageFlow::paragraph(const std::string& text, double size, FontFace face, Color color, double indent) {
  const double w = width() - indent;
  const auto lines = wrap(text, w, size, face);
  const double lh = size * type::leading;
  for (const auto& line : lines) {
    ensure(lh);
    y_ -= lh;
    draw_text(page_, doc_.font(face), size, left_ + indent, y_ + size * (type::leading - 1) * 0.9, line,
              color);
  }
  y_ -= size * 0.35;
}

void PageFlow::bullets(const std::vector<std::string>& items, double size) {
  const double indent = 11;
  for (const auto& item : items) {
    const auto lines = wrap(item, width() - indent, size, FontFace::regular);
    const double lh = size * type::leading;
    ensure(lh * std::min<size_t>(lines.size(), 2));
    bool first = true;
    for (const auto& line : lines) {
      ensure(lh);
      y_ -= lh;
      const double base = y_ + size * (type::leading - 1) * 0.9;
      if (first) fill_rect(page_, left_ + 2, base + size * 0.28, size * 0.3, size * 0.3, palette::accent);
      draw_text(page_, doc_.font(FontFace::regular), size, left_ + indent, base, line);
      first = false;
    }
    y_ -= size * 0.2;
  }
  y_ -= size * 0.3;
}

void PageFlow::key_values(const std::vector<std::pair<std::string, std::string>>& items, int columns) {
  columns = std::max(1, columns);
  const double gap = 10;
  const double cw = (width() - gap * (columns - 1)) / columns;
  const double label_size = type::small - 0.6;
  for (size_t i = 0; i < items.size(); i += columns) {
    // Labels wrap too; all values of a row start below the tallest label.
    double label_h = 0, row_h = 0;
    for (int c = 0; c < columns && i + c < items.size(); ++c)
      label_h = std::max(label_h, text_height(items[i + c].first, cw, label_size, FontFace::regular));
    for (int c = 0; c < columns && i + c < items.size(); ++c)
      row_h = std::max(row_h, label_h + text_height(items[i + c].second, cw, type::body, FontFace::regular));
    ensure(row_h + 4);
    for (int c = 0; c < columns && i + c < items.size(); ++c) {
      const double x = left_ + c * (cw + gap);
      draw_wrapped(items[i + c].first, x, y_, cw, label_size, FontFace::regular, palette::muted);
      draw_wrapped(items[i + c].second, x, y_ - label_h, cw, type::body, FontFace::regular);
    }
    y_ -= row_h + 5;
  }
}

double PageFlow::table_header(const Table& t, const std::vector<double>& widths) {
  const double size = t.font_size - 0.4;
  double h = 0;
  for (size_t c = 0; c < t.columns.size(); ++c)
    h = std::max(h, text_height(t.columns[c].header, widths[c] - 2 * kCellPadX, size, FontFace::bold));
  h += 2 * kCellPadY;
  fill_rect(page_, left_, y_ - h, width(), h, palette::accent_light);
  double x = left_;
  for (size_t c = 0; c < t.columns.size(); ++c) {
    draw_wrapped(t.columns[c].header, x + kCellPadX, y_ - kCellPadY, widths[c] - 2 * kCellPadX, size,
                 FontFace::bold, palette::ink, t.columns[c].align);
    x += widths[c];
  }
  y_ -= h;
  draw_line(page_, left_, y_, right_, y_, palette::muted, 0.6);
  return h;
}

std::vector<double> PageFlow::column_widths(const Table& t) const {
  const double total = std::accumulate(t.columns.begin(), t.columns.end(), 0.0,
                                       [](double s, const TableColumn& c) { return s + c.weight; });
  std::vector<double> widths;
  for (const auto& c : t.columns) widths.push_back((right_ - left_) * c.weight / total);
  return widths;
}

double PageFlow::row_height(const Table& t, const std::vector<double>& widths, std::size_t r, FontFace face) {
  double h = 0;
  for (size_t c = 0; c < t.columns.size() && c < t.rows[r].size(); ++c)
    h = std::max(h, text_height(t.rows[r][c], widths[c] - 2 * kCellPadX, t.font_size, face));
  return std::max(h, t.font_size * type::leading) + 2 * kCellPadY;
}

double PageFlow::table_start_height(const Table& t) {
  if (t.columns.empty()) return 0;
  const auto widths = column_widths(t);
  double h = 0;
  for (size_t c = 0; c < t.columns.size(); ++c)
    h = std::max(h, text_height(t.columns[c].header, widths[c] - 2 * kCellPadX, t.font_size - 0.4, FontFace::bold));
  h += 2 * kCellPadY;
  if (!t.rows.empty()) {
    const bool strong = !t.emphasis.empty() && t.emphasis[0];
    h += row_height(t, widths, 0, strong ? FontFace::bold : FontFace::regular);
  }
  return std::min(h, (top_ - bottom_) / 2);  // a first row taller than that breaks anyway
}

void PageFlow::table(const Table& t) {
  if (t.columns.empty()) return;
  const std::vector<double> widths = column_widths(t);
  // The header never stands alone at a page's foot: it keeps its first row.
  ensure(std::max(40.0, table_start_height(t)));
  table_header(t, widths);
  for (size_t r = 0; r < t.rows.size(); ++r) {
    const bool strong = r < t.emphasis.size() && t.emphasis[r];
    const FontFace face = strong ? FontFace::bold : FontFace::regular;
    const double h = row_height(t, widths, r, face);
    if (y_ - h < bottom_) {
      new_page();
      table_header(t, widths);
    }
    if (r % 2 == 1) fill_rect(page_, left_, y_ - h, width(), h, palette::faint);
    if (strong) fill_rect(page_, left_, y_ - h, 2.2, h, palette::accent);
    double x = left_;
    for (size_t c = 0; c < t.columns.size() && c < t.rows[r].size(); ++c) {
      draw_wrapped(t.rows[r][c], x + kCellPadX, y_ - kCellPadY, widths[c] - 2 * kCellPadX, t.font_size,
                   face, palette::ink, t.columns[c].align);
      x += widths[c];
    }
    y_ -= h;
  }
  draw_line(page_, left_, y_, right_, y_, palette::rule, 0.5);
  y_ -= 8;
}

}  // namespace ferrum::report
