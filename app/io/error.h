// Error: the one error type of the front end.
//
// Every failure a command reports is an Error with a kind: bad input (a
// file's content; "FILE:LINE:COLUMN: FIELD: what was expected", line and
// column 1-based, 0 when unknown), bad usage (a wrong or missing option),
// the file system (cannot create, write or lock), or an internal failure.
// ExitCode is the one mapping from kind to exit status: bad input and bad
// usage 2, file system and internal 1 (documented in README.md). Commands
// throw an Error (or Errors, every problem of one input) and the command
// guard (app/cli/command_guard.h) prints one line per problem.
#pragma once

#include <string>
#include <utility>
#include <vector>

namespace locind::app {

inline constexpr int kExitOk = 0;
inline constexpr int kExitFailure = 1;
inline constexpr int kExitInputError = 2;

enum class ErrorKind { kBadInput, kBadUsage, kFileSystem, kInternal };

// kBadInput, kBadUsage -> kExitInputError (2); kFileSystem, kInternal ->
// kExitFailure (1).
int ExitCode(ErrorKind kind);

struct Error {
  std::string file;
  int line = 0;
  int column = 0;
  std::string field;
  std::string message;
  ErrorKind kind = ErrorKind::kBadInput;

  // One line: "FILE:LINE:COLUMN: FIELD: message" for located problems, the
  // message alone when there is no file; control characters and bytes that
  // are not well-formed UTF-8, in any part, are shown as C escapes (\n, \t,
  // \xNN).
  std::string ToString() const;
};

// Shorthands for an Error of one kind without a file location, thrown as
// `throw UsageError{"--out is missing"}`. A usage error is printed as
// "locind NAME: message"; the others as the message alone.
struct UsageError : Error {
  explicit UsageError(std::string text) : Error{{}, 0, 0, {}, std::move(text), ErrorKind::kBadUsage} {}
};
struct FileSystemError : Error {
  explicit FileSystemError(std::string text)
      : Error{{}, 0, 0, {}, std::move(text), ErrorKind::kFileSystem} {}
};
struct InternalError : Error {
  explicit InternalError(std::string text) : Error{{}, 0, 0, {}, std::move(text), ErrorKind::kInternal} {}
};

// Every problem found in one input, in file order; commands throw it like an
// Error and print one line each.
using Errors = std::vector<Error>;

// Every problem as ToString(), one per line (no newline at the end).
std::string ToString(const Errors& errors);

// Readers that can go on after a bad row stop after this many problems.
inline constexpr size_t kMaxErrors = 20;

// Appends `e` to `errors`; at kMaxErrors problems also appends
// "FILE: stopped after 20 problems" and returns true (stop reading).
bool AddError(Errors& errors, Error e);

}  // namespace locind::app
