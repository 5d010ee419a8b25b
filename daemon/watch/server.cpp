#include "daemon/watch/server.h"

#include <Poco/JSON/Array.h>
#include <Poco/JSON/Object.h>
#include <Poco/JSON/Stringifier.h>
#include <pthread.h>
#include <signal.h>
#include <spdlog/spdlog.h>
#include <unistd.h>

#include <chrono>
#include <cstdio>
#include <optional>
#include <sstream>
#include <thread>

#include "analytics/calendar.h"
#include "daemon/app/logging.h"
#include "daemon/assess/load_retention.h"
#include "daemon/mail/messages.h"
#include "daemon/mail/outbox.h"
#include "daemon/pipeline/import_bridge.h"
#include "daemon/pipeline/pipeline.h"
#include "daemon/reporting/report_writer.h"
#include "daemon/site/atomic_file.h"
#include "daemon/watch/drop_watcher.h"

namespace fs = std::filesystem;
using namespace std::chrono_literals;

namespace ferrum::watch {

std::atomic<bool> Server::stop_requested{false};
std::atomic<bool> Server::reload_requested{false};

namespace {

std::int64_t now_utc() { return ingest::system_clock_now(); }


std::int64_t parse_iso(const std::string& s) {
  int y = 0, mo = 0, d = 0, h = 0, mi = 0, se = 0;
  if (std::sscanf(s.c_str(), "%d-%d-%dT%d:%d:%dZ", &y, &mo, &d, &h, &mi, &se) != 6) return 0;
  return analytics::start_of(analytics::days_from_civil(y, mo, d)) + h * 3600 + mi * 60 + se;
}

// What the previous assessment of a unit said, to see whether it got worse.
struct Snapshot {
  int condition = 0;        // C57.104-2008 fault-gas condition (CO, CO2 left out), 0 = none
  int status = 0;           // C57.104-2019 status, 0 = none
  double c2h2 = -1;         // ppm, -1 = none
  bool arcing = false;
  double peak_hot_spot = -1;
  std::string encode() const {
    std::ostringstream o;
    o << condition << " " << status << " " << c2h2 << " " << arcing << " " << peak_hot_spot;
    return o.str();
  }
  static Snapshot decode(const std::string& s) {
    Snapshot x;
    std::istringstream in(s);
    in >> x.condition >> x.status >> x.c2h2 >> x.arcing >> x.peak_hot_spot;
    return x;
  }
  static Snapshot of(const analytics::UnitAssessment& a) {
    Snapshot x;
    x.condition = a.dga.c57104_2008_fault_condition.value_or(0);
    x.status = a.dga.c57104_2019_fault_status.value_or(0);
    for (const auto& g : a.dga.gases)
      if (g.gas == "C2H2" && g.ppm) x.c2h2 = *g.ppm;
    x.arcing = a.active_arcing;
    x.peak_hot_spot = a.thermal.peak_hot_spot_c.value_or(-1);
    return x;
  }
};

// "acetylene rising: 4 -> 6 ppm (first detected 2024-03-01)": appeared, rising
// or present as the oil history says (analytics), not as the last snapshot.
std::string acetylene_alert_text(const analytics::UnitAssessment& a) {
  const auto& d = a.dga;
  std::optional<double> now, before;
  for (const auto& g : d.gases)
    if (g.gas == "C2H2") now = g.ppm;
  if (a.gas_history.size() > 1) before = a.gas_history[a.gas_history.size() - 2].c2h2;
  auto ppm = [](double v) {
    char buf[32];
    std::snprintf(buf, sizeof buf, "%.4g", v);
    return std::string(buf);
  };
  std::string text = "acetylene " + (d.acetylene_trend.empty() ? std::string("detected") : d.acetylene_trend) + ": ";
  if (d.acetylene_trend != "appeared" && before && now) text += ppm(*before) + " -> ";
  text += now ? ppm(*now) + " ppm" : std::string("detected");
  if (d.acetylene_first_detected && d.acetylene_trend != "appeared")
    text += " (first detected " + analytics::format_day(*d.acetylene_first_detected) + ")";
  return text;
}

}  // namespace

std::int64_t next_weekly_time(std::int64_t after, int weekday, int minute_of_day, int offset_minutes) {
  // Work in site-local seconds, then convert back.
  const std::int64_t local = after + offset_minutes * 60LL;
  analytics::Day day = analytics::day_of(local);
  for (int i = 0; i < 8; ++i, ++day) {
    if (analytics::weekday_of(day) != weekday) continue;
    const std::int64_t t = analytics::start_of(day) + minute_of_day * 60LL - offset_minutes * 60LL;
    if (t > after) return t;
  }
  return after + 7 * 86400;  // not reached
}

void start_signal_thread() {
  sigset_t set;
  sigemptyset(&set);
  sigaddset(&set, SIGTERM);
  sigaddset(&set, SIGINT);
  sigaddset(&set, SIGHUP);
  sigaddset(&set, SIGQUIT);
  pthread_sigmask(SIG_BLOCK, &set, nullptr);
  std::thread([set]() {
    for (;;) {
      int sig = 0;
      if (sigwait(&set, &sig) != 0) continue;
      if (sig == SIGHUP) {
        Server::reload_requested = true;
      } else {
        if (Server::stop_requested.exchange(true)) _exit(0);  // a second request: leave at once
      }
    }
  }).detach();
}

struct Server::Impl {
  site::SiteRoot root;
  config::SiteConfig config;
  std::unique_ptr<store::Store> store;
  ServerOptions options;
  std::unique_ptr<ingest::Pipeline> pipeline;
  std::unique_ptr<reporting::ReportWriter> writer;
  std::unique_ptr<DropWatcher> watcher;
  std::int64_t started = now_utc();
  std::map<std::string, std::chrono::steady_clock::time_point> dirty_units;  // unit -> last change
  std::chrono::steady_clock::time_point next_rescan{};
  std::chrono::steady_clock::time_point retry_at{};
  std::chrono::seconds backoff{1};
  std::chrono::steady_clock::time_point weekly_retry_at{};  // after a failed bundle
  std::vector<fs::path> retry;  // files whose import failed for a reason not theirs
  std::string store_problem;    // the shared database's last error while it cannot be reached
  bool recovery_due = false;    // the start's recovery waits for the shared database
  std::string progress_file;    // the file whose import progress is being timed
  std::uint64_t progress_done = 0;
  std::chrono::steady_clock::time_point progress_started, progress_logged;
  std::string last_import, last_import_party, last_import_at;
  std::vector<std::string> recent_rejections;
  std::string last_status_text;
  std::size_t files_processed = 0;
  std::string stopped_at;
  std::chrono::steady_clock::time_point next_mail_check{};
  analytics::Day retention_day = 0;  // the day the load retention last ran

