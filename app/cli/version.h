// What `locind --version` prints: the program version, the git commit the
// build was configured from ("unknown" outside a git checkout), the compiler
// and the versions of Eigen, Boost and yaml-cpp it was built against.
#pragma once

#include <string>

namespace locind::app {

// Several lines, each "name: value", ending in a newline; the first is
// "locind VERSION".
std::string VersionText();

}  // namespace locind::app
