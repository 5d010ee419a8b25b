// Top-to-bottom layout of report content over as many pages as needed:
// section headings (with bookmarks), wrapped paragraphs, bullet lists,
// key/value grids and tables that break between rows and repeat their
// header. Text never leaves its box: everything is wrapped to its width.
#pragma once

#include <hpdf.h>

#include <functional>
#include <string>
#include <utility>
#include <vector>

#include "report/pdf_document.h"
#include "report/pdf_draw.h"

namespace ferrum::report {

struct TableColumn {
  std::string header;
  double weight = 1;  // share of the table width
  Align align = Align::left;
};

struct Table {
  std::vector<TableColumn> columns;
  std::vector<std::vector<std::string>> rows;
  std::vector<bool> emphasis;  // per row: bold text and a marker bar (optional)
  double font_size = 8;
};

// Typography shared by every ferrum PDF.
namespace type {
inline constexpr double body = 8.6;
inline constexpr double small = 7.4;
inline constexpr double section = 12.5;
inline constexpr double subsection = 9.6;
inline constexpr double leading = 1.32;  // line height / font size
}  // namespace type

class PageFlow {
 public:
  // `running_title` is printed at the top of every page after the first.
  PageFlow(PdfDocument& doc, std::string running_title);

  PdfDocument& doc() { return doc_; }
  HPDF_Page page() const { return page_; }
  double x() const { return left_; }
  double y() const { return y_; }
  double width() const { return right_ - left_; }
  double bottom() const { return bottom_; }

  void new_page();
  // Starts a new page unless `height` points fit above the bottom limit.
  void ensure(double height);
  // Raises the bottom limit of the current page (content reserved below it).
  void reserve_bottom(double height) { bottom_ += height; }
  void space(double points) { y_ -= points; }
  // Claims `height` points for a drawing and returns the top y of that block.
  double take(double height);

  // Section heading with a bookmark; keeps at least `keep_with` points below it on the page.
  void section(const std::string& title, double keep_with = 80);
  void subsection(const std::string& title, double keep_with = 40);
  void paragraph(const std::string& text, double size = type::body, FontFace face = FontFace::regular,
                 Color color = palette::ink, double indent = 0);
  void bullets(const std::vector<std::string>& items, double size = type::body);
  // Label/value pairs in `columns` columns; labels in muted grey above values.
  void key_values(const std::vector<std::pair<std::string, std::string>>& items, int columns);
  void table(const Table& t);
  // Height of a table's header and first row: what a heading above it keeps
  // with it, so that no heading is left at a page's foot with nothing under it.
  double table_start_height(const Table& t);

  // Wrapped lines of `text` for a box `width` wide (measured with this page's fonts).
  std::vector<std::string> wrap(const std::string& text, double width, double size, FontFace face);
  // Height of the wrapped text block.
  double text_height(const std::string& text, double width, double size, FontFace face);
  // Draws wrapped text with its first line's top at `top`; returns the y below it.
  double draw_wrapped(const std::string& text, double x, double top, double width, double size,
                      FontFace face, Color color = palette::ink, Align align = Align::left);

 private:
  void draw_running_header();
  double table_header(const Table& t, const std::vector<double>& widths);
  std::vector<double> column_widths(const Table& t) const;
  double row_height(const Table& t, const std::vector<double>& widths, std::size_t r, FontFace face);

  PdfDocument& doc_;
  std::string running_title_;
  HPDF_Page page_ = nullptr;
  double left_ = 0, right_ = 0, top_ = 0, bottom_ = 0, y_ = 0;
};

}  // namespace ferrum::report