  // An alert: its PDF and line (ReportWriter), then mail at once to everyone
  // whose sites it concerns (through the outbox). One alert is one finding: its own PDF, one alerts.csv line and one mail.
  // Its time is printed once, in site time ([site] time_zone), for all three.
  void raise_alert(const std::string& unit, const std::string& kind, const std::string& text,
                   const std::string& first_step, std::int64_t at_utc) {
    const std::string at = config::site_timestamp(at_utc, config.time_zone);
    const fs::path pdf = writer->alert(unit, kind, text, first_step, at_utc);
    try {
      const auto info = store->find_unit(unit);
      mail::Outbox outbox(root);
      mail::queue_alert(outbox, config, unit, info ? info->site : "", text, pdf, at, now_utc());
    } catch (const std::exception& e) {
      spdlog::error("alert mail for {} not queued: {}", unit, e.what());
    }
  }

  // Sends what is due in the outbox, at most once a second.
  void deliver_mail() {
    const auto now = std::chrono::steady_clock::now();
    if (!config.mail.enabled() || (!options.once && now < next_mail_check)) return;
    next_mail_check = now + 1s;
    try {
      mail::Outbox(root).deliver_due(config.mail, now_utc());
    } catch (const std::exception& e) {
      spdlog::error("outbox: {}", e.what());
    }
  }

