// ferrum tables: the standard tables the methods read, their sources and
// audit status, which the site overrides, and an export for review.
#include <Poco/JSON/Array.h>
#include <Poco/JSON/Object.h>
#include <Poco/JSON/Stringifier.h>

#include <filesystem>
#include <iostream>
#include <set>

#include "analytics/standard_tables.h"
#include "daemon/app/commands_impl.h"
#include "daemon/assess/site_tables.h"
#include "daemon/site/atomic_file.h"
#include "daemon/site/site_root.h"

namespace ferrum::app {
namespace {

Poco::JSON::Object::Ptr table_json(const analytics::TableInfo& i) {
  Poco::JSON::Object::Ptr o = new Poco::JSON::Object;
  for (const auto& [key, value] : {std::pair{"file", &i.file}, {"table", &i.id}, {"standard", &i.standard},
                                   {"edition", &i.edition}, {"clause", &i.clause}, {"status", &i.status}})
    o->set(key, *value);
  // Fields a status may leave empty are null.
  for (const auto& [key, value] : {std::pair{"where", &i.where}, {"by", &i.by}, {"when", &i.when}, {"note", &i.note}})
    o->set(key, value->empty() ? Poco::Dynamic::Var() : Poco::Dynamic::Var(*value));
  o->set("site_override", i.site_override);
  o->set("source", i.origin);
  return o;
}

// Writes every table file in force (the site's copy where it is used, else
// the embedded one) into `dir`.
void export_tables(const std::filesystem::path& dir, const std::vector<analytics::TableOverride>& site,
                   const analytics::TableLoad& load) {
  std::filesystem::create_directories(dir);
  std::set<std::string> used;
  for (const auto& i : load.tables->info)
    if (i.site_override) used.insert(i.file);
  for (const std::string& file : analytics::standard_table_files()) {
    std::string_view text = analytics::embedded_table_text(file);
    for (const auto& o : site)
      if (o.file == file && used.count(file)) text = o.text;
    site::write_file_atomically(dir / file, text);
    std::cout << (dir / file).string() << (used.count(file) ? " (site copy)" : " (embedded)") << "\n";
  }
}

}  // namespace

int cmd_tables(const Invocation& inv) {
  const site::SiteRoot root = site::resolve_root(inv.get("root"));
  const auto site_files = assess::read_site_tables(root);
  const analytics::TableLoad load = analytics::load_standard_tables(site_files);
  if (inv.has("export")) {
    if (inv.get("export").empty()) throw UsageError("--export needs a folder");
    export_tables(inv.get("export"), site_files, load);
  } else if (inv.has("json")) {
    Poco::JSON::Object out;
    Poco::JSON::Array::Ptr tables = new Poco::JSON::Array;
    for (const auto& i : load.tables->info) tables->add(table_json(i));
    out.set("tables", tables);
    Poco::JSON::Array::Ptr refused = new Poco::JSON::Array;
    for (const auto& r : load.refused) {
      Poco::JSON::Object::Ptr o = new Poco::JSON::Object;
      o->set("file", r.shown);
      o->set("line", r.error.line);
      o->set("column", r.error.column);
      o->set("reason", r.error.message);
      refused->add(o);
    }
    out.set("refused", refused);
    Poco::JSON::Stringifier::stringify(out, std::cout, 2);
    std::cout << "\n";
  } else {
    std::string file;
    for (const auto& i : load.tables->info) {
      if (i.file != file) {
        file = i.file;
        std::cout << file << "  " << i.standard << " (" << (i.site_override ? "site copy " + i.origin : "embedded")
                  << ")\n";
      }
      std::cout << "  " << i.id << ": " << i.title() << "\n      " << i.status_text() << "\n";
      if (!i.note.empty()) std::cout << "      note: " << i.note << "\n";
    }
  }
  for (const auto& r : load.refused)
    std::cerr << "ferrum tables: " << r.text() << " (refused; the embedded table stays in force)\n";
  return load.refused.empty() ? kOk : kRejected;
}

}  // namespace ferrum::app
