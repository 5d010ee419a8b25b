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

#include <optional>
#include <string>
#include <vector>

#include "analytics/ranking_input.h"
#include "daemon/site/site_root.h"
#include "schema/store.h"

namespace ferrum::assess {

std::string ranking_cache_key(const site::SiteRoot& root, store::Store& store, analytics::Day as_of);

// The cached units, when the cache exists and was written under `key`.
std::optional<std::vector<analytics::RankingInput>> read_ranking_cache(const site::SiteRoot& root,
                                                                       const std::string& key);

// Best effort: a site root the command may not write to (a reader's
// account) only means no cache; returns whether it was written. Written one
// unit at a time: the file is never held whole.
bool write_ranking_cache(const site::SiteRoot& root, const std::string& key,
                         const std::vector<analytics::RankingInput>& units);

}  // namespace ferrum::assess
