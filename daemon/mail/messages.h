// What each recipient receives (configuration: [recipients.NAME] gets/sites):
//   weekly  the unit reports of their sites from the week's bundle;
//   fleet   the fleet report (PDF) and its CSV;
//   alerts  each alert at once, with its PDF, when it concerns their sites.
// Every body starts with the one-line safety caution (report/safety_text.h)
// and a plain-text summary. A message whose attachments would pass
// [mail] max_mb carries the summary and the files' paths instead.
#pragma once

#include <cstdint>
#include <filesystem>
#include <map>
#include <string>
#include <vector>

#include "daemon/config/site_config.h"
#include "daemon/mail/outbox.h"
#include "schema/store.h"

namespace ferrum::mail {

// Queues the alert for every recipient with `alerts` whose sites include `site`.
// `raised_at` is the alert's time as its PDF and alerts.csv print it
// (config::site_timestamp). Returns how many messages were queued.
int queue_alert(Outbox& outbox, const config::SiteConfig& config, const std::string& unit_id, const std::string& site,
                const std::string& text, const std::filesystem::path& pdf, const std::string& raised_at,
                std::int64_t now);

struct WeeklyQueued {
  std::vector<std::string> queued, already;  // recipient names
};
// Queues the weekly mail of the bundle `dir` (reports/YYYY-Www/) for every
// recipient with `weekly` or `fleet`. `unit_sites`: unit id -> site, to pick
// the unit reports of a planner's sites.
WeeklyQueued queue_weekly(Outbox& outbox, const config::SiteConfig& config, const std::filesystem::path& dir,
                          const std::map<std::string, std::string>& unit_sites, std::int64_t now);

// A test message to `address` (checked like a configured address). Returns its id.
std::string queue_test(Outbox& outbox, const config::SiteConfig& config, const std::string& address, std::int64_t now);

}  // namespace ferrum::mail
