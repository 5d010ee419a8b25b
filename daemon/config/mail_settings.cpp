#include "daemon/config/mail_settings.h"

#include <Poco/String.h>
#include <Poco/Util/AbstractConfiguration.h>

#include <algorithm>
#include <fstream>

#include "daemon/config/site_config.h"

namespace ferrum::config {
namespace {

const char* const kMailKeys[] = {"smtp_host", "smtp_port", "security", "user", "password_file",
                                 "from", "ca_file", "subject_prefix", "max_mb", "retry_seconds"};
const char* const kGets[] = {"weekly", "fleet", "alerts"};

std::set<std::string> lower_list(const std::string& text) {
  const auto list = parse_list(text);
  return {list.begin(), list.end()};
}

void check_keys(const Poco::Util::AbstractConfiguration& ini, const std::string& section,
                const std::set<std::string>& allowed) {
  Poco::Util::AbstractConfiguration::Keys ks;
  ini.keys(section, ks);
  for (const auto& k : ks)
    if (!allowed.count(k)) throw ConfigError(section + "." + k + ": unknown key");
}

}  // namespace

void check_header_text(const std::string& key, const std::string& text) {
  if (text.size() > 120) throw ConfigError(key + ": longer than 120 characters");
  for (unsigned char ch : text)
    if (ch < 0x20 || ch == 0x7f) throw ConfigError(key + ": contains a control character (refused: header injection)");
}

void check_mail_address(const std::string& key, const std::string& text) {
  check_header_text(key, text);
  const auto at = text.rfind('@');
  if (at == std::string::npos || at == 0 || at + 1 == text.size() || text.size() > 254)
    throw ConfigError(key + ": '" + text + "' is not an address of the form name@domain");
  // The local part: the unquoted characters RFC 5322 allows (dot-atom),
  // nothing that ends an address or starts a command.
  static const std::string local_ok = "!#$%&'*+-/=?^_`{|}~.";
  for (std::size_t i = 0; i < at; ++i) {
    const unsigned char ch = static_cast<unsigned char>(text[i]);
    if (!std::isalnum(ch) && local_ok.find(static_cast<char>(ch)) == std::string::npos)
      throw ConfigError(key + ": '" + text + "': the character '" + std::string(1, text[i]) +
                        "' is not allowed in an address");
  }
  if (text[0] == '.' || text[at - 1] == '.' || text.find("..") != std::string::npos)
    throw ConfigError(key + ": '" + text + "': misplaced dot");
  // The domain: letters, digits, hyphens and dots (RFC 5321 section 4.1.2).
  const std::string domain = text.substr(at + 1);
  for (char c : domain) {
    const unsigned char ch = static_cast<unsigned char>(c);
    if (!std::isalnum(ch) && c != '-' && c != '.')
      throw ConfigError(key + ": '" + text + "': the domain may hold letters, digits, '-' and '.' only");
  }
  if (domain.front() == '.' || domain.back() == '.' || domain.front() == '-')
    throw ConfigError(key + ": '" + text + "': misplaced dot or hyphen in the domain");
}

void load_mail_settings(const Poco::Util::AbstractConfiguration& ini, SiteConfig& c) {
  MailSettings m;
  check_keys(ini, "mail", std::set<std::string>(std::begin(kMailKeys), std::end(kMailKeys)));
  auto get = [&](const char* k, const std::string& dflt) { return Poco::trim(ini.getString(std::string("mail.") + k, dflt)); };
  m.smtp_host = get("smtp_host", "");
  for (char ch : m.smtp_host)
    if (!std::isalnum(static_cast<unsigned char>(ch)) && ch != '.' && ch != '-' && ch != ':')
      throw ConfigError("mail.smtp_host: '" + m.smtp_host + "' is not a host name or address");
  m.smtp_port = static_cast<int>(parse_whole_number("mail.smtp_port", get("smtp_port", "587"), 1, 65535));
  m.security = Poco::toLower(get("security", "starttls"));
  if (m.security != "starttls" && m.security != "tls" && m.security != "none")
    throw ConfigError("mail.security: '" + m.security + "' must be starttls, tls or none");
  m.user = get("user", "");
  check_header_text("mail.user", m.user);
  m.password_file = get("password_file", "");
  if (!m.user.empty()) {
    if (m.password_file.empty()) throw ConfigError("mail.password_file: required when mail.user is set");
    if (!std::ifstream(m.password_file)) throw ConfigError("mail.password_file: cannot read " + m.password_file);
  }
  m.from = get("from", "");
  m.ca_file = get("ca_file", "");
  if (!m.ca_file.empty() && !std::ifstream(m.ca_file)) throw ConfigError("mail.ca_file: cannot read " + m.ca_file);
  m.subject_prefix = get("subject_prefix", "ferrum");
  check_header_text("mail.subject_prefix", m.subject_prefix);
  m.max_bytes = parse_whole_number("mail.max_mb", get("max_mb", "20"), 1, 1024) * 1024 * 1024;
  m.retry_seconds = static_cast<int>(parse_whole_number("mail.retry_seconds", get("retry_seconds", "60"), 1, 3600));
  if (m.enabled()) {
    if (m.from.empty()) throw ConfigError("mail.from: required when mail.smtp_host is set");
    check_mail_address("mail.from", m.from);
  }
  c.mail = m;

  Poco::Util::AbstractConfiguration::Keys names;
  ini.keys("recipients", names);
  for (const auto& name : names) {
    const std::string sec = "recipients." + name;
    check_keys(ini, sec, {"email", "sites", "gets"});
    Recipient r;
    r.name = name;
    r.email = Poco::trim(ini.getString(sec + ".email", ""));
    check_mail_address(sec + ".email", r.email);
    r.sites = lower_list(ini.getString(sec + ".sites", "*"));
    for (const auto& s : r.sites) check_header_text(sec + ".sites", s);
    if (r.sites.empty()) throw ConfigError(sec + ".sites: name at least one site, or *");
    r.gets = lower_list(ini.getString(sec + ".gets", ""));
    if (r.gets.empty()) throw ConfigError(sec + ".gets: list at least one of weekly, fleet, alerts");
    for (const auto& g : r.gets)
      if (std::find(std::begin(kGets), std::end(kGets), g) == std::end(kGets))
        throw ConfigError(sec + ".gets: '" + g + "' is not one of weekly, fleet, alerts");
    c.recipients[name] = r;
  }
  if (!c.recipients.empty() && !m.enabled())
    throw ConfigError("mail.smtp_host: recipients are configured but no SMTP server");
}

std::string mail_config_sample() {
  return "\n; Mail (off while smtp_host is empty). security: starttls, tls or none. The password is the\n"
         "; first line of password_file (keep it readable by the ferrum user only). ca_file: certificate\n"
         "; authorities trusted for TLS (empty: the system's). A message larger than max_mb carries the\n"
         "; summary and the reports' paths instead of the files. A failed attempt is retried after\n"
         "; retry_seconds, doubling up to one hour.\n"
         "[mail]\n"
         "smtp_host =\n"
         "smtp_port = 587\n"
         "security = starttls\n"
         "user =\n"
         "password_file =\n"
         "from =\n"
         "ca_file =\n"
         "subject_prefix = ferrum\n"
         "max_mb = 20\n"
         "retry_seconds = 60\n"
         "\n; Recipients: one section each. gets: any of weekly (the unit reports of their sites), fleet\n"
         "; (the fleet report and its CSV), alerts (at once, for their sites); sites: * or a list.\n"
         "; [recipients.north_planner]\n"
         "; email = planner@example.org\n"
         "; sites = Quillmere, Ostrand Yard\n"
         "; gets = weekly, alerts\n";
}

}  // namespace ferrum::config
