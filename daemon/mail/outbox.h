// The outbox: mail that loses nothing and is not sent twice by accident.
//
//   ROOT/outbox/ID.eml    the whole message (RFC 5322, attachments included),
//                         with its Message-ID, written atomically first
//   ROOT/outbox/ID.json   its envelope and delivery state (to, from, attempts,
//                         next attempt, last error); written atomically after
//                         the .eml: its presence is what queues the message
//   ROOT/outbox/sent/     both files once the server accepted the message
//   ROOT/outbox/failed/   both files after a permanent rejection (5xx), with
//                         the server's answer in the .json
//
// IDs are chosen by the caller and stable (weekly-2026-W49-anna, alert-...):
// queueing an ID that is already waiting, sent or failed does nothing, so a
// restart that repeats the work after a crash does not send a second copy.
// A message is moved to sent/ only after the server's 250 to its data; a
// crash between the two sends it again at the next start, with the same
// Message-ID (at least once, never lost). Failures that are not the message's
// (server down, 4xx, wrong password) keep it waiting, retried with back-off
// (retry_seconds, doubling, at most one hour), across restarts.
#pragma once

#include <cstdint>
#include <filesystem>
#include <string>
#include <vector>

#include "daemon/config/mail_settings.h"
#include "daemon/site/site_root.h"

namespace ferrum::mail {

struct OutgoingMail {
  std::string id;       // file name stem: letters, digits, '-', '_', '.'
  std::string to;       // one address (validated by the configuration)
  std::string subject;
  std::string body;     // plain text, UTF-8
  std::vector<std::filesystem::path> attachments;
};

struct OutboxSummary {
  int waiting = 0, failed = 0, sent = 0;
  std::string oldest_waiting;      // queued_at of the oldest waiting message
  std::string last_error;          // of the waiting messages, the latest
  std::vector<std::string> failures;  // "ID to ADDRESS: server answer"
};

class Outbox {
 public:
  explicit Outbox(site::SiteRoot root);
  std::filesystem::path dir() const;

  // Queues a message (rendered with its Message-ID now). Returns false when
  // the ID was queued before (waiting, sent or failed): nothing is written.
  bool enqueue(const config::MailSettings& settings, const OutgoingMail& mail, std::int64_t now);

  // Sends every waiting message whose time has come, over one connection.
  // Returns how many the server accepted. Never throws for SMTP or network
  // failures (they are logged and kept in the messages' state).
  int deliver_due(const config::MailSettings& settings, std::int64_t now);

  // Seconds until the next waiting message is due (0: now; -1: none waiting).
  std::int64_t seconds_to_next(std::int64_t now) const;

  OutboxSummary summary() const;

 private:
  site::SiteRoot root_;
};

// Renders a complete message (headers, text body, attachments base64).
std::string render_message(const config::MailSettings& settings, const OutgoingMail& mail,
                           const std::string& message_id);

}  // namespace ferrum::mail
