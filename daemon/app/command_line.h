// The command line of `ferrum`: one executable, one subcommand per task.
//
//   ferrum COMMAND [options] [arguments]
//
// Options are parsed by Poco::Util (ferrum_app.cpp); this header holds what
// the commands receive and the table of commands with their help texts.
#pragma once

#include <map>
#include <optional>
#include <string>
#include <vector>

namespace ferrum::app {

// Everything given on the command line, after Poco parsed it.
struct Invocation {
  std::string command;                      // "init", "ingest", ...
  std::vector<std::string> args;            // positional arguments after the command
  std::map<std::string, std::string> options;  // long option name -> value ("" for flags)

  bool has(const std::string& name) const { return options.count(name) > 0; }
  std::string get(const std::string& name, const std::string& fallback = "") const {
    auto it = options.find(name);
    return it == options.end() ? fallback : it->second;
  }
};

struct CommandInfo {
  const char* name;
  const char* synopsis;   // "ferrum ingest --root DIR [FILE...]"
  const char* summary;    // one line
  const char* details;    // paragraph(s) for `ferrum COMMAND --help`
  std::vector<std::string> options;  // long options this command accepts
};

const std::vector<CommandInfo>& commands();
const CommandInfo* find_command(const std::string& name);

// Exit codes. 3 = "not running" for `status`, as the LSB convention says.
enum ExitCode { kOk = 0, kFailed = 1, kUsage = 2, kNotRunning = 3, kRejected = 4 };

// Runs a parsed command. Returns the process exit code.
int run_command(const Invocation& inv);

}  // namespace ferrum::app
