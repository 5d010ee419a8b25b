// Progress of a long command on standard error: "what: done/total (pct),
// rate, time left", redrawn in place at most four times a second. Shown only
// when standard error is a terminal and --quiet was not given, so that
// scripts, pipes and log files see nothing of it. Hand-written: no library
// in the stack draws a progress line, and it is a few lines of text.
#pragma once

#include <chrono>
#include <string>

namespace ferrum::app {

class ProgressDisplay {
 public:
  // `unit` names what is counted ("units", "MB"); `quiet` silences it.
  ProgressDisplay(std::string what, std::string unit, bool quiet);
  ~ProgressDisplay();
  ProgressDisplay(const ProgressDisplay&) = delete;
  ProgressDisplay& operator=(const ProgressDisplay&) = delete;

  bool active() const { return active_; }
  void set_what(std::string what) { what_ = std::move(what); }
  // Redraws when a quarter of a second passed since the last line (or at the end).
  void update(double done, double total);
  // Ends the line (the last state stays on screen).
  void finish();

 private:
  std::string what_, unit_;
  bool active_ = false, drawn_ = false;
  std::chrono::steady_clock::time_point start_, last_;
  double done_ = 0, total_ = 0;
};

// The progress line (no carriage return), e.g.
// "load.csv: 12.3/34.0 MB (36 %), 8.1 MB/s, 3 s left". Pure, for tests.
std::string progress_line(const std::string& what, double done, double total, const std::string& unit,
                          double elapsed_s);

// True when `fd` is a terminal.
bool is_terminal(int fd);

}  // namespace ferrum::app
