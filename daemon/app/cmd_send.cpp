// ferrum send --root DIR (--weekly | --test ADDRESS): queue mail in the
// outbox and, unless the daemon runs (it delivers the outbox itself), send it
// now. See daemon/mail/outbox.h.
#include <Poco/JSON/Object.h>
#include <Poco/JSON/Parser.h>

#include <chrono>
#include <fstream>
#include <iostream>
#include <sstream>

#include "daemon/app/commands_impl.h"
#include "daemon/app/site_context.h"
#include "daemon/mail/messages.h"
#include "daemon/mail/outbox.h"

namespace fs = std::filesystem;

namespace ferrum::app {
namespace {

std::int64_t utc_now() {
  return std::chrono::duration_cast<std::chrono::seconds>(std::chrono::system_clock::now().time_since_epoch()).count();
}

// The newest complete week folder, reports/YYYY-Www/ with its index.pdf.
fs::path latest_bundle(const site::SiteRoot& root) {
  fs::path best;
  if (fs::is_directory(root.reports()))
    for (const auto& e : fs::directory_iterator(root.reports())) {
      const std::string name = e.path().filename().string();
      if (e.is_directory() && name.size() == 8 && name[4] == '-' && name[5] == 'W' && fs::exists(e.path() / "index.pdf") &&
          (best.empty() || name > best.filename().string()))
        best = e.path();
    }
  return best;
}

// What became of message `id`: "sent", "failed: ...", or "waiting: ...".
std::string fate(const mail::Outbox& outbox, const std::string& id) {
  auto error_of = [](const fs::path& p) {
    std::ifstream in(p);
    std::stringstream t;
    t << in.rdbuf();
    try {
      auto o = Poco::JSON::Parser().parse(t.str()).extract<Poco::JSON::Object::Ptr>();
      return o->getValue<std::string>("last_error");
    } catch (const std::exception&) {
      return std::string("(state unreadable)");
    }
  };
  if (fs::exists(outbox.dir() / "sent" / (id + ".json"))) return "sent";
  if (fs::exists(outbox.dir() / "failed" / (id + ".json")))
    return "REJECTED (outbox/failed/): " + error_of(outbox.dir() / "failed" / (id + ".json"));
  return "waiting, will be retried: " + error_of(outbox.dir() / (id + ".json"));
}

}  // namespace

int cmd_send(const Invocation& inv) {
  if (inv.has("weekly") == inv.has("test")) throw UsageError("give --weekly or --test ADDRESS (one of them)");
  auto site = open_site(inv, Access::read);
  if (!site->config.mail.enabled())
    throw std::runtime_error("mail is off: set [mail] smtp_host and from in " + site->root.config().string());
  mail::Outbox outbox(site->root);
  const std::int64_t now = utc_now();
  std::vector<std::string> ids;
  if (inv.has("test")) {
    ids.push_back(mail::queue_test(outbox, site->config, inv.get("test"), now));
  } else {
    const fs::path dir = latest_bundle(site->root);
    if (dir.empty()) throw std::runtime_error("no weekly bundle yet: run 'ferrum report --weekly' first");
    std::map<std::string, std::string> sites;
    for (const auto& u : site->store->units()) sites[u.unit_id] = u.site;
    const auto q = mail::queue_weekly(outbox, site->config, dir, sites, now);
    if (q.queued.empty() && q.already.empty()) std::cout << "no recipient gets weekly or fleet mail\n";
    for (const auto& name : q.already)
      std::cout << name << ": " << dir.filename().string() << " was queued before (not sent twice)\n";
    for (const auto& name : q.queued) ids.push_back("weekly-" + dir.filename().string() + "-" + name);
  }
  // The daemon delivers the outbox itself; two senders could send a message twice.
  const site::LockHolder holder = site::RootLock::holder(site->root);
  site::RootLock lock;
  if (holder.is_daemon() || !lock.try_acquire(site->root, "send")) {
    const site::LockHolder now_holder = site::RootLock::holder(site->root);
    std::cout << ids.size() << " message(s) queued in " << outbox.dir().string()
              << (now_holder.is_daemon() ? "; the running daemon sends them\n"
                                         : "; 'ferrum " + now_holder.command +
                                               "' holds the root now: the daemon or the next 'ferrum send' sends them\n");
    return kOk;
  }
  outbox.deliver_due(site->config.mail, now);
  bool all_sent = true;
  for (const auto& id : ids) {
    const std::string f = fate(outbox, id);
    all_sent &= f == "sent";
    std::cout << id << ": " << f << "\n";
  }
  return all_sent ? kOk : kFailed;
}

}  // namespace ferrum::app
