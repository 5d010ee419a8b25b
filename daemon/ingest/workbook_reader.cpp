#include "daemon/ingest/workbook_reader.h"

#include <Poco/Exception.h>
#include <Poco/SAX/Attributes.h>
#include <Poco/SAX/DefaultHandler.h>
#include <Poco/SAX/SAXParser.h>
#include <Poco/Zip/ZipArchive.h>
#include <Poco/Zip/ZipStream.h>

#include <algorithm>
#include <charconv>
#include <cctype>
#include <cmath>
#include <cstring>
#include <functional>
#include <map>
#include <optional>
#include <streambuf>

#include "analytics/calendar.h"
#include "daemon/ingest/field_parsers.h"
#include "daemon/ingest/file_kinds.h"

namespace ferrum::ingest {

namespace {

// A failure that rejects the whole workbook; caught in read_header().
struct WorkbookError {
  std::string reason;
};

constexpr const char* kDamaged =
    "the workbook is damaged or is not an .xlsx file; open it in its spreadsheet program and "
    "save it again as .xlsx, or save it as CSV";

std::string local_name(const std::string& local, const std::string& qname) {
  if (!local.empty()) return local;
  const auto colon = qname.find(':');
  return colon == std::string::npos ? qname : qname.substr(colon + 1);
}

// The value of the attribute whose local name is `name`, "" when absent.
std::string attribute(const Poco::XML::Attributes& a, std::string_view name) {
  for (int i = 0; i < a.getLength(); ++i) {
    if (local_name(a.getLocalName(i), a.getQName(i)) == name) return a.getValue(i);
  }
  return {};
}

// SAX callbacks as functions: each part needs only a few of them.
class Handler : public Poco::XML::DefaultHandler {
 public:
  std::function<void(const std::string&, const Poco::XML::Attributes&)> on_start;
  std::function<void(const std::string&)> on_end;
  std::function<void(const char*, int)> on_text;

  void startElement(const Poco::XML::XMLString& uri, const Poco::XML::XMLString& local,
                    const Poco::XML::XMLString& qname, const Poco::XML::Attributes& attrs) override {
    (void)uri;
    if (on_start) on_start(local_name(local, qname), attrs);
  }
  void endElement(const Poco::XML::XMLString& uri, const Poco::XML::XMLString& local,
                  const Poco::XML::XMLString& qname) override {
    (void)uri;
    if (on_end) on_end(local_name(local, qname));
  }
  void characters(const Poco::XML::XMLChar ch[], int start, int length) override {
    if (on_text) on_text(ch + start, length);
  }
};

// Poco::Zip reads a ZIP64 end-of-central-directory record by allocating the
// record size the file states (new char[size], then a copy into a string)
// before reading the record. A damaged or hostile file stating exabytes made
// that allocation fail (std::bad_alloc: an abort under AddressSanitizer, found
// by tests/fuzz/fuzz_workbook_reader), and one stating gigabytes made ferrum
// allocate and copy gigabytes. This stream buffer sits between Poco and the
// file: when Poco, having just read the record's signature "PK\6\6" (a 4-byte
// read), reads the 8-byte record size and that size is more than the bytes
// left in the file, Poco is given the smallest valid size instead and the
// package is refused as damaged. A true ZIP64 record always fits in its file,
// so no valid workbook is refused. Hand-written because Poco has no limit of
// its own for this (README, "Where ferrum writes code by hand").
class Zip64SizeGuard : public std::streambuf {
 public:
  explicit Zip64SizeGuard(std::streambuf* file) : file_(file) {
    const auto start = file_->pubseekoff(0, std::ios::cur, std::ios::in);
    const auto end = file_->pubseekoff(0, std::ios::end, std::ios::in);
    if (start != pos_type(off_type(-1)) && end != pos_type(off_type(-1))) {
      size_ = static_cast<std::int64_t>(end);
      file_->pubseekpos(start, std::ios::in);
    }
  }
  bool tripped() const { return tripped_; }

