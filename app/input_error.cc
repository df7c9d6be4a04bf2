#include "app/input_error.h"

#include <sstream>

namespace locind::app {

std::string InputError::ToString() const {
  std::ostringstream out;
  out << file;
  if (line > 0) {
    out << ':' << line;
    if (column > 0) out << ':' << column;
  }
  out << ": ";
  if (!field.empty()) out << field << ": ";
  out << message;
  return out.str();
}

}  // namespace locind::app
