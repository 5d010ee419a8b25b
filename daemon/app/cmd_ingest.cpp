#include <spdlog/spdlog.h>

#include <iostream>

#include "daemon/app/commands_impl.h"
#include "daemon/app/progress_display.h"
#include "daemon/app/site_context.h"
#include "daemon/pipeline/pipeline.h"
#include "daemon/site/site_root.h"

namespace fs = std::filesystem;

namespace ferrum::app {
namespace {

void print_outcome(const ingest::FileOutcome& o) {
  const auto& r = o.receipt;
  std::cout << r.status << "  " << (r.party.empty() ? "-" : r.party) << "/" << r.file;
  if (!r.kind.empty()) std::cout << "  " << r.kind;
  if (r.status == "accepted") std::cout << "  " << r.rows << " rows";
  if (r.status == "rejected") {
    if (!r.reason.empty()) std::cout << "  " << r.reason;
    if (r.problem_count) std::cout << "  " << r.problem_count << " problem(s), first at line " << r.problems.front().line
                                   << ": " << r.problems.front().reason;
  }
  std::cout << "\n";
}

}  // namespace

int cmd_ingest(const Invocation& inv) {
  auto site = open_site(inv, Access::write);
  ingest::Pipeline pipeline(site->root, site->config, *site->store);
  ProgressDisplay progress("", "MB", inv.has("quiet"));
  if (progress.active())
    pipeline.set_progress([&](const std::string& name, std::uint64_t done, std::uint64_t total) {
      if (total == 0) return progress.finish();  // read to its end: the outcome is logged next
      progress.set_what(name);
      progress.update(static_cast<double>(done) / 1e6, static_cast<double>(total) / 1e6);
    });
  bool any_rejected = false;
  for (const auto& o : pipeline.recover()) {
    print_outcome(o);
    any_rejected |= o.receipt.status == "rejected";
  }
  std::vector<fs::path> files;
  if (inv.args.empty()) {
    files = pipeline.waiting_files();
  } else {
    for (const auto& a : inv.args) {
      const fs::path p = fs::absolute(a).lexically_normal();
      const auto rel = p.lexically_relative(site->root.drop());
      if (rel.empty() || *rel.begin() == "..")
        throw UsageError(a + " is not inside " + site->root.drop().string() + "; drop it into a party folder first");
      files.push_back(p);
    }
  }
  for (const auto& f : files) {
    auto o = pipeline.process(f);
    progress.finish();
    if (!o) continue;
    print_outcome(*o);
    any_rejected |= o->receipt.status == "rejected";
    for (const auto& item : o->unsafe_items) spdlog::warn("UNSAFE inspection item reported: {}", item);
  }
  return any_rejected ? kRejected : kOk;
}

int cmd_check(const Invocation& inv) {
  if (inv.args.empty()) throw UsageError("name at least one file to check");
  std::unique_ptr<SiteContext> site;
  const site::SiteRoot root = site::resolve_root(inv.get("root"));
  std::unique_ptr<store::Store> scratch;
  config::SiteConfig cfg;
  store::Store* store = nullptr;
  const bool have_site = fs::exists(root.config());
  if (have_site) {
    site = open_site(inv, Access::read);
    store = site->store.get();
    cfg = site->config;
  } else {
    if (inv.has("party")) throw UsageError("--party needs a site root with a ferrum.ini");
    scratch = store::open_sqlite_store(":memory:");
    store = scratch.get();
    cfg.parties["(check)"] = config::Party{"(check)", {}, {"*"}};
  }
  ingest::Pipeline pipeline(root, cfg, *store);
  pipeline.set_units_must_exist(have_site);
  bool all_ok = true;
  for (const auto& f : inv.args) {
    const auto r = pipeline.check(f, inv.get("party"));
    all_ok &= r.status != "rejected";
    std::cout << (inv.has("json") ? r.to_json() : r.to_text());
    if (!have_site && !inv.has("json"))
      std::cout << "  (no site root: unit ids were not checked against a register)\n";
    std::cout << "\n";
  }
  return all_ok ? kOk : kRejected;
}

}  // namespace ferrum::app
