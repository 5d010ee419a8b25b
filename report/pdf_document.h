// RAII wrapper around one libharu document: error conversion, fonts loaded
// once per document, metadata, bookmarks, "page x of y" footers, and atomic
// saving (temp file, fsync, rename).
//
// Not thread-safe; one PdfDocument per rendering call.
#pragma once

#include <hpdf.h>

#include <string>
#include <vector>

#include "report/pdf_draw.h"
#include "report/report_options.h"

namespace ferrum::report {

// Faces of the one embedded font (DejaVu Sans); bold is synthetic, see FontRef.
enum class FontFace { regular, bold };

class PdfDocument {
 public:
  // Loads the embedded DejaVu fonts (UTF-8) and sets title, author, subject
  // and creation date. Throws RenderError (bad date, missing font, ...).
  PdfDocument(const ReportOptions& options, const std::string& title, const std::string& subject);
  ~PdfDocument();
  PdfDocument(const PdfDocument&) = delete;
  PdfDocument& operator=(const PdfDocument&) = delete;

  HPDF_Page add_page();
  const std::vector<HPDF_Page>& pages() const { return pages_; }
  double page_width() const { return width_; }
  double page_height() const { return height_; }
  FontRef font(FontFace face) const;

  // A top-level bookmark pointing at `y` (page points from the bottom) on `page`.
  void add_bookmark(const std::string& title, HPDF_Page page, double y);

  // Draws the footer on every page: `left` text and "page x of y". Call once,
  // after the last page exists.
  void draw_footers(const std::string& left);

  // Writes the file atomically: to "<path>.tmp", fsync, rename over `path`,
  // fsync the directory. Throws RenderError on failure (temp file removed).
  void save(const std::string& path);

  HPDF_Doc handle() const { return doc_; }

 private:
  HPDF_Doc doc_ = nullptr;
  double width_ = 0, height_ = 0;
  HPDF_Font regular_ = nullptr;
  std::vector<HPDF_Page> pages_;
};

// Parses "YYYY-MM-DDTHH:MM:SSZ" (also "YYYY-MM-DD"); throws RenderError when malformed.
HPDF_Date parse_creation_date(const std::string& iso);

}  // namespace ferrum::report
