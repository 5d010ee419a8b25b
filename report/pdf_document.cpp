#include "report/pdf_document.h"

#include <fcntl.h>
#include <unistd.h>

#include <cstdio>
#include <ctime>
#include <filesystem>

#include "report/render_error.h"

namespace ferrum::report {
namespace {

// libharu reports every failure here; unwinding out of the C library is safe
// on this platform (built with unwind tables) and leaves the document to the
// destructor's HPDF_Free.
void throw_on_error(HPDF_STATUS error_no, HPDF_STATUS detail_no, void*) {
  char buf[96];
  std::snprintf(buf, sizeof buf, "libharu error 0x%04X (detail %u)", static_cast<unsigned>(error_no),
                static_cast<unsigned>(detail_no));
  throw RenderError(buf);
}

HPDF_Date now_utc() {
  const std::time_t t = std::time(nullptr);
  std::tm tm{};
  gmtime_r(&t, &tm);
  HPDF_Date d{};
  d.year = tm.tm_year + 1900;
  d.month = tm.tm_mon + 1;
  d.day = tm.tm_mday;
  d.hour = tm.tm_hour;
  d.minutes = tm.tm_min;
  d.seconds = tm.tm_sec;
  d.ind = 'Z';
  return d;
}

std::string font_path(const char* file) { return std::string(FERRUM_FONT_DIR) + "/" + file; }

void fsync_path(const std::string& path, int flags) {
  const int fd = ::open(path.c_str(), flags);
  if (fd < 0) return;
  ::fsync(fd);
  ::close(fd);
}

}  // namespace

HPDF_Date parse_creation_date(const std::string& iso) {
  HPDF_Date d{};
  d.ind = 'Z';
  int n = 0;
  const int fields = std::sscanf(iso.c_str(), "%4d-%2d-%2dT%2d:%2d:%2dZ%n", &d.year, &d.month, &d.day,
                                 &d.hour, &d.minutes, &d.seconds, &n);
  const bool date_only = fields == 3 && iso.size() == 10;
  if (!(fields == 6 && static_cast<size_t>(n) == iso.size()) && !date_only)
    throw RenderError("creation date is not YYYY-MM-DDTHH:MM:SSZ: '" + iso + "'");
  if (date_only) d.hour = d.minutes = d.seconds = 0;
  if (d.month < 1 || d.month > 12 || d.day < 1 || d.day > 31 || d.hour > 23 || d.minutes > 59 ||
      d.seconds > 59)
    throw RenderError("creation date out of range: '" + iso + "'");
  return d;
}

PdfDocument::PdfDocument(const ReportOptions& options, const std::string& title,
                         const std::string& subject) {
  // Validate before allocating anything.
  const HPDF_Date created =
      options.creation_date.empty() ? now_utc() : parse_creation_date(options.creation_date);
  doc_ = HPDF_New(throw_on_error, nullptr);
  if (!doc_) throw RenderError("libharu could not allocate a document");
  try {
    HPDF_SetCompressionMode(doc_, HPDF_COMP_ALL);
    HPDF_UseUTFEncodings(doc_);
    HPDF_SetCurrentEncoder(doc_, "UTF-8");
    // One TTF, parsed once per document; pages share the font object.
    const char* regular = HPDF_LoadTTFontFromFile(doc_, font_path("DejaVuSans.ttf").c_str(), HPDF_TRUE);
    regular_ = HPDF_GetFont(doc_, regular, "UTF-8");
    HPDF_SetInfoAttr(doc_, HPDF_INFO_TITLE, title.c_str());
    HPDF_SetInfoAttr(doc_, HPDF_INFO_SUBJECT, subject.c_str());
    HPDF_SetInfoAttr(doc_, HPDF_INFO_AUTHOR, options.author.c_str());
    HPDF_SetInfoAttr(doc_, HPDF_INFO_CREATOR, "ferrum report (libharu)");
    HPDF_SetInfoDateAttr(doc_, HPDF_INFO_CREATION_DATE, created);
    HPDF_SetPageMode(doc_, HPDF_PAGE_MODE_USE_OUTLINE);
  } catch (...) {
    HPDF_Free(doc_);
    doc_ = nullptr;
    throw;
  }
  const bool letter = options.paper == ReportOptions::Paper::letter;
  width_ = letter ? 612 : 595.28;
  height_ = letter ? 792 : 841.89;
}

PdfDocument::~PdfDocument() {
  if (doc_) HPDF_Free(doc_);
}

HPDF_Page PdfDocument::add_page() {
  HPDF_Page page = HPDF_AddPage(doc_);
  HPDF_Page_SetWidth(page, static_cast<HPDF_REAL>(width_));
  HPDF_Page_SetHeight(page, static_cast<HPDF_REAL>(height_));
  pages_.push_back(page);
  return page;
}

FontRef PdfDocument::font(FontFace face) const {
  return {regular_, face == FontFace::bold};
}

void PdfDocument::add_bookmark(const std::string& title, HPDF_Page page, double y) {
  // Bookmark titles go through the UTF-8 encoder so that non-ASCII text survives.
  HPDF_Outline outline = HPDF_CreateOutline(doc_, nullptr, title.c_str(), HPDF_GetEncoder(doc_, "UTF-8"));
  HPDF_Destination dst = HPDF_Page_CreateDestination(page);
  HPDF_Destination_SetFitH(dst, static_cast<HPDF_REAL>(y));  // XYZ with zoom 0 is rejected by libharu
  HPDF_Outline_SetDestination(outline, dst);
}

void PdfDocument::draw_footers(const std::string& left) {
  const int total = static_cast<int>(pages_.size());
  const float size = 7.5f;
  for (int i = 0; i < total; ++i) {
    HPDF_Page page = pages_[i];
    const std::string right = "page " + std::to_string(i + 1) + " of " + std::to_string(total);
    HPDF_Page_SetGrayFill(page, 0.35f);
    HPDF_Page_SetGrayStroke(page, 0.6f);
    HPDF_Page_SetLineWidth(page, 0.5f);
    HPDF_Page_SetDash(page, nullptr, 0, 0);
    HPDF_Page_MoveTo(page, 42, 34);
    HPDF_Page_LineTo(page, static_cast<HPDF_REAL>(width_ - 42), 34);
    HPDF_Page_Stroke(page);
    HPDF_Page_BeginText(page);
    HPDF_Page_SetFontAndSize(page, regular_, size);
    HPDF_Page_TextOut(page, 42, 24, left.c_str());
    const float w = HPDF_Page_TextWidth(page, right.c_str());
    HPDF_Page_TextOut(page, static_cast<HPDF_REAL>(width_ - 42 - w), 24, right.c_str());
    HPDF_Page_EndText(page);
  }
}

void PdfDocument::save(const std::string& path) {
  const std::string tmp = path + ".tmp";
  try {
    HPDF_SaveToFile(doc_, tmp.c_str());
  } catch (const RenderError& e) {
    std::remove(tmp.c_str());
    throw RenderError(std::string("cannot write ") + tmp + ": " + e.what());
  }
  fsync_path(tmp, O_RDONLY);
  if (std::rename(tmp.c_str(), path.c_str()) != 0) {
    std::remove(tmp.c_str());
    throw RenderError("cannot rename " + tmp + " to " + path);
  }
  std::string dir = std::filesystem::path(path).parent_path().string();
  fsync_path(dir.empty() ? "." : dir, O_RDONLY | O_DIRECTORY);
}

}  // namespace ferrum::report
