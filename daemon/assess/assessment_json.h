// The assessment document as JSON (Poco::JSON), with the key names the README
// documents. Absent values are null, never 0. Conditions and statuses are
// integers; zones and faults are the published codes.
#pragma once

#include <Poco/JSON/Array.h>
#include <Poco/JSON/Object.h>

#include <functional>
#include <ostream>
#include <string>
#include <string_view>
#include <utility>
#include <vector>

#include "analytics/assessment.h"
#include "analytics/fleet_ranking.h"
#include "analytics/site_view.h"

namespace ferrum::assess {

Poco::JSON::Object::Ptr to_json(const analytics::UnitAssessment& a);
Poco::JSON::Object::Ptr to_json(const analytics::FleetRanking& r);
Poco::JSON::Object::Ptr to_json(const analytics::DgaSummary& d);
// The site view (analytics/site_view.h): `sites` of `rank --json`.
Poco::JSON::Array::Ptr to_json(const std::vector<analytics::SiteView>& sites);

// Pretty-printed text of a JSON value.
std::string stringify(const Poco::Dynamic::Var& v);

// stringify(to_json(r)) with the `extra` top-level keys set, written a unit
// at a time: `rank --json` never holds the whole fleet's tree (at 5,000
// units it took more memory than the ranking itself).
void write_json(std::ostream& out, const analytics::FleetRanking& r,
                const std::vector<std::pair<std::string, Poco::Dynamic::Var>>& extra);
// The same with the rows from `rows` (r's own units are not read): a
// ranking whose rows wait in a file (spilled_ranking.h).
void write_json(std::ostream& out, const analytics::FleetRanking& r, const analytics::RankedRows& rows,
                const std::vector<std::pair<std::string, Poco::Dynamic::Var>>& extra);

// The elements of an array written one at a time, each as the text
// element_text gives it (its place in a top-level array of the document).
using TextElements = std::function<void(const std::function<void(std::string_view)>& each)>;
std::string element_text(const Poco::Dynamic::Var& element);
// A site of the site view as such an element: the "sites" of `rank --json`.
std::string site_element_text(const analytics::SiteView& site);
// write_json with a "sites" array as well, written a site at a time.
void write_json(std::ostream& out, const analytics::FleetRanking& r, const analytics::RankedRows& rows,
                const TextElements& sites, const std::vector<std::pair<std::string, Poco::Dynamic::Var>>& extra);

}  // namespace ferrum::assess
