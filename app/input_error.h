// InputError: one bad-input problem, located in a file.
//
// Every reader reports problems as "FILE:LINE:COLUMN: FIELD: what was
// expected" (line and column 1-based; 0 when unknown), one line each, and the
// program exits with kExitInputError.
#pragma once

#include <string>

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

  std::string ToString() const;
};

}  // namespace locind::app
