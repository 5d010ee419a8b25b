// libFuzzer target: the .xlsx workbook reader (daemon/ingest/workbook_reader.h)
// on any bytes.
//
// The reader promises never to throw, crash or hang on a damaged or hostile
// workbook, to refuse a whole file with exactly one problem, and to give
// each malformed row exactly one problem. Mutated ZIP bytes rarely get past
// the containers' checksums, so the first input byte chooses: even, the
// input is the workbook file itself; odd, the rest of the input is the XML
// of the worksheet (odd and >= 0x80: of the shared strings), packed here
// into an otherwise valid workbook with Poco::Zip::Compress, so that the
// sheet and string parsers see the mutations.
// Plumbing: no engineering value is checked here, so no published source applies.
#include <Poco/DateTime.h>
#include <Poco/Path.h>
#include <Poco/Zip/Compress.h>

#include <cstddef>
#include <cstdint>
#include <cstdio>
#include <cstdlib>
#include <sstream>
#include <string>

#include "daemon/ingest/workbook_reader.h"

namespace {

using ferrum::ingest::ProblemLog;
using ferrum::ingest::RecordStatus;
using ferrum::ingest::WorkbookOptions;
using ferrum::ingest::WorkbookReader;

void require(bool condition, const char* what) {
  if (!condition) {
    std::fprintf(stderr, "invariant broken: %s\n", what);
    std::abort();
  }
}

const char* const kSheet =
    "<worksheet xmlns=\"http://schemas.openxmlformats.org/spreadsheetml/2006/main\"><sheetData>"
    "<row r=\"1\"><c r=\"A1\" t=\"s\"><v>0</v></c><c r=\"B1\" t=\"inlineStr\"><is><t>h2_ppm</t></is></c></row>"
    "<row r=\"2\"><c r=\"A2\" t=\"s\"><v>1</v></c><c r=\"B2\" s=\"1\"><v>46095.5</v></c></row>"
    "</sheetData></worksheet>";
const char* const kStrings =
    "<sst xmlns=\"http://schemas.openxmlformats.org/spreadsheetml/2006/main\"><si><t>unit_id</t></si>"
    "<si><r><t>T</t></r><r><t>1</t></r><rPh><t>x</t></rPh></si></sst>";

std::string pack(const std::string& sheet, const std::string& strings) {
  const std::pair<const char*, std::string> parts[] = {
      {"xl/workbook.xml",
       "<workbook xmlns=\"http://schemas.openxmlformats.org/spreadsheetml/2006/main\" "
       "xmlns:r=\"http://schemas.openxmlformats.org/officeDocument/2006/relationships\"><workbookPr "
       "date1904=\"0\"/><sheets><sheet name=\"oil_lab\" sheetId=\"1\" r:id=\"rId1\"/></sheets></workbook>"},
      {"xl/_rels/workbook.xml.rels",
       "<Relationships xmlns=\"http://schemas.openxmlformats.org/package/2006/relationships\"><Relationship "
       "Id=\"rId1\" Type=\"http://schemas.openxmlformats.org/officeDocument/2006/relationships/worksheet\" "
       "Target=\"worksheets/sheet1.xml\"/></Relationships>"},
      {"xl/styles.xml",
       "<styleSheet xmlns=\"http://schemas.openxmlformats.org/spreadsheetml/2006/main\"><numFmts><numFmt "
       "numFmtId=\"164\" formatCode=\"[h]:mm;&quot;d&quot;\\y\"/></numFmts><cellXfs><xf numFmtId=\"0\"/>"
       "<xf numFmtId=\"164\"/><xf numFmtId=\"14\"/></cellXfs></styleSheet>"},
      {"xl/worksheets/sheet1.xml", sheet},
      {"xl/sharedStrings.xml", strings},
  };
  std::ostringstream out;
  Poco::Zip::Compress zip(out, true);
  for (const auto& [name, text] : parts) {
    std::istringstream in(text);
    zip.addFile(in, Poco::DateTime(2026, 1, 1), Poco::Path(name, Poco::Path::PATH_UNIX),
                Poco::Zip::ZipCommon::CM_STORE);
  }
  zip.close();
  return out.str();
}

}  // namespace

extern "C" int LLVMFuzzerTestOneInput(const std::uint8_t* data, std::size_t size) {
  std::string bytes(reinterpret_cast<const char*>(data), size);
  if (size > 0 && (data[0] & 1)) {
    const std::string xml = bytes.substr(1);
    bytes = (data[0] & 0x80) ? pack(kSheet, xml) : pack(xml, kStrings);
  }
  std::istringstream in(bytes);
  WorkbookOptions options;
  options.preferred_sheets = {"oil_lab"};
  options.max_part_bytes = 1 << 20;  // a small bound: reach the "too large" path
  WorkbookReader reader(in, options);
  ProblemLog problems;
  problems.set_locator([&reader](std::int64_t line, int column) { return reader.locate(line, column); });
  if (!reader.read_header(problems)) {
    require(problems.count() == 1, "a refused workbook logs exactly one problem");
    return 0;
  }
  require(!reader.header().empty(), "an accepted header has at least one column");
  const std::size_t columns = reader.header().size();
  std::int64_t last_line = reader.header_line();
  for (;;) {
    const std::int64_t before = problems.count();
    const RecordStatus status = reader.next(problems);
    if (status == RecordStatus::end) break;
    require(reader.record_line() > last_line, "row numbers increase");
    last_line = reader.record_line();
    if (status == RecordStatus::ok) {
      require(problems.count() == before, "a good row logs nothing");
      require(reader.fields().size() == columns, "a good row has as many fields as the header");
    } else {
      require(problems.count() == before + 1, "a malformed row logs exactly one problem");
      require(!problems.kept().back().location.empty(), "a workbook problem names its row");
    }
  }
  return 0;
}
