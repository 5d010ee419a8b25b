// The table of commands and the dispatch. Each command's body lives in a
// cmd_*.cpp file of its own.
#include <spdlog/spdlog.h>

#include <iostream>

#include "daemon/app/command_line.h"
#include "daemon/app/commands_impl.h"
#include "daemon/app/logging.h"
#include "daemon/config/site_config.h"
#include "schema/store.h"

namespace ferrum::app {

const std::vector<CommandInfo>& commands() {
  static const std::vector<CommandInfo> all = {
      {"init", "ferrum init --root DIR", "create a site root with a commented default ferrum.ini",
       "Creates ROOT/drop/PARTY/ for each configured party, archive/, quarantine/, reports/, log/,\n"
       "the database ferrum.db, and ferrum.ini with one party, 'planning', allowed every file kind and\n"
       "every site. An existing ferrum.ini is left untouched.",
       {"root"}},
      {"ingest", "ferrum ingest --root DIR [FILE...] [--quiet]", "process the dropped files once and exit",
       "Takes every file waiting in drop/PARTY/ (or the FILEs named, which must be inside a party\n"
       "folder), imports it whole or rejects it whole, moves it to archive/ or quarantine/ and writes\n"
       "its receipt into drop/PARTY/receipts/. Exit status 0 when every file was accepted, 4 when\n"
       "some were rejected, 1 on failure. On a terminal, a large file shows its progress on\n"
       "standard error (--quiet: none).",
       {"root", "quiet"}},
      {"check", "ferrum check [--root DIR] [--party NAME] FILE...",
       "validate files without importing them and print their receipts",
       "For contractors before they drop a file. With a site root, unit ids are checked against\n"
       "its register and --party applies that party's permissions; without one (no ferrum.ini in\n"
       "the root), only the file itself is checked. Nothing is stored or moved. Exit status 0 when\n"
       "every file would be accepted, 4 otherwise.",
       {"root", "party", "json"}},
      {"report", "ferrum report --root DIR (UNIT... | --fleet | --weekly) [--out DIR]",
       "write PDF reports",
       "UNIT...: one PDF per unit (file name ferrum-UNIT-DATE.pdf). --fleet: the fleet report\n"
       "(PDF, ranking CSV, sites CSV). --weekly: every unit report and the fleet report into reports/YYYY-Www/ with\n"
       "an index page, leaving earlier weeks untouched. Default folder: ROOT/reports/. On a\n"
       "terminal, --fleet and --weekly show their progress on standard error (--quiet: none).",
       {"root", "out", "fleet", "weekly", "as-of", "quiet"}},
      {"serve", "ferrum serve --root DIR [--daemon --pidfile FILE]",
       "watch the drop folders, ingest, alert and report until stopped",
       "Runs in the foreground (or as a daemon with --daemon). Watches every party folder, takes\n"
       "complete files, re-renders the reports of the units they change, raises alerts, produces the\n"
       "weekly bundle on schedule, and exits 0 on SIGTERM or SIGINT. SIGHUP reloads ferrum.ini.",
       {"root", "daemon", "pidfile", "umask", "once"}},
      {"status", "ferrum status --root DIR", "tell whether the daemon runs and what it did last",
       "Prints the daemon's pid and uptime, the last import, files waiting, recent rejections, the\n"
       "last and next weekly bundle and open alerts. Exit status 0 running, 3 not running.",
       {"root", "json"}},
      {"assess", "ferrum assess --root DIR [UNIT...] [--json]", "print the assessment of units",
       "One assessment document per unit (all units when none is named): health index, factors,\n"
       "remaining life, gases, oil, paper, thermal, infrared, inspection, actions, missing data.\n"
       "--json prints a JSON array (schema in README.md). With --json or a piped output, progress\n"
       "shows on standard error when it is a terminal (--quiet: none).",
       {"root", "json", "as-of", "quiet"}},
      {"rank", "ferrum rank --root DIR [--json | --csv] [--fresh]", "rank the fleet by risk",
       "Every unit with rank, site, health index, band, remaining life and limiting factor, risk,\n"
       "recommended action and year, and the rated MVA due per year for ten years. Reuses the last\n"
       "whole-fleet assessment (ROOT/cache/) when nothing changed since; --fresh assesses anew,\n"
       "with its progress on standard error when that is a terminal (--quiet: none).",
       {"root", "json", "csv", "as-of", "fresh", "quiet"}},
      {"dga", "ferrum dga --h2 PPM --ch4 PPM ... [--json]", "interpret one gas sample typed on the command line",
       "No database needed. Gases in µL/L (ppm): --h2 --ch4 --c2h6 --c2h4 --c2h2 --co --co2 --o2 --n2.\n"
       "A value written <N or ND means below the detection limit. --age YEARS selects the IEEE\n"
       "C57.104-2019 age row.",
       {"h2", "ch4", "c2h6", "c2h4", "c2h2", "co", "co2", "o2", "n2", "age", "hv-kv", "json"}},
      {"thermal", "ferrum thermal --root DIR UNIT [--from DATE --to DATE] [--csv]",
       "print or export the computed hot-spot series of a unit",
       "Runs the unit's thermal model over its load series and prints one row per step: time,\n"
       "load (per unit), ambient, top-oil and hot-spot temperature (°C), relative ageing rate, and\n"
       "the measured top-oil temperature where one was delivered.",
       {"root", "from", "to", "csv"}},
      {"ratio", "ferrum ratio --hv-kv KV --lv-kv KV --vector-group GROUP [--tap N ...] [--json]",
       "print the expected turns ratio per phase and tap, for a crew on site",
       "No database needed. The phase ratio a turns-ratio test set reads (HV phase winding over LV\n"
       "phase winding: √3·U_HV/U_LV for Dy, U_HV/(√3·U_LV) for Yd, U_HV/U_LV for Yy, Dd and 1ph)\n"
       "with the ±0.5 % band. With --tap-positions, --tap-nominal and --tap-step-pct: every tap (position\n"
       "1 the highest HV voltage), or only --tap N.",
       {"hv-kv", "lv-kv", "vector-group", "tap", "tap-positions", "tap-nominal", "tap-step-pct", "json"}},
      {"tables", "ferrum tables [--root DIR] [--json | --export DIR]",
       "list the standard tables the methods read, their audit status and the site's copies",
       "Every table (standard, edition, table or clause) with its status: unverified, checked against a\n"
       "public reproduction (where), or verified against the licensed standard (by whom, when), and\n"
       "whether the site's corrected copy in ROOT/tables/ is used. A malformed site copy is named with\n"
       "line and column (exit status 4); the embedded table stays in force. --export DIR writes the\n"
       "table files in force to DIR for review.",
       {"root", "json", "export"}},
      {"send", "ferrum send --root DIR (--weekly | --test ADDRESS)", "mail the latest weekly bundle, or a test message",
       "Queues the mail in ROOT/outbox/ and sends it through [mail] smtp_host, unless the daemon runs:\n"
       "then the daemon sends it. --weekly: each recipient's part of the newest reports/YYYY-Www/\n"
       "(a recipient who was sent that week already is not sent it twice). --test ADDRESS: a test\n"
       "message. Exit status 0 when every message was accepted by the server, 1 otherwise (the\n"
       "server's answer is printed; a message not rejected for good stays queued and is retried).",
       {"root", "weekly", "test"}},
      {"plan", "ferrum plan --root DIR [--budget N [--budget N]] [--horizon N] [--json | --csv]",
       "plan replacements and refurbishments year by year under a budget",
       "Per year (ten by default, [plan] horizon_years or --horizon): the units funded with their action,\n"
       "cost and MVA, the money spent, the fleet's risk with the plan, without any plan and with an\n"
       "unlimited budget, and the units deferred with their risk. Budget: --budget N, else [plan]\n"
       "budget_per_year; --budget given twice compares two budgets side by side. Costs from [costs]\n"
       "and the register's replacement_cost and refurbishment_cost. Reuses the last whole-fleet\n"
       "assessment like rank (--fresh: anew).",
       {"root", "json", "csv", "as-of", "fresh", "quiet", "budget", "horizon"}},
      {"worklist", "ferrum worklist --root DIR [--csv | --json] [--site S] [--crew C]",
       "list every open action of the fleet, soonest due first",
       "One row per open action: due date (overdue, or the booking date of a booked action), priority,\n"
       "the date its evidence was found and what it is, whether it needs an outage, the crew, unit,\n"
       "site, action reference (UNIT/need, as quoted in a work-status file) and text. Actions a\n"
       "planner marked done or cancelled are left out until newer evidence raises them again.\n"
       "--site and --crew keep one site's or one crew's actions (any case).",
       {"root", "json", "csv", "as-of", "site", "crew"}},
  };
  return all;
}

const CommandInfo* find_command(const std::string& name) {
  for (const auto& c : commands())
    if (name == c.name) return &c;
  return nullptr;
}

int run_command(const Invocation& inv) {
  init_stderr_logging("warn");
  try {
    if (inv.command == "init") return cmd_init(inv);
    if (inv.command == "ingest") return cmd_ingest(inv);
    if (inv.command == "check") return cmd_check(inv);
    if (inv.command == "report") return cmd_report(inv);
    if (inv.command == "serve") return cmd_serve(inv);
    if (inv.command == "status") return cmd_status(inv);
    if (inv.command == "assess") return cmd_assess(inv);
    if (inv.command == "rank") return cmd_rank(inv);
    if (inv.command == "dga") return cmd_dga(inv);
    if (inv.command == "thermal") return cmd_thermal(inv);
    if (inv.command == "ratio") return cmd_ratio(inv);
    if (inv.command == "tables") return cmd_tables(inv);
    if (inv.command == "send") return cmd_send(inv);
    if (inv.command == "plan") return cmd_plan(inv);
    if (inv.command == "worklist") return cmd_worklist(inv);
  } catch (const UsageError& e) {
    std::cerr << "ferrum " << inv.command << ": " << e.what() << "\n";
    return kUsage;
  } catch (const config::ConfigError& e) {
    std::cerr << "ferrum " << inv.command << ": configuration: " << e.what() << "\n";
    return kFailed;
  } catch (const store::IncompatibleStore& e) {
    std::cerr << "ferrum " << inv.command << ": " << e.what() << "\n";
    return kFailed;
  } catch (const std::exception& e) {
    std::cerr << "ferrum " << inv.command << ": " << e.what() << "\n";
    return kFailed;
  }
  return kUsage;
}

}  // namespace ferrum::app
