#include <Poco/JSON/Array.h>
#include <Poco/JSON/Object.h>
#include <Poco/JSON/Parser.h>

#include <algorithm>
#include <chrono>
#include <cstdio>
#include <fstream>
#include <iostream>
#include <sstream>

#include "analytics/calendar.h"
#include "daemon/app/commands_impl.h"
#include "daemon/mail/outbox.h"
#include "daemon/site/site_root.h"

namespace ferrum::app {

namespace {

// "3d 04h 12m" since an ISO-8601 UTC time written by the daemon.
std::string uptime_text(const std::string& started_at) {
  int y = 0, mo = 0, d = 0, h = 0, mi = 0, se = 0;
  if (std::sscanf(started_at.c_str(), "%d-%d-%dT%d:%d:%dZ", &y, &mo, &d, &h, &mi, &se) != 6) return "unknown";
  const std::int64_t start = analytics::start_of(analytics::days_from_civil(y, mo, d)) + h * 3600 + mi * 60 + se;
  const auto now = std::chrono::duration_cast<std::chrono::seconds>(
                       std::chrono::system_clock::now().time_since_epoch()).count();
  const long long up = std::max<long long>(0, now - start);
  char buf[64];
  if (up >= 86400)
    std::snprintf(buf, sizeof buf, "%lldd %02lldh %02lldm", up / 86400, up / 3600 % 24, up / 60 % 60);
  else
    std::snprintf(buf, sizeof buf, "%lldh %02lldm %02llds", up / 3600, up / 60 % 60, up % 60);
  return buf;
}

}  // namespace

int cmd_status(const Invocation& inv) {
  const site::SiteRoot root = site::resolve_root(inv.get("root"));
  if (!std::filesystem::exists(root.config())) throw std::runtime_error("no ferrum.ini in " + root.root.string());
  // The root lock is held by the daemon (`ferrum serve`) or by a one-off
  // command such as `ferrum ingest`: only the first is "running".
  const site::LockHolder holder = site::RootLock::holder(root);
  const long pid = holder.is_daemon() ? holder.pid : 0;
  std::ifstream in(root.status_file());
  Poco::JSON::Object::Ptr st;
  if (in) {
    std::stringstream text;
    text << in.rdbuf();
    try {
      st = Poco::JSON::Parser().parse(text.str()).extract<Poco::JSON::Object::Ptr>();
    } catch (const std::exception&) {
    }
  }
  const mail::OutboxSummary outbox = mail::Outbox(root).summary();
  if (inv.has("json")) {
    Poco::JSON::Object::Ptr o = st ? st : Poco::JSON::Object::Ptr(new Poco::JSON::Object);
    Poco::JSON::Object::Ptr ob = new Poco::JSON::Object;
    ob->set("waiting", outbox.waiting);
    ob->set("failed", outbox.failed);
    ob->set("sent", outbox.sent);
    ob->set("oldest_waiting", outbox.oldest_waiting);
    ob->set("last_error", outbox.last_error);
    Poco::JSON::Array::Ptr fl = new Poco::JSON::Array;
    for (const auto& f : outbox.failures) fl->add(f);
    ob->set("failures", fl);
    o->set("outbox", ob);
    o->set("running", pid != 0);
    if (holder.pid != 0 && !holder.is_daemon()) {
      Poco::JSON::Object::Ptr h = new Poco::JSON::Object;
      h->set("pid", holder.pid);
      h->set("command", holder.command);
      o->set("lock_holder", h);
    }
    o->stringify(std::cout, 2);
    std::cout << "\n";
    return pid ? kOk : kNotRunning;
  }
  auto get = [&](const char* k) { return st && st->has(k) ? st->get(k).toString() : std::string(); };
  if (pid) {
    std::cout << "ferrum is running on " << root.root.string() << " (pid " << pid << ", up "
              << uptime_text(get("started_at")) << ", since " << get("started_at") << ")\n";
  } else {
    std::cout << "ferrum is NOT running on " << root.root.string();
    if (!get("stopped_at").empty()) std::cout << " (stopped " << get("stopped_at") << ")";
    std::cout << "\n";
    if (holder.pid != 0)
      std::cout << "  busy:           'ferrum " << holder.command << "' (pid " << holder.pid
                << ") is working on this root now\n";
  }
  if (st) {
    std::cout << "  last import:    "
              << (get("last_import").empty() ? "none since start"
                                             : get("last_import_party") + "/" + get("last_import") + " at " +
                                                   get("last_import_at"))
              << "\n  files waiting:  " << get("files_waiting") << "\n  last weekly:    "
              << (get("last_weekly_bundle").empty() ? "none yet" : get("last_weekly_bundle") + " (" + get("last_weekly_run") + ")")
              << "\n  next weekly:    " << get("next_weekly_run") << "\n";
    if (!get("store_problem").empty())
      std::cout << "  DATABASE:       unreachable, files wait in work/ and are retried: " << get("store_problem") << "\n";
    if (auto rej = st->getArray("recent_rejections"); rej && rej->size()) {
      std::cout << "  recent rejections:\n";
      for (std::size_t i = 0; i < rej->size(); ++i) std::cout << "    " << rej->get(static_cast<unsigned>(i)).toString() << "\n";
    }
    if (auto al = st->getArray("open_alerts"); al && al->size()) {
      std::cout << "  open alerts:\n";
      for (std::size_t i = 0; i < al->size(); ++i) std::cout << "    " << al->get(static_cast<unsigned>(i)).toString() << "\n";
    } else {
      std::cout << "  open alerts:    none\n";
    }
  }
  std::cout << "  outbox:         " << outbox.waiting << " waiting";
  if (outbox.waiting) std::cout << " (oldest queued " << outbox.oldest_waiting << ")";
  std::cout << ", " << outbox.failed << " failed, " << outbox.sent << " sent\n";
  if (!outbox.last_error.empty()) std::cout << "    last error:   " << outbox.last_error << "\n";
  for (const auto& f : outbox.failures) std::cout << "    failed:       " << f << "\n";
  return pid ? kOk : kNotRunning;
}

}  // namespace ferrum::app
