// The assessment document as JSON (Poco::JSON), with the key names the README
// documents. Absent values are null, never 0. Conditions and statuses are
// integers; zones and faults are the published codes.
#pragma once

#include <Poco/JSON/Array.h>
#include <Poco/JSON/Object.h>

#include <string>
#include <vector>

#include "analytics/assessment.h"
#include "analytics/site_view.h"

namespace ferrum::assess {

Poco::JSON::Object::Ptr to_json(const analytics::UnitAssessment& a);
Poco::JSON::Object::Ptr to_json(const analytics::FleetRanking& r);
Poco::JSON::Object::Ptr to_json(const analytics::DgaSummary& d);
// The site view (analytics/site_view.h): `sites` of `rank --json`.
Poco::JSON::Array::Ptr to_json(const std::vector<analytics::SiteView>& sites);

// Pretty-printed text of a JSON value.
std::string stringify(const Poco::Dynamic::Var& v);

}  // namespace ferrum::assess
