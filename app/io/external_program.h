// Running an outside program (gnuplot, chromium) and collecting its output.
#pragma once

#include <string>
#include <vector>

#include "base/status.h"

namespace locind::app {

struct ProgramOutput {
  int exit_code = 0;
  std::string out;  // standard output
  std::string err;  // standard error
};

// Runs argv[0] (searched on PATH) with `input` on its standard input and
// waits for it. Fails when the program cannot be started or is killed by a
// signal; a non-zero exit code is returned, not an error.
// REQUIRES: argv is not empty.
Result<ProgramOutput> RunProgram(const std::vector<std::string>& argv, const std::string& input = "");

}  // namespace locind::app
