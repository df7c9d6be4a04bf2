// ChildProcess: a program run with a conversation on its standard streams.
//
// Unlike RunProgram (app/io/external_program.h: one input, wait, read), the
// caller answers the child line by line while it runs: every line the child
// writes on its standard output is passed to `answer`, whose result (plus a
// newline) is written back to the child's standard input. The program is
// started without a shell (argv[0] searched on PATH), in `folder` as its
// working directory, in a process group of its own; when `time_limit_seconds`
// passes, the whole group is killed (SIGKILL). Standard error is kept (its
// last `kErrTailBytes` bytes).
#pragma once

#include <cstddef>
#include <functional>
#include <string>
#include <vector>

namespace locind::app {

inline constexpr size_t kErrTailBytes = 2000;

struct ChildRequest {
  std::vector<std::string> argv;  // REQUIRES: not empty
  std::string folder;             // working directory; must exist
  double time_limit_seconds = 60;
  // Called for each line of standard output (without its newline); its
  // result is sent back as one line. May be empty: output is then ignored.
  std::function<std::string(const std::string& line)> answer;
};

struct ChildOutcome {
  bool started = false;    // false: could not be started (see message)
  bool timed_out = false;  // killed at the time limit
  int exit_code = -1;      // when it exited
  int signal = 0;          // when a signal ended it (not at the time limit)
  std::string err_tail;    // the last kErrTailBytes of standard error
  std::string message;     // why it could not be started
  double seconds = 0;      // wall-clock time

  // True for a normal exit with code 0.
  bool ok() const { return started && !timed_out && signal == 0 && exit_code == 0; }
  // "exit code 3", "killed by signal 11", "time limit of 2 s passed", ...
  std::string Describe() const;
};

// Runs the child to its end (or the time limit). Never throws for the
// child's behaviour; a failure to create pipes is reported as not started.
ChildOutcome RunChild(const ChildRequest& request);

}  // namespace locind::app
