// What every command handler shares: the
// comma-list splitter for node options, and the guard that turns errors
// into one line on the error stream and an exit code.
#pragma once

#include <functional>
#include <ostream>
#include <string>
#include <vector>

namespace locind::app {

// "a,b,,c" -> {"a", "b", "c"}.
std::vector<std::string> SplitList(const std::string& text);

// Runs `body` and returns its exit code. An Error (or Errors) prints one
// line per problem: located ones as FILE:LINE:COLUMN: FIELD: message, others
// as "locind NAME: message"; the exit code is ExitCode(kind) (app/io/error.h).
// An option-parsing error prints "locind NAME: message" (then `usage`, when
// given), exit 2; any other exception is internal: "locind NAME: message",
// exit 1.
int GuardCommand(const std::string& name, std::ostream& err, const std::function<int()>& body,
                 const std::string& usage = "");

}  // namespace locind::app
