#include "daemon/pipeline/pipeline.h"

#include <Poco/Crypto/DigestEngine.h>
#include <fcntl.h>
#include <spdlog/spdlog.h>
#include <sys/stat.h>
#include <unistd.h>

#include <algorithm>
#include <chrono>
#include <cstdio>
#include <fstream>
#include <map>
#include <sstream>

#include "analytics/calendar.h"
#include "daemon/pipeline/held_back_record.h"
#include "daemon/pipeline/import_bridge.h"
#include "daemon/site/atomic_file.h"

namespace fs = std::filesystem;

namespace ferrum::ingest {
namespace {

bool ends_with(const std::string& s, const std::string& suffix) {
  return s.size() >= suffix.size() && s.compare(s.size() - suffix.size(), suffix.size(), suffix) == 0;
}


// A file-system name may be at most 255 bytes; long dropped names are cut
// (keeping the extension) before a hash or ".json" is added.
std::string fit_name(const std::string& name, std::size_t room) {
  if (name.size() <= room) return name;
  const auto dot = name.rfind('.');
  std::string ext = (dot != std::string::npos && name.size() - dot <= 10) ? name.substr(dot) : "";
  std::string stem = name.substr(0, room - ext.size());
  // Never cut inside a UTF-8 sequence.
  while (!stem.empty() && (static_cast<unsigned char>(stem.back()) & 0xC0) == 0x80) stem.pop_back();
  if (!stem.empty() && static_cast<unsigned char>(stem.back()) >= 0xC0) stem.pop_back();
  return stem + ext;
}

// name.csv + hash -> name.3f9a1c2e.csv
std::string stored_name(const std::string& name, const std::string& sha) {
  const std::string tag = sha.empty() ? "unread" : sha.substr(0, 8);
  const std::string fitted = fit_name(name, 200);
  const auto dot = fitted.rfind('.');
  if (dot == std::string::npos || dot == 0) return fitted + "." + tag;
  return fitted.substr(0, dot) + "." + tag + fitted.substr(dot);
}

// Moves without overwriting: name, then name.2, name.3, ...
fs::path move_to_free_name(const fs::path& from, const fs::path& wanted) {
  fs::create_directories(wanted.parent_path());
  if (site::move_no_replace(from, wanted)) return wanted;
  for (int i = 2; i < 10000; ++i) {
    fs::path alt = wanted;
    alt += "." + std::to_string(i);
    if (site::move_no_replace(from, alt)) return alt;
  }
  throw std::runtime_error("no free name for " + wanted.string());
}

// A dropped name as it goes into the log: control characters (a newline in a
// name would forge a log line) written as \xNN.
std::string loggable(const std::string& name) {
  std::string out;
  for (const char ch : name) {
    const auto c = static_cast<unsigned char>(ch);
    if (c < 0x20 || c == 0x7f) {
      char hex[8];
      std::snprintf(hex, sizeof hex, "\\x%02x", c);
      out += hex;
    } else {
      out += ch;
    }
  }
  return out;
}

// Size and modification time of a file: if they differ after the import,
// the file was written to while it was read.
struct FileStamp {
  long long size = -1;
  long long mtime_ns = -1;
  static FileStamp of(const fs::path& p) {
    struct stat st {};
    if (::stat(p.c_str(), &st) != 0) return {};
    return {static_cast<long long>(st.st_size), st.st_mtim.tv_sec * 1000000000LL + st.st_mtim.tv_nsec};
  }
  bool operator==(const FileStamp&) const = default;
};

// What the parse found, into the receipt.
void fill_receipt(Receipt& r, const ImportResult& result, const config::SiteConfig& config) {
  r.kind = result.kind;
  r.rows = result.rows;
  r.rows_new = result.rows_new;
  r.rows_on_file = result.rows_on_file;
  r.problems = result.problems.kept();
  r.problem_count = result.problems.count();
  r.warnings = result.warnings.entries();
  r.reason = result.file_reason;
  if (result.declared_delimiter == '\t')
    r.separator_note = "values separated by tabs, as the file's sep= first line says";
  else if (result.declared_delimiter)
    r.separator_note = std::string("values separated by '") + result.declared_delimiter +
                       "', as the file's sep= first line says";
  r.source_note = result.source_note;
  if (result.first_day) {
    r.data_from = analytics::format_day(*result.first_day);
    r.data_to = analytics::format_day(*result.last_day);
  }
  r.format_note = result.format_note;
  r.work_matched = result.work_matched;
  r.work_not_raised = result.work_not_raised;
  if (result.offset_assumed)
    r.utc_offset_note = "times without a UTC offset were taken as UTC" + config.utc_offset_text + " (site.utc_offset)";
}

}  // namespace

std::int64_t system_clock_now() {
  return std::chrono::duration_cast<std::chrono::seconds>(std::chrono::system_clock::now().time_since_epoch())
      .count();
}

std::string sha256_of_file(const fs::path& path) {
  const int fd = ::open(path.c_str(), O_RDONLY | O_NOFOLLOW | O_CLOEXEC);
  if (fd < 0) throw std::runtime_error("cannot open " + path.string());
  // OpenSSL's SHA-256 through Poco::Crypto (which the Debian Poco packages
  // ship) rather than Poco Foundation's portable SHA2Engine: see README,
  // "Where ferrum writes code by hand" for the measured difference.
  Poco::Crypto::DigestEngine engine("SHA256");
  std::vector<char> buf(1 << 16);
  for (;;) {
    const ssize_t n = ::read(fd, buf.data(), buf.size());
    if (n < 0) {
      if (errno == EINTR) continue;
      ::close(fd);
      throw std::runtime_error("cannot read " + path.string());
    }
    if (n == 0) break;
    engine.update(buf.data(), static_cast<unsigned>(n));
  }
  ::close(fd);
  return Poco::DigestEngine::digestToHex(engine.digest());
}

Pipeline::Pipeline(const site::SiteRoot& root, const config::SiteConfig& config, store::Store& store, Clock clock)
    : root_(root), config_(config), store_(store), clock_(std::move(clock)) {}

bool Pipeline::is_ignored_name(const std::string& name) {
  return name.empty() || name[0] == '.' || ends_with(name, ".part") || ends_with(name, ".tmp") || name == "receipts";
}

std::string Pipeline::now_text() const { return analytics::format_utc(clock_()); }

fs::path Pipeline::destination(const std::string& status, const std::string& name, const std::string& sha,
                               std::int64_t now) const {
  fs::path wanted;
  if (status == "rejected") {
    wanted = root_.quarantine() / stored_name(name, sha);
  } else {
    const auto c = analytics::civil_from_days(analytics::day_of(now));
    char ym[16];
    std::snprintf(ym, sizeof ym, "%04d/%02d", c.year, c.month);
    wanted = root_.archive() / ym / stored_name(name, sha);
  }
  // The record must name the place the file will really have: a taken name
  // (the same file dropped again) gets its .2, .3... here, before the record
  // is written, not at the move. Otherwise the record points at the earlier
  // copy and recover() takes a committed file for an uncommitted one.
  std::error_code ec;
  for (int i = 2; fs::exists(wanted, ec) && i < 10000; ++i) {
    fs::path alt = wanted;
    alt += "." + std::to_string(i);
    if (!fs::exists(alt, ec)) return alt;
  }
  return wanted;
}

std::vector<fs::path> Pipeline::waiting_files() const {
  std::vector<fs::path> out;
  std::error_code ec;
  // Stray files directly in drop/ (rejected: "drop into your party's folder").
  for (const auto& e : fs::directory_iterator(root_.drop(), ec)) {
    if (!e.is_directory(ec) && !is_ignored_name(e.path().filename().string())) out.push_back(e.path());
  }
  for (const auto& e : fs::directory_iterator(root_.drop(), ec)) {
    if (!e.is_directory(ec) || e.is_symlink(ec)) continue;
    std::vector<std::pair<fs::file_time_type, fs::path>> files;
    for (const auto& f : fs::directory_iterator(e.path(), ec)) {
      const std::string name = f.path().filename().string();
      if (is_ignored_name(name)) continue;
      if (f.is_directory(ec) && !f.is_symlink(ec)) continue;
      std::error_code tec;
      files.emplace_back(fs::symlink_status(f.path(), tec).type() == fs::file_type::symlink
                             ? fs::file_time_type::min()
                             : fs::last_write_time(f.path(), tec),
                         f.path());
    }
    add_subfolder_files(e.path(), files);
    std::sort(files.begin(), files.end());
    for (auto& [t, p] : files) out.push_back(p);
  }
  return out;
}

void Pipeline::add_subfolder_files(const fs::path& party_dir,
                                   std::vector<std::pair<fs::file_time_type, fs::path>>& out) {
  std::error_code ec;
  for (const auto& sub : fs::directory_iterator(party_dir, ec)) {
    if (sub.symlink_status(ec).type() != fs::file_type::directory || is_ignored_name(sub.path().filename().string()))
      continue;
    for (auto it = fs::recursive_directory_iterator(sub.path(), ec); !ec && it != fs::recursive_directory_iterator();
         it.increment(ec)) {
      const std::string leaf = it->path().filename().string();
      const bool folder = it->symlink_status(ec).type() == fs::file_type::directory;
      if (is_ignored_name(leaf) || (folder && it.depth() + 2 > kMaxSubfolderDepth)) {
        if (folder) it.disable_recursion_pending();
        continue;
      }
      if (folder) continue;
      std::error_code tec;
      out.emplace_back(fs::last_write_time(it->path(), tec), it->path());
    }
  }
}

std::optional<FileOutcome> Pipeline::process(const fs::path& dropped) {
  const auto started = std::chrono::steady_clock::now();
  std::string name = dropped.filename().string();
  if (is_ignored_name(name)) return std::nullopt;
  struct stat st {};
  if (::lstat(dropped.c_str(), &st) != 0) return std::nullopt;  // gone already
  if (S_ISDIR(st.st_mode)) return std::nullopt;                  // party folders, receipts/: never files

  // Where it is: drop/NAME, drop/PARTY/NAME, or a sub-folder of a party
  // folder (drop/PARTY/SUB/.../NAME: taken under the name SUB_..._NAME).
  fs::path parent = dropped.parent_path();
  std::vector<std::string> folders;
  while (!fs::equivalent(parent, root_.drop())) {
    const std::string folder = parent.filename().string();
    if (folders.size() >= kMaxSubfolderDepth || parent == parent.parent_path() || is_ignored_name(folder))
      return std::nullopt;  // receipts/, hidden folders, or not under drop/ at all
    folders.insert(folders.begin(), folder);
    parent = parent.parent_path();
  }
  const bool in_drop_root = folders.empty();
  const std::string party = in_drop_root ? std::string() : folders.front();
  std::string subfolder;
  for (std::size_t i = 1; i < folders.size(); ++i) subfolder += folders[i] + "/";
  if (!subfolder.empty()) {
    std::string flat = subfolder;
    std::replace(flat.begin(), flat.end(), '/', '_');
    name = flat + name;
  }
  std::optional<FileOutcome> out;
  if (const std::string reason = unread_refusal(st, party); !reason.empty()) {
    out = refuse(dropped, party, name, reason, true);
  } else {
    // Claim it: whoever renames it first owns it.
    const fs::path work_dir = root_.work() / party;
    fs::create_directories(work_dir);
    fs::path claimed = work_dir / name;
    if (!site::move_no_replace(dropped, claimed)) {
      claimed = work_dir / (name + "." + std::to_string(clock_()) + ".claim");
      if (!site::move_no_replace(dropped, claimed)) return std::nullopt;
    }
    out = import_claimed(claimed, party, name, now_text(), subfolder);
  }
  out->seconds = std::chrono::duration<double>(std::chrono::steady_clock::now() - started).count();
  spdlog::info("file {}/{}: {} {} rows={} problems={} in {:.3f}s", party.empty() ? "drop" : party, loggable(name),
               out->receipt.status, out->receipt.kind, out->receipt.rows, out->receipt.problem_count, out->seconds);
  return out;
}

std::string Pipeline::unread_refusal(const struct stat& st, const std::string& party) const {
  if (party.empty()) return "files must be dropped into your party's folder (drop/PARTY/), not into drop/ itself";
  if (!config_.party(party)) return "'" + party + "' is not a party in ferrum.ini; ask the site to add it";
  if (S_ISLNK(st.st_mode)) return "symbolic links are refused unread; drop the file itself";
  if (!S_ISREG(st.st_mode)) return "only regular files are accepted (this is a device, FIFO or socket)";
  if (st.st_nlink > 1) return "hard links are refused unread; drop a copy of the file";
  if (static_cast<long long>(st.st_size) > config_.max_file_bytes)
    return "the file is larger than the site's limit of " + std::to_string(config_.max_file_bytes / (1024 * 1024)) +
           " MB (ingest.max_file_mb); split it";
  return "";
}

FileOutcome Pipeline::refuse(const fs::path& path, const std::string& party, const std::string& name,
                             const std::string& reason, bool unread) {
  FileOutcome out;
  Receipt& r = out.receipt;
  r.file = name;
  r.party = party;
  r.status = "rejected";
  r.received_at = now_text();
  r.reason = reason;
  if (!unread) r.sha256 = sha256_of_file(path);
  const fs::path dest = destination("rejected", name, r.sha256, clock_());
  r.stored_as = fs::relative(dest, root_.root).string();
  store::FileRecord rec{0, r.sha256, party.empty() ? "(none)" : party, name, "", "rejected", 0, 0,
                        r.received_at, r.stored_as, r.to_json()};
  store_.add_file(rec);
  finish(out, path);
  return out;
}

FileOutcome Pipeline::import_claimed(const fs::path& claimed, const std::string& party, const std::string& name,
                                     const std::string& received_at, const std::string& subfolder) {
  FileOutcome out;
  Receipt& r = out.receipt;
  r.file = name;
  r.party = party;
  r.subfolder = subfolder;
  r.received_at = received_at;
  const FileStamp before = FileStamp::of(claimed);
  r.sha256 = sha256_of_file(claimed);
  const std::int64_t now = clock_();

  auto duplicate_of = [&](const store::FileRecord& earlier) {
    r.status = "duplicate";
    r.kind = earlier.kind;
    r.duplicate_of_received_at = earlier.received_at;
    r.duplicate_of_stored_as = earlier.stored_as;
    r.stored_as = fs::relative(destination("duplicate", name, r.sha256, now), root_.root).string();
    store_.add_file({0, r.sha256, party, name, r.kind, "duplicate", 0, 0, received_at, r.stored_as, r.to_json()});
    finish(out, claimed);
    return out;
  };
  if (auto earlier = store_.accepted_file_with_hash(r.sha256)) return duplicate_of(*earlier);

  const config::Party* p = config_.party(party);
  ImportSettings settings;
  settings.party = p;
  settings.config = &config_;
  settings.now = now;
  settings.cancel = cancel_;
  settings.file_name = name;
  ImportResult result;
  store_.begin();
  try {
    // Another root of a shared database may be importing the same content
    // right now: wait for it, then look again (its commit decides).
    store_.hold_content(r.sha256);
    if (auto earlier = store_.accepted_file_with_hash(r.sha256)) {
      store_.rollback();
      return duplicate_of(*earlier);
    }
    store::FileRecord rec{0, r.sha256, party, name, "", "importing", 0, 0, received_at, "", "{}"};
    rec.id = store_.add_file(rec);
    settings.file_id = rec.id;
    std::ifstream in(claimed, std::ios::binary);
    if (!in) throw std::runtime_error("cannot open the claimed file " + claimed.string());
    if (progress_) {
      std::error_code ec;
      const std::uint64_t total = fs::file_size(claimed, ec);
      settings.tick = [this, &in, &name, total] {  // total by value: it ends with this block
        const auto at = in.tellg();
        progress_(name, at < 0 ? total : static_cast<std::uint64_t>(at), total);
      };
    }
    result = import_stream(in, settings, store_);
    if (settings.tick) progress_(name, 0, 0);  // the end of the file's progress
    fill_receipt(r, result, config_);
    // A writer still holding the file open may have appended to it while it
    // was hashed and parsed: the rows would not be those of the stored bytes.
    const bool changed = !(FileStamp::of(claimed) == before);
    if (changed) {
      r.reason = "the file changed while it was being read (was it still being written?); drop it again once it is complete";
      r.sha256 = sha256_of_file(claimed);
    }
    const bool ok = !changed && result.problems.empty() && result.file_reason.empty() && !result.kind.empty();
    if (ok) {
      r.status = "accepted";
      r.units.assign(result.units.begin(), result.units.end());
      r.unsafe_items = result.unsafe_items;
      r.unsafe_alerted = raises_alerts_;
      r.stored_as = fs::relative(destination("accepted", name, r.sha256, now), root_.root).string();
      rec.kind = r.kind;
      rec.status = "accepted";
      rec.rows = r.rows;
      rec.stored_as = r.stored_as;
      rec.receipt_json = r.to_json();
      store_.update_file(rec);
      store_.commit();
    } else {
      store_.rollback();
    }
  } catch (...) {
    store_.rollback();
    throw;  // the file stays in work/ and is retried (disk full, database read-only, ...)
  }
  if (r.status != "accepted") {
    r.status = "rejected";
    // Whose results are held up: the register's units the file names (a
    // unit not in the register holds nothing; the problems name it). A
    // register file's own units are new or updated, so all of them count.
    r.units.clear();
    for (const auto& u : result.named_units)
      if (result.kind == "units_register" || store_.find_unit(u)) r.units.push_back(u);
    r.data_from.clear();  // nothing was taken
    r.data_to.clear();
    r.rows_new.reset();
    r.rows_on_file.reset();
    if (r.reason.empty() && r.problem_count == 0) r.reason = "the file has no usable content";
    r.stored_as = fs::relative(destination("rejected", name, r.sha256, now), root_.root).string();
    store_.add_file({0, r.sha256, party, name, r.kind, "rejected", r.rows, r.problem_count, received_at, r.stored_as,
                     r.to_json()});
    // Newer results this file held back, per unit: the unit report says so.
    record_held_back(store_, result.kind, result.newest_day, received_at, party + "/" + name);
  } else {
    out.units = r.units;
    out.unsafe_items = result.unsafe_items;
  }
  finish(out, claimed);
  return out;
}

void Pipeline::finish(FileOutcome& out, const fs::path& from) {
  const fs::path wanted = root_.root / out.receipt.stored_as;
  const fs::path actual = move_to_free_name(from, wanted);
  if (actual != wanted) {
    // Another file of the same name and content is already there; the
    // record says where this one went.
    out.receipt.stored_as = fs::relative(actual, root_.root).string();
  }
  write_receipt(out.receipt);
}

fs::path Pipeline::receipt_dir(const std::string& party) const {
  // No party folder to answer in: the receipt goes beside the quarantined file.
  if (party.empty() || !config_.party(party)) return root_.quarantine() / "receipts";
  return root_.drop() / party / "receipts";
}

// The receipt of an earlier drop under the same name is kept as NAME.N.txt /
// NAME.N.json (N = 1 for the oldest, then 2, ...), so that the newest is
// always NAME.txt / NAME.json and no answer a party was given is lost.
namespace {
void keep_earlier_receipt(const fs::path& dir, const std::string& name) {
  std::error_code ec;
  const fs::path txt = dir / (name + ".txt"), json = dir / (name + ".json");
  const bool has_txt = fs::exists(txt, ec), has_json = fs::exists(json, ec);
  if (!has_txt && !has_json) return;
  for (int n = 1;; ++n) {
    const std::string base = name + "." + std::to_string(n);
    const fs::path old_txt = dir / (base + ".txt"), old_json = dir / (base + ".json");
    if (fs::exists(old_txt, ec) || fs::exists(old_json, ec)) continue;
    if (has_json) fs::rename(json, old_json);
    if (has_txt) fs::rename(txt, old_txt);
    return;
  }
}
}  // namespace

void Pipeline::write_receipt(const Receipt& r) {
  const fs::path dir = receipt_dir(r.party);
  fs::create_directories(dir);
  keep_earlier_receipt(dir, fit_name(r.file, 240));
  site::write_file_atomically(dir / (fit_name(r.file, 240) + ".txt"), r.to_text());
  site::write_file_atomically(dir / (fit_name(r.file, 240) + ".json"), r.to_json());
}

// A file refused unread gets its row (step 4) before its move into
// quarantine/ (step 5), like every other file: the commit decides, the move
// follows. A crash between the two leaves that row, whose stored_as does not
// exist, and the file still where it was dropped, with no receipt. Taken as a
// new drop it would get a second 'rejected' row; so the move is finished here
// under the first row. Nothing else writes a files row before recover(), so
// such a row can only be the newest one; and the file in its place must still
// be refused for the same reason (a file dropped since under that name is a
// new delivery, left to the watcher).
std::optional<FileOutcome> Pipeline::finish_interrupted_refusal() {
  const auto latest = store_.recent_files(1);
  if (latest.empty()) return std::nullopt;
  const store::FileRecord& rec = latest.front();
  if (rec.status != "rejected" || !rec.sha256.empty() || rec.stored_as.empty()) return std::nullopt;
  const std::string party = rec.party == "(none)" ? std::string() : rec.party;
  const std::string& name = rec.original_name;
  if (name.empty() || fs::path(name).filename() != fs::path(name) || is_ignored_name(name) ||
      (!party.empty() && fs::path(party).filename() != fs::path(party)))
    return std::nullopt;
  std::error_code ec;
  const fs::path wanted = root_.root / rec.stored_as;
  if (fs::symlink_status(wanted, ec).type() != fs::file_type::not_found) return std::nullopt;  // moved already
  // Its receipt written means its move was done (the receipt follows the
  // move): the file was taken out of quarantine/ by hand since.
  if (std::ifstream in{receipt_dir(party) / (fit_name(name, 240) + ".json")}) {
    std::stringstream text;
    text << in.rdbuf();
    try {
      if (Receipt::from_json(text.str()).stored_as == rec.stored_as) return std::nullopt;
    } catch (const std::exception&) {
      // An unreadable receipt: not this row's; finish() below rewrites it.
    }
  }
  const fs::path dropped = (party.empty() ? root_.drop() : root_.drop() / party) / name;
  struct stat st {};
  if (::lstat(dropped.c_str(), &st) != 0 || S_ISDIR(st.st_mode)) return std::nullopt;
  FileOutcome o;
  o.receipt = Receipt::from_json(rec.receipt_json);
  if (o.receipt.reason.empty() || unread_refusal(st, party) != o.receipt.reason) return std::nullopt;
  o.receipt.file = name;
  o.receipt.party = party;
  o.receipt.status = "rejected";
  o.receipt.received_at = rec.received_at;
  o.receipt.stored_as = rec.stored_as;
  finish(o, dropped);
  spdlog::warn("recovered {}/{}: finished the move of a refused file to {} after an interruption",
               party.empty() ? "drop" : party, loggable(name), o.receipt.stored_as);
  return o;
}

std::vector<FileOutcome> Pipeline::recover() {
  std::vector<FileOutcome> out;
  std::error_code ec;
  // First, before any new row: a refusal whose move was interrupted.
  if (auto o = finish_interrupted_refusal()) out.push_back(std::move(*o));
  for (const auto& pdir : fs::directory_iterator(root_.work(), ec)) {
    if (!pdir.is_directory(ec)) continue;
    const std::string party = pdir.path().filename().string();
    for (const auto& f : fs::directory_iterator(pdir.path(), ec)) {
      std::string name = f.path().filename().string();
      if (ends_with(name, ".claim")) {  // work/PARTY/NAME.<time>.claim
        name = name.substr(0, name.size() - 6);
        name = name.substr(0, name.rfind('.'));
      }
      const std::string sha = sha256_of_file(f.path());
      auto rec = store_.latest_file_with_hash(sha);
      if (rec && rec->status != "importing" && !rec->stored_as.empty() && !fs::exists(root_.root / rec->stored_as) &&
          rec->original_name == name) {
        // Committed before the crash; only the move and receipt were left.
        FileOutcome o;
        o.receipt = Receipt::from_json(rec->receipt_json);
        o.receipt.file = name;
        o.receipt.party = party;
        o.receipt.status = rec->status;
        o.receipt.kind = rec->kind;
        o.receipt.rows = rec->rows;
        o.receipt.sha256 = sha;
        o.receipt.received_at = rec->received_at;
        o.receipt.stored_as = rec->stored_as;
        o.receipt.problem_count = rec->problem_count;
        // The units it changed, so that their reports are rendered again.
        if (rec->status == "accepted") o.units = o.receipt.units;
        fs::create_directories((root_.root / rec->stored_as).parent_path());
        const fs::path actual = move_to_free_name(f.path(), root_.root / rec->stored_as);
        if (config_.party(party)) {
          const fs::path dir = root_.drop() / party / "receipts";
          fs::create_directories(dir);
          site::write_file_atomically(dir / (fit_name(name, 240) + ".json"), rec->receipt_json);
          site::write_file_atomically(dir / (fit_name(name, 240) + ".txt"), Receipt::from_json(rec->receipt_json).to_text());
        }
        spdlog::warn("recovered {}/{}: finished the move to {} after an interruption", party, name,
                     fs::relative(actual, root_.root).string());
        out.push_back(std::move(o));
        continue;
      }
      // Never committed: import it again from the start.
      spdlog::warn("recovered {}/{}: the import was interrupted; processing it again", party, loggable(name));
      out.push_back(import_claimed(f.path(), party, name, now_text()));
      const Receipt& r = out.back().receipt;
      spdlog::info("file {}/{}: {} {} rows={} problems={} (after an interruption)", party, loggable(name), r.status,
                   r.kind, r.rows, r.problem_count);
    }
  }
  // A crash between the move and the receipt leaves a file without its
  // receipt: rewrite the receipts of recent files from the database.
  for (const auto& rec : store_.recent_files(200)) {
    if (rec.status == "importing" || !config_.party(rec.party)) continue;
    const fs::path dir = root_.drop() / rec.party / "receipts";
    const fs::path json = dir / (fit_name(rec.original_name, 240) + ".json");
    if (fs::exists(json, ec)) continue;
    try {
      fs::create_directories(dir);
      site::write_file_atomically(json, rec.receipt_json);
      site::write_file_atomically(dir / (fit_name(rec.original_name, 240) + ".txt"),
                                  Receipt::from_json(rec.receipt_json).to_text());
      spdlog::warn("recovered the missing receipt of {}/{}", rec.party, rec.original_name);
    } catch (const std::exception& e) {
      spdlog::error("cannot rewrite the receipt of {}/{}: {}", rec.party, rec.original_name, e.what());
    }
  }
  return out;
}

Receipt Pipeline::check(const fs::path& file, const std::string& party) {
  Receipt r;
  r.file = file.filename().string();
  r.party = party;
  r.received_at = now_text();
  r.status = "rejected";
  struct stat st {};
  if (::lstat(file.c_str(), &st) != 0) {
    r.reason = "no such file";
    return r;
  }
  if (!S_ISREG(st.st_mode)) {
    r.reason = "not a regular file";
    return r;
  }
  r.sha256 = sha256_of_file(file);
  if (auto earlier = store_.accepted_file_with_hash(r.sha256)) {
    r.status = "duplicate";
    r.kind = earlier->kind;
    r.duplicate_of_received_at = earlier->received_at;
    r.duplicate_of_stored_as = earlier->stored_as;
    return r;
  }
  ImportSettings settings;
  settings.party = party.empty() ? nullptr : config_.party(party);
  if (!party.empty() && !settings.party) {
    r.reason = "'" + party + "' is not a party in ferrum.ini";
    return r;
  }
  settings.config = &config_;
  settings.now = clock_();
  settings.units_must_exist = units_must_exist_;
  settings.file_name = r.file;
  // The same import as a real drop, in a transaction that is always rolled
  // back: the answer is exactly the receipt the file would get.
  ImportResult result;
  store_.begin();
  try {
    settings.file_id = store_.add_file({0, r.sha256, party.empty() ? "(check)" : party, r.file, "", "importing", 0, 0,
                                        r.received_at, "", "{}"});
    std::ifstream in(file, std::ios::binary);
    result = import_stream(in, settings, store_);
  } catch (...) {
    store_.rollback();
    throw;
  }
  store_.rollback();
  fill_receipt(r, result, config_);
  r.units.assign(result.units.begin(), result.units.end());
  if (result.problems.empty() && result.file_reason.empty() && !result.kind.empty()) r.status = "accepted";
  if (r.status == "rejected") {
    r.units.assign(result.named_units.begin(), result.named_units.end());
    r.data_from.clear();
    r.data_to.clear();
    r.rows_new.reset();
    r.rows_on_file.reset();
  }
  r.stored_as = "(check only: nothing stored)";
  return r;
}

}  // namespace ferrum::ingest
