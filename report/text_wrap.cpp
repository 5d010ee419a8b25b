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

void wrap_paragraph(std::string_view para, double max_width, const MeasureFn& measure,
                    std::vector<std::string>& out) {
  std::string line;
  size_t pos = 0;
  while (pos < para.size()) {
    while (pos < para.size() && para[pos] == ' ') ++pos;
    if (pos >= para.size()) break;
    size_t end = para.find(' ', pos);
    if (end == std::string_view::npos) end = para.size();
    const std::string_view word = para.substr(pos, end - pos);
    pos = end;
    const std::string candidate = line.empty() ? std::string(word) : line + " " + std::string(word);
    if (measure(candidate) <= max_width) {
      line = candidate;
      continue;
    }
    if (!line.empty()) out.push_back(line);
    line.clear();
    if (measure(word) <= max_width) {
      line = std::string(word);
    } else {
      std::vector<std::string> pieces;
      split_long_word(word, max_width, measure, pieces);
      for (size_t k = 0; k + 1 < pieces.size(); ++k) out.push_back(pieces[k]);
      if (!pieces.empty()) line = pieces.back();
    }
  }
  if (!line.empty()) out.push_back(line);
}

}  // namespace

std::vector<std::string> wrap_text(std::string_view text, double max_width, const MeasureFn& measure) {
  std::vector<std::string> lines;
  size_t start = 0;
  while (start <= text.size()) {
    size_t nl = text.find('\n', start);
    if (nl == std::string_view::npos) nl = text.size();
    const size_t before = lines.size();
    wrap_paragraph(text.substr(start, nl - start), max_width, measure, lines);
    // Keep an explicit blank line between paragraphs, but not at the very end.
    if (lines.size() == before && nl < text.size()) lines.emplace_back();
    start = nl + 1;
  }
  return lines;
}

}  // namespace ferrum::report
