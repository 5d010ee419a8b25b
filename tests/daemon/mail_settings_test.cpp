// [mail] and [recipients.NAME]: what is accepted and what is refused when
// ferrum.ini loads. Plumbing and RFC 5321/5322 address syntax; no engineering
// value is checked here, so no published source applies.
#include <gtest/gtest.h>

#include <unistd.h>

#include <filesystem>
#include <fstream>

#include "daemon/config/site_config.h"

namespace fs = std::filesystem;
using namespace ferrum::config;

namespace {

SiteConfig load_text(const std::string& extra) {
  static int n = 0;
  const fs::path p = fs::temp_directory_path() / ("ferrum-mail-" + std::to_string(::getpid()) + "-" + std::to_string(++n) + ".ini");
  std::ofstream(p) << "[party.planning]\nkinds = *\n" << extra;
  try {
    SiteConfig c = load_site_config(p.string());
    fs::remove(p);
    return c;
  } catch (...) {
    fs::remove(p);
    throw;
  }
}

std::string refusal(const std::string& extra) {
  try {
    load_text(extra);
  } catch (const ConfigError& e) {
    return e.what();
  }
  return "";
}

const std::string kMail = "[mail]\nsmtp_host = mail.example.org\nfrom = ferrum@example.org\n";

TEST(MailSettings, OffByDefaultAndDefaults) {
  const SiteConfig c = load_text("");
  EXPECT_FALSE(c.mail.enabled());
  EXPECT_EQ(c.mail.smtp_port, 587);
  EXPECT_EQ(c.mail.security, "starttls");
  EXPECT_EQ(c.mail.max_bytes, 20LL * 1024 * 1024);
  EXPECT_TRUE(c.recipients.empty());
}

TEST(MailSettings, RecipientsWithSitesAndGets) {
  const SiteConfig c = load_text(kMail + "max_mb = 5\n[recipients.anna]\nemail = anna.b+w@north-grid.example.org\n"
                                         "sites = Quillmere, Ostrand Yard\ngets = weekly, alerts\n"
                                         "[recipients.carla]\nemail = carla@example.org\ngets = fleet\n");
  ASSERT_EQ(c.recipients.size(), 2u);
  const Recipient& a = c.recipients.at("anna");
  EXPECT_TRUE(a.serves("QUILLMERE"));
  EXPECT_FALSE(a.serves("Elsewhere"));
  EXPECT_TRUE(a.wants("weekly"));
  EXPECT_FALSE(a.wants("fleet"));
  EXPECT_TRUE(c.recipients.at("carla").serves("anywhere"));  // sites default to *
  EXPECT_EQ(c.mail.max_bytes, 5LL * 1024 * 1024);
}

TEST(MailSettings, HostileOrMalformedValuesAreRefusedNamingTheKey) {
  const std::pair<std::string, std::string> cases[] = {
      {kMail + "[recipients.x]\nemail = a@b.org, c@d.org\ngets = alerts\n", "recipients.x.email"},
      {kMail + "[recipients.x]\nemail = a@b.org\rBcc: c@d.org\ngets = alerts\n", "recipients.x.email"},
      {kMail + "[recipients.x]\nemail = <a@b.org>\ngets = alerts\n", "recipients.x.email"},
      {kMail + "[recipients.x]\nemail = a..b@c.org\ngets = alerts\n", "recipients.x.email"},
      {kMail + "[recipients.x]\nemail = a@b_c.org\ngets = alerts\n", "recipients.x.email"},
      {kMail + "[recipients.x]\nemail = @b.org\ngets = alerts\n", "recipients.x.email"},
      {kMail + "[recipients.x]\nemail = a@b.org\ngets = all\n", "recipients.x.gets"},
      {kMail + "[recipients.x]\nemail = a@b.org\n", "recipients.x.gets"},
      {kMail + "[recipients.x]\nemail = a@b.org\ngets = fleet\ncc = c@d.org\n", "recipients.x.cc"},
      {kMail + "subject_prefix = x\x1b[31m\n", "mail.subject_prefix"},
      {kMail + "security = ssl\n", "mail.security"},
      {kMail + "smtp_port = 0\n", "mail.smtp_port"},
      {kMail + "max_mb = 0\n", "mail.max_mb"},
      {kMail + "user = ferrum\n", "mail.password_file"},
      {kMail + "user = ferrum\npassword_file = /nonexistent/ferrum-password\n", "mail.password_file"},
      {kMail + "smtp_host = a b\n", "mail.smtp_host"},
      {"[mail]\nsmtp_host = mail.example.org\n", "mail.from"},
      {"[mail]\nsmtp_host = mail.example.org\nfrom = ferrum@example.org\rRCPT TO:<x@y.org>\n", "mail.from"},
      {"[recipients.x]\nemail = a@b.org\ngets = alerts\n", "mail.smtp_host"},
  };
  for (const auto& [text, key] : cases) {
    const std::string why = refusal(text);
    EXPECT_NE(why.find(key), std::string::npos) << text << "\n-> " << why;
  }
}

TEST(MailSettings, AddressCheckAcceptsPlainAddressesOnly) {
  EXPECT_NO_THROW(check_mail_address("k", "o'brien@example.org"));
  EXPECT_THROW(check_mail_address("k", "a@b.org\n"), ConfigError);
  EXPECT_THROW(check_mail_address("k", "a@b.org>\r\nRCPT TO:<c@d.org"), ConfigError);
  EXPECT_THROW(check_mail_address("k", "Anna <a@b.org>"), ConfigError);
  EXPECT_THROW(check_mail_address("k", "a@.b.org"), ConfigError);
}

}  // namespace