 protected:
  int_type underflow() override { return file_->sgetc(); }
  int_type uflow() override {
    after_signature_ = false;
    return file_->sbumpc();
  }
  std::streamsize xsgetn(char* s, std::streamsize n) override {
    const bool size_read = n == 8 && after_signature_;
    after_signature_ = false;
    const std::int64_t at = size_read ? static_cast<std::int64_t>(file_->pubseekoff(0, std::ios::cur, std::ios::in)) : 0;
    std::streamsize got = file_->sgetn(s, n);
    if (size_read && size_ >= 0 && at >= 0) {
      std::uint64_t stated = 0;
      for (int i = 7; i >= 0; --i) stated = (stated << 8) | (i < got ? static_cast<unsigned char>(s[i]) : 0);
      // A size cut short by the end of the file counts as too large: Poco
      // would take it from the bytes it got and whatever its buffer held.
      if (got < 8 || stated > static_cast<std::uint64_t>(size_ - (at + 8))) {
        tripped_ = true;
        constexpr std::uint64_t kSmallest = 44;  // the record's fixed fields after the size (APPNOTE 4.3.14)
        for (int i = 0; i < 8; ++i) s[i] = static_cast<char>((kSmallest >> (8 * i)) & 0xff);
        got = 8;
      }
    }
    after_signature_ = n == 4 && got == 4 && std::memcmp(s, "PK\x06\x06", 4) == 0;
    return got;
  }
  pos_type seekoff(off_type off, std::ios::seekdir dir, std::ios::openmode which) override {
    if (!(off == 0 && dir == std::ios::cur)) after_signature_ = false;  // tellg() moves nothing
    return file_->pubseekoff(off, dir, which);
  }
  pos_type seekpos(pos_type pos, std::ios::openmode which) override {
    after_signature_ = false;
    return file_->pubseekpos(pos, which);
  }

 private:
  std::streambuf* file_;
  std::int64_t size_ = -1;  // -1: not seekable (no check)
  bool after_signature_ = false;
  bool tripped_ = false;
};

class Package {
 public:
  Package(std::istream& in, std::uint64_t max_part_bytes) : guard_(in.rdbuf()), in_(&guard_), max_(max_part_bytes) {
    bool parsed = true;
    try {
      archive_.emplace(in_);
    } catch (const Poco::Exception&) {
      parsed = false;
    } catch (const std::exception&) {
      parsed = false;
    }
    // The guard's reason first: Poco may fail further on, after the size it was given.
    if (guard_.tripped()) throw WorkbookError{std::string(kDamaged) + " (a ZIP64 record states more bytes than the file has)"};
    if (!parsed) throw WorkbookError{kDamaged};
    for (auto it = archive_->headerBegin(); it != archive_->headerEnd(); ++it) {
      if (it->second.isEncrypted()) {
        throw WorkbookError{"the workbook is encrypted (password-protected); save a copy without a "
                            "password, as .xlsx or CSV"};
      }
    }
  }

  bool has(const std::string& name) const { return archive_->findHeader(name) != archive_->headerEnd(); }

  // The unpacked bytes of part `name`; throws WorkbookError when it is
  // missing (and required), damaged or too large.
  std::string read(const std::string& name) {
    const auto it = archive_->findHeader(name);
    if (it == archive_->headerEnd()) throw WorkbookError{std::string(kDamaged) + " (" + name + " is missing)"};
    std::string out;
    try {
      in_.clear();
      Poco::Zip::ZipInputStream zin(in_, it->second, true);
      char buf[1 << 16];
      while (zin.read(buf, sizeof buf) || zin.gcount() > 0) {
        out.append(buf, static_cast<std::size_t>(zin.gcount()));
        if (out.size() > max_) {
          throw WorkbookError{"the workbook's part " + name + " is larger than " +
                              std::to_string(max_ >> 20) + " MB unpacked; split the data or save it as CSV"};
        }
        if (zin.eof()) break;
      }
      if (zin.bad()) throw WorkbookError{std::string(kDamaged) + " (" + name + " cannot be unpacked)"};
    } catch (const Poco::Exception&) {
      throw WorkbookError{std::string(kDamaged) + " (" + name + " cannot be unpacked)"};
    }
    return out;
  }

