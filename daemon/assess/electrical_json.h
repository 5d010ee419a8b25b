// The `electrical` key of `ferrum assess --json`: every electrical field-test
// check of the unit (analytics/electrical/electrical_results.h), or null when
// the unit has no electrical tests. Keys are documented in the README.
#pragma once

#include <Poco/Dynamic/Var.h>

#include <optional>

#include "analytics/electrical/electrical_results.h"

namespace ferrum::assess {

Poco::Dynamic::Var electrical_json(const std::optional<analytics::ElectricalSummary>& s);

}  // namespace ferrum::assess
