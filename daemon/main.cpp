// ferrum: condition assessment of power transformers. See README.md.
#include <malloc.h>

#include <exception>
#include <iostream>

#include "daemon/app/ferrum_app.h"

int main(int argc, char** argv) {
  // An assessment allocates and frees a few buffers of ~1 MB (a year of
  // thermal points); above glibc's default mmap threshold each of them was
  // a fresh mapping, zero-filled page by page: a fifth of the CPU time of
  // `assess` over a large fleet went to page faults (bench/results.md §2).
  // Served from the heap instead, they are reused.
  mallopt(M_MMAP_THRESHOLD, 64 << 20);
  mallopt(M_TRIM_THRESHOLD, 128 << 20);
  try {
    ferrum::app::FerrumApp app;
    return app.run(argc, argv);
  } catch (const std::exception& e) {
    std::cerr << "ferrum: " << e.what() << "\n";
    return 1;
  }
}
