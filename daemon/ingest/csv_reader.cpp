#include "daemon/ingest/csv_reader.h"

#include <algorithm>
#include <cstring>

#include "daemon/ingest/utf8.h"

namespace ferrum::ingest {

namespace {

constexpr int kEnd = -1;

bool is_blank(char c) { return c == ' ' || c == '\t'; }

std::string_view trim_blanks(std::string_view s) {
  while (!s.empty() && is_blank(s.front())) s.remove_prefix(1);
  while (!s.empty() && (is_blank(s.back()) || s.back() == '\r')) s.remove_suffix(1);
  return s;
}

// ';' when the line has more semicolons than commas outside quotes.
char detect_delimiter(std::string_view line) {
  std::size_t commas = 0, semicolons = 0;
  bool quoted = false;
  for (char c : line) {
    if (c == '"') quoted = !quoted;
    if (quoted) continue;
    commas += c == ',';
    semicolons += c == ';';
  }
  return semicolons > commas ? ';' : ',';
}

std::string size_text(std::size_t bytes) {
  if (bytes % (1u << 20) == 0) return std::to_string(bytes >> 20) + " MiB";
  if (bytes % (1u << 10) == 0) return std::to_string(bytes >> 10) + " KiB";
  return std::to_string(bytes) + " bytes";
}

}  // namespace

bool CsvReader::ByteSource::refill() {
  if (!in_) return false;
  buf_.resize(chunk_);
  in_.read(buf_.data(), static_cast<std::streamsize>(chunk_));
  pos_ = 0;
  end_ = static_cast<std::size_t>(in_.gcount());
  return end_ > 0;
}

CsvReader::CsvReader(std::istream& in, CsvOptions options)
    : src_(in, std::max<std::size_t>(options.chunk_bytes, 16)), options_(options) {}

void CsvReader::fail(Scan& scan, std::string reason) {
  if (scan.failed) return;  // one problem per record: the first explains the rest
  scan.failed = true;
  scan.problem_field = static_cast<int>(ends_.size());
  scan.problem_reason = std::move(reason);
}

void CsvReader::skip_rest_of_line() {
  for (;;) {
    const int c = src_.get();
    if (c == kEnd) return;
    if (c == '\n') break;
    if (c == '\r') {
      if (src_.peek() == '\n') src_.get();
      break;
    }
  }
  ++line_;
}

// Copies the unquoted fields already buffered into buf_/ends_: plain bytes
// and the delimiters between them, up to a line end, quote or NUL (left to
// the byte-at-a-time scanner) and at most max_record_bytes; returns the
// number of bytes consumed. Byte-at-a-time scanning was the reader's main
// cost.
std::size_t CsvReader::copy_plain_run() {
  const std::string_view avail = src_.buffered();
  const std::size_t room = buf_.size() < options_.max_record_bytes ? options_.max_record_bytes - buf_.size() : 0;
  const std::size_t limit = std::min(avail.size(), room);
  const auto delimiter = static_cast<unsigned char>(delimiter_);
  std::size_t n = 0, run = 0;
  for (; n < limit; ++n) {
    const auto c = static_cast<unsigned char>(avail[n]);
    if (!special_[c]) continue;
    if (c != delimiter) break;
    buf_.append(avail.data() + run, n - run);
    ends_.push_back(buf_.size());
    run = n + 1;
  }
  buf_.append(avail.data() + run, n - run);
  src_.skip(n);
  return n;
}

// One record into buf_ (field bytes, unescaped) and ends_ (field ends).
CsvReader::Scan CsvReader::scan_record() {
  enum class State { start, unquoted, quoted, quote_in_quoted, after_quoted };
  Scan scan;
  buf_.clear();
  ends_.clear();
  record_line_ = line_;
  State state = State::start;
  bool any = false, was_quoted = false, blank_so_far = true;

  const auto end_field = [&] {
    ends_.push_back(buf_.size());
    state = State::start;
    blank_so_far = true;
  };
  const auto end_record = [&](int c) {
    if (c == '\r' && src_.peek() == '\n') src_.get();
    ++line_;
    ends_.push_back(buf_.size());
    scan.blank = ends_.size() == 1 && !was_quoted && trim_blanks(buf_).empty();
  };
  const auto append = [&](int c) {
    buf_.push_back(static_cast<char>(c));
    blank_so_far = blank_so_far && is_blank(static_cast<char>(c));
  };

  for (;;) {
    if (state == State::start || state == State::unquoted) {
      const std::size_t before = buf_.size(), fields_before = ends_.size();
      if (copy_plain_run() > 0) {
        any = true;
        const bool new_field = ends_.size() != fields_before;  // a delimiter was consumed
        const std::size_t field_start = new_field ? ends_.back() : before;
        if (new_field || blank_so_far)
          blank_so_far = std::all_of(buf_.begin() + static_cast<std::ptrdiff_t>(field_start), buf_.end(), is_blank);
        state = new_field && buf_.size() == field_start ? State::start : State::unquoted;
        continue;
      }
    }
    const int c = src_.get();
    if (c == kEnd) {
      if (!any) {
        scan.at_end = true;
        return scan;
      }
      if (state == State::quoted) {
        fail(scan, "a quote opened in this row is never closed (check for a missing '\"')");
        finished_ = true;  // the open quote swallowed the rest of the file
      }
      ends_.push_back(buf_.size());
      return scan;
    }
    any = true;
    if (buf_.size() >= options_.max_record_bytes) {
      ends_.push_back(buf_.size());
      fail(scan, "row is longer than " + size_text(options_.max_record_bytes) +
                     "; it was skipped (is a quote left open, or is this not a CSV file?)");
      scan.problem_field = -1;
      if (c == '\n' || c == '\r') {
        end_record(c);
      } else {
        skip_rest_of_line();
      }
      return scan;
    }
    if (c == 0) fail(scan, "contains a NUL byte: binary data, not CSV text");
    switch (state) {
      case State::start:
        if (c == '"') {
          state = State::quoted;
          was_quoted = true;
        } else if (c == delimiter_) {
          end_field();
        } else if (c == '\n' || c == '\r') {
          end_record(c);
          return scan;
        } else {
          append(c);
          state = State::unquoted;
        }
        break;
      case State::unquoted:
        if (c == delimiter_) {
          end_field();
        } else if (c == '\n' || c == '\r') {
          end_record(c);
          return scan;
        } else if (c == '"' && blank_so_far) {
          buf_.resize(ends_.empty() ? 0 : ends_.back());  // spaces before a quoted field
          state = State::quoted;
          was_quoted = true;
        } else {
          if (c == '"') {
            fail(scan,
                 "a quote inside an unquoted value: put the whole value in quotes and "
                 "double each quote inside it");
          }
          append(c);
        }
        break;
      case State::quoted:
        if (c == '"') {
          state = State::quote_in_quoted;
        } else {
          if (c == '\n' || (c == '\r' && src_.peek() != '\n')) ++line_;
          buf_.push_back(static_cast<char>(c));
        }
        break;
      case State::quote_in_quoted:
      case State::after_quoted:
        if (c == '"' && state == State::quote_in_quoted) {
          buf_.push_back('"');
          state = State::quoted;
        } else if (c == delimiter_) {
          end_field();
        } else if (c == '\n' || c == '\r') {
          end_record(c);
          return scan;
        } else if (is_blank(static_cast<char>(c))) {
          state = State::after_quoted;
        } else {
          fail(scan, "text after the closing quote of a value");
          append(c);
          state = State::unquoted;
        }
        break;
    }
  }
}

void CsvReader::build_views() {
  views_.clear();
  std::size_t begin = 0;
  for (std::size_t end : ends_) {
    views_.emplace_back(buf_.data() + begin, end - begin);
    begin = end;
  }
}

void CsvReader::log_record_problem(ProblemLog& problems, int field, std::string reason) {
  std::string_view value;
  if (field >= 0 && static_cast<std::size_t>(field) < ends_.size()) {
    const std::size_t begin = field == 0 ? 0 : ends_[field - 1];
    value = std::string_view(buf_).substr(begin, ends_[field] - begin);
    problems.add(record_line_, column_name(field), field + 1, value, std::move(reason));
  } else {
    problems.add(record_line_, "", 0, std::string_view(buf_).substr(0, 100), std::move(reason));
  }
}

bool CsvReader::check_utf8(ProblemLog& problems) {
  if (is_ascii(buf_)) return true;
  for (std::size_t i = 0; i < views_.size(); ++i) {
    const std::size_t bad = find_invalid_utf8(views_[i]);
    if (bad == std::string_view::npos) continue;
    log_record_problem(problems, static_cast<int>(i),
                       "invalid UTF-8 at byte " + std::to_string(bad + 1) +
                           " of this value: save the file as UTF-8");
    return false;
  }
  return true;
}

bool CsvReader::skip_byte_order_mark(ProblemLog& problems) {
  std::string first;
  for (int i = 0; i < 3; ++i) {
    const int c = src_.get();
    if (c == kEnd) break;
    first.push_back(static_cast<char>(c));
  }
  if (first == "\xEF\xBB\xBF") return true;
  if (first.rfind("\xFF\xFE", 0) == 0 || first.rfind("\xFE\xFF", 0) == 0) {
    problems.add(1, "", 0, "", "the file is UTF-16 text: save it as UTF-8 CSV");
    return false;
  }
  src_.push_back(std::move(first));
  return true;
}

bool CsvReader::read_header_line(std::string& line, ProblemLog& problems, bool& at_end) {
  line.clear();
  at_end = false;
  for (;;) {
    const int c = src_.get();
    if (c == kEnd) {
      at_end = true;
      return true;
    }
    if (c == '\n' || c == '\r') {
      if (c == '\r' && src_.peek() == '\n') src_.get();
      ++line_;
      return true;
    }
    if (line.size() >= options_.max_record_bytes) {
      problems.add(line_, "", 0, line,
                   "the first line is longer than " + size_text(options_.max_record_bytes) +
                       ": this is not a CSV header");
      return false;
    }
    line.push_back(static_cast<char>(c));
  }
}

bool CsvReader::read_header(ProblemLog& problems) {
  if (!skip_byte_order_mark(problems)) return false;
  std::string line;
  for (;;) {
    const std::int64_t start = line_;
    bool at_end = false;
    if (!read_header_line(line, problems, at_end)) return false;
    const std::string_view text = trim_blanks(line);
    // "sep=X" before the header, as spreadsheet programs write it, names
    // the delimiter instead of leaving it to detection.
    if (!declared_delimiter_ && text.size() == 5 && (text.substr(0, 4) == "sep=" || text.substr(0, 4) == "SEP=") &&
        (text[4] == ',' || text[4] == ';' || text[4] == '\t' || text[4] == '|')) {
      declared_delimiter_ = text[4];
      if (at_end) {
        problems.add(start, "", 0, "", "the file has no header row (only a sep= line)");
        return false;
      }
      continue;
    }
    if (!text.empty() && text.front() != '#') {
      delimiter_ = declared_delimiter_ ? declared_delimiter_ : detect_delimiter(line);
      for (const char c : {delimiter_, '\n', '\r', '"', '\0'}) special_[static_cast<unsigned char>(c)] = true;
      src_.push_back(line + '\n');
      line_ = start;
      break;
    }
    if (at_end) {
      problems.add(start, "", 0, "", "the file has no header row (it is empty or only comments)");
      return false;
    }
  }
  Scan scan = scan_record();
  if (scan.failed) {
    log_record_problem(problems, scan.problem_field, "header row: " + scan.problem_reason);
    return false;
  }
  header_line_ = record_line_;
  build_views();
  if (!check_utf8(problems)) return false;
  header_.clear();
  for (auto v : views_) header_.emplace_back(trim_blanks(v));
  views_.clear();
  return true;
}

RecordStatus CsvReader::next(ProblemLog& problems) {
  for (;;) {
    views_.clear();
    if (finished_) return RecordStatus::end;
    Scan scan = scan_record();
    if (scan.at_end) return RecordStatus::end;
    if (scan.failed) {
      log_record_problem(problems, scan.problem_field, std::move(scan.problem_reason));
      return RecordStatus::malformed;
    }
    if (scan.blank) continue;
    build_views();
    if (!check_utf8(problems)) {
      views_.clear();
      return RecordStatus::malformed;
    }
    if (views_.size() != header_.size()) {
      const bool more = views_.size() > header_.size();
      problems.add(record_line_, "", 0, more ? views_[header_.size()] : std::string_view(),
                   "row has " + std::to_string(views_.size()) + " values but the header has " +
                       std::to_string(header_.size()) + " columns" +
                       (more ? std::string(" (is a value containing '") + delimiter_ +
                                   "' not in quotes?)"
                             : std::string()));
      views_.clear();
      return RecordStatus::malformed;
    }
    return RecordStatus::ok;
  }
}

}  // namespace ferrum::ingest