  void rebuild() {
    pipeline = std::make_unique<ingest::Pipeline>(root, config, *store);
    pipeline->set_cancel_flag(&Server::stop_requested);
    pipeline->set_raises_alerts(true);  // raise_alert() below, for every unsafe item of an accepted file
    // A file that takes longer than 10 s is logged every 10 s while it is read.
    pipeline->set_progress([this](const std::string& name, std::uint64_t done, std::uint64_t total) {
      const auto now = std::chrono::steady_clock::now();
      if (total == 0) {  // read to its end
        progress_file.clear();
        return;
      }
      if (name != progress_file || done < progress_done) {  // another file, or the same name again
        progress_file = name;
        progress_done = done;
        progress_started = progress_logged = now;
        return;
      }
      progress_done = done;
      if (now - progress_logged < std::chrono::seconds(10)) return;
      progress_logged = now;
      spdlog::info("file {}: {:.1f} of {:.1f} MB read after {:.0f} s", name, static_cast<double>(done) / 1e6,
                   static_cast<double>(total) / 1e6,
                   std::chrono::duration<double>(now - progress_started).count());
    });
    writer = std::make_unique<reporting::ReportWriter>(root, config, *store);
    std::vector<std::string> parties;
    for (const auto& [name, p] : config.parties) parties.push_back(name);
    if (!watcher) watcher = std::make_unique<DropWatcher>(root.drop());
    watcher->watch(parties);
  }

  void reload() {
    try {
      config::SiteConfig fresh = config::load_site_config(root.config().string());
      const auto changes = config::describe_changes(config, fresh);
      config = std::move(fresh);
      app::set_log_level(config.log_level);
      rebuild();
      if (changes.empty()) spdlog::info("configuration reloaded: nothing changed");
      for (const auto& c : changes) spdlog::info("configuration reloaded: {}", c);
    } catch (const std::exception& e) {
      spdlog::error("configuration NOT reloaded, keeping the previous one: {}", e.what());
    }
  }

  void note_outcome(const ingest::FileOutcome& o) {
    ++files_processed;
    last_import = o.receipt.file;
    last_import_party = o.receipt.party;
    last_import_at = o.receipt.received_at;
    if (o.receipt.status == "rejected") {
      recent_rejections.insert(recent_rejections.begin(),
                               o.receipt.received_at + " " + o.receipt.party + "/" + o.receipt.file + ": " +
                                   (o.receipt.reason.empty() && !o.receipt.problems.empty()
                                        ? "line " + std::to_string(o.receipt.problems.front().line) + ": " +
                                              o.receipt.problems.front().reason
                                        : o.receipt.reason));
      if (recent_rejections.size() > 10) recent_rejections.resize(10);
    }
    const auto now = std::chrono::steady_clock::now();
    for (const auto& u : o.units) dirty_units[u] = now;
    for (const auto& item : o.unsafe_items) {
      const auto colon = item.find(':');
      const std::string unit = item.substr(0, colon);
      raise_alert(unit, "unsafe_inspection", "inspection rated an item UNSAFE: " + item.substr(colon + 2),
                    "Keep people away from the unit and have a qualified engineer assess it before any work.",
                    now_utc());
      // An unsafe earth: the other units of the site get a site-earth-check
      // action (analytics/site_earth_check.h), so their reports are redone too.
      if (item.compare(colon + 2, 9, "grounding") == 0) mark_site_dirty(unit, now);
    }
  }

  void mark_site_dirty(const std::string& unit, std::chrono::steady_clock::time_point now) {
    try {
      const auto info = store->find_unit(unit);
      if (!info) return;
      for (const auto& u : store->units())
        if (u.site == info->site) dirty_units.emplace(u.unit_id, now);
    } catch (const std::exception& e) {
      spdlog::error("units of the site of {} not marked for a new report: {}", unit, e.what());
    }
  }

  void process_file(const fs::path& p) {
    try {
      if (auto o = pipeline->process(p)) note_outcome(*o);
    } catch (const ingest::ImportCancelled&) {
      // Stopping: the transaction was rolled back; the file waits in work/
      // and recover() imports it whole at the next start.
      spdlog::info("stop requested: the import of {} was rolled back and resumes at the next start", p.string());
    } catch (const std::exception& e) {
      // Not the file's fault (disk full, database locked or read-only, the
      // shared database unreachable): it stays in work/ (or in its party
      // folder) and is tried again later.
      if (dynamic_cast<const store::StoreUnavailable*>(&e)) store_problem = e.what();
      spdlog::error("could not process {}: {}; will retry in {} s", p.string(), e.what(), backoff.count());
      retry_at = std::chrono::steady_clock::now() + backoff;
      backoff = std::min(backoff * 2, std::chrono::seconds(300));
      retry.push_back(p);
    }
  }

