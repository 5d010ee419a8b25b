// The Poco application behind `ferrum`. It defines every option once, lets
// Poco parse them, checks that the command accepts them, and hands over to
// run_command(). Being a ServerApplication gives `serve` the --daemon,
// --pidfile and --umask options and orderly termination on SIGTERM/SIGINT.
#pragma once

#include <Poco/Util/ServerApplication.h>

#include "daemon/app/command_line.h"

namespace ferrum::app {

class FerrumApp : public Poco::Util::ServerApplication {
 public:
  FerrumApp();

  // Poco forks for --daemon before it even parses the options, and a child's
  // errors are invisible (docs/implementation-notes.md). So with --daemon this first
  // resolves the root to an absolute path (the child runs in /) and checks
  // that `serve` can start there, printing why not, before handing over to
  // ServerApplication::run.
  int run(int argc, char** argv);

 protected:
  void defineOptions(Poco::Util::OptionSet& options) override;
  void handleOption(const std::string& name, const std::string& value) override;
  int main(const std::vector<std::string>& args) override;

 private:
  void print_help() const;
  Invocation inv_;
  bool help_ = false;
  bool version_ = false;
};

}  // namespace ferrum::app
