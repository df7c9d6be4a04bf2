// Progress of a long run, written to stderr: on a terminal a bar redrawn in
// place with counts, percentage and the estimated time left; otherwise
// (a log file, a batch job) one plain line every `period` seconds and a last
// line at the end.
#pragma once

#include <chrono>
#include <cstdint>
#include <mutex>
#include <ostream>
#include <string>

namespace locind::app {

class Progress {
 public:
  // `done` units are already finished (a resumed run); the estimate counts
  // only units finished by this process.
  Progress(std::ostream& err, bool terminal, int64_t total, int64_t done, std::string what,
           double period_seconds = 10);

  // One more unit finished. Thread-safe.
  void Advance();
  // Prints the final state (once).
  void Finish();

  // "1h02m", "3m05s", "12s".
  static std::string Duration(double seconds);

 private:
  void Print(bool final);

  std::ostream& err_;
  bool terminal_;
  int64_t total_;
  int64_t done_;
  int64_t done_at_start_;
  std::string what_;
  double period_;
  std::chrono::steady_clock::time_point start_;
  std::chrono::steady_clock::time_point last_print_;
  bool finished_ = false;
  std::mutex mutex_;
};

// True when stderr is a terminal.
bool StderrIsTerminal();

}  // namespace locind::app