  // Finishes or imports again the files left in work/ by a failure (and, when
  // the start's recovery is due, the units waiting for a report). False when
  // the store still fails: the next try is set with back-off.
  bool recover_in_work(std::chrono::steady_clock::time_point now) {
    try {
      if (recovery_due) load_dirty_units();
      for (const auto& o : pipeline->recover()) note_outcome(o);
      if (recovery_due) spdlog::info("database reachable again: the start's recovery is done");
      recovery_due = false;
      backoff = std::chrono::seconds(1);
      return true;
    } catch (const std::exception& e) {
      // Still failing: keep the files where they are and try again later.
      if (dynamic_cast<const store::StoreUnavailable*>(&e)) store_problem = e.what();
      spdlog::error("retry failed: {}; next try in {} s", e.what(), backoff.count());
      retry_at = now + backoff;
      backoff = std::min(backoff * 2, std::chrono::seconds(300));
      return false;
    }
  }

  void ingest_ready() {
    const auto now = std::chrono::steady_clock::now();
    if (now >= next_rescan) {
      watcher->rescan();
      next_rescan = now + std::chrono::seconds(config.rescan_seconds);
    }
    if ((!retry.empty() || recovery_due) && now >= retry_at) {
      auto again = std::move(retry);
      retry.clear();
      if (!recover_in_work(now)) {
        retry = std::move(again);
        return;
      }
      for (const auto& p : again)
        if (fs::exists(p) && retry.empty()) process_file(p);
      watcher->rescan();
    }
    if (!retry.empty()) return;
    auto ready = watcher->take_ready(std::chrono::seconds(config.settle_seconds), now);
    // Started while the database was down and a file arrives: the start's
    // recovery is tried first, whatever the back-off, so that a database back
    // between two tries never imports a new file before the interrupted ones.
    // Still down: the new files are claimed into work/ and wait with them.
    if (!ready.empty() && recovery_due) recover_in_work(now);
    for (const auto& p : ready) {
      if (stop_requested && !options.once) break;  // leave the rest for next time
      process_file(p);
      if (!retry.empty()) break;
    }
  }

  analytics::Day today() const { return analytics::day_of(now_utc() + config.utc_offset_minutes * 60LL); }

  void render_dirty(bool force) {
    const auto now = std::chrono::steady_clock::now();
    const auto as_of = today();
    std::vector<std::string> due;
    for (auto it = dirty_units.begin(); it != dirty_units.end();) {
      if (!force && now - it->second < std::chrono::seconds(config.debounce_seconds)) {
        ++it;
        continue;
      }
      due.push_back(it->first);
      it = dirty_units.erase(it);
    }
    // Units of the sites this root serves get their reports, all at once:
    // each unit of their sites is assessed once for all of them, not once
    // per report (a file naming every unit of a site), and their alerts are
    // checked on that same assessment. Units of another root's region are
    // assessed for their alerts only.
    std::vector<std::string> to_render;
    for (const auto& unit : due) {
      try {
        const auto info = store->find_unit(unit);
        if (info && config.store.serves_site(info->site)) {
          to_render.push_back(unit);
          continue;
        }
        const auto a = writer->assess(unit, as_of);  // throws for a unit not in the register
        check_alerts(unit, a);
      } catch (const std::exception& e) {
        spdlog::error("report for {} failed: {}", unit, e.what());
      }
    }
    if (to_render.empty()) return;
    const auto outcomes = writer->unit_reports_by_id(to_render, as_of, root.reports(),
                                                     [&](const analytics::UnitAssessment& a) {
                                                       try {
                                                         check_alerts(a.unit.unit_id, a);
                                                       } catch (const std::exception& e) {
                                                         spdlog::error("alerts of {} failed: {}", a.unit.unit_id, e.what());
                                                       }
                                                     });
    for (const auto& o : outcomes) {
      if (o.error.empty()) spdlog::info("report {} rendered: {}", o.unit_id, o.path.filename().string());
      else spdlog::error("report for {} failed: {}", o.unit_id, o.error);
    }
  }

