// The site view (analytics/site_view.h) in the fleet report and as CSV
// (ferrum-fleet-sites-DATE.csv beside the fleet report). Lays out what the
// analytics produced and computes nothing.
#pragma once

#include <string>
#include <vector>

#include "analytics/site_view.h"

namespace ferrum::report {

class PageFlow;

// "Sites and N-1": per site installed capacity, the sum of the units' peaks,
// the N-1 result with the largest unit out (sites that fail flagged), and the
// units that take no transferred load with the reason.
void site_section(PageFlow& flow, const std::vector<analytics::SiteView>& sites);

// One row per unit, with its site's totals and N-1 result; the caution line
// last. Pure.
std::string fleet_sites_csv(const std::vector<analytics::SiteView>& sites);

}  // namespace ferrum::report
