// The fleet work list (analytics/work_list.h) as JSON for `ferrum worklist
// --json`: dates YYYY-MM-DD, an absent date null.
#pragma once

#include <Poco/JSON/Object.h>

#include <vector>

#include "analytics/work_list.h"

namespace ferrum::assess {

Poco::JSON::Object::Ptr to_json(const std::vector<analytics::WorkListRow>& rows, analytics::Day as_of,
                                 const analytics::WorkListFilter& filter);

}  // namespace ferrum::assess
