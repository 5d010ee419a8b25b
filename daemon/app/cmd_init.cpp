#include <iostream>

#include "daemon/app/commands_impl.h"
#include "daemon/app/site_context.h"
#include "daemon/config/site_config.h"
#include "daemon/site/atomic_file.h"
#include "daemon/site/site_root.h"
#include "schema/store.h"

namespace ferrum::app {

int cmd_init(const Invocation& inv) {
  if (!inv.args.empty()) throw UsageError("init takes no arguments (did you mean --root " + inv.args[0] + "?)");
  const site::SiteRoot root = site::resolve_root(inv.get("root"));
  site::create_layout(root);
  const bool had_config = std::filesystem::exists(root.config());
  if (!had_config) site::write_file_atomically(root.config(), config::default_site_config_text());
  const config::SiteConfig cfg = config::load_site_config(root.config().string());
  for (const auto& [name, party] : cfg.parties) std::filesystem::create_directories(root.drop() / name / "receipts");
  open_store(root, cfg);
  std::cout << "site root " << root.root.string() << (had_config ? " (existing ferrum.ini kept)" : "") << "\n"
            << "  configuration  " << root.config().string() << "\n"
            << "  drop files in  " << (root.drop() / "PARTY").string() << "/  (parties:";
  for (const auto& [name, party] : cfg.parties) std::cout << " " << name;
  std::cout << ")\n  database       " << (cfg.store.shared() ? "PostgreSQL, " + cfg.store.postgresql : root.database().string())
            << "\n";
  return kOk;
}

}  // namespace ferrum::app
