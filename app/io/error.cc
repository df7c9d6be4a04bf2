#include "app/io/error.h"

#include <cstdio>
#include <sstream>

namespace locind::app {
namespace {

// Length of the well-formed UTF-8 sequence at text[i] (2 to 4 bytes; no
// overlong forms, surrogates or code points above U+10FFFF, following the
// table of well-formed byte sequences in the Unicode Standard, chapter 3,
// table 3-7), or 0 when the bytes there are not one.
size_t Utf8Length(const std::string& text, size_t i) {
  const auto at = [&text](size_t k) { return static_cast<unsigned char>(text[k]); };
  const unsigned char b = at(i);
  size_t n = 0;
  unsigned char low = 0x80, high = 0xbf;  // allowed range of the second byte
  if (b >= 0xc2 && b <= 0xdf) {
    n = 2;
  } else if (b >= 0xe0 && b <= 0xef) {
    n = 3;
    if (b == 0xe0) low = 0xa0;
    if (b == 0xed) high = 0x9f;
  } else if (b >= 0xf0 && b <= 0xf4) {
    n = 4;
    if (b == 0xf0) low = 0x90;
    if (b == 0xf4) high = 0x8f;
  } else {
    return 0;
  }
  if (i + n > text.size() || at(i + 1) < low || at(i + 1) > high) return 0;
  for (size_t k = 2; k < n; ++k) {
    if (at(i + k) < 0x80 || at(i + k) > 0xbf) return 0;
  }
  return n;
}

void PutEscaped(std::ostream& out, unsigned char byte) {
  char escaped[5];
  std::snprintf(escaped, sizeof escaped, "\\x%02x", byte);
  out << escaped;
}

// Control characters (a newline inside a quoted YAML scalar, a NUL byte, an
// escape character quoted back by yaml-cpp) would break the one-line rule or
// the terminal, and bytes that are not UTF-8 (a file in another encoding, a
// binary file) would reach the terminal raw; both are shown as C escapes.
void PutVisible(std::ostream& out, const std::string& text) {
  for (size_t i = 0; i < text.size(); ++i) {
    const char ch = text[i];
    const auto byte = static_cast<unsigned char>(ch);
    if (ch == '\n') {
      out << "\\n";
    } else if (ch == '\t') {
      out << "\\t";
    } else if (byte < 0x20 || byte == 0x7f) {
      PutEscaped(out, byte);
    } else if (byte < 0x80) {
      out << ch;
    } else if (const size_t n = Utf8Length(text, i); n > 0) {
      out << text.substr(i, n);
      i += n - 1;
    } else {
      PutEscaped(out, byte);
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
