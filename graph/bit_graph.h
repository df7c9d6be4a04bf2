// BitGraph: the compact form of a Dmg with at most 64 nodes, one 64-bit mask
// per node for parents, children and siblings. All exact algorithms
// (mu-separation, projection, equivalence classes) run on it.
#pragma once

#include <cstdint>
#include <vector>

#include "graph/dmg.h"
#include "graph/edge.h"
#include "base/status.h"

namespace locind::graph {

using Mask = uint64_t;

inline constexpr int kMaxBitGraphNodes = 64;

inline Mask Bit(int v) { return Mask{1} << v; }
inline bool Contains(Mask set, int v) { return (set >> v) & 1u; }
inline Mask AllNodes(int n) { return n >= 64 ? ~Mask{0} : (Bit(n) - 1); }

struct BitGraph {
  int n = 0;
  std::vector<Mask> parents;   // parents[v]: nodes u with u -> v
  std::vector<Mask> children;  // children[v]: nodes w with v -> w
  std::vector<Mask> siblings;  // siblings[v]: nodes w with v <-> w

  explicit BitGraph(int nodes = 0)
      : n(nodes), parents(nodes, 0), children(nodes, 0), siblings(nodes, 0) {}

  bool HasDirected(int from, int to) const { return Contains(children[from], to); }
  bool HasBidirected(int a, int b) const { return Contains(siblings[a], b); }
  bool Has(const Edge& e) const;
  void Add(const Edge& e);
  void Remove(const Edge& e);
  bool operator==(const BitGraph&) const = default;
};

// Every edge of g in the order of ListEdges(const Dmg&).
std::vector<Edge> ListEdges(const BitGraph& g);

// The graph on n nodes with every directed edge (loops included) and every
// bidirected edge: where a search for a maximal graph starts.
// REQUIRES: 0 <= n <= kMaxBitGraphNodes.
BitGraph CompleteGraph(int n);

// Fails (with the node count and the limit in the message) when g has more
// than 64 nodes.
Result<BitGraph> ToBitGraph(const Dmg& g);

// The Dmg with `names` (REQUIRES: names.size() == g.n) and the edges of g.
Dmg ToDmg(const BitGraph& g, const std::vector<std::string>& names);

// A message for operations refused beyond `limit` nodes.
Status NodeLimitError(const char* operation, int nodes, int limit);

}  // namespace locind::graph
