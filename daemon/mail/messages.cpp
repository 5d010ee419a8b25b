#include "daemon/mail/messages.h"

#include <Poco/RandomStream.h>

#include <algorithm>
#include <fstream>
#include <sstream>

#include "analytics/calendar.h"
#include "daemon/config/mail_settings.h"
#include "report/safety_text.h"

namespace fs = std::filesystem;

namespace ferrum::mail {
namespace {

// The id of a file name: letters, digits and '-' kept, the rest '_'.
std::string id_part(const std::string& s) {
  std::string out;
  for (char c : s) out += std::isalnum(static_cast<unsigned char>(c)) || c == '-' ? c : '_';
  return out;
}

std::string opening() { return report::one_line_caution() + "\n\n"; }

// Attachments, or (over the size limit) their paths in the body instead.
void attach_or_list(OutgoingMail& m, const std::vector<fs::path>& files, long long max_bytes) {
  long long total = static_cast<long long>(m.body.size());
  for (const auto& f : files) total += static_cast<long long>(fs::file_size(f)) * 4 / 3 + 512;  // base64
  if (total <= max_bytes) {
    m.attachments = files;
    return;
  }
  m.body += "\nThe reports are too large to attach (over the limit of " + std::to_string(max_bytes / (1024 * 1024)) +
            " MB set by [mail] max_mb). They are on the ferrum server:\n";
  for (const auto& f : files) m.body += "  " + f.string() + "\n";
}

std::string read_or(const fs::path& p, const std::string& fallback) {
  std::ifstream in(p);
  if (!in) return fallback;
  std::ostringstream o;
  o << in.rdbuf();
  return o.str();
}

}  // namespace

int queue_alert(Outbox& outbox, const config::SiteConfig& config, const std::string& unit_id, const std::string& site,
                const std::string& text, const fs::path& pdf, const std::string& raised_at, std::int64_t now) {
  if (!config.mail.enabled()) return 0;
  int n = 0;
  for (const auto& [name, r] : config.recipients) {
    if (!r.wants("alerts") || !r.serves(site)) continue;
    OutgoingMail m;
    m.id = "alert-" + id_part(pdf.stem().string()) + "-" + id_part(name);
    m.to = r.email;
    m.subject = config.mail.subject_prefix + " ALERT " + unit_id + " (" + site + "): " + text;
    if (m.subject.size() > 200) m.subject = m.subject.substr(0, 197) + "...";
    m.body = opening() + "ALERT for unit " + unit_id + " at " + site + ", raised " + raised_at +
             ":\n  " + text + "\n\nThe attached alert report states the first step. A qualified engineer decides "
             "what is done.\n\n" + config.utility_name + " - ferrum\n";
    attach_or_list(m, {pdf}, config.mail.max_bytes);
    n += outbox.enqueue(config.mail, m, now) ? 1 : 0;
  }
  return n;
}

WeeklyQueued queue_weekly(Outbox& outbox, const config::SiteConfig& config, const fs::path& dir,
                          const std::map<std::string, std::string>& unit_sites, std::int64_t now) {
  WeeklyQueued out;
  if (!config.mail.enabled()) return out;
  const std::string label = dir.filename().string();
  std::vector<fs::path> fleet_files;
  std::map<std::string, std::vector<fs::path>> unit_reports_by_site;  // lower-case site -> files
  std::vector<fs::path> files;
  for (const auto& e : fs::directory_iterator(dir)) files.push_back(e.path());
  std::sort(files.begin(), files.end());
  for (const auto& p : files) {
    const std::string name = p.filename().string();
    if (name.rfind("ferrum-fleet-", 0) == 0) {
      fleet_files.push_back(p);
      continue;
    }
    // ferrum-UNIT-YYYY-MM-DD.pdf
    if (name.rfind("ferrum-", 0) != 0 || name.size() < 7 + 15 || p.extension() != ".pdf") continue;
    const std::string unit = name.substr(7, name.size() - 7 - 15);
    auto it = unit_sites.find(unit);
    if (it == unit_sites.end()) continue;
    std::string site = it->second;
    for (char& c : site) c = static_cast<char>(std::tolower(static_cast<unsigned char>(c)));
    unit_reports_by_site[site].push_back(p);
  }
  const std::string summary = read_or(dir / "summary.txt", "(the summary of this week is in index.pdf)\n");
  // summary.txt opens with the caution itself (report::planner_week_text); an
  // older bundle's, or the stand-in, gets it here: once, first, either way.
  const std::string lead = summary.rfind(report::one_line_caution(), 0) == 0 ? "" : opening();
  for (const auto& [name, r] : config.recipients) {
    if (!r.wants("weekly") && !r.wants("fleet")) continue;
    std::vector<fs::path> attach;
    std::string what;
    if (r.wants("weekly")) {
      for (const auto& [site, reports] : unit_reports_by_site)
        if (r.serves(site)) attach.insert(attach.end(), reports.begin(), reports.end());
      what += std::to_string(attach.size()) + " unit report(s) of " +
              (r.sites.count("*") ? std::string("every site") : "your sites");
    }
    if (r.wants("fleet")) {
      attach.insert(attach.end(), fleet_files.begin(), fleet_files.end());
      what += std::string(what.empty() ? "" : "; ") + "the fleet report and its CSV";
    }
    attach.push_back(dir / "index.pdf");
    OutgoingMail m;
    m.id = "weekly-" + id_part(label) + "-" + id_part(name);
    m.to = r.email;
    m.subject = config.mail.subject_prefix + " weekly " + label + ": " + config.utility_name;
    m.body = lead + summary + "\nAttached: " + what + ", and the week's cover page (index.pdf).\n\n" +
             config.utility_name + " - ferrum\n";
    attach_or_list(m, attach, config.mail.max_bytes);
    (outbox.enqueue(config.mail, m, now) ? out.queued : out.already).push_back(name);
  }
  return out;
}

std::string queue_test(Outbox& outbox, const config::SiteConfig& config, const std::string& address, std::int64_t now) {
  config::check_mail_address("--test", address);
  OutgoingMail m;
  Poco::RandomInputStream rnd;
  m.id = "test-" + id_part(analytics::format_utc(now)) + "-" + std::to_string(rnd.get() & 0xffff);
  m.to = address;
  m.subject = config.mail.subject_prefix + " test message: " + config.utility_name;
  m.body = opening() + "This is a test message from ferrum at " + config.utility_name + ", sent " +
           analytics::format_utc(now) + " through " + config.mail.smtp_host + ":" +
           std::to_string(config.mail.smtp_port) + " (" + config.mail.security + ").\n";
  outbox.enqueue(config.mail, m, now);
  return m.id;
}

}  // namespace ferrum::mail
