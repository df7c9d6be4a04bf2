// The JSON shape for graphs, shared by every command that prints one:
//   {"nodes": ["a", ...],
//    "edges": [{"from": "a", "to": "b", "kind": "directed"|"bidirected",
//               "mark": "solid"|"dashed"}, ...]}
// A bidirected edge appears once; "mark" is "solid" where no class was
// computed.
#pragma once

#include <string>
#include <vector>

#include "graph/dmg.h"
#include "graph/edge.h"

namespace locind::app {

// Escapes a string for a JSON string literal (quotes included).
std::string JsonString(const std::string& s);

// `dashed` lists the edges to mark dashed (may be empty).
std::string GraphJson(const graph::Dmg& g, const std::vector<graph::Edge>& dashed = {});

}  // namespace locind::app
