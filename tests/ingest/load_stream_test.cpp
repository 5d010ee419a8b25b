// Load series stream in bounded memory: the number of heap allocations made
// while checking a file does not grow with its number of rows.
#include <gtest/gtest.h>

#include <atomic>
#include <cstdlib>
#include <new>
#include <sstream>
#include <string>

#include "tests/ingest/ingest_test_support.h"

namespace {
std::atomic<long> g_allocations{0};
}

// Counting replacement of the global allocator for this test binary.
void* operator new(std::size_t size) {
  ++g_allocations;
  if (void* p = std::malloc(size == 0 ? 1 : size)) return p;
  throw std::bad_alloc();
}
void operator delete(void* p) noexcept { std::free(p); }
void operator delete(void* p, std::size_t) noexcept { std::free(p); }

namespace ferrum::ingest {
namespace {

using namespace ferrum::ingest::testing;

std::string load_file(int rows) {
  std::string text = "unit_id,timestamp,load_a,ambient_c,top_oil_c\n";
  char line[128];
  for (int i = 0; i < rows; ++i) {
    const int minutes = i % (24 * 60);
    std::snprintf(line, sizeof line, "T1,2025-%02d-%02dT%02d:%02d:00Z,%d.5,%d.25,%d.75\n",
                  1 + (i / 1440 / 28) % 12, 1 + (i / 1440) % 28, minutes / 60, minutes % 60,
                  50 + i % 100, i % 30, 40 + i % 30);
    text += line;
  }
  return text;
}

struct Count : RowSink {
  long rows = 0;
  double sum = 0;
  void load_point(const LoadRow& r) override {
    ++rows;
    sum += r.point.load_pu;
  }
};

long allocations_for(const std::string& text, long& rows) {
  std::istringstream in(text);
  const CheckOptions options = test_options();
  Count sink;
  const long before = g_allocations.load();
  const CheckSummary s = check_stream(in, options, sink);
  const long used = g_allocations.load() - before;
  EXPECT_TRUE(s.acceptable()) << problems_text(s);
  rows = sink.rows;
  return used;
}

TEST(LoadStream, AllocationsDoNotGrowWithRows) {
  long small_rows = 0, large_rows = 0;
  const long small = allocations_for(load_file(2'000), small_rows);
  const long large = allocations_for(load_file(50'000), large_rows);
  EXPECT_EQ(small_rows, 2'000);
  EXPECT_EQ(large_rows, 50'000);
  // A few allocations per file (header, column map, buffers), none per row.
  EXPECT_GT(small, 0);  // the counter works
  EXPECT_LT(small, 200);
  EXPECT_LE(large, small + 20) << "allocations: " << small << " for 2k rows, " << large
                               << " for 50k rows";
}

}  // namespace
}  // namespace ferrum::ingest