 private:
  Zip64SizeGuard guard_;  // every read of the file goes through it
  std::istream in_;
  std::uint64_t max_;
  std::optional<Poco::Zip::ZipArchive> archive_;
};

void parse_xml(const std::string& xml, Handler& handler, const std::string& part) {
  Poco::XML::SAXParser parser;
  parser.setFeature(Poco::XML::XMLReader::FEATURE_NAMESPACES, true);
  parser.setFeature(Poco::XML::XMLReader::FEATURE_EXTERNAL_GENERAL_ENTITIES, false);
  parser.setFeature(Poco::XML::XMLReader::FEATURE_EXTERNAL_PARAMETER_ENTITIES, false);
  parser.setContentHandler(&handler);
  try {
    parser.parseMemoryNP(xml.data(), xml.size());
  } catch (const WorkbookError&) {
    throw;
  } catch (const Poco::Exception&) {
    throw WorkbookError{std::string(kDamaged) + " (" + part + " is not well-formed XML)"};
  }
}

struct SheetRef {
  std::string name;
  std::string rel_id;
};

// xl/workbook.xml: the sheets in order and the date system.
std::vector<SheetRef> read_workbook(Package& pkg, bool& date1904) {
  std::vector<SheetRef> sheets;
  Handler h;
  h.on_start = [&](const std::string& el, const Poco::XML::Attributes& a) {
    if (el == "sheet") sheets.push_back({attribute(a, "name"), attribute(a, "id")});
    if (el == "workbookPr") {
      const std::string v = attribute(a, "date1904");
      date1904 = v == "1" || v == "true";
    }
  };
  parse_xml(pkg.read("xl/workbook.xml"), h, "xl/workbook.xml");
  return sheets;
}

// xl/_rels/workbook.xml.rels: relationship id -> part name, worksheets only.
std::map<std::string, std::string> read_worksheet_targets(Package& pkg) {
  std::map<std::string, std::string> out;
  Handler h;
  h.on_start = [&](const std::string& el, const Poco::XML::Attributes& a) {
    if (el != "Relationship") return;
    const std::string type = attribute(a, "Type");
    if (!type.ends_with("/worksheet")) return;
    std::string target = attribute(a, "Target");
    if (target.starts_with("/")) {
      target.erase(0, 1);
    } else {
      target = "xl/" + target;
    }
    out[attribute(a, "Id")] = target;
  };
  parse_xml(pkg.read("xl/_rels/workbook.xml.rels"), h, "xl/_rels/workbook.xml.rels");
  return out;
}

// Shared strings in order; rich-text runs joined, phonetic runs (rPh) left out.
std::vector<std::string> read_shared_strings(Package& pkg) {
  std::vector<std::string> out;
  if (!pkg.has("xl/sharedStrings.xml")) return out;
  int phonetic = 0;
  bool in_t = false;
  Handler h;
  h.on_start = [&](const std::string& el, const Poco::XML::Attributes&) {
    if (el == "si") out.emplace_back();
    if (el == "rPh") ++phonetic;
    if (el == "t") in_t = true;
  };
  h.on_end = [&](const std::string& el) {
    if (el == "rPh") --phonetic;
    if (el == "t") in_t = false;
  };
  h.on_text = [&](const char* s, int n) {
    if (in_t && phonetic == 0 && !out.empty()) out.back().append(s, static_cast<std::size_t>(n));
  };
  parse_xml(pkg.read("xl/sharedStrings.xml"), h, "xl/sharedStrings.xml");
  return out;
}

enum class DateStyle { none, date, time, date_time };

// Built-in number formats of ECMA-376 Part 1, 18.8.30 that show dates or
// times (14-22, 45-47), and the East Asian built-in date formats (27-36, 50-58).
DateStyle builtin_style(int id) {
  if (id >= 14 && id <= 17) return DateStyle::date;
  if ((id >= 18 && id <= 21) || (id >= 45 && id <= 47)) return DateStyle::time;
  if (id == 22) return DateStyle::date_time;
  if ((id >= 27 && id <= 36) || (id >= 50 && id <= 58)) return DateStyle::date;
  return DateStyle::none;
}

// A custom format code: date when it has d, m or y, time when h or s,
// outside quoted text, [..] sections (colours, locales) and escaped characters.
DateStyle custom_style(std::string_view code) {
  bool date = false, time = false, quoted = false, bracket = false;
  for (std::size_t i = 0; i < code.size(); ++i) {
    const char c = code[i];
    if (quoted) {
      quoted = c != '"';
      continue;
    }
    if (bracket) {
      bracket = c != ']';
      // Elapsed-time sections [h], [mm], [ss] are times.
      if (c == 'h' || c == 'H' || c == 's' || c == 'S') time = true;
      continue;
    }
    if (c == '"') quoted = true;
    else if (c == '[') bracket = true;
    else if (c == '\\' || c == '_' || c == '*') ++i;
    else if (c == 'd' || c == 'D' || c == 'y' || c == 'Y' || c == 'm' || c == 'M') date = true;
    else if (c == 'h' || c == 'H' || c == 's' || c == 'S') time = true;
  }
  // "mm" next to h or s is minutes, not months.
  if (time && date) {
    const bool calendar = code.find_first_of("dDyY") != std::string_view::npos;
    if (!calendar) return DateStyle::time;
    return DateStyle::date_time;
  }
  return date ? DateStyle::date : time ? DateStyle::time : DateStyle::none;
}

// xl/styles.xml: the date style of each cell format (cellXfs), by index.
std::vector<DateStyle> read_styles(Package& pkg) {
  std::vector<DateStyle> out;
  if (!pkg.has("xl/styles.xml")) return out;
  std::map<int, std::string> custom;
  bool in_xfs = false;
  Handler h;
  h.on_start = [&](const std::string& el, const Poco::XML::Attributes& a) {
    if (el == "numFmt") {
      int id = 0;
      const std::string v = attribute(a, "numFmtId");
      std::from_chars(v.data(), v.data() + v.size(), id);
      custom[id] = attribute(a, "formatCode");
    } else if (el == "cellXfs") {
      in_xfs = true;
    } else if (el == "xf" && in_xfs) {
      int id = 0;
      const std::string v = attribute(a, "numFmtId");
      std::from_chars(v.data(), v.data() + v.size(), id);
      const auto it = custom.find(id);
      out.push_back(it != custom.end() ? custom_style(it->second) : builtin_style(id));
    }
  };
  h.on_end = [&](const std::string& el) {
    if (el == "cellXfs") in_xfs = false;
  };
  parse_xml(pkg.read("xl/styles.xml"), h, "xl/styles.xml");
  return out;
}

// "C7" -> column 2 (0-based) and row 7; false when it is not a reference.
bool parse_reference(std::string_view ref, int& column, std::int64_t& row) {
  std::size_t i = 0;
  int col = 0;
  while (i < ref.size() && ref[i] >= 'A' && ref[i] <= 'Z' && i < 3) col = col * 26 + (ref[i++] - 'A' + 1);
  if (col == 0 || col > 16384 || i == ref.size()) return false;
  std::int64_t r = 0;
  const auto [end, ec] = std::from_chars(ref.data() + i, ref.data() + ref.size(), r);
  if (ec != std::errc() || end != ref.data() + ref.size() || r < 1 || r > 1048576) return false;
  column = col - 1;
  row = r;
  return true;
}

std::string shortest(double v) {
  char buf[32];
  const auto [end, ec] = std::to_chars(buf, buf + sizeof buf, v);
  return ec == std::errc() ? std::string(buf, end) : std::string();
}

std::string two(int v) {
  std::string s = std::to_string(v);
  return s.size() < 2 ? "0" + s : s;
}

// A serial date-time of the workbook's date system as ISO 8601 text; "" with
// `problem` set when it is no date.
std::string serial_to_text(double serial, DateStyle style, bool date1904, std::string& problem) {
  if (!std::isfinite(serial) || serial < 0 || serial > 2958466) {  // 9999-12-31 in the 1900 system
    problem = "not a date: the cell's serial number " + format_number(serial) + " is outside the calendar";
    return {};
  }
  double whole = std::floor(serial);
  long long seconds = std::llround((serial - whole) * 86400.0);
  if (seconds == 86400) {
    whole += 1;
    seconds = 0;
  }
  const long long n = static_cast<long long>(whole);
  std::string time = "T" + two(static_cast<int>(seconds / 3600)) + ":" + two(static_cast<int>(seconds / 60 % 60)) +
                     ":" + two(static_cast<int>(seconds % 60));
  if (style == DateStyle::time && n == 0) return time.substr(1);  // a time of day alone
  analytics::Day day;
  if (date1904) {
    day = analytics::days_from_civil(1904, 1, 1) + n;
  } else if (n == 60) {
    problem = "not a date: serial number 60 is 29 February 1900, a day that never was (a spreadsheet quirk); "
              "type the date again";
    return {};
  } else if (n == 0) {
    problem = "not a date: serial number 0 is no day (1900 date system)";
    return {};
  } else {
    day = analytics::days_from_civil(1899, 12, n < 60 ? 31 : 30) + n;
  }
  std::string text = analytics::format_day(day);
  if (style == DateStyle::date_time || style == DateStyle::time || seconds != 0) text += time;
  return text;
}

// The chosen worksheet's rows.
class SheetReader {
 public:
  SheetReader(const std::vector<std::string>& strings, const std::vector<DateStyle>& styles, bool date1904)
      : strings_(strings), styles_(styles), date1904_(date1904) {}

