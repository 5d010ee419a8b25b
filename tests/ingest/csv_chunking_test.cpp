// The CSV reader copies runs of plain bytes in bulk while they are in its
// read buffer and falls back to byte-at-a-time scanning elsewhere (quotes,
// line ends, NUL, the end of a chunk). Where a chunk ends changes which path
// reads which byte, so random text read in chunks of 16, 17, 23 bytes and
// 64 KiB must give identical records, lines and problems.
#include <gtest/gtest.h>

#include <random>
#include <sstream>
#include <string>
#include <vector>

#include "daemon/ingest/csv_reader.h"

namespace ferrum::ingest {
namespace {

struct Outcome {
  bool header_ok = false;
  std::vector<std::vector<std::string>> rows;
  std::vector<std::int64_t> lines;
  std::vector<std::string> problems;  // "line:column:reason"
  bool operator==(const Outcome&) const = default;
};

Outcome read(const std::string& text, std::size_t chunk, std::size_t max_record) {
  CsvOptions o;
  o.chunk_bytes = chunk;
  o.max_record_bytes = max_record;
  std::istringstream in(text);
  CsvReader reader(in, o);
  ProblemLog log(1000);
  Outcome out;
  out.header_ok = reader.read_header(log);
  if (out.header_ok) {
    for (;;) {
      const RecordStatus st = reader.next(log);
      if (st == RecordStatus::end) break;
      if (st == RecordStatus::malformed) continue;
      out.rows.emplace_back(reader.fields().begin(), reader.fields().end());
      out.lines.push_back(reader.record_line());
    }
  }
  for (const auto& p : log.kept())
    out.problems.push_back(std::to_string(p.line) + ":" + std::to_string(p.column_number) + ":" + p.reason);
  return out;
}

std::string random_text(std::mt19937& rng) {
  // Mostly plain bytes, with every byte the scanner treats specially.
  static const std::vector<std::string> pieces = {"a", "bc", "12.5", " ", "\t", ",", ",", ";", "\"", "\"\"",
                                                  "\n", "\r\n", "\r", std::string(1, '\0'), "\xC3\xA9", "\xE9",
                                                  "  \"q,x\"  ", "xxxxxxxxxxxxxxxxxxxx"};
  std::string text = rng() % 2 ? "h1,h2,h3\n" : "h1;h2;h3\n";
  const int n = 20 + static_cast<int>(rng() % 200);
  for (int i = 0; i < n; ++i) text += pieces[rng() % pieces.size()];
  return text;
}

TEST(CsvChunking, RandomTextReadsTheSameInAnyChunkSize) {
  std::mt19937 rng(20261201);
  for (int i = 0; i < 3000; ++i) {
    const std::string text = random_text(rng);
    const std::size_t max_record = i % 3 == 0 ? 24 : std::size_t{1} << 20;  // also cut long rows
    const Outcome whole = read(text, 64 << 10, max_record);
    for (std::size_t chunk : {16, 17, 23}) {
      ASSERT_EQ(read(text, chunk, max_record), whole) << "chunk " << chunk << " text: " << text;
    }
  }
}

}  // namespace
}  // namespace ferrum::ingest
