#include "daemon/ingest/problems.h"

#include <utility>

#include "daemon/ingest/utf8.h"

namespace ferrum::ingest {

namespace {

void append_escaped_byte(std::string& out, unsigned char c) {
  static constexpr char kHex[] = "0123456789ABCDEF";
  out += "\\x";
  out += kHex[c >> 4];
  out += kHex[c & 0xF];
}

}  // namespace

std::string display_value(std::string_view raw, std::size_t max_bytes) {
  std::string out;
  std::size_t i = 0;
  while (i < raw.size()) {
    const auto c = static_cast<unsigned char>(raw[i]);
    std::size_t len = c < 0x80 ? 1 : utf8_sequence_length(raw, i);
    const bool printable = len > 1 || (len == 1 && c >= 0x20 && c != 0x7F);
    const std::size_t shown = printable ? len : 4;  // "\xNN"
    if (out.size() + shown > max_bytes) {
      out += "...";
      return out;
    }
    if (printable) {
      out.append(raw.substr(i, len));
    } else {
      append_escaped_byte(out, c);
      len = 1;
    }
    i += len;
  }
  return out;
}

void ProblemLog::add(std::int64_t line, std::string_view column, int column_number,
                     std::string_view raw_value, std::string reason) {
  if (count_ == 0 && before_first_) std::exchange(before_first_, nullptr)();
  ++count_;
  if (kept_.size() >= keep_) return;
  kept_.push_back(Problem{line, std::string(column), column_number, display_value(raw_value),
                          std::move(reason), locator_ ? locator_(line, column_number) : std::string()});
}

void WarningLog::add(std::int64_t line, std::string_view column, std::string_view message,
                     std::int64_t count) {
  if (count <= 0) return;
  for (auto& w : entries_) {
    if (w.column == column && w.message == message) {
      w.count += count;
      if (w.lines.size() < Warning::kMaxLines && w.lines.back() != line) w.lines.push_back(line);
      return;
    }
  }
  if (entries_.size() >= max_distinct_) {
    overflow_ += count;
    return;
  }
  entries_.push_back(Warning{std::string(column), std::string(message), line, count, {line}});
}

std::int64_t WarningLog::total() const {
  std::int64_t n = overflow_;
  for (const auto& w : entries_) n += w.count;
  return n;
}

}  // namespace ferrum::ingest
