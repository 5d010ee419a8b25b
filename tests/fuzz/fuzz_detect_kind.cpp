// libFuzzer target: kind detection (daemon/ingest/file_kinds.h) on any header.
//
// The input is split into column names at commas and line breaks, the way a
// header row arrives from the CSV reader, and detect_kind must classify it
// without crashing. Checked: a recognised kind binds only columns that exist,
// each column at most once; an unrecognised header always says why.
// Plumbing: no engineering value is checked here, so no published source applies.
#include <cstddef>
#include <cstdint>
#include <cstdio>
#include <cstdlib>
#include <set>
#include <string>
#include <vector>

#include "daemon/ingest/file_kinds.h"

namespace {

void require(bool condition, const char* what) {
  if (!condition) {
    std::fprintf(stderr, "invariant broken: %s\n", what);
    std::abort();
  }
}

std::vector<std::string> split_header(const std::uint8_t* data, std::size_t size) {
  std::vector<std::string> names(1);
  for (std::size_t i = 0; i < size; ++i) {
    const char c = static_cast<char>(data[i]);
    if (c == ',' || c == '\n')
      names.emplace_back();
    else
      names.back().push_back(c);
  }
  return names;
}

}  // namespace

extern "C" int LLVMFuzzerTestOneInput(const std::uint8_t* data, std::size_t size) {
  const std::vector<std::string> header = split_header(data, size);
  for (const auto& name : header) {
    const std::string canonical = ferrum::ingest::normalise_column_name(name);
    require(ferrum::ingest::normalise_column_name(canonical) == canonical, "normalising twice changes nothing");
  }
  const ferrum::ingest::KindDetection d = ferrum::ingest::detect_kind(header);
  if (!d.recognised) {
    require(!d.reason.empty(), "an unrecognised header says why");
    require(d.reason_column < static_cast<int>(header.size()), "reason column inside the header");
    return 0;
  }
  std::set<int> bound;
  for (const auto& [field, binding] : d.columns.entries()) {
    if (!binding.present()) continue;
    require(binding.index < static_cast<int>(header.size()), "binding inside the header");
    require(bound.insert(binding.index).second, "one column bound to two fields");
  }
  for (const int column : d.unknown_columns) {
    require(column >= 0 && column < static_cast<int>(header.size()), "unknown column inside the header");
    require(bound.count(column) == 0, "a bound column listed as unknown");
  }
  (void)ferrum::ingest::to_string(d.kind);
  return 0;
}
