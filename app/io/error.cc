#include "app/io/error.h"

#include <cstdio>
#include <sstream>

namespace locind::app {
namespace {

// Control characters (a newline inside a quoted YAML scalar, a NUL byte, an
// escape character quoted back by yaml-cpp) would break the one-line rule or
// the terminal; they are shown as C escapes instead.
void PutVisible(std::ostream& out, const std::string& text) {
  for (const char ch : text) {
    const auto byte = static_cast<unsigned char>(ch);
    if (ch == '\n') {
      out << "\\n";
    } else if (ch == '\t') {
      out << "\\t";
    } else if (byte < 0x20 || byte == 0x7f) {
      char escaped[5];
      std::snprintf(escaped, sizeof escaped, "\\x%02x", byte);
      out << escaped;
    } else {
      out << ch;
    }
  }
}

}  // namespace

int ExitCode(ErrorKind kind) {
  switch (kind) {
    case ErrorKind::kBadInput:
    case ErrorKind::kBadUsage:
      return kExitInputError;
    case ErrorKind::kFileSystem:
    case ErrorKind::kInternal:
      return kExitFailure;
  }
  return kExitFailure;
}

std::string Error::ToString() const {
  std::ostringstream out;
  if (file.empty() && line == 0 && field.empty()) {
    PutVisible(out, message);
    return out.str();
  }
  PutVisible(out, file);
  if (line > 0) {
    out << ':' << line;
    if (column > 0) out << ':' << column;
  }
  out << ": ";
  if (!field.empty()) {
    PutVisible(out, field);
    out << ": ";
  }
  PutVisible(out, message);
  return out.str();
}

std::string ToString(const Errors& errors) {
  std::string lines;
  for (const Error& e : errors) {
    if (!lines.empty()) lines += '\n';
    lines += e.ToString();
  }
  return lines;
}

bool AddError(Errors& errors, Error e) {
  const std::string file = e.file;
  errors.push_back(std::move(e));
  if (errors.size() < kMaxErrors) return false;
  errors.push_back(
      Error{file, 0, 0, "", "stopped after " + std::to_string(kMaxErrors) + " problems"});
  return true;
}

}  // namespace locind::app
