#include "app/io/input_error.h"

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

std::string InputError::ToString() const {
  std::ostringstream out;
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

std::string ToString(const InputErrors& errors) {
  std::string lines;
  for (const InputError& e : errors) {
    if (!lines.empty()) lines += '\n';
    lines += e.ToString();
  }
  return lines;
}

bool AddInputError(InputErrors& errors, InputError e) {
  const std::string file = e.file;
  errors.push_back(std::move(e));
  if (errors.size() < kMaxInputErrors) return false;
  errors.push_back(
      InputError{file, 0, 0, "", "stopped after " + std::to_string(kMaxInputErrors) + " problems"});
  return true;
}

}  // namespace locind::app
