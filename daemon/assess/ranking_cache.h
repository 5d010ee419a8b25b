// The inputs of the fleet ranking from the last whole-fleet assessment, kept
// in ROOT/cache/ranking-inputs.json so that `rank` after `assess` (or a
// second `rank`) need not assess every unit again: over 5,000 units the
// assessments are the whole cost of a ranking (bench/results.md §2).
//
// The cache holds, per unit, its analytics::RankingInput (exactly what the
// ranking, the plan and the site view read; ranking_input.h); tests compare
// rankings made from full and from cached assessments. It is used only under the key it was written
// with: a digest of the ferrum executable (size and time), ferrum.ini, the
// site's own IEEE C57.104 tables, the newest file record in the database
// (every import adds one) and the as-of day. Anything else, or any error
// reading it, means the assessments are made afresh. Deleting ROOT/cache/
// is always safe.
#pragma once

#include <functional>
#include <memory>
#include <optional>
#include <string>
#include <vector>

#include "analytics/ranking_input.h"
#include "daemon/site/atomic_file.h"
#include "daemon/site/site_root.h"
#include "schema/store.h"

namespace ferrum::assess {

std::string ranking_cache_key(const site::SiteRoot& root, store::Store& store, analytics::Day as_of);

// The cached units, when the cache exists and was written under `key`.
std::optional<std::vector<analytics::RankingInput>> read_ranking_cache(const site::SiteRoot& root,
                                                                       const std::string& key);
// The same a unit at a time, so that nothing of the fleet is held: `each`
// gets the units in the cache's order. Returns false when there is no
// usable cache; a cache found damaged or cut short part-way returns false
// after `each` has had some units, which the caller must then discard.
bool read_ranking_cache(const site::SiteRoot& root, const std::string& key,
                        const std::function<void(analytics::RankingInput&&)>& each);

// One unit as one line of the cache (no newline), and back. The reader
// throws on a line that is not one unit.
std::string ranking_input_line(const analytics::RankingInput& unit);
analytics::RankingInput ranking_input_of_line(const std::string& line);

// The cache written as the units come (`ferrum assess` and `rank` over the
// fleet hand each unit over once assessed): the file appears, whole, at
// commit(); a writer destroyed without it leaves the old cache in place.
// Best effort, as write_ranking_cache: an unwritable root only means no
// cache, and add() and commit() never throw.
class RankingCacheWriter {
 public:
  RankingCacheWriter(const site::SiteRoot& root, const std::string& key, std::size_t count);
  ~RankingCacheWriter();
  void add(const analytics::RankingInput& unit);
  bool commit();  // whether the cache was written: false also when not `count` units were added

 private:
  void flush();
  std::unique_ptr<site::AtomicFileWriter> file_;
  std::string piece_;
  std::size_t count_ = 0, added_ = 0;
};

// Best effort: a site root the command may not write to (a reader's
// account) only means no cache; returns whether it was written. Written one
// unit at a time: the file is never held whole.
bool write_ranking_cache(const site::SiteRoot& root, const std::string& key,
                         const std::vector<analytics::RankingInput>& units);

}  // namespace ferrum::assess
