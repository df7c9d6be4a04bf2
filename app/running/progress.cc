#include "app/running/progress.h"

#include <cmath>
#include <cstdio>
#include <sstream>

#include <unistd.h>

namespace locind::app {
namespace {

double Seconds(std::chrono::steady_clock::duration d) {
  return std::chrono::duration<double>(d).count();
}

}  // namespace

bool StderrIsTerminal() { return ::isatty(STDERR_FILENO) == 1; }

Progress::Progress(std::ostream& err, bool terminal, int64_t total, int64_t done, std::string what,
                   double period_seconds)
    : err_(err),
      terminal_(terminal),
      total_(total),
      done_(done),
      done_at_start_(done),
      what_(std::move(what)),
      period_(terminal ? 0.2 : period_seconds),
      start_(std::chrono::steady_clock::now()),
      last_print_(start_) {
  if (terminal_) Print(false);
}

std::string Progress::Duration(double seconds) {
  const int64_t s = static_cast<int64_t>(std::llround(std::max(0.0, seconds)));
  char buffer[32];
  if (s >= 3600) {
    std::snprintf(buffer, sizeof buffer, "%lldh%02lldm", static_cast<long long>(s / 3600),
                  static_cast<long long>(s / 60 % 60));
  } else if (s >= 60) {
    std::snprintf(buffer, sizeof buffer, "%lldm%02llds", static_cast<long long>(s / 60),
                  static_cast<long long>(s % 60));
  } else {
    std::snprintf(buffer, sizeof buffer, "%llds", static_cast<long long>(s));
  }
  return buffer;
}

void Progress::Advance() {
  std::lock_guard<std::mutex> hold(mutex_);
  ++done_;
  const auto now = std::chrono::steady_clock::now();
  if (Seconds(now - last_print_) >= period_) {
    last_print_ = now;
    Print(false);
  }
}

void Progress::Finish() {
  std::lock_guard<std::mutex> hold(mutex_);
  if (finished_) return;
  finished_ = true;
  Print(true);
}

void Progress::Print(bool final) {
  const double elapsed = Seconds(std::chrono::steady_clock::now() - start_);
  const int64_t fresh = done_ - done_at_start_;
  const double percent = total_ > 0 ? 100.0 * static_cast<double>(done_) / static_cast<double>(total_) : 100;
  std::ostringstream line;
  if (terminal_) {
    constexpr int kWidth = 30;
    const int filled = static_cast<int>(kWidth * percent / 100);
    line << "\r[" << std::string(filled, '#') << std::string(kWidth - filled, '.') << "] ";
  }
  line << done_ << "/" << total_ << " " << what_ << " (" << static_cast<int>(percent) << "%), elapsed "
       << Duration(elapsed);
  if (!final && fresh > 0 && done_ < total_) {
    line << ", about " << Duration(elapsed / static_cast<double>(fresh) * static_cast<double>(total_ - done_))
         << " left";
  } else if (!final && done_ < total_) {
    line << ", estimating time left";
  }
  if (terminal_) line << "   ";
  err_ << line.str() << (terminal_ && !final ? "" : "\n") << std::flush;
}

}  // namespace locind::app