  std::vector<WorkbookReader::Row> rows;
  std::string merged;  // first merged range, "" when none

  void read(const std::string& xml, const std::string& part) {
    Handler h;
    h.on_start = [&](const std::string& el, const Poco::XML::Attributes& a) { start(el, a); };
    h.on_end = [&](const std::string& el) { end(el); };
    h.on_text = [&](const char* s, int n) {
      if (in_value_ || (in_inline_ && in_t_ && phonetic_ == 0)) text_.append(s, static_cast<std::size_t>(n));
    };
    parse_xml(xml, h, part);
  }

 private:
  void start(const std::string& el, const Poco::XML::Attributes& a) {
    if (el == "row") {
      std::int64_t r = 0;
      const std::string v = attribute(a, "r");
      if (v.empty()) {
        r = last_row_ + 1;
      } else if (const auto [e, ec] = std::from_chars(v.data(), v.data() + v.size(), r);
                 ec != std::errc() || e != v.data() + v.size() || r <= last_row_ || r > 1048576) {
        throw WorkbookError{std::string(kDamaged) + " (row number '" + v + "' out of order)"};
      }
      last_row_ = r;
      rows.push_back({r, {}});
      last_column_ = -1;
    } else if (el == "c") {
      if (rows.empty()) throw WorkbookError{std::string(kDamaged) + " (a cell outside a row)"};
      const std::string ref = attribute(a, "r");
      int column = last_column_ + 1;
      std::int64_t r = rows.back().number;
      if (!ref.empty() && (!parse_reference(ref, column, r) || r != rows.back().number || column <= last_column_)) {
        throw WorkbookError{std::string(kDamaged) + " (cell reference '" + ref + "' out of place)"};
      }
      if (column > 16383) throw WorkbookError{std::string(kDamaged) + " (too many columns)"};
      last_column_ = column;
      type_ = attribute(a, "t");
      style_ = DateStyle::none;
      const std::string s = attribute(a, "s");
      std::size_t index = 0;
      if (!s.empty() && std::from_chars(s.data(), s.data() + s.size(), index).ec == std::errc() &&
          index < styles_.size()) {
        style_ = styles_[index];
      }
      has_formula_ = has_value_ = false;
      text_.clear();
    } else if (el == "v") {
      in_value_ = true;
      has_value_ = true;
      text_.clear();
    } else if (el == "f") {
      has_formula_ = true;
    } else if (el == "is") {
      in_inline_ = true;
      has_value_ = true;
      text_.clear();
    } else if (el == "t") {
      in_t_ = true;
    } else if (el == "rPh") {
      ++phonetic_;
    } else if (el == "mergeCell" && merged.empty()) {
      merged = attribute(a, "ref");
      if (merged.empty()) merged = "?";
    }
  }

