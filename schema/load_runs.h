// Sorted runs of queued load points, kept in an unnamed temporary file and
// merged back in key order (unit, time, line): an external merge sort with
// bounded memory, so that a load file in any row order is written to the
// database in one pass in key order (see SqliteStore::write_queued_load).
// Independent of the database: a PostgreSQL store can queue the same way.
#pragma once

#include <cstdint>
#include <memory>
#include <span>
#include <string>
#include <vector>

namespace ferrum::store {

// One queued load point: the store's unit key, the time, the values and the
// line of the file it came from.
struct QueuedPoint {
  std::int64_t unit_key, ts;
  double load_pu, ambient_c, top_oil_c;
  std::int64_t line;
};

// The order points are written in: by unit and time; of two points of one
// unit and time (a file problem), the earlier line first.
inline bool key_less(const QueuedPoint& a, const QueuedPoint& b) {
  return a.unit_key != b.unit_key ? a.unit_key < b.unit_key : a.ts != b.ts ? a.ts < b.ts : a.line < b.line;
}

class LoadRuns {
 public:
  // `dir`: where the temporary file is made (unnamed, gone when closed).
  explicit LoadRuns(std::string dir);
  ~LoadRuns();
  LoadRuns(const LoadRuns&) = delete;
  LoadRuns& operator=(const LoadRuns&) = delete;

  bool empty() const { return runs_.empty(); }
  std::size_t count() const { return runs_.size(); }
  // Appends one run, already sorted by key_less. Throws StoreError
  // when the file cannot be written (disk full).
  void add(std::span<const QueuedPoint> sorted);
  // Forgets every run (the file is truncated).
  void clear();

  // Reads the runs and one more sorted run held in memory (`last`) back in
  // key order, with a read buffer of at most `buffer_bytes` in all.
  class Merge {
   public:
    Merge(const LoadRuns& runs, std::span<const QueuedPoint> last, std::size_t buffer_bytes = 8u << 20);
    ~Merge();
    Merge(const Merge&) = delete;
    Merge& operator=(const Merge&) = delete;
    // The next point in key order; false at the end.
    bool next(QueuedPoint& out);

   private:
    struct Source;
    void refill(Source& s);
    const LoadRuns& runs_;
    std::vector<Source> sources_;
    std::vector<int> heap_;  // indexes of sources_ with a current point, a min-heap by key_less
  };

 private:
  struct Run {
    std::int64_t offset;  // in points
    std::int64_t size;
  };
  std::string dir_;
  int fd_ = -1;
  std::int64_t end_ = 0;  // points written
  std::vector<Run> runs_;
};

}  // namespace ferrum::store
