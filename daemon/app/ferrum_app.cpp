#include "daemon/app/ferrum_app.h"

#include <Poco/Util/HelpFormatter.h>
#include <Poco/Util/Option.h>
#include <Poco/Util/OptionSet.h>

#include <algorithm>
#include <filesystem>
#include <iostream>

#include "daemon/app/commands_impl.h"
#include "daemon/site/site_root.h"

namespace ferrum::app {

using Poco::Util::Option;

namespace {

struct OptionDef {
  const char* name;
  const char* argument;  // nullptr for a flag
  const char* help;
};

// Every option of every command. Which command takes which is in commands().
const OptionDef kOptions[] = {
    {"root", "DIR", "site root (default: $FERRUM_ROOT, else the current folder)"},
    {"out", "DIR", "output folder (default: ROOT/reports)"},
    {"json", nullptr, "print JSON"},
    {"csv", nullptr, "print CSV"},
    {"fleet", nullptr, "the fleet report"},
    {"weekly", nullptr, "the weekly bundle: all unit reports and the fleet report in reports/YYYY-Www/"},
    {"from", "DATE", "first day (YYYY-MM-DD)"},
    {"to", "DATE", "last day (YYYY-MM-DD)"},
    {"as-of", "DATE", "assess as of this day instead of today (YYYY-MM-DD)"},
    {"party", "NAME", "check the file as if dropped by this party"},
    {"h2", "PPM", "hydrogen, µL/L"},
    {"ch4", "PPM", "methane, µL/L"},
    {"c2h6", "PPM", "ethane, µL/L"},
    {"c2h4", "PPM", "ethylene, µL/L"},
    {"c2h2", "PPM", "acetylene, µL/L"},
    {"co", "PPM", "carbon monoxide, µL/L"},
    {"co2", "PPM", "carbon dioxide, µL/L"},
    {"o2", "PPM", "oxygen, µL/L"},
    {"n2", "PPM", "nitrogen, µL/L"},
    {"age", "YEARS", "age of the unit in years (IEEE C57.104-2019 tables; default: unknown)"},
    {"hv-kv", "KV", "HV voltage in kV (dga: default 132; ratio: required)"},
    {"once", nullptr, "serve: process what is waiting, render, and exit (for scripts)"},
    {"fresh", nullptr, "rank: assess every unit anew instead of reusing the last whole-fleet assessment"},
    {"quiet", nullptr, "show no progress line on a terminal (ingest, assess, rank, report)"},
    {"lv-kv", "KV", "LV voltage in kV"},
    {"vector-group", "GROUP", "vector group, e.g. Dyn11, YNd1, Yy0, 1ph"},
    {"tap", "N", "tap position"},
    {"tap-positions", "N", "number of tap positions"},
    {"tap-nominal", "N", "the tap position of the nameplate voltage"},
    {"tap-step-pct", "PCT", "HV voltage step per tap position, % of the nameplate HV voltage"},
    {"export", "DIR", "tables: write the table files in force to this folder"},
    {"test", "ADDRESS", "send: a test message to this address"},
    {"budget", "N", "plan: money per year (given twice: two budgets side by side)"},
    {"horizon", "N", "plan: years the plan covers (default [plan] horizon_years, 10)"},
    {"site", "S", "worklist: only this site's actions"},
    {"crew", "C", "worklist: only this crew's actions (oil sampling, thermography, maintenance, ...)"},
};

bool command_accepts(const CommandInfo& c, const std::string& option) {
  return std::find(c.options.begin(), c.options.end(), option) != c.options.end();
}

}  // namespace

FerrumApp::FerrumApp() { setUnixOptions(true); }

void FerrumApp::defineOptions(Poco::Util::OptionSet& options) {
  ServerApplication::defineOptions(options);  // --daemon, --pidfile, --umask
  options.addOption(Option("help", "h", "show help").required(false).repeatable(false));
  options.addOption(Option("version", "", "show the version").required(false).repeatable(false));
  for (const auto& o : kOptions) {
    Option opt(o.name, "", o.help);
    opt.required(false).repeatable(std::string(o.name) == "budget");  // plan compares budgets
    if (o.argument) opt.argument(o.argument);
    options.addOption(opt);
  }
}

void FerrumApp::handleOption(const std::string& name, const std::string& value) {
  // Options are parsed before the daemon changes to /: paths become absolute
  // here. The pidfile is written by `serve` itself once it holds the root lock
  // (Poco's own handler would write it at once, even for a second daemon that
  // is then refused, and delete the first one's file at exit).
  if (name != "pidfile") ServerApplication::handleOption(name, value);
  if (name == "help") help_ = true;
  else if (name == "version") version_ = true;
  else if ((name == "root" || name == "pidfile") && !value.empty())
    inv_.options[name] = std::filesystem::absolute(value).lexically_normal().string();
  else if (name == "budget" && inv_.has("budget")) inv_.options[name] += "\n" + value;  // given again: compared
  else inv_.options[name] = value;
}

int FerrumApp::run(int argc, char** argv) {
  std::vector<std::string> args(argv, argv + argc);
  if (std::find(args.begin(), args.end(), "--daemon") == args.end()) return ServerApplication::run(argc, argv);
  // Same test as Poco's isDaemon(): it forks before parsing anything. Find
  // --root and --pidfile the way Poco will parse them (--name=value or
  // --name value) and make the root explicit and absolute for the child.
  std::string root, pidfile;
  std::vector<std::string> kept;
  auto take = [&](const std::string& flag, std::string& target, std::size_t& i) {
    if (args[i] == flag && i + 1 < args.size()) {
      target = args[++i];
      return true;
    }
    if (args[i].rfind(flag + "=", 0) != 0) return false;
    target = args[i].substr(flag.size() + 1);
    return true;
  };
  for (std::size_t i = 0; i < args.size(); ++i)
    if (i == 0 || (!take("--root", root, i) && !take("--pidfile", pidfile, i))) kept.push_back(args[i]);
  const auto command = std::find_if(kept.begin() + 1, kept.end(), [](const std::string& a) { return a.empty() || a[0] != '-'; });
  if (command == kept.end() || *command != "serve") {
    std::cerr << "ferrum: --daemon applies to 'ferrum serve' only\n";
    return kUsage;
  }
  try {
    root = site::resolve_root(root).root.string();
    if (!pidfile.empty()) pidfile = std::filesystem::absolute(pidfile).lexically_normal().string();
    check_serve_can_start(root, pidfile);
  } catch (const std::exception& e) {
    std::cerr << "ferrum serve: " << e.what() << "\n";
    return kFailed;
  }
  kept.push_back("--root=" + root);
  if (!pidfile.empty()) kept.push_back("--pidfile=" + pidfile);
  std::vector<char*> rewritten;
  for (auto& a : kept) rewritten.push_back(a.data());
  rewritten.push_back(nullptr);
  return ServerApplication::run(static_cast<int>(kept.size()), rewritten.data());
}

void FerrumApp::print_help() const {
  std::cout << "ferrum " << FERRUM_VERSION
            << " - condition assessment of power transformers from dropped inspection, oil-lab,\n"
               "infrared and load files.\n\n"
               "usage: ferrum COMMAND [options] [arguments]\n\ncommands:\n";
  for (const auto& c : commands()) std::cout << "  " << c.name << std::string(10 - std::string(c.name).size(), ' ') << c.summary << "\n";
  std::cout << "\n'ferrum COMMAND --help' tells more about one command. Every command that works on a\n"
               "site takes --root DIR (default: $FERRUM_ROOT, else the current folder).\n"
               "ferrum advises; a qualified engineer decides. Local codes and licensed practice govern.\n";
}

int FerrumApp::main(const std::vector<std::string>& args) {
  if (version_) {
    std::cout << "ferrum " << FERRUM_VERSION << "\n";
    return kOk;
  }
  if (args.empty()) {
    print_help();
    return help_ ? kOk : kUsage;
  }
  inv_.command = args[0];
  inv_.args.assign(args.begin() + 1, args.end());
  const CommandInfo* c = find_command(inv_.command);
  if (!c) {
    std::cerr << "ferrum: unknown command '" << inv_.command << "'; see ferrum --help\n";
    return kUsage;
  }
  if (help_) {
    std::cout << "usage: " << c->synopsis << "\n\n" << c->summary << "\n\n" << c->details << "\n";
    if (!c->options.empty()) {
      std::cout << "\noptions:\n";
      for (const auto& name : c->options)
        for (const auto& o : kOptions)
          if (name == o.name)
            std::cout << "  --" << o.name << (o.argument ? std::string(" ") + o.argument : std::string()) << "\n      "
                      << o.help << "\n";
    }
    return kOk;
  }
  for (const auto& [name, value] : inv_.options) {
    if (!command_accepts(*c, name)) {
      std::cerr << "ferrum " << c->name << ": option --" << name << " does not apply; see ferrum " << c->name
                << " --help\n";
      return kUsage;
    }
  }
  return run_command(inv_);
}

}  // namespace ferrum::app
