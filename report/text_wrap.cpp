#include "report/text_wrap.h"

namespace ferrum::report {
namespace {

bool is_continuation_byte(unsigned char c) { return (c & 0xC0) == 0x80; }

// Cuts an over-long word into pieces that fit, at code-point boundaries.
void split_long_word(std::string_view word, double max_width, const MeasureFn& measure,
                     std::vector<std::string>& out) {
  std::string piece;
  size_t i = 0;
  while (i < word.size()) {
    size_t j = i + 1;
    while (j < word.size() && is_continuation_byte(static_cast<unsigned char>(word[j]))) ++j;
    std::string candidate = piece + std::string(word.substr(i, j - i));
    if (!piece.empty() && measure(candidate) > max_width) {
      out.push_back(piece);
      piece = std::string(word.substr(i, j - i));
    } else {
      piece = std::move(candidate);
    }
    i = j;
  }
  if (!piece.empty()) out.push_back(piece);
}

void wrap_paragraph(std::string_view para, double max_width, const MeasureFn& measure, double& extra,
                    std::vector<std::string>& out) {
  const double space = measure(" ");
  std::string line;
  double line_w = 0;
  size_t pos = 0;
  while (pos < para.size()) {
    while (pos < para.size() && para[pos] == ' ') ++pos;
    if (pos >= para.size()) break;
    size_t end = para.find(' ', pos);
    if (end == std::string_view::npos) end = para.size();
    const std::string_view word = para.substr(pos, end - pos);
    pos = end;
    const double word_w = measure(word);
    const double candidate_w = line.empty() ? extra + word_w : line_w + space + word_w;
    if (candidate_w <= max_width) {
      if (!line.empty()) line += ' ';
      line += word;
      line_w = candidate_w;
      continue;
    }
    if (!line.empty()) {
      out.push_back(line);
      extra = 0;
    }
    line.clear();
    if (extra + word_w <= max_width) {
      line = std::string(word);
      line_w = extra + word_w;
    } else {
      std::vector<std::string> pieces;
      split_long_word(word, max_width - extra, measure, pieces);
      for (size_t k = 0; k + 1 < pieces.size(); ++k) out.push_back(pieces[k]);
      extra = 0;
      if (!pieces.empty()) {
        line = pieces.back();
        line_w = measure(line);
      }
    }
  }
  if (!line.empty()) {
    out.push_back(line);
    extra = 0;
  }
}

}  // namespace

std::vector<std::string> wrap_text(std::string_view text, double max_width, const MeasureFn& measure,
                                   double first_line_extra) {
  double extra = first_line_extra;
  std::vector<std::string> lines;
  size_t start = 0;
  while (start <= text.size()) {
    size_t nl = text.find('\n', start);
    if (nl == std::string_view::npos) nl = text.size();
    const size_t before = lines.size();
    wrap_paragraph(text.substr(start, nl - start), max_width, measure, extra, lines);
    // Keep an explicit blank line between paragraphs, but not at the very end.
    if (lines.size() == before && nl < text.size()) lines.emplace_back();
    start = nl + 1;
  }
  return lines;
}

}  // namespace ferrum::report
