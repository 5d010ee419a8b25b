#include "daemon/assess/ranking_cache.h"

#include <Poco/DigestEngine.h>
#include <Poco/JSON/Parser.h>
#include <Poco/SHA2Engine.h>

#include <filesystem>
#include <fstream>
#include <sstream>

#include "daemon/assess/site_tables.h"
#include "daemon/site/atomic_file.h"

namespace ferrum::assess {
namespace {

namespace fs = std::filesystem;
using Poco::JSON::Array;
using Poco::JSON::Object;

fs::path cache_file(const site::SiteRoot& root) { return root.root / "cache" / "ranking-inputs.json"; }

std::string file_text(const fs::path& p) {
  std::ifstream in(p, std::ios::binary);
  std::ostringstream s;
  s << in.rdbuf();
  return s.str();
}

// Size and modification time of the running executable: any rebuild or
// upgrade (other methods, other defaults) changes them.
std::string executable_identity() {
  std::error_code ec;
  const fs::path exe = fs::read_symlink("/proc/self/exe", ec);
  if (ec) return "unknown";
  const auto size = fs::file_size(exe, ec);
  const auto time = fs::last_write_time(exe, ec).time_since_epoch().count();
  return exe.string() + ":" + std::to_string(size) + ":" + std::to_string(time);
}

template <typename T>
Poco::Dynamic::Var opt(const std::optional<T>& v) {
  return v ? Poco::Dynamic::Var(*v) : Poco::Dynamic::Var();
}

template <typename T>
std::optional<T> get_opt(const Object::Ptr& o, const std::string& key) {
  if (!o->has(key) || o->isNull(key)) return std::nullopt;
  return o->getValue<T>(key);
}

Object::Ptr unit_to_json(const analytics::RankingInput& a) {
  Object::Ptr o = new Object;
  o->set("unit_id", a.unit_id);
  o->set("site", a.site);
  o->set("rated_mva", a.rated_mva);
  o->set("criticality", a.criticality);
  o->set("customers_served", opt(a.customers_served));
  o->set("health_index", opt(a.health_index));
  o->set("condition_index", opt(a.condition_index));
  o->set("band", a.band);
  o->set("confidence", a.confidence);
  Array::Ptr missing = new Array;
  for (const auto& m : a.missing) missing->add(m);
  o->set("missing", missing);
  o->set("remaining_life_years", opt(a.remaining_life_years));
  o->set("limiting_factor", a.limiting_factor);
  o->set("beyond_horizon", a.beyond_horizon);
  o->set("horizon_years", a.horizon_years);
  o->set("action", a.action);
  o->set("action_year", opt(a.action_year));
  o->set("action_reason", a.action_reason);
  o->set("treats_paper", a.treats_paper);
  if (const auto& f = a.first_action) {
    Object::Ptr x = new Object;
    x->set("priority", f->priority);
    x->set("due", f->due);
    x->set("text", f->text);
    x->set("reason", f->reason);
    x->set("found", f->found);
    x->set("source", f->source);
    x->set("need", f->need);
    x->set("reference", f->reference);
    x->set("outage", f->outage);
    x->set("crew", f->crew);
    x->set("overdue", f->overdue);
    x->set("status", f->status);  // the planners' work status: booked, with its date and note
    x->set("work_date", f->work_date);
    x->set("work_note", f->work_note);
    o->set("first_action", x);
  }
  const auto& in = a.site_inputs;
  Object::Ptr site = new Object;  // what the site view reads (analytics/site_view.h)
  site->set("peak_load_pu", opt(in.peak_load_pu));
  site->set("emergency_load_pu", opt(in.emergency_load_pu));
  site->set("hours_above_normal_cyclic", opt(in.hours_above_normal_cyclic));
  site->set("normal_cyclic_limit_c", in.normal_cyclic_limit_c);
  site->set("hot_spot_from_measured_top_oil", in.hot_spot_from_measured_top_oil);
  site->set("paper_moisture_pct", opt(in.paper_moisture_pct));
  site->set("unsafe_inspection", in.unsafe_inspection);
  site->set("active_arcing", in.active_arcing);
  site->set("c57104_2008_fault_condition", opt(in.c57104_2008_fault_condition));
  o->set("site_inputs", site);
  return o;
}

analytics::RankingInput unit_from_json(const Object::Ptr& o) {
  analytics::RankingInput a;
  a.unit_id = o->getValue<std::string>("unit_id");
  a.site = o->getValue<std::string>("site");
  a.rated_mva = o->getValue<double>("rated_mva");
  a.criticality = o->getValue<int>("criticality");
  a.customers_served = get_opt<int>(o, "customers_served");
  a.health_index = get_opt<double>(o, "health_index");
  a.condition_index = get_opt<double>(o, "condition_index");
  a.band = o->getValue<std::string>("band");
  a.confidence = o->getValue<std::string>("confidence");
  const auto missing = o->getArray("missing");
  for (std::size_t i = 0; missing && i < missing->size(); ++i) a.missing.push_back(missing->getElement<std::string>(i));
  a.remaining_life_years = get_opt<double>(o, "remaining_life_years");
  a.limiting_factor = o->getValue<std::string>("limiting_factor");
  a.beyond_horizon = o->getValue<bool>("beyond_horizon");
  a.horizon_years = o->getValue<double>("horizon_years");
  a.action = o->getValue<std::string>("action");
  a.action_year = get_opt<int>(o, "action_year");
  a.action_reason = o->getValue<std::string>("action_reason");
  a.treats_paper = o->optValue<bool>("treats_paper", false);
  if (const auto x = o->getObject("first_action")) {
    analytics::Action f;
    f.priority = x->getValue<int>("priority");
    f.due = x->getValue<analytics::Day>("due");
    f.text = x->getValue<std::string>("text");
    f.reason = x->getValue<std::string>("reason");
    f.found = x->optValue<analytics::Day>("found", 0);
    f.source = x->optValue<std::string>("source", "");
    f.need = x->optValue<std::string>("need", "");
    f.reference = x->optValue<std::string>("reference", "");
    f.outage = x->optValue<bool>("outage", false);
    f.crew = x->optValue<std::string>("crew", "");
    f.overdue = x->optValue<bool>("overdue", false);
    f.status = x->optValue<std::string>("status", "");
    f.work_date = x->optValue<analytics::Day>("work_date", 0);
    f.work_note = x->optValue<std::string>("work_note", "");
    a.first_action = std::move(f);
  }
  if (const auto x = o->getObject("site_inputs")) {
    auto& in = a.site_inputs;
    in.peak_load_pu = get_opt<double>(x, "peak_load_pu");
    in.emergency_load_pu = get_opt<double>(x, "emergency_load_pu");
    in.hours_above_normal_cyclic = get_opt<double>(x, "hours_above_normal_cyclic");
    in.normal_cyclic_limit_c = x->getValue<double>("normal_cyclic_limit_c");
    in.hot_spot_from_measured_top_oil = x->getValue<bool>("hot_spot_from_measured_top_oil");
    in.paper_moisture_pct = get_opt<double>(x, "paper_moisture_pct");
    in.unsafe_inspection = x->getValue<bool>("unsafe_inspection");
    in.active_arcing = x->getValue<bool>("active_arcing");
    in.c57104_2008_fault_condition = get_opt<int>(x, "c57104_2008_fault_condition");
  }
  return a;
}

}  // namespace

std::string ranking_cache_key(const site::SiteRoot& root, store::Store& store, analytics::Day as_of) {
  Poco::SHA2Engine engine(Poco::SHA2Engine::SHA_256);
  const auto part = [&](const std::string& s) {
    engine.update(std::to_string(s.size()) + ":");
    engine.update(s);
  };
  part(executable_identity());
  part(file_text(root.config()));
  for (const auto& t : read_site_tables(root)) part(t.file + ":" + t.text);
  const auto newest = store.newest_file_in_database();
  part(!newest ? "no files" : std::to_string(newest->id) + ":" + newest->status);
  part(std::to_string(as_of));
  return Poco::DigestEngine::digestToHex(engine.digest());
}

// The file is one JSON document written one unit per line:
//   {"key":"...","count":N,"units":[
//   {...unit...},
//   {...unit...}
//   ]}
// so that neither side holds the whole document as a Poco tree (at 5,000
// units that tree, not the units, was most of `rank`'s memory). Each unit
// line is parsed on its own; anything else in the file means "assess afresh".
bool read_ranking_cache(const site::SiteRoot& root, const std::string& key,
                        const std::function<void(analytics::RankingInput&&)>& each) {
  try {
    const fs::path p = cache_file(root);
    if (!fs::exists(p)) return false;
    std::ifstream in(p);
    std::string line;
    std::size_t count = 0, read = 0;
    if (!std::getline(in, line)) return false;
    {
      Poco::JSON::Parser parser;
      const auto head = parser.parse(line + "]}").extract<Object::Ptr>();
      if (head->getValue<std::string>("key") != key) return false;
      count = head->getValue<std::size_t>("count");
    }
    while (std::getline(in, line)) {
      if (line == "]}")  // complete: nothing after it, and every unit the head announced
        return !std::getline(in, line) && read == count;
      if (!line.empty() && line.back() == ',') line.pop_back();
      each(ranking_input_of_line(line));
      ++read;
    }
    return false;  // cut short
  } catch (const std::exception&) {  // Poco's exceptions too
    return false;                     // unreadable or of another version: assess afresh
  }
}

std::optional<std::vector<analytics::RankingInput>> read_ranking_cache(const site::SiteRoot& root,
                                                                       const std::string& key) {
  std::vector<analytics::RankingInput> out;
  if (!read_ranking_cache(root, key, [&](analytics::RankingInput&& u) { out.push_back(std::move(u)); }))
    return std::nullopt;
  return out;
}

std::string ranking_input_line(const analytics::RankingInput& unit) {
  std::ostringstream s;
  Poco::JSON::Stringifier::stringify(unit_to_json(unit), s, 0);  // one line: no indent
  return std::move(s).str();
}

analytics::RankingInput ranking_input_of_line(const std::string& line) {
  Poco::JSON::Parser parser;
  return unit_from_json(parser.parse(line).extract<Object::Ptr>());
}

RankingCacheWriter::RankingCacheWriter(const site::SiteRoot& root, const std::string& key, std::size_t count)
    : count_(count) {
  try {
    Object::Ptr head = new Object;
    head->set("key", key);
    head->set("count", count);  // a file cut at a line's end is not taken for a smaller fleet
    std::ostringstream text;
    Poco::JSON::Stringifier::stringify(head, text, 0);
    piece_ = text.str();
    piece_.pop_back();  // the head's closing brace: the units follow
    piece_ += ",\"units\":[\n";
    fs::create_directories(cache_file(root).parent_path());
    file_ = std::make_unique<site::AtomicFileWriter>(cache_file(root));
  } catch (const std::exception&) {
    file_.reset();  // a root the command may not write to: no cache
  }
}

RankingCacheWriter::~RankingCacheWriter() = default;

void RankingCacheWriter::flush() {
  try {
    if (file_) file_->write(piece_);
  } catch (const std::exception&) {
    file_.reset();
  }
  piece_.clear();
}

void RankingCacheWriter::add(const analytics::RankingInput& unit) {
  if (!file_) return;
  try {
    if (added_ > 0) piece_ += ",\n";
    piece_ += ranking_input_line(unit);
    ++added_;
  } catch (const std::exception&) {
    file_.reset();
    return;
  }
  if (piece_.size() >= 64 * 1024) flush();  // some units at a time, not one write per line
}

bool RankingCacheWriter::commit() {
  if (!file_ || added_ != count_) {
    file_.reset();
    return false;
  }
  piece_ += added_ > 0 ? "\n]}\n" : "]}\n";
  flush();
  try {
    if (!file_) return false;
    file_->commit();
    file_.reset();
    return true;
  } catch (const std::exception&) {
    file_.reset();
    return false;
  }
}

bool write_ranking_cache(const site::SiteRoot& root, const std::string& key,
                         const std::vector<analytics::RankingInput>& units) {
  RankingCacheWriter writer(root, key, units.size());
  for (const auto& u : units) writer.add(u);
  return writer.commit();
}

}  // namespace ferrum::assess
