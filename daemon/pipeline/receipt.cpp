#include "daemon/pipeline/receipt.h"

#include <Poco/JSON/Array.h>
#include <Poco/JSON/Object.h>
#include <Poco/JSON/Parser.h>
#include <Poco/JSON/Stringifier.h>

#include <cstdio>
#include <filesystem>
#include <sstream>

#include "daemon/ingest/utf8.h"
#include "report/safety_text.h"

namespace ferrum::ingest {
namespace {

// JSON text is UTF-8, but a dropped file's name may be any bytes: bytes that
// are not valid UTF-8 are written as \xNN (as in problem values), so that
// every receipt stays readable by a strict JSON parser.
std::string json_text(std::string_view s) {
  std::string out;
  for (std::size_t i = 0; i < s.size();) {
    const std::size_t n = utf8_sequence_length(s, i);
    if (n > 0) {
      out.append(s.substr(i, n));
      i += n;
      continue;
    }
    char buf[8];
    std::snprintf(buf, sizeof buf, "\\x%02X", static_cast<unsigned char>(s[i]));
    out += buf;
    ++i;
  }
  return out;
}

}  // namespace

std::string Receipt::to_json() const {
  using Poco::JSON::Array;
  using Poco::JSON::Object;
  Object::Ptr o = new Object(Poco::JSON_PRESERVE_KEY_ORDER);
  o->set("file", json_text(file));
  o->set("party", party);
  o->set("sha256", sha256.empty() ? Poco::Dynamic::Var() : Poco::Dynamic::Var(sha256));
  o->set("status", status);
  o->set("kind", kind.empty() ? Poco::Dynamic::Var() : Poco::Dynamic::Var(kind));
  o->set("rows", rows);
  if (rows_new && rows_on_file) {
    o->set("rows_new", *rows_new);
    o->set("rows_already_on_file", *rows_on_file);
  }
  o->set("received_at", received_at);
  o->set("stored_as", json_text(stored_as));
  o->set("reason", reason.empty() ? Poco::Dynamic::Var() : Poco::Dynamic::Var(reason));
  Array::Ptr w = new Array;
  for (const auto& x : warnings) {
    Object::Ptr j = new Object(Poco::JSON_PRESERVE_KEY_ORDER);
    j->set("line", x.first_line);
    j->set("column", x.column);
    j->set("message", x.message);
    j->set("count", x.count);
    Array::Ptr lines = new Array;
    for (const auto n : x.lines) lines->add(n);
    j->set("lines", lines);
    w->add(j);
  }
  o->set("warnings", w);
  Array::Ptr p = new Array;
  for (const auto& x : problems) {
    Object::Ptr j = new Object(Poco::JSON_PRESERVE_KEY_ORDER);
    j->set("line", x.line);
    j->set("column", x.column);
    j->set("column_number", x.column_number);
    j->set("value", x.value);
    j->set("reason", x.reason);
    if (!x.location.empty()) j->set("location", x.location);
    p->add(j);
  }
  o->set("problems", p);
  o->set("problem_count", problem_count);
  Array::Ptr u = new Array;
  for (const auto& x : units) u->add(x);
  o->set("units", u);
  if (!data_from.empty()) {
    Object::Ptr d = new Object(Poco::JSON_PRESERVE_KEY_ORDER);
    d->set("from", data_from);
    d->set("to", data_to);
    o->set("dates", d);
  }
  if (!unsafe_items.empty()) {
    Array::Ptr s = new Array;
    for (const auto& x : unsafe_items) s->add(x);
    o->set("unsafe_items_reported", s);
    o->set("unsafe_alert_sent", unsafe_alerted);
  }
  if (status == "duplicate") {
    Object::Ptr d = new Object(Poco::JSON_PRESERVE_KEY_ORDER);
    d->set("received_at", duplicate_of_received_at);
    d->set("stored_as", json_text(duplicate_of_stored_as));
    o->set("already_imported", d);
  }
  if (!utc_offset_note.empty()) o->set("time_note", utc_offset_note);
  if (!separator_note.empty()) o->set("separator_note", separator_note);
  if (!source_note.empty()) o->set("source_note", source_note);
  if (!subfolder.empty()) o->set("subfolder", json_text(subfolder));
  if (!format_note.empty()) o->set("format_note", format_note);
  if (!work_matched.empty() || !work_not_raised.empty()) {
    Object::Ptr w = new Object(Poco::JSON_PRESERVE_KEY_ORDER);
    Array::Ptr m = new Array, n = new Array;
    for (const auto& x : work_matched) m->add(json_text(x));
    for (const auto& x : work_not_raised) n->add(json_text(x));
    w->set("matched", m);
    w->set("not_raised", n);
    o->set("action_references", w);
  }
  // Receipts go to field crews and labs too: they carry the caution as every
  // other output does.
  o->set("caution", report::one_line_caution());
  std::ostringstream out;
  Poco::JSON::Stringifier::stringify(o, out, 2);
  out << "\n";
  return out.str();
}

Receipt Receipt::from_json(const std::string& json) {
  using Poco::JSON::Array;
  using Poco::JSON::Object;
  Receipt r;
  Poco::JSON::Parser parser;
  const Object::Ptr o = parser.parse(json).extract<Object::Ptr>();
  auto str = [&](const Object::Ptr& obj, const char* k) {
    return obj->has(k) && !obj->isNull(k) ? obj->getValue<std::string>(k) : std::string();
  };
  r.file = str(o, "file");
  r.party = str(o, "party");
  r.sha256 = str(o, "sha256");
  r.status = str(o, "status");
  r.kind = str(o, "kind");
  r.rows = o->optValue<long long>("rows", 0);
  if (o->has("rows_new") && o->has("rows_already_on_file")) {
    r.rows_new = o->getValue<long long>("rows_new");
    r.rows_on_file = o->getValue<long long>("rows_already_on_file");
  }
  r.received_at = str(o, "received_at");
  r.stored_as = str(o, "stored_as");
  r.reason = str(o, "reason");
  r.problem_count = o->optValue<long long>("problem_count", 0);
  r.utc_offset_note = str(o, "time_note");
  r.separator_note = str(o, "separator_note");
  r.source_note = str(o, "source_note");
  r.subfolder = str(o, "subfolder");
  r.format_note = str(o, "format_note");
  if (auto a = o->getArray("problems")) {
    for (std::size_t i = 0; i < a->size(); ++i) {
      auto p = a->getObject(static_cast<unsigned>(i));
      r.problems.push_back({p->optValue<std::int64_t>("line", 0), str(p, "column"), p->optValue<int>("column_number", 0),
                            str(p, "value"), str(p, "reason"), str(p, "location")});
    }
  }
  if (auto a = o->getArray("warnings")) {
    for (std::size_t i = 0; i < a->size(); ++i) {
      auto w = a->getObject(static_cast<unsigned>(i));
      r.warnings.push_back({str(w, "column"), str(w, "message"), w->optValue<std::int64_t>("line", 0),
                            w->optValue<std::int64_t>("count", 1), {}});
      if (auto lines = w->getArray("lines"))
        for (std::size_t k = 0; k < lines->size(); ++k)
          r.warnings.back().lines.push_back(lines->getElement<std::int64_t>(static_cast<unsigned>(k)));
    }
  }
  if (auto a = o->getArray("units"))
    for (std::size_t i = 0; i < a->size(); ++i) r.units.push_back(a->getElement<std::string>(static_cast<unsigned>(i)));
  if (auto a = o->getArray("unsafe_items_reported"))
    for (std::size_t i = 0; i < a->size(); ++i)
      r.unsafe_items.push_back(a->getElement<std::string>(static_cast<unsigned>(i)));
  if (o->has("unsafe_alert_sent")) r.unsafe_alerted = o->getValue<bool>("unsafe_alert_sent");
  if (auto d = o->getObject("dates")) {
    r.data_from = str(d, "from");
    r.data_to = str(d, "to");
  }
  if (auto w = o->getObject("action_references")) {
    if (auto a = w->getArray("matched"))
      for (std::size_t i = 0; i < a->size(); ++i)
        r.work_matched.push_back(a->getElement<std::string>(static_cast<unsigned>(i)));
    if (auto a = w->getArray("not_raised"))
      for (std::size_t i = 0; i < a->size(); ++i)
        r.work_not_raised.push_back(a->getElement<std::string>(static_cast<unsigned>(i)));
  }
  if (auto d = o->getObject("already_imported")) {
    r.duplicate_of_received_at = str(d, "received_at");
    r.duplicate_of_stored_as = str(d, "stored_as");
  }
  return r;
}

std::string Receipt::to_text() const {
  std::ostringstream o;
  o << "ferrum receipt for " << file << "\n\n";
  if (status == "accepted") {
    o << "ACCEPTED: " << rows << " row" << (rows == 1 ? "" : "s") << " of " << kind << " imported.\n";
  } else if (status == "duplicate") {
    o << "ALREADY IMPORTED: the same content was already imported on " << duplicate_of_received_at << " as "
      << std::filesystem::path(duplicate_of_stored_as).filename().string() << ".\nNothing was changed.\n";
  } else {
    o << "REJECTED: nothing from this file was imported.\n";
    if (!reason.empty()) o << reason << "\n";
    if (problem_count > 0) {
      o << problem_count << " problem" << (problem_count == 1 ? "" : "s") << " found";
      if (problem_count > static_cast<long long>(problems.size())) o << " (the first " << problems.size() << " are listed)";
      o << (problem_count == 1 ? ". Correct it" : ". Correct them") << " and drop the whole file again.\n";
    }
  }
  o << "\n  party:       " << party << "\n  received:    " << received_at << " (UTC)\n";
  if (!kind.empty()) o << "  kind:        " << kind << "\n";
  if (!sha256.empty()) o << "  sha256:      " << sha256 << "\n";
  // The site's own path (archive/..., quarantine/...) means nothing to a
  // party, who cannot open it: the text names the copy (the JSON keeps the path).
  o << "  site copy:   " << std::filesystem::path(stored_as).filename().string()
    << (status == "rejected" ? " (kept by the site among its rejected files, unchanged; quote this name when asking "
                               "about the file)\n"
                             : " (kept by the site; quote this name when asking about the file)\n");
  if (!units.empty()) {
    // A rejected file's units: whose results wait until it is corrected.
    o << (status == "rejected" ? "  units held:  " : "  units:       ");
    for (std::size_t i = 0; i < units.size(); ++i) o << (i ? ", " : "") << units[i];
    o << (status == "rejected" ? " (their results in this file are held up until it is corrected)\n" : "\n");
  }
  if (rows_new && rows_on_file) {
    // Rows whose key (unit and date, time, item, ...) an earlier file had
    // delivered: the file corrected or repeated them, and its values stand.
    o << "  rows:        " << *rows_new << " new, ";
    if (*rows_on_file == 0) o << "none already on file\n";
    else
      o << *rows_on_file << " already on file (an earlier file delivered "
        << (*rows_on_file == 1 ? "it" : "them") << "; this file's values now stand)\n";
  }
  if (!data_from.empty())
    o << "  dates:       " << data_from << (data_to != data_from ? " to " + data_to : std::string()) << "\n";
  if (!utc_offset_note.empty()) o << "  times:       " << utc_offset_note << "\n";
  if (!separator_note.empty()) o << "  separator:   " << separator_note << "\n";
  if (!subfolder.empty())
    o << "  dropped in:  " << subfolder << " (a sub-folder of your folder; taken under the name " << file << ")\n";
  if (!source_note.empty()) o << "  read from:   " << source_note << "\n";
  if (!format_note.empty()) o << "  your format: " << format_note << "\n";
  if (!work_matched.empty()) {
    o << "\nActions matched (" << work_matched.size() << "):\n";
    for (const auto& x : work_matched) o << "  " << x << "\n";
  }
  if (!work_not_raised.empty()) {
    o << "\nNot raised by ferrum for the unit now (kept; check the reference against the unit report):\n";
    for (const auto& x : work_not_raised) o << "  " << x << "\n";
  }
  if (!unsafe_items.empty()) {
    // Confirms to the inspector that the rating did not wait for a report,
    // and says so plainly when this import sent no alert.
    if (unsafe_alerted)
      o << "\nRated UNSAFE, reported to the site's planners at once (an alert was raised):\n";
    else
      o << "\nRated UNSAFE (imported by hand with `ferrum ingest`, which raises no alert: tell the site's "
           "planners now):\n";
    for (const auto& item : unsafe_items) o << "  " << item << "\n";
  }
  if (!problems.empty()) {
    o << "\nProblems (line, column: reason [value]):\n";
    for (const auto& p : problems) {
      if (!p.location.empty()) {
        o << "  " << p.location;  // a workbook: row and cell
        if (!p.column.empty()) o << " (" << p.column << ")";
      } else {
        o << "  line " << p.line;
        if (!p.column.empty()) o << ", column " << p.column << " (" << p.column_number << ")";
      }
      o << ": " << p.reason;
      if (!p.value.empty()) o << " [" << p.value << "]";
      o << "\n";
    }
  }
  if (!warnings.empty()) {
    // A rejected file was not taken at all: its warnings are what would
    // still be reported once the problems above are corrected.
    o << (status == "rejected" ? "\nWarnings (these alone would not stop the file):\n"
                               : "\nWarnings (the file was still taken as a whole):\n");
    for (const auto& w : warnings) {
      // The lines it was seen on (the first ones when many), not only the first.
      if (w.lines.size() > 1) {
        o << "  lines ";
        for (std::size_t k = 0; k < w.lines.size(); ++k) o << (k ? ", " : "") << w.lines[k];
        if (w.count > static_cast<long long>(w.lines.size())) o << ", ...";
      } else {
        o << "  line " << w.first_line;
      }
      if (!w.column.empty()) o << ", column " << w.column;
      o << ": " << w.message;
      if (w.count > 1) o << " (" << w.count << " times)";
      o << "\n";
    }
  }
  o << "\n" << report::one_line_caution() << "\n";
  return o.str();
}

}  // namespace ferrum::ingest
