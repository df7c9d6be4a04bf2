#include "graph/edge.h"

namespace locind::graph {

std::vector<Edge> ListEdges(const Dmg& g) {
  std::vector<Edge> out;
  for (int a = 0; a < g.size(); ++a) {
    for (int b = 0; b < g.size(); ++b) {
      if (g.HasDirected(a, b)) out.push_back({a, b, EdgeKind::kDirected});
    }
  }
  for (int a = 0; a < g.size(); ++a) {
    for (int b = a + 1; b < g.size(); ++b) {
      if (g.HasBidirected(a, b)) out.push_back({a, b, EdgeKind::kBidirected});
    }
  }
  return out;
}

bool HasEdge(const Dmg& g, const Edge& e) {
  return e.kind == EdgeKind::kDirected ? g.HasDirected(e.from, e.to)
                                       : g.HasBidirected(e.from, e.to);
}

void AddEdge(Dmg& g, const Edge& e) {
  if (e.kind == EdgeKind::kDirected) {
    g.AddDirected(e.from, e.to);
  } else {
    g.AddBidirected(e.from, e.to);
  }
}

void RemoveEdge(Dmg& g, const Edge& e) {
  if (e.kind == EdgeKind::kDirected) {
    g.RemoveDirected(e.from, e.to);
  } else {
    g.RemoveBidirected(e.from, e.to);
  }
}

std::string EdgeText(const Dmg& g, const Edge& e) {
  const char* arrow = e.kind == EdgeKind::kDirected ? " -> " : " <-> ";
  return g.name(e.from) + arrow + g.name(e.to);
}

}  // namespace locind::graph
