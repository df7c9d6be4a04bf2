// What every command handler shares: the usage error it throws, the
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

// Runs `body` and returns its exit code. InputError (or InputErrors) prints
// its own FILE:LINE:COLUMN line (one per problem) and UsageError or an option-parsing error prints
// "locind NAME: message" (then `usage`, when given), all with exit code 2;
// any other exception prints "locind NAME: message" with exit code 1.
int GuardCommand(const std::string& name, std::ostream& err, const std::function<int()>& body,
                 const std::string& usage = "");

}  // namespace locind::app
