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
std::optional<std::vector<analytics::RankingInput>> read_ranking_cache(const site::SiteRoot& root,
                                                                       const std::string& key) {
  try {
    const fs::path p = cache_file(root);
    if (!fs::exists(p)) return std::nullopt;
    std::ifstream in(p);
    std::string line;
    std::size_t count = 0;
    if (!std::getline(in, line)) return std::nullopt;
    {
      Poco::JSON::Parser parser;
      const auto head = parser.parse(line + "]}").extract<Object::Ptr>();
      if (head->getValue<std::string>("key") != key) return std::nullopt;
      count = head->getValue<std::size_t>("count");
    }
    std::vector<analytics::RankingInput> out;
    out.reserve(count);
    while (std::getline(in, line)) {
      if (line == "]}") {  // complete: nothing after it, and every unit the head announced
        if (std::getline(in, line) || out.size() != count) return std::nullopt;
        return out;
      }
      if (!line.empty() && line.back() == ',') line.pop_back();
      Poco::JSON::Parser parser;
      out.push_back(unit_from_json(parser.parse(line).extract<Object::Ptr>()));
    }
    return std::nullopt;  // cut short
  } catch (const std::exception&) {  // Poco's exceptions too
    return std::nullopt;                // unreadable or of another version: assess afresh
  }
}

bool write_ranking_cache(const site::SiteRoot& root, const std::string& key,
                         const std::vector<analytics::RankingInput>& units) {
  try {
    Object::Ptr head = new Object;
    head->set("key", key);
    head->set("count", units.size());  // a file cut at a line's end is not taken for a smaller fleet
    std::ostringstream text;
    Poco::JSON::Stringifier::stringify(head, text, 0);
    std::string head_text = text.str();
    head_text.pop_back();  // the head's closing brace: the units follow
    head_text += ",\"units\":[\n";
    fs::create_directories(cache_file(root).parent_path());
    site::write_file_atomically(cache_file(root), [&](const site::WritePiece& write) {
      std::ostringstream piece;  // some units at a time, not one write per line
      piece << head_text;
      for (std::size_t i = 0; i < units.size(); ++i) {
        Poco::JSON::Stringifier::stringify(unit_to_json(units[i]), piece, 0);  // one line: no indent
        piece << (i + 1 < units.size() ? ",\n" : "\n");
        if (piece.view().size() >= 64 * 1024) {
          write(piece.view());
          piece.str("");
        }
      }
      piece << "]}\n";
      write(piece.view());
    });
    return true;
  } catch (const std::exception&) {
    return false;
  }
}

}  // namespace ferrum::assess
