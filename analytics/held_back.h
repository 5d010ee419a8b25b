// Data held back: a file that was rejected (quarantine) may hold newer results
// for a unit than the store has (issue #16, "What to build" 4). The daemon
// records, per unit and kind, the newest date a rejected file's rows name
// (UnitData::held_back); the unit report says so while nothing as new was
// accepted since, e.g. "a file rejected on 2026-11-20 holds a newer oil sample
// (2026-11-12): ask the lab to correct it and drop it again".
#pragma once

#include <string>
#include <vector>

#include "analytics/unit_data.h"

namespace ferrum::analytics {

// The held-back records whose date is newer than the newest stored result of
// their kind ("oil", "infrared", "inspection", "electrical", "load").
std::vector<HeldBack> newer_held_back(const UnitData& data);

// The sentence the unit report and JSON print.
std::string held_back_text(const HeldBack& h);

}  // namespace ferrum::analytics
