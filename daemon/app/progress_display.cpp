#include "daemon/app/progress_display.h"

#include <unistd.h>

#include <cmath>
#include <cstdio>

namespace ferrum::app {
namespace {

std::string number(double v) {
  char buf[32];
  std::snprintf(buf, sizeof buf, v < 100 && v != std::floor(v) ? "%.1f" : "%.0f", v);
  return buf;
}

std::string duration(double s) {
  char buf[32];
  if (s < 90) std::snprintf(buf, sizeof buf, "%.0f s", s);
  else if (s < 5400) std::snprintf(buf, sizeof buf, "%.0f min", s / 60);
  else std::snprintf(buf, sizeof buf, "%.1f h", s / 3600);
  return buf;
}

}  // namespace

bool is_terminal(int fd) { return ::isatty(fd) == 1; }

std::string progress_line(const std::string& what, double done, double total, const std::string& unit,
                          double elapsed_s) {
  std::string line = what + ": " + number(done);
  if (total > 0) line += "/" + number(total);
  line += " " + unit;
  if (total > 0) line += " (" + std::to_string(static_cast<int>(std::floor(100 * std::min(done, total) / total))) + " %)";
  if (elapsed_s > 0 && done > 0) {
    const double rate = done / elapsed_s;
    line += ", " + number(rate) + " " + unit + "/s";
    if (total > done) line += ", " + duration((total - done) / rate) + " left";
  }
  return line;
}

ProgressDisplay::ProgressDisplay(std::string what, std::string unit, bool quiet)
    : what_(std::move(what)), unit_(std::move(unit)), active_(!quiet && is_terminal(STDERR_FILENO)),
      start_(std::chrono::steady_clock::now()), last_(start_) {}

ProgressDisplay::~ProgressDisplay() { finish(); }

void ProgressDisplay::update(double done, double total) {
  if (!active_) return;
  done_ = done;
  total_ = total;
  const auto now = std::chrono::steady_clock::now();
  if (drawn_ && now - last_ < std::chrono::milliseconds(250) && done < total) return;
  last_ = now;
  const std::string line = progress_line(what_, done, total, unit_, std::chrono::duration<double>(now - start_).count());
  // \r and clear to the end of the line: a shorter line leaves no rest.
  std::fprintf(stderr, "\r%s\033[K", line.c_str());
  std::fflush(stderr);
  drawn_ = true;
}

void ProgressDisplay::finish() {
  if (!active_ || !drawn_) return;
  std::fputc('\n', stderr);
  std::fflush(stderr);
  drawn_ = false;
}

}  // namespace ferrum::app