  void end(const std::string& el) {
    if (el == "v") in_value_ = false;
    else if (el == "is") in_inline_ = false;
    else if (el == "t") in_t_ = false;
    else if (el == "rPh") --phonetic_;
    else if (el == "c") finish_cell();
  }

  void finish_cell() {
    WorkbookReader::Cell cell;
    cell.column = last_column_;
    const bool string_type = type_ == "s" || type_ == "str" || type_ == "inlineStr";
    if (!has_value_ || (text_.empty() && !string_type)) {
      if (!has_formula_) return;  // an empty (styled) cell
      cell.problem = "a formula without a saved value: open the workbook in its spreadsheet program, let it "
                     "calculate and save it again, or replace the formula by its value";
    } else if (type_ == "s") {
      std::size_t index = 0;
      const auto [e, ec] = std::from_chars(text_.data(), text_.data() + text_.size(), index);
      if (ec != std::errc() || e != text_.data() + text_.size() || index >= strings_.size()) {
        throw WorkbookError{std::string(kDamaged) + " (a shared string that does not exist)"};
      }
      cell.text = strings_[index];
      cell.is_text = true;
    } else if (type_ == "inlineStr" || type_ == "str") {
      cell.text = text_;
      cell.is_text = true;
    } else if (type_ == "b") {
      cell.text = text_ == "1" ? "TRUE" : "FALSE";
    } else if (type_ == "e") {
      cell.text = text_;
      cell.problem = "the cell holds the error value " + text_ + " instead of a value";
    } else if (type_ == "d") {
      cell.text = text_;
      if (cell.text.size() > 10 && cell.text.substr(10) == "T00:00:00" && style_ == DateStyle::date) cell.text.resize(10);
    } else {
      double v = 0;
      const std::string_view t = trim(text_);
      const auto [e, ec] = std::from_chars(t.data(), t.data() + t.size(), v);
      if (ec != std::errc() || e != t.data() + t.size()) {
        throw WorkbookError{std::string(kDamaged) + " (a number cell holds '" + display_value(text_, 20) + "')"};
      }
      cell.text = style_ == DateStyle::none ? shortest(v) : serial_to_text(v, style_, date1904_, cell.problem);
    }
    if (cell.text.empty() && cell.problem.empty()) return;
    rows.back().cells.push_back(std::move(cell));
  }