  // Units whose reports were still to be re-rendered when the daemon
  // stopped: a stop must be quick, so they are rendered after the next start.
  void save_dirty_units() {
    std::string list;
    for (const auto& [unit, t] : dirty_units) list += unit + "\n";
    try {
      store->set_state("dirty_units", list);
    } catch (const std::exception& e) {
      spdlog::error("cannot remember the units waiting for a report: {}", e.what());
    }
  }
  void load_dirty_units() {
    std::istringstream in(store->state("dirty_units").value_or(""));
    const auto now = std::chrono::steady_clock::now();
    for (std::string unit; std::getline(in, unit);)
      if (!unit.empty()) dirty_units[unit] = now - std::chrono::hours(1);
  }

  void check_alerts(const std::string& unit, const analytics::UnitAssessment& a) {
    const Snapshot now = Snapshot::of(a);
    const auto stored = store->state("snapshot:" + unit);
    const Snapshot before = stored ? Snapshot::decode(*stored) : Snapshot{};
    const std::int64_t at = now_utc();
    // Appearing, or rising by more than the repeatability of a lab
    // measurement (10 % + 0.5 ppm: common practice, no published source).
    if (now.c2h2 > 0 && (before.c2h2 <= 0 || now.c2h2 > before.c2h2 * 1.1 + 0.5))
      raise_alert(unit, "acetylene", acetylene_alert_text(a),
                    std::string(a.unit.oltc == analytics::OltcType::communicating
                                    ? "The register gives a communicating on-load tap changer: first check for a leak "
                                      "from the tap-changer compartment into the main tank (an OLTC oil sample, both "
                                      "conservator levels). "
                                    : "") +
                        "Resample the oil at once to confirm, with the responsible engineer's permission: the unit "
                        "may be gassing while energised, so keep the time at the unit short and consider sampling "
                        "after de-energising. An engineer decides whether the unit stays energised. Do not "
                        "re-energise after a trip before that evaluation.",
                    at);
    // Worsening, or a unit's first gas figures already at a high level:
    // condition 3 or 4 of C57.104-2008 (a high, and an excessive, level of
    // decomposition in its description of the four conditions; from memory,
    // see README sources), status 3 of C57.104-2019.
    // A first sample at condition 1 or 2 (status 1 or 2) is the unit's
    // baseline, not news.
    if (now.condition > before.condition && (before.condition > 0 || now.condition >= 3))
      raise_alert(unit, "gas_condition",
                    "IEEE C57.104-2008 fault-gas condition (CO and CO2 left out) " +
                        (before.condition > 0 ? "worsened from " + std::to_string(before.condition) + " to "
                                              : std::string("at its first assessment by ferrum (nothing earlier to compare with): ")) +
                        std::to_string(now.condition),
                    "Follow the sampling interval of C57.104-2008 Table 3 given in the unit report.", at);
    if (now.status > before.status && (before.status > 0 || now.status >= 3))
      raise_alert(unit, "dga_status",
                    "IEEE C57.104-2019 DGA status " +
                        (before.status > 0 ? "worsened from " + std::to_string(before.status) + " to "
                                           : std::string("at its first assessment by ferrum (nothing earlier to compare with): ")) +
                        std::to_string(now.status),
                    "Resample and review the gas trend with an engineer.", at);
    const double emergency = a.thermal.long_emergency_limit_c;
    if (now.peak_hot_spot > emergency && before.peak_hot_spot <= emergency)
      raise_alert(unit, "hot_spot",
                    "computed hot-spot temperature reached " + std::to_string(static_cast<int>(now.peak_hot_spot)) +
                        " °C, above the long-time emergency limit of " + std::to_string(static_cast<int>(emergency)) + " °C",
                    "Reduce the load and check the cooling; review the loading with an engineer.", at);
    store->set_state("snapshot:" + unit, now.encode());
    check_infrared_alerts(unit, a, at);
  }

