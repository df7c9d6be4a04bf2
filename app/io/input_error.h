// InputError: one bad-input problem, located in a file.
//
// Every reader reports problems as "FILE:LINE:COLUMN: FIELD: what was
// expected" (line and column 1-based; 0 when unknown), one line each, and the
// program exits with kExitInputError.
#pragma once

#include <string>
#include <vector>

namespace locind::app {

inline constexpr int kExitOk = 0;
inline constexpr int kExitFailure = 1;
inline constexpr int kExitInputError = 2;

struct InputError {
  std::string file;
  int line = 0;
  int column = 0;
  std::string field;
  std::string message;

  // One line: control characters in any part are shown as C escapes.
  std::string ToString() const;
};

// A wrong or missing option; printed as "locind NAME: message", exit 2.
struct UsageError {
  std::string message;
};

// Every problem found in one input, in file order; commands throw it like an
// InputError and print one line each.
using InputErrors = std::vector<InputError>;

// Every problem as ToString(), one per line (no newline at the end).
std::string ToString(const InputErrors& errors);

// Readers that can go on after a bad row stop after this many problems.
inline constexpr size_t kMaxInputErrors = 20;

// Appends `e` to `errors`; at kMaxInputErrors problems also appends
// "FILE: stopped after 20 problems" and returns true (stop reading).
bool AddInputError(InputErrors& errors, InputError e);

}  // namespace locind::app
