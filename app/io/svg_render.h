// SVG rendering of DOT text with the Graphviz library (dot layout).
#pragma once

#include <string>

#include "base/status.h"

namespace locind::app {

// The SVG document for `dot`, or an error when Graphviz rejects it.
Result<std::string> RenderSvg(const std::string& dot);

}  // namespace locind::app
