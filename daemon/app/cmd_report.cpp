#include <iostream>

#include "daemon/app/commands_impl.h"
#include "daemon/app/progress_display.h"
#include "daemon/app/site_context.h"
#include "daemon/reporting/report_writer.h"

namespace fs = std::filesystem;

namespace ferrum::app {

int cmd_report(const Invocation& inv) {
  const int modes = (inv.has("fleet") ? 1 : 0) + (inv.has("weekly") ? 1 : 0) + (inv.args.empty() ? 0 : 1);
  if (modes != 1) throw UsageError("name units, or give --fleet, or --weekly (one of them)");
  if (inv.has("weekly") && inv.has("out")) throw UsageError("--weekly always writes into ROOT/reports/YYYY-Www/");
  auto site = open_site(inv, Access::read);
  const analytics::Day as_of = today(inv, site->config);
  reporting::ReportWriter writer(site->root, site->config, *site->store);
  ProgressDisplay progress("", "units", inv.has("quiet"));
  writer.set_progress([&](const char* stage, std::size_t done, std::size_t total) {
    progress.set_what(stage);
    progress.update(static_cast<double>(done), static_cast<double>(total));
    if (done == total) progress.finish();  // each stage on its own line
  });
  const fs::path out = inv.has("out") ? fs::absolute(inv.get("out")) : site->root.reports();
  if (inv.has("weekly")) {
    std::cout << writer.weekly_bundle(as_of).string() << "\n";
    return kOk;
  }
  if (inv.has("fleet")) {
    const auto f = writer.fleet_report(as_of, out);
    std::cout << f.pdf.string() << "\n" << f.csv.string() << "\n" << f.sites_csv.string() << "\n";
    return kOk;
  }
  // One call for all the named units: their sites' units are assessed once.
  std::string failed;
  for (const auto& o : writer.unit_reports_by_id(inv.args, as_of, out)) {
    if (o.error.empty()) std::cout << o.path.string() << "\n";
    else failed += (failed.empty() ? "" : "; ") + o.unit_id + ": " + o.error;
  }
  if (!failed.empty()) throw std::runtime_error("no report for " + failed);
  return kOk;
}

}  // namespace ferrum::app