  // An infrared finding of NETA priority 1 ("repair immediately"; ferrum
  // severity 4) raises one alert per finding (component and survey date),
  // once: the findings already alerted are kept in the store's state.
  void check_infrared_alerts(const std::string& unit, const analytics::UnitAssessment& a, std::int64_t at) {
    const std::string key = "infrared_alerted:" + unit;
    std::string alerted = store->state(key).value_or("");
    bool changed = false;
    for (const auto& f : a.infrared) {
      if (f.severity.value_or(0) < 4) continue;
      const std::string id = analytics::format_day(f.date) + " " + f.component + "\n";
      if (("\n" + alerted).find("\n" + id) != std::string::npos) continue;
      std::string text = "infrared survey " + analytics::format_day(f.date) + ": " + f.component + ", " +
                         f.severity_text;
      if (f.corrected_rise_k) {
        char rise[48];
        std::snprintf(rise, sizeof rise, ", %.1f K at rated load", *f.corrected_rise_k);
        text += rise;
      }
      raise_alert(unit, "infrared_priority_1", text,
                  "Have the connection repaired immediately, under an outage and permit as a qualified engineer "
                  "decides; until then reduce the load on the unit where possible and keep people away from "
                  "the hot part.",
                  at);
      alerted += id;
      changed = true;
    }
    if (changed) store->set_state(key, alerted);
  }

  void weekly() {
    const std::int64_t now = now_utc();
    std::int64_t last = 0;
    if (auto s = store->state("weekly_last_run")) last = parse_iso(*s);
    if (last == 0) {
      if (auto c = store->state("created_at")) last = parse_iso(*c);
      else {
        store->set_state("created_at", analytics::format_utc(now));
        last = now;
      }
    }
    const std::int64_t due = next_weekly_time(last, config.weekly_weekday, config.weekly_minute_of_day,
                                              config.utc_offset_minutes);
    if (due > now || std::chrono::steady_clock::now() < weekly_retry_at) return;
    // One daemon writes the fleet's bundle: the holder of the fleet lead
    // (a shared database's advisory lock; always this one with SQLite).
    if (!store->hold_fleet_lead()) return;
    try {
      // Due now, or missed while the daemon was down: produce it for today.
      const auto dir = writer->weekly_bundle(today());
      queue_weekly_mail(dir);  // before the week is marked done: queueing again is harmless
      store->set_state("weekly_last_run", analytics::format_utc(now));
      store->set_state("weekly_last_bundle", fs::relative(dir, root.root).string());
      spdlog::info("weekly bundle written: {}", dir.string());
    } catch (const std::exception& e) {
      spdlog::error("weekly bundle failed: {}; next try in 10 minutes", e.what());
      weekly_retry_at = std::chrono::steady_clock::now() + std::chrono::minutes(10);
    }
  }

  // [store] keep_load_points_years, once a day, by the fleet lead (one
  // daemon for a shared database).
  void load_retention() {
    if (config.store.keep_load_points_years <= 0 || retention_day == today()) return;
    if (!store->hold_fleet_lead()) return;
    retention_day = today();
    try {
      const auto n = assess::apply_load_retention(*store, config, &root, retention_day);
      if (n > 0) spdlog::info("load retention: old load points of {} unit(s) summarised by day", n);
    } catch (const store::StoreUnavailable&) {
      retention_day = 0;  // tried again once the database is back
      throw;
    } catch (const std::exception& e) {
      spdlog::error("load retention failed: {}; next try tomorrow", e.what());
    }
  }

  void queue_weekly_mail(const fs::path& dir) {
    if (!config.mail.enabled()) return;
    try {
      std::map<std::string, std::string> sites;
      for (const auto& u : store->units()) sites[u.unit_id] = u.site;
      mail::Outbox outbox(root);
      const auto q = mail::queue_weekly(outbox, config, dir, sites, now_utc());
      spdlog::info("weekly mail: {} message(s) queued, {} queued before", q.queued.size(), q.already.size());
    } catch (const std::exception& e) {
      spdlog::error("weekly mail not queued: {}", e.what());
    }
  }

