#include "daemon/mail/outbox.h"

#include <Poco/JSON/Object.h>
#include <Poco/JSON/Parser.h>
#include <Poco/JSON/Stringifier.h>
#include <Poco/Net/Context.h>
#include <Poco/Net/FilePartSource.h>
#include <Poco/Net/MailMessage.h>
#include <Poco/Net/MailRecipient.h>
#include <Poco/Net/NetException.h>
#include <Poco/Net/RejectCertificateHandler.h>
#include <Poco/Net/SSLManager.h>
#include <Poco/Net/SecureSMTPClientSession.h>
#include <Poco/Net/SecureStreamSocket.h>
#include <Poco/Net/SocketAddress.h>
#include <Poco/Net/StringPartSource.h>
#include <Poco/RandomStream.h>
#include <Poco/String.h>
#include <spdlog/spdlog.h>

#include <algorithm>
#include <fstream>
#include <memory>
#include <mutex>
#include <sstream>

#include "analytics/calendar.h"
#include "daemon/site/atomic_file.h"

namespace fs = std::filesystem;

namespace ferrum::mail {
namespace {

std::string read_text(const fs::path& p) {
  std::ifstream in(p, std::ios::binary);
  std::ostringstream o;
  o << in.rdbuf();
  return o.str();
}

Poco::JSON::Object::Ptr read_state(const fs::path& p) {
  try {
    return Poco::JSON::Parser().parse(read_text(p)).extract<Poco::JSON::Object::Ptr>();
  } catch (const std::exception&) {
    return nullptr;
  }
}

void write_state(const fs::path& p, const Poco::JSON::Object::Ptr& o) {
  std::ostringstream out;
  Poco::JSON::Stringifier::stringify(o, out, 2);
  site::write_file_atomically(p, out.str() + "\n");
}

std::string random_hex(int bytes) {
  Poco::RandomInputStream rnd;
  std::string out;
  static const char* hex = "0123456789abcdef";
  for (int i = 0; i < bytes; ++i) {
    const int c = rnd.get() & 0xff;
    out += hex[c >> 4];
    out += hex[c & 15];
  }
  return out;
}

std::string media_type(const fs::path& p) {
  const std::string ext = Poco::toLower(p.extension().string());
  if (ext == ".pdf") return "application/pdf";
  if (ext == ".csv") return "text/csv";
  return "application/octet-stream";
}

// Moves ID.json and ID.eml from the outbox into `to` (sent/ or failed/).
// The .json goes first: once it has left, the message is no longer waiting.
void file_away(const fs::path& outbox, const std::string& id, const fs::path& to) {
  fs::create_directories(to);
  for (const char* ext : {".json", ".eml"}) {
    const fs::path from = outbox / (id + ext);
    if (fs::exists(from) && !site::move_no_replace(from, to / (id + ext)))
      fs::rename(from, to / (id + "." + random_hex(4) + ext));  // never overwrite an earlier copy
  }
  site::sync_directory(to);
  site::sync_directory(outbox);
}

std::string password_of(const config::MailSettings& s) {
  std::ifstream in(s.password_file);
  if (!in) throw std::runtime_error("cannot read mail.password_file " + s.password_file);
  std::string line;
  std::getline(in, line);
  while (!line.empty() && (line.back() == '\r' || line.back() == '\n')) line.pop_back();
  return line;
}

Poco::Net::Context::Ptr tls_context(const config::MailSettings& s) {
  // The server's certificate is verified against ca_file (or the system's
  // authorities) and its name; a failure refuses the connection, never asks.
  static std::once_flag once;
  std::call_once(once, [] { Poco::Net::initializeSSL(); });
  Poco::Net::Context::Ptr ctx = new Poco::Net::Context(Poco::Net::Context::TLS_CLIENT_USE, "", "", s.ca_file,
                                                       Poco::Net::Context::VERIFY_RELAXED, 9, s.ca_file.empty());
  Poco::SharedPtr<Poco::Net::InvalidCertificateHandler> reject = new Poco::Net::RejectCertificateHandler(false);
  Poco::Net::SSLManager::instance().initializeClient(nullptr, reject, ctx);
  return ctx;
}

// A logged-in session with the site's server. Throws on failure.
std::unique_ptr<Poco::Net::SMTPClientSession> connect(const config::MailSettings& s) {
  using namespace Poco::Net;
  const Poco::Timespan timeout(30, 0);
  std::unique_ptr<SMTPClientSession> session;
  const auto port = static_cast<Poco::UInt16>(s.smtp_port);
  if (s.security == "tls") {
    SecureStreamSocket socket(tls_context(s));
    socket.setPeerHostName(s.smtp_host);
    socket.connect(SocketAddress(s.smtp_host, port), timeout);
    session = std::make_unique<SMTPClientSession>(socket);
  } else if (s.security == "starttls") {
    // Constructed from the host name, so that startTLS checks the
    // certificate against that name.
    auto secure = std::make_unique<SecureSMTPClientSession>(s.smtp_host, port);
    secure->setTimeout(timeout);
    secure->login();
    if (!secure->startTLS(tls_context(s))) throw SMTPException("the server does not offer STARTTLS");
    session = std::move(secure);
  } else {
    StreamSocket socket;
    socket.connect(SocketAddress(s.smtp_host, port), timeout);
    session = std::make_unique<SMTPClientSession>(socket);
  }
  session->setTimeout(timeout);
  if (s.user.empty()) session->login();
  else session->login(SMTPClientSession::AUTH_PLAIN, s.user, password_of(s));
  return session;
}

bool permanent(const Poco::Net::SMTPException& e) { return e.code() >= 500 && e.code() < 600; }

}  // namespace

Outbox::Outbox(site::SiteRoot root) : root_(std::move(root)) {}

fs::path Outbox::dir() const { return root_.root / "outbox"; }

std::string render_message(const config::MailSettings& settings, const OutgoingMail& mail,
                           const std::string& message_id) {
  using namespace Poco::Net;
  MailMessage m;
  m.setSender(settings.from);
  m.addRecipient(MailRecipient(MailRecipient::PRIMARY_RECIPIENT, mail.to));
  m.setSubject(MailMessage::encodeWord(mail.subject, "UTF-8"));
  m.set("Message-ID", message_id);
  // Lines end in CRLF (RFC 5322 2.1; RFC 5321 4.1.1.4 ends DATA lines with
  // CRLF): quoted-printable passes a bare LF through, and a server that
  // splits DATA at CRLF would see one line of the whole summary and refuse it
  // as too long (RFC 5321 4.5.3.1.6).
  std::string body;
  body.reserve(mail.body.size() + mail.body.size() / 32);
  for (std::size_t i = 0; i < mail.body.size(); ++i) {
    const char c = mail.body[i];
    if (c == '\r') continue;  // a CR only ever comes as part of the CRLF written below
    if (c == '\n') body += '\r';
    body += c;
  }
  m.addContent(new StringPartSource(body, "text/plain; charset=UTF-8"), MailMessage::ENCODING_QUOTED_PRINTABLE);
  for (const auto& a : mail.attachments)
    m.addAttachment(a.filename().string(), new FilePartSource(a.string(), media_type(a)));
  std::ostringstream out;
  m.write(out);
  return out.str();
}

bool Outbox::enqueue(const config::MailSettings& settings, const OutgoingMail& mail, std::int64_t now) {
  if (mail.id.empty() || mail.id.find_first_not_of("abcdefghijklmnopqrstuvwxyzABCDEFGHIJKLMNOPQRSTUVWXYZ0123456789-_.") !=
                             std::string::npos || mail.id[0] == '.')
    throw std::invalid_argument("outbox: bad message id '" + mail.id + "'");
  const fs::path d = dir();
  for (const fs::path& place : {d, d / "sent", d / "failed"})
    if (fs::exists(place / (mail.id + ".json"))) return false;
  fs::create_directories(d);
  const std::string domain = settings.from.substr(settings.from.rfind('@') + 1);
  const std::string message_id = "<" + mail.id + "." + random_hex(6) + "@" + domain + ">";
  site::write_file_atomically(d / (mail.id + ".eml"), render_message(settings, mail, message_id));
  Poco::JSON::Object::Ptr st = new Poco::JSON::Object(Poco::JSON_PRESERVE_KEY_ORDER);
  st->set("id", mail.id);
  st->set("message_id", message_id);
  st->set("to", mail.to);
  st->set("from", settings.from);
  st->set("subject", mail.subject);
  st->set("queued_at", analytics::format_utc(now));
  st->set("attempts", 0);
  st->set("next_attempt", static_cast<Poco::Int64>(now));
  st->set("last_error", "");
  write_state(d / (mail.id + ".json"), st);
  spdlog::info("mail {} to {} queued ({})", mail.id, mail.to, message_id);
  return true;
}

namespace {

struct Waiting {
  std::string id;
  fs::path state_path;
  Poco::JSON::Object::Ptr state;
};

std::vector<Waiting> waiting_messages(const fs::path& d) {
  std::vector<Waiting> out;
  if (!fs::is_directory(d)) return out;
  for (const auto& e : fs::directory_iterator(d)) {
    if (!e.is_regular_file() || e.path().extension() != ".json" || e.path().filename().string()[0] == '.') continue;
    Waiting w{e.path().stem().string(), e.path(), read_state(e.path())};
    if (w.state) out.push_back(std::move(w));
    else spdlog::error("outbox: {} is unreadable; left in place", e.path().string());
  }
  std::sort(out.begin(), out.end(), [](const Waiting& a, const Waiting& b) {
    return a.state->getValue<std::string>("queued_at") + a.id < b.state->getValue<std::string>("queued_at") + b.id;
  });
  return out;
}

void note_failure(Waiting& w, const std::string& error, std::int64_t now, int retry_seconds) {
  const int attempts = w.state->getValue<int>("attempts") + 1;
  const std::int64_t backoff =
      std::min<std::int64_t>(3600, static_cast<std::int64_t>(retry_seconds) << std::min(attempts - 1, 12));
  w.state->set("attempts", attempts);
  w.state->set("next_attempt", static_cast<Poco::Int64>(now + backoff));
  w.state->set("last_error", error);
  w.state->set("last_attempt", analytics::format_utc(now));
  write_state(w.state_path, w.state);
  spdlog::warn("mail {} to {} not sent (attempt {}): {}; next try in {} s", w.id,
               w.state->getValue<std::string>("to"), attempts, error, backoff);
}

}  // namespace

int Outbox::deliver_due(const config::MailSettings& settings, std::int64_t now) {
  if (!settings.enabled()) return 0;
  const fs::path d = dir();
  std::vector<Waiting> due;
  for (auto& w : waiting_messages(d))
    if (w.state->getValue<Poco::Int64>("next_attempt") <= now) due.push_back(std::move(w));
  if (due.empty()) return 0;
  std::unique_ptr<Poco::Net::SMTPClientSession> session;
  try {
    session = connect(settings);
  } catch (const Poco::Exception& e) {
    // Not the messages' fault (server down, TLS, wrong password): all wait.
    const std::string why = "connecting to " + settings.smtp_host + ":" + std::to_string(settings.smtp_port) +
                            ": " + e.displayText();
    for (auto& w : due) note_failure(w, why, now, settings.retry_seconds);
    return 0;
  } catch (const std::exception& e) {
    for (auto& w : due) note_failure(w, e.what(), now, settings.retry_seconds);
    return 0;
  }
  int sent = 0;
  for (auto& w : due) {
    const std::string to = w.state->getValue<std::string>("to");
    try {
      std::ifstream eml(d / (w.id + ".eml"), std::ios::binary);
      if (!eml) throw std::runtime_error("the message file " + w.id + ".eml is missing");
      Poco::Net::SMTPClientSession::Recipients rcpt{to};
      session->sendAddresses(w.state->getValue<std::string>("from"), rcpt);
      session->sendData();
      session->sendMessage(eml);
      w.state->set("sent_at", analytics::format_utc(now));
      w.state->set("attempts", w.state->getValue<int>("attempts") + 1);
      write_state(w.state_path, w.state);
      file_away(d, w.id, d / "sent");
      ++sent;
      spdlog::info("mail {} to {} sent ({})", w.id, to, w.state->getValue<std::string>("message_id"));
    } catch (const Poco::Net::SMTPException& e) {
      if (permanent(e)) {
        w.state->set("attempts", w.state->getValue<int>("attempts") + 1);
        w.state->set("last_error", e.displayText());
        w.state->set("failed_at", analytics::format_utc(now));
        write_state(w.state_path, w.state);
        file_away(d, w.id, d / "failed");
        spdlog::error("mail {} to {} REJECTED by the server, moved to outbox/failed/: {}", w.id, to, e.displayText());
      } else {
        note_failure(w, e.displayText(), now, settings.retry_seconds);
      }
      try {
        std::string response;
        session->sendCommand("RSET", response);
      } catch (const Poco::Exception&) {
        return sent;  // the connection is gone: the rest waits for the next round
      }
    } catch (const Poco::Exception& e) {
      note_failure(w, e.displayText(), now, settings.retry_seconds);
      return sent;  // the connection broke
    } catch (const std::exception& e) {
      note_failure(w, e.what(), now, settings.retry_seconds);
    }
  }
  try {
    session->close();
  } catch (const Poco::Exception&) {
  }
  return sent;
}

std::int64_t Outbox::seconds_to_next(std::int64_t now) const {
  std::int64_t best = -1;
  for (const auto& w : waiting_messages(dir())) {
    const std::int64_t t = std::max<std::int64_t>(0, w.state->getValue<Poco::Int64>("next_attempt") - now);
    if (best < 0 || t < best) best = t;
  }
  return best;
}

OutboxSummary Outbox::summary() const {
  OutboxSummary s;
  std::string latest_attempt;
  for (const auto& w : waiting_messages(dir())) {
    ++s.waiting;
    if (s.oldest_waiting.empty()) s.oldest_waiting = w.state->getValue<std::string>("queued_at");
    const std::string err = w.state->getValue<std::string>("last_error");
    const std::string at = w.state->has("last_attempt") ? w.state->getValue<std::string>("last_attempt") : "";
    if (!err.empty() && at >= latest_attempt) {
      latest_attempt = at;
      s.last_error = err;
    }
  }
  for (const auto& w : waiting_messages(dir() / "failed")) {
    ++s.failed;
    s.failures.push_back(w.id + " to " + w.state->getValue<std::string>("to") + ": " +
                         w.state->getValue<std::string>("last_error"));
  }
  if (fs::is_directory(dir() / "sent"))
    for (const auto& e : fs::directory_iterator(dir() / "sent")) s.sent += e.path().extension() == ".json";
  return s;
}

}  // namespace ferrum::mail
