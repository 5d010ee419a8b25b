// worklist: every open action of the fleet, soonest due first (issue #16).
#include <Poco/String.h>

#include <iostream>

#include "analytics/work_list.h"
#include "daemon/app/commands_impl.h"
#include "daemon/app/site_context.h"
#include "daemon/assess/assessment_json.h"
#include "daemon/assess/assessment_service.h"
#include "daemon/assess/work_list_json.h"
#include "report/safety_text.h"
#include "report/work_list_report.h"

namespace ferrum::app {

int cmd_worklist(const Invocation& inv) {
  if (inv.has("json") && inv.has("csv")) throw UsageError("--json or --csv, not both");
  analytics::WorkListFilter filter;
  filter.site = inv.get("site");
  filter.crew = inv.get("crew");
  if (inv.has("site") && filter.site.empty()) throw UsageError("--site: name a site");
  if (inv.has("crew") && filter.crew.empty()) throw UsageError("--crew: name a crew");
  auto site = open_site(inv, Access::read);
  const analytics::Day as_of = today(inv, site->config);
  const auto options = assess::options_from_config(site->config, &site->root);
  // Only the site's units are assessed (append_work_list filters again).
  std::vector<std::string> ids;
  for (const auto& u : site->store->units())
    if (filter.site.empty() || Poco::icompare(u.site, filter.site) == 0) ids.push_back(u.unit_id);
  std::vector<analytics::WorkListRow> rows;
  assess::assess_units_parallel(*site->store, ids, as_of, options, 0, [&](analytics::UnitAssessment&& a) {
    analytics::append_work_list(a, filter, rows);
  });
  analytics::sort_work_list(rows);
  if (inv.has("json")) {
    auto doc = assess::to_json(rows, as_of, filter);
    doc->set("caution", report::one_line_caution());
    std::cout << assess::stringify(doc) << "\n";
  } else if (inv.has("csv")) {
    std::cout << report::work_list_csv(rows);
  } else {
    std::cout << report::work_list_text(rows, as_of) << "\n" << report::one_line_caution() << "\n";
  }
  return kOk;
}

}  // namespace ferrum::app
