#include "graph/bit_graph.h"

#include <string>

namespace locind::graph {

bool BitGraph::Has(const Edge& e) const {
  return e.kind == EdgeKind::kDirected ? HasDirected(e.from, e.to)
                                       : HasBidirected(e.from, e.to);
}

void BitGraph::Add(const Edge& e) {
  if (e.kind == EdgeKind::kDirected) {
    children[e.from] |= Bit(e.to);
    parents[e.to] |= Bit(e.from);
  } else {
    siblings[e.from] |= Bit(e.to);
    siblings[e.to] |= Bit(e.from);
  }
}

void BitGraph::Remove(const Edge& e) {
  if (e.kind == EdgeKind::kDirected) {
    children[e.from] &= ~Bit(e.to);
    parents[e.to] &= ~Bit(e.from);
  } else {
    siblings[e.from] &= ~Bit(e.to);
    siblings[e.to] &= ~Bit(e.from);
  }
}

Status NodeLimitError(const char* operation, int nodes, int limit) {
  return Status::Error(std::string(operation) + " is exact only up to " + std::to_string(limit) +
                       " nodes; this graph has " + std::to_string(nodes));
}

Result<BitGraph> ToBitGraph(const Dmg& g) {
  if (g.size() > kMaxBitGraphNodes) {
    return NodeLimitError("mu-separation", g.size(), kMaxBitGraphNodes);
  }
  BitGraph out(g.size());
  for (const Edge& e : ListEdges(g)) out.Add(e);
  return out;
}

std::vector<Edge> ListEdges(const BitGraph& g) {
  std::vector<Edge> out;
  for (int a = 0; a < g.n; ++a) {
    for (int b = 0; b < g.n; ++b) {
      if (g.HasDirected(a, b)) out.push_back({a, b, EdgeKind::kDirected});
    }
  }
  for (int a = 0; a < g.n; ++a) {
    for (int b = a + 1; b < g.n; ++b) {
      if (g.HasBidirected(a, b)) out.push_back({a, b, EdgeKind::kBidirected});
    }
  }
  return out;
}

Dmg ToDmg(const BitGraph& g, const std::vector<std::string>& names) {
  Dmg out(names);
  for (const Edge& e : ListEdges(g)) AddEdge(out, e);
  return out;
}

BitGraph CompleteGraph(int n) {
  BitGraph g(n);
  for (int a = 0; a < n; ++a) {
    for (int b = 0; b < n; ++b) {
      g.Add({a, b, EdgeKind::kDirected});
      if (a < b) g.Add({a, b, EdgeKind::kBidirected});
    }
  }
  return g;
}

}  // namespace locind::graph
