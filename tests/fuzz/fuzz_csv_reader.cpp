// libFuzzer target: the CSV reader (daemon/ingest/csv_reader.h) on any bytes.
//
// The reader promises never to throw, crash or hang on damaged input, and to
// give each malformed record exactly one problem. The first input byte picks
// small chunk and record limits so that buffer refills, the push-back area
// and the over-long-record path are all reached with short inputs.
// Plumbing: no engineering value is checked here, so no published source applies.
#include <cstddef>
#include <cstdint>
#include <cstdio>
#include <cstdlib>
#include <sstream>
#include <string>

#include "daemon/ingest/csv_reader.h"

namespace {

using ferrum::ingest::CsvOptions;
using ferrum::ingest::CsvReader;
using ferrum::ingest::ProblemLog;
using ferrum::ingest::RecordStatus;

// Aborts with a message: libFuzzer records the input as a crash.
void require(bool condition, const char* what) {
  if (!condition) {
    std::fprintf(stderr, "invariant broken: %s\n", what);
    std::abort();
  }
}

}  // namespace

extern "C" int LLVMFuzzerTestOneInput(const std::uint8_t* data, std::size_t size) {
  CsvOptions options;
  if (size > 0) {
    const std::uint8_t knob = data[0];
    options.chunk_bytes = 1 + (knob & 0x0f);                       // 1..16 bytes per read
    options.max_record_bytes = (knob & 0x10) ? 64 : 4096;          // reach the length limit
  }
  std::istringstream in(std::string(reinterpret_cast<const char*>(data), size));
  CsvReader reader(in, options);
  ProblemLog problems;
  if (!reader.read_header(problems)) {
    require(problems.count() == 1, "a refused header logs exactly one problem");
    return 0;
  }
  require(!reader.header().empty(), "an accepted header has at least one column");
  const std::size_t columns = reader.header().size();
  std::int64_t last_line = reader.header_line();
  for (std::size_t records = 0;; ++records) {
    require(records <= size + 1, "more records than input bytes");
    const std::int64_t before = problems.count();
    const RecordStatus status = reader.next(problems);
    if (status == RecordStatus::end) break;
    require(reader.record_line() > last_line, "record lines increase");
    last_line = reader.record_line();
    if (status == RecordStatus::ok) {
      require(problems.count() == before, "a good record logs nothing");
      require(reader.fields().size() == columns, "a good record has as many fields as the header");
      for (const auto field : reader.fields()) require(field.size() <= size, "field longer than the input");
    } else {
      require(problems.count() == before + 1, "a malformed record logs exactly one problem");
    }
  }
  return 0;
}
