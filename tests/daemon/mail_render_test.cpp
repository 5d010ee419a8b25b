// The rendered message (daemon/mail/outbox.h render_message): every line ends
// in CRLF and none is longer than SMTP allows, however long the plain-text
// summary is. Plumbing and RFC 5321/5322 syntax; no engineering value is
// checked here, so no published source applies.
#include <gtest/gtest.h>

#include <Poco/Net/QuotedPrintableDecoder.h>

#include <sstream>
#include <string>

#include "daemon/mail/outbox.h"

using namespace ferrum;

TEST(MailRender, EveryLineEndsInCrlfAndIsShortEvenForALongMultiLineSummary) {
  config::MailSettings s;
  s.smtp_host = "127.0.0.1";
  s.from = "ferrum@utility.example";
  mail::OutgoingMail m;
  m.id = "weekly-2026-W49-anna";
  m.to = "anna@quillmere.example";
  m.subject = "ferrum weekly 2026-W49";
  // 60 short lines separated by bare LF, as the planner's week is written,
  // one stray CR, and one line longer than a DATA line may be.
  for (int i = 0; i < 60; ++i) m.body += "  UNIT-" + std::to_string(i) + " (Site): investigate by 2027\n";
  m.body += "stray\rCR\n" + std::string(1500, 'x') + "\n";
  const std::string eml = mail::render_message(s, m, "<weekly-2026-W49-anna.0@utility.example>");
  std::size_t start = 0;
  for (std::size_t i = 0; i < eml.size(); ++i) {
    if (eml[i] == '\n') {
      ASSERT_GT(i, 0u);
      EXPECT_EQ(eml[i - 1], '\r') << "bare LF at byte " << i;
    } else if (eml[i] == '\r') {
      ASSERT_LT(i + 1, eml.size());
      EXPECT_EQ(eml[i + 1], '\n') << "bare CR at byte " << i;
    }
    if (eml.compare(i, 2, "\r\n") == 0) {
      EXPECT_LE(i - start, 998u) << "line at byte " << start;  // RFC 5322 2.1.1
      start = i + 2;
    }
  }
  // The text part reads back as written (line ends aside; the stray CR dropped).
  const std::size_t head = eml.find("text/plain");
  ASSERT_NE(head, std::string::npos);
  const std::size_t from = eml.find("\r\n\r\n", head) + 4;
  const std::size_t to = eml.find("\r\n--", from);
  std::istringstream qp(eml.substr(from, to - from));
  Poco::Net::QuotedPrintableDecoder decoder(qp);
  std::string text;
  for (char c; decoder.get(c);)
    if (c != '\r') text += c;
  EXPECT_NE(text.find("  UNIT-59 (Site): investigate by 2027\n"), std::string::npos);
  EXPECT_NE(text.find("strayCR\n" + std::string(1500, 'x')), std::string::npos);
}
