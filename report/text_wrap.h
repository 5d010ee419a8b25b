// Greedy word wrapping for text drawn into fixed-width boxes. Pure: the width
// of a piece of text comes from a caller-supplied measure (page points), so
// the tests run without a PDF.
#pragma once

#include <functional>
#include <string>
#include <string_view>
#include <vector>

namespace ferrum::report {

using MeasureFn = std::function<double(std::string_view)>;

// Splits `text` into lines no wider than `max_width`. Breaks at spaces; "\n"
// forces a break; a single word wider than the box is cut between UTF-8 code
// points (never inside one). Empty text gives no lines.
// Widths are taken as additive (word + space + word), true for libharu,
// which applies no kerning: each word is measured once. The first line of
// the text is `first_line_extra` wider than measured (e.g. a bold lead-in).
std::vector<std::string> wrap_text(std::string_view text, double max_width, const MeasureFn& measure,
                                   double first_line_extra = 0);

}  // namespace ferrum::report
