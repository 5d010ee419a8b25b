// The mail part of ferrum.ini: [mail] (the site's SMTP server) and one
// [recipients.NAME] section per person. Loaded and validated with the rest of
// the configuration (site_config.cpp calls load_mail_settings); an address or
// subject text that could inject a header or an SMTP command is refused there,
// naming the key, so that nothing hostile ever reaches a message.
#pragma once

#include <cctype>
#include <map>
#include <set>
#include <string>

namespace Poco::Util {
class AbstractConfiguration;
}

namespace ferrum::config {

struct SiteConfig;

struct MailSettings {
  std::string smtp_host;          // empty: mail is off
  int smtp_port = 587;
  std::string security = "starttls";  // starttls, tls or none
  std::string user;               // empty: no authentication
  std::string password_file;      // read at every connection, first line
  std::string from;
  std::string ca_file;            // certificate authorities for TLS; empty: the system's
  std::string subject_prefix = "ferrum";
  long long max_bytes = 20LL * 1024 * 1024;  // a larger message carries paths instead of files
  int retry_seconds = 60;         // first back-off after a failed attempt (doubles, at most 1 h)
  bool enabled() const { return !smtp_host.empty(); }
  bool operator==(const MailSettings& o) const {
    return smtp_host == o.smtp_host && smtp_port == o.smtp_port && security == o.security && user == o.user &&
           password_file == o.password_file && from == o.from && ca_file == o.ca_file &&
           subject_prefix == o.subject_prefix && max_bytes == o.max_bytes && retry_seconds == o.retry_seconds;
  }
  bool operator!=(const MailSettings& o) const { return !(*this == o); }
};

struct Recipient {
  std::string name;               // NAME of [recipients.NAME]
  std::string email;
  std::set<std::string> sites;    // lower case; "*" = every site
  std::set<std::string> gets;     // weekly, fleet, alerts
  bool wants(const std::string& what) const { return gets.count(what) > 0; }
  bool serves(const std::string& site) const {
    std::string lower = site;
    for (char& c : lower) c = static_cast<char>(std::tolower(static_cast<unsigned char>(c)));
    return sites.count("*") > 0 || sites.count(lower) > 0;
  }
  bool operator==(const Recipient& o) const {
    return email == o.email && sites == o.sites && gets == o.gets;
  }
};

// Reads [mail] and every [recipients.NAME] into `c`. Throws ConfigError
// naming the key.
void load_mail_settings(const Poco::Util::AbstractConfiguration& ini, SiteConfig& c);

// Throws ConfigError("KEY: ...") unless `text` is one plain address
// local@domain (no display name, no spaces, no control characters, no <>,
// no comma): what may go into MAIL FROM/RCPT TO and a header unquoted.
void check_mail_address(const std::string& key, const std::string& text);

// Throws ConfigError unless `text` is printable on one header line (no
// control characters, at most 120 bytes).
void check_header_text(const std::string& key, const std::string& text);

// The commented [mail] and [recipients.NAME] example of the default ferrum.ini.
std::string mail_config_sample();

}  // namespace ferrum::config
