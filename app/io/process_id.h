// Process ids in data files: which tokens name a process in an event file
// (its process column and '# processes:' line) or a path file (its header).
//
// Rule: any non-empty token of visible characters except ',' and ';' (the
// field and list separators of the CSV files), '"' and '\\' (they would
// break the quoted names of DOT drawings) and whitespace, not starting with
// '#' (a comment line). Numeric ids are ids like any other:
// "17", "003" and "3" are three different processes (compared as text).
// Ids that are not graph-file node names (letters, digits, '_' and '.',
// starting with a letter or '_') are fine for `test` and `learn`, but a
// learned graph printed with them does not read back as a graph file.
#pragma once

#include <string_view>

namespace locind::app {

// True when `id` follows the rule above.
bool IsValidProcessId(std::string_view id);

// The rule in one phrase, for error messages.
inline constexpr char kProcessIdRule[] =
    "a process id is any token without spaces, commas, semicolons, '\"' or '\\', not starting with '#'";

}  // namespace locind::app
