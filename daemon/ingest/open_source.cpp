#include "daemon/ingest/open_source.h"

#include <algorithm>
#include <array>
#include <cctype>
#include <cstring>

#include "daemon/ingest/file_kinds.h"

namespace ferrum::ingest {

namespace {

// A file that is refused before any record is read.
class RefusedSource : public RecordSource {
 public:
  explicit RefusedSource(std::string reason) : reason_(std::move(reason)) {}
  bool read_header(ProblemLog& problems) override {
    problems.add(1, "", 0, "", reason_);
    return false;
  }
  const std::vector<std::string>& header() const override { return header_; }
  std::int64_t header_line() const override { return 1; }
  RecordStatus next(ProblemLog&) override { return RecordStatus::end; }
  std::span<const std::string_view> fields() const override { return {}; }
  std::int64_t record_line() const override { return 1; }

 private:
  std::string reason_;
  std::vector<std::string> header_;
};

}  // namespace

std::unique_ptr<RecordSource> open_record_source(std::istream& in, const SourceOptions& options) {
  std::array<char, 8> head{};
  const std::istream::pos_type start = in.tellg();
  in.read(head.data(), head.size());
  const std::streamsize n = in.gcount();
  in.clear();
  in.seekg(start);
  static constexpr unsigned char kOle[8] = {0xD0, 0xCF, 0x11, 0xE0, 0xA1, 0xB1, 0x1A, 0xE1};
  if (n == 8 && std::memcmp(head.data(), kOle, 8) == 0) {
    return std::make_unique<RefusedSource>(
        "this is an old binary spreadsheet (.xls), or a workbook saved with a password: ferrum cannot "
        "read it; save it as .xlsx (without a password) or as CSV");
  }
  if (n >= 4 && head[0] == 'P' && head[1] == 'K' && (head[2] == 3 || head[2] == 5) && (head[3] == 4 || head[3] == 6)) {
    return std::make_unique<WorkbookReader>(in, options.workbook);
  }
  std::string ext = options.file_name.substr(std::min(options.file_name.size(), options.file_name.rfind('.')));
  for (char& c : ext) c = static_cast<char>(std::tolower(static_cast<unsigned char>(c)));
  if (ext == ".xlsx" || ext == ".xlsm") {
    return std::make_unique<RefusedSource>(
        "the file is named " + ext + " but is not a workbook (its content is not the ZIP container an .xlsx "
        "is stored in): open it in its spreadsheet program and save it again as .xlsx, or as CSV");
  }
  if (ext == ".xls") {
    return std::make_unique<RefusedSource>(
        "the file is named .xls but is not a spreadsheet workbook (often a web page or text saved under that "
        "name): save it as .xlsx or as CSV");
  }
  return std::make_unique<CsvReader>(in, options.csv);
}

std::string describe_source(const RecordSource& source) {
  if (const auto* w = dynamic_cast<const WorkbookReader*>(&source)) {
    return "worksheet '" + w->sheet_name() + "' of an .xlsx workbook; dates stored as serial numbers read in the " +
           (w->date1904() ? "1904 date system (the workbook's setting)" : "1900 date system");
  }
  return {};
}

std::vector<std::string> kind_sheet_names() {
  std::vector<std::string> out;
  for (FileKind k : all_kinds()) out.emplace_back(to_string(k));
  return out;
}

}  // namespace ferrum::ingest
