// Builds small .xlsx workbooks in memory for the reader's tests, with
// Poco::Zip::Compress (a second ZIP writer besides the Python one of the
// e2e tests). Part and element names from ECMA-376 Part 1 (SpreadsheetML).
//
// A cell is written as text with an optional code:
//   ""            empty          "=n:12.5"      number
//   "=d:46095"    number, date style (built-in 14)
//   "=t:46095.25" number, date-time style (custom dd/mm/yyyy hh:mm)
//   "=b:1"        boolean        "=e:#N/A"      error value
//   "=f:A1*2"     formula, no saved value       "=F:A1*2|5"  formula saved as 5
//   "=i:text"     inline string  anything else  shared string
#pragma once

#include <Poco/DateTime.h>
#include <Poco/Path.h>
#include <Poco/Zip/Compress.h>

#include <sstream>
#include <string>
#include <utility>
#include <vector>

#include "daemon/ingest/workbook_reader.h"

namespace ferrum::ingest::testing {

using SheetRows = std::vector<std::vector<std::string>>;

struct XlsxSpec {
  std::vector<std::pair<std::string, SheetRows>> sheets;
  bool date1904 = false;
  std::vector<std::string> merged;  // ranges on the first sheet
  int first_row = 1;                // row number of rows[0]
  int first_column = 1;             // column number of each row's first cell
};

inline std::string xml_escape(const std::string& s) {
  std::string out;
  for (char c : s) {
    if (c == '&') out += "&amp;";
    else if (c == '<') out += "&lt;";
    else if (c == '>') out += "&gt;";
    else if (c == '"') out += "&quot;";
    else out += c;
  }
  return out;
}

inline std::string sheet_xml(const XlsxSpec& spec, const SheetRows& rows, std::vector<std::string>& strings,
                             bool first) {
  std::string x = "<?xml version=\"1.0\" encoding=\"UTF-8\"?><worksheet xmlns=\"http://schemas.openxmlformats.org/"
                  "spreadsheetml/2006/main\"><sheetData>";
  for (std::size_t i = 0; i < rows.size(); ++i) {
    const std::string r = std::to_string(spec.first_row + static_cast<int>(i));
    x += "<row r=\"" + r + "\">";
    for (std::size_t j = 0; j < rows[i].size(); ++j) {
      const std::string& v = rows[i][j];
      if (v.empty()) continue;
      const std::string ref = column_letters(spec.first_column + static_cast<int>(j)) + r;
      const std::string code = v.size() > 3 && v[0] == '=' && v[2] == ':' ? v.substr(0, 3) : "";
      const std::string body = code.empty() ? v : v.substr(3);
      if (code == "=n:") x += "<c r=\"" + ref + "\"><v>" + body + "</v></c>";
      else if (code == "=d:") x += "<c r=\"" + ref + "\" s=\"1\"><v>" + body + "</v></c>";
      else if (code == "=t:") x += "<c r=\"" + ref + "\" s=\"2\"><v>" + body + "</v></c>";
      else if (code == "=b:") x += "<c r=\"" + ref + "\" t=\"b\"><v>" + body + "</v></c>";
      else if (code == "=e:") x += "<c r=\"" + ref + "\" t=\"e\"><v>" + xml_escape(body) + "</v></c>";
      else if (code == "=f:") x += "<c r=\"" + ref + "\"><f>" + xml_escape(body) + "</f></c>";
      else if (code == "=F:") {
        const auto bar = body.find('|');
        x += "<c r=\"" + ref + "\"><f>" + xml_escape(body.substr(0, bar)) + "</f><v>" + body.substr(bar + 1) +
             "</v></c>";
      } else if (code == "=i:") {
        x += "<c r=\"" + ref + "\" t=\"inlineStr\"><is><t>" + xml_escape(body) + "</t></is></c>";
      } else {
        std::size_t k = 0;
        while (k < strings.size() && strings[k] != v) ++k;
        if (k == strings.size()) strings.push_back(v);
        x += "<c r=\"" + ref + "\" t=\"s\"><v>" + std::to_string(k) + "</v></c>";
      }
    }
    x += "</row>";
  }
  x += "</sheetData>";
  if (first && !spec.merged.empty()) {
    x += "<mergeCells>";
    for (const auto& m : spec.merged) x += "<mergeCell ref=\"" + m + "\"/>";
    x += "</mergeCells>";
  }
  return x + "</worksheet>";
}

inline std::string build_xlsx(const XlsxSpec& spec) {
  std::vector<std::string> strings;
  std::vector<std::pair<std::string, std::string>> parts;
  std::string sheets, rels;
  for (std::size_t k = 0; k < spec.sheets.size(); ++k) {
    const std::string n = std::to_string(k + 1);
    sheets += "<sheet name=\"" + xml_escape(spec.sheets[k].first) + "\" sheetId=\"" + n + "\" r:id=\"rId" + n + "\"/>";
    rels += "<Relationship Id=\"rId" + n +
            "\" Type=\"http://schemas.openxmlformats.org/officeDocument/2006/relationships/worksheet\" "
            "Target=\"worksheets/sheet" + n + ".xml\"/>";
    parts.emplace_back("xl/worksheets/sheet" + n + ".xml", sheet_xml(spec, spec.sheets[k].second, strings, k == 0));
  }
  parts.emplace_back("xl/workbook.xml",
                     "<?xml version=\"1.0\"?><workbook xmlns=\"http://schemas.openxmlformats.org/spreadsheetml/2006/"
                     "main\" xmlns:r=\"http://schemas.openxmlformats.org/officeDocument/2006/relationships\">" +
                         std::string(spec.date1904 ? "<workbookPr date1904=\"1\"/>" : "") + "<sheets>" + sheets +
                         "</sheets></workbook>");
  parts.emplace_back("xl/_rels/workbook.xml.rels",
                     "<?xml version=\"1.0\"?><Relationships xmlns=\"http://schemas.openxmlformats.org/package/2006/"
                     "relationships\">" + rels + "</Relationships>");
  parts.emplace_back("xl/styles.xml",
                     "<?xml version=\"1.0\"?><styleSheet xmlns=\"http://schemas.openxmlformats.org/spreadsheetml/2006/"
                     "main\"><numFmts count=\"1\"><numFmt numFmtId=\"164\" formatCode=\"dd/mm/yyyy\\ hh:mm\"/>"
                     "</numFmts><cellXfs count=\"3\"><xf numFmtId=\"0\"/><xf numFmtId=\"14\"/><xf numFmtId=\"164\"/>"
                     "</cellXfs></styleSheet>");
  std::string sst = "<?xml version=\"1.0\"?><sst xmlns=\"http://schemas.openxmlformats.org/spreadsheetml/2006/main\">";
  for (const auto& s : strings) sst += "<si><t>" + xml_escape(s) + "</t></si>";
  parts.emplace_back("xl/sharedStrings.xml", sst + "</sst>");

  std::ostringstream out;
  Poco::Zip::Compress zip(out, true);
  for (const auto& [name, text] : parts) {
    std::istringstream in(text);
    zip.addFile(in, Poco::DateTime(2026, 1, 1), Poco::Path(name, Poco::Path::PATH_UNIX));
  }
  zip.close();
  return out.str();
}

}  // namespace ferrum::ingest::testing
