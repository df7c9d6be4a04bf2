// DOT text for a Dmg (formatting only; rendering to SVG lives in app/).
//
// Our visual language: observed nodes are plain ellipses, hidden nodes grey
// dashed boxes; directed edges dark grey with one arrowhead; bidirected edges
// blue with arrowheads at both ends; edges marked dashed (not in every member
// of the class) are drawn dashed. Colours are from the Okabe & Ito (2008)
// colour-blind-safe set.
#pragma once

#include <map>
#include <string>
#include <vector>

#include "graph/dmg.h"
#include "graph/edge.h"

namespace locind::graph {

struct DotOptions {
  std::string title;
  std::vector<int> hidden;               // node indices drawn as hidden
  std::vector<Edge> dashed;              // edges drawn dashed
  std::map<Edge, std::string> color;     // per-edge colour override ("#rrggbb")
  std::vector<Edge> extra;               // edges not in the graph, drawn dotted
  std::vector<Edge> bold;                // edges drawn thicker (graph or extra)
};

std::string ToDot(const Dmg& g, const DotOptions& options = {});

// Quotes a DOT identifier.
std::string DotQuote(const std::string& s);

}  // namespace locind::graph