  void write_status() {
    using Poco::JSON::Array;
    using Poco::JSON::Object;
    Object::Ptr o = new Object(Poco::JSON_PRESERVE_KEY_ORDER);
    o->set("pid", static_cast<long>(::getpid()));
    o->set("started_at", analytics::format_utc(started));
    o->set("last_import", last_import);
    o->set("last_import_party", last_import_party);
    o->set("last_import_at", last_import_at);
    o->set("files_processed", static_cast<long>(files_processed));
    o->set("files_waiting", static_cast<long>(pipeline->waiting_files().size()));
    Array::Ptr rej = new Array;
    for (const auto& r : recent_rejections) rej->add(r);
    o->set("recent_rejections", rej);
    std::int64_t last = 0;
    Array::Ptr alerts = new Array;
    try {
      if (auto s = store->state("weekly_last_run")) last = parse_iso(*s);
      o->set("last_weekly_bundle", store->state("weekly_last_bundle").value_or(""));
      for (const auto& a : store->open_alerts())
        alerts->add(config::site_timestamp_of_stored(a.raised_at, config.time_zone) + " " + a.unit_id + " " + a.kind +
                    ": " + a.text);
    } catch (const store::StoreUnavailable& e) {
      store_problem = e.what();
    }
    o->set("last_weekly_run", last ? analytics::format_utc(last) : "");
    o->set("next_weekly_run", analytics::format_utc(next_weekly_time(last ? last : now_utc(), config.weekly_weekday,
                                                   config.weekly_minute_of_day, config.utc_offset_minutes)));
    o->set("open_alerts", alerts);
    o->set("store_problem", store_problem);  // why files wait in work/, when the database cannot be reached
    o->set("units_waiting_for_report", static_cast<long>(dirty_units.size()));
    o->set("stopped_at", stopped_at);
    std::ostringstream out;
    Poco::JSON::Stringifier::stringify(o, out, 2);
    const std::string text = out.str();
    if (text == last_status_text) return;
    try {
      site::write_file_atomically(root.status_file(), text + "\n");
      last_status_text = text;
    } catch (const std::exception& e) {
      spdlog::warn("cannot write status file: {}", e.what());
    }
  }
};

Server::Server(site::SiteRoot root, config::SiteConfig config, std::unique_ptr<store::Store> store,
               ServerOptions options)
    : impl_(std::make_unique<Impl>()) {
  impl_->root = std::move(root);
  impl_->config = std::move(config);
  impl_->store = std::move(store);
  impl_->options = options;
}

Server::~Server() = default;

int Server::run() {
  Impl& s = *impl_;
  s.rebuild();
  spdlog::info("ferrum serving {} (pid {}); parties: {}", s.root.root.string(), ::getpid(), s.config.parties.size());
  try {
    s.load_dirty_units();
    for (const auto& o : s.pipeline->recover()) s.note_outcome(o);
  } catch (const store::StoreUnavailable& e) {
    // Started while the shared database is down: keep running; the recovery
    // (and the files that arrive meanwhile, claimed into work/) wait for it,
    // retried with back-off; status says why.
    spdlog::error("database unreachable at start: {}; files wait in work/ and are retried", e.what());
    s.store_problem = e.what();
    s.recovery_due = true;
    s.retry_at = std::chrono::steady_clock::now() + s.backoff;
  }
  auto last_status = std::chrono::steady_clock::now() - 10s;
  for (;;) {
    if (reload_requested.exchange(false)) s.reload();
    s.ingest_ready();
    if (stop_requested && !s.options.once) break;  // reports of dirty units: at the next start
    try {
      s.render_dirty(s.options.once);
      s.weekly();
      s.load_retention();
      if (s.retry.empty() && !s.recovery_due) s.store_problem.clear();
    } catch (const store::StoreUnavailable& e) {
      // The shared database is gone for now: the daemon keeps running, files
      // wait in work/ and are retried with back-off; status says why.
      if (s.store_problem.empty()) spdlog::error("database unreachable: {}", e.what());
      s.store_problem = e.what();
    }
    s.deliver_mail();
    if (std::chrono::steady_clock::now() - last_status >= 1s) {
      s.write_status();
      last_status = std::chrono::steady_clock::now();
    }
    if (s.options.once && s.watcher->pending() == 0 && s.dirty_units.empty() && s.retry.empty() && !s.recovery_due)
      break;
    std::this_thread::sleep_for(200ms);
  }
  // Stopping: nothing in flight (files are processed one at a time on this
  // thread), so the status can say so and the process leave.
  s.save_dirty_units();
  s.stopped_at = analytics::format_utc(now_utc());
  s.write_status();
  spdlog::info("ferrum stopped");
  return 0;
}

}  // namespace ferrum::watch
