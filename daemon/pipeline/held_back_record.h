// What rejected files hold back, per unit and kind (issue #16, "What to
// build" 4): when a file is rejected, the newest date its rows name for each
// unit is kept in the store's state ("held_back:UNIT:KIND" = "DAY<TAB>
// RECEIVED_AT<TAB>PARTY/NAME"; the newest date wins). The assessment reads it
// back into UnitData::held_back, and analytics/held_back.h keeps what is newer
// than the stored results.
#pragma once

#include <map>
#include <string>
#include <vector>

#include "analytics/unit_data.h"
#include "schema/store.h"

namespace ferrum::ingest {

// The analytics kind of a file kind ("oil_lab" -> "oil"), "" for kinds without dated rows.
std::string held_back_kind(const std::string& file_kind);

// Records a rejected file's newest date per unit (unit id -> day).
void record_held_back(store::Store& store, const std::string& file_kind,
                      const std::map<std::string, analytics::Day>& newest_day, const std::string& received_at,
                      const std::string& file);

// The unit's records, one per kind that has one.
std::vector<analytics::HeldBack> held_back_of(store::Store& store, const std::string& unit_id);

}  // namespace ferrum::ingest
