// Files appear complete or not at all: content is written to a temporary
// name beside the target and renamed over it.
#pragma once

#include <string>

#include "base/status.h"

namespace locind::app {

Status WriteFileAtomically(const std::string& path, const std::string& content);

}  // namespace locind::app
