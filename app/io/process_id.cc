#include "app/io/process_id.h"

#include <algorithm>

namespace locind::app {

bool IsValidProcessId(std::string_view id) {
  if (id.empty() || id.front() == '#') return false;
  // Bytes of 0x80 and above are let through (UTF-8 names); the error lines
  // escape any that are not well-formed (app/io/error.h).
  return std::none_of(id.begin(), id.end(), [](char ch) {
    const auto byte = static_cast<unsigned char>(ch);
    return byte <= 0x20 || byte == 0x7f || ch == ',' || ch == ';' || ch == '"' || ch == '\\';
  });
}

}  // namespace locind::app