  const std::vector<std::string>& strings_;
  const std::vector<DateStyle>& styles_;
  bool date1904_;
  std::int64_t last_row_ = 0;
  int last_column_ = -1;
  std::string type_;
  DateStyle style_ = DateStyle::none;
  bool has_formula_ = false, has_value_ = false, in_value_ = false, in_inline_ = false, in_t_ = false;
  int phonetic_ = 0;
  std::string text_;
};

// A unit written under a column name ("ppm", "(°C)", "[kV]"): the mark of
// a header split over two rows.
bool is_unit_label(std::string_view text) {
  std::string t;
  for (char c : trim(text)) {
    if (c != '(' && c != ')' && c != '[' && c != ']' && c != ' ') t += static_cast<char>(std::tolower(static_cast<unsigned char>(c)));
  }
  static constexpr std::string_view kUnits[] = {"ppm",   "ppb",    "°c",   "degc", "°f",    "degf",  "%",
                                                "kv",    "mva",    "kva",  "a",    "k",     "mg/kg", "µl/l",
                                                "ul/l",  "mgkoh/g", "mn/m", "l",    "pu",    "p.u."};
  return std::find(std::begin(kUnits), std::end(kUnits), t) != std::end(kUnits);
}

}  // namespace

std::string column_letters(int column) {
  std::string out;
  for (; column > 0; column = (column - 1) / 26) out.insert(out.begin(), static_cast<char>('A' + (column - 1) % 26));
  return out;
}

WorkbookReader::WorkbookReader(std::istream& in, WorkbookOptions options) : in_(in), options_(std::move(options)) {}

WorkbookReader::~WorkbookReader() = default;

std::string WorkbookReader::locate(std::int64_t line, int column_number) const {
  std::string out = "row " + std::to_string(line);
  if (column_number > 0) out += ", cell " + column_letters(first_column_ + column_number) + std::to_string(line);
  return out;
}

bool WorkbookReader::load(ProblemLog& problems) {
  try {
    Package pkg(in_, options_.max_part_bytes);
    const std::vector<SheetRef> sheets = read_workbook(pkg, date1904_);
    const std::map<std::string, std::string> targets = read_worksheet_targets(pkg);
    const SheetRef* chosen = nullptr;
    for (const std::string& wanted : options_.preferred_sheets) {
      for (const SheetRef& s : sheets) {
        if (!chosen && targets.count(s.rel_id) && normalise_column_name(s.name) == wanted) chosen = &s;
      }
    }
    for (const SheetRef& s : sheets) {
      if (!chosen && targets.count(s.rel_id)) chosen = &s;
    }
    if (!chosen) throw WorkbookError{"the workbook has no worksheet"};
    sheet_name_ = chosen->name;
    const std::vector<std::string> strings = read_shared_strings(pkg);
    const std::vector<DateStyle> styles = read_styles(pkg);
    const std::string part = targets.at(chosen->rel_id);
    SheetReader sheet(strings, styles, date1904_);
    sheet.read(pkg.read(part), part);
    if (!sheet.merged.empty()) {
      throw WorkbookError{"worksheet '" + sheet_name_ + "' has merged cells (" + sheet.merged +
                          "): unmerge them, so that there is one header row and one value per cell"};
    }
    rows_ = std::move(sheet.rows);
  } catch (const WorkbookError& e) {
    problems.add(1, "", 0, "", e.reason);
    return false;
  } catch (const std::exception&) {
    problems.add(1, "", 0, "", kDamaged);
    return false;
  }
  rows_.erase(std::remove_if(rows_.begin(), rows_.end(), [](const Row& r) { return r.cells.empty(); }), rows_.end());
  return true;
}

bool WorkbookReader::read_header(ProblemLog& problems) {
  if (!load(problems)) return false;
  if (rows_.empty()) {
    problems.add(1, "", 0, "", "worksheet '" + sheet_name_ + "' is empty: no header row");
    return false;
  }
  const Row& head = rows_.front();
  header_row_ = head.number;
  for (const Cell& c : head.cells) {
    if (!c.problem.empty() || !c.is_text) {
      problems.add(head.number, "", 0, c.text,
                   "the header row (row " + std::to_string(head.number) + ", cell " + column_letters(c.column + 1) +
                       std::to_string(head.number) + ") must hold column names, not " +
                       (c.problem.empty() ? "a number or date" : "an error or formula"));
      return false;
    }
  }
  first_column_ = head.cells.front().column;
  const int last = head.cells.back().column;
  header_.assign(static_cast<std::size_t>(last - first_column_ + 1), std::string());
  for (const Cell& c : head.cells) header_[static_cast<std::size_t>(c.column - first_column_)] = std::string(trim(c.text));
  next_row_ = 1;
  // A second header row: the next row holds only text, some of it under a
  // column without a name (names split over two rows) or naming units.
  if (rows_.size() > 1) {
    const Row& second = rows_[1];
    bool all_text = true, second_line = false;
    for (const Cell& c : second.cells) {
      all_text &= c.is_text;
      const int k = c.column - first_column_;
      second_line |= k < 0 || k >= static_cast<int>(header_.size()) || header_[static_cast<std::size_t>(k)].empty() ||
                     is_unit_label(c.text);
    }
    if (all_text && second_line) {
      problems.add(second.number, "", 0, "",
                   "a second header row (row " + std::to_string(second.number) +
                       " holds only names): keep one header row with one name per column, e.g. 'H2 (ppm)'");
      return false;
    }
  }
  return true;
}

RecordStatus WorkbookReader::next(ProblemLog& problems) {
  views_.clear();
  if (next_row_ >= rows_.size()) return RecordStatus::end;
  const Row& row = rows_[next_row_++];
  record_row_ = row.number;
  values_.assign(header_.size(), std::string());
  bool bad = false;
  for (const Cell& c : row.cells) {
    const int k = c.column - first_column_;
    if (k < 0 || k >= static_cast<int>(header_.size())) {
      if (!bad) {
        problems.add(row.number, "", 0, c.text,
                     "cell " + column_letters(c.column + 1) + std::to_string(row.number) +
                         " holds a value outside the table (its column has no header)");
      }
      bad = true;
      continue;
    }
    if (!c.problem.empty()) {
      if (!bad) problems.add(row.number, header_[static_cast<std::size_t>(k)], k + 1, c.text, c.problem);
      bad = true;
      continue;
    }
    values_[static_cast<std::size_t>(k)] = c.text;
  }
  if (bad) return RecordStatus::malformed;
  for (const std::string& v : values_) views_.emplace_back(v);
  return RecordStatus::ok;
}

}  // namespace ferrum::ingest
