// The maximal graph and the equivalence graph of a Markov equivalence class.
//
// Every class of directed mixed graphs has a unique maximal member, a
// supergraph of all members (Mogensen & Hansen 2020, Ann. Statist. 48(1);
// the test suite re-checks uniqueness on every graph with 3 nodes). The equivalence graph is that maximal graph with each edge marked
// solid (in every member) or dashed (missing from some member).
//
// How it is computed (docs/theory.md F2, F4, F5): an absent edge e belongs to the
// maximal graph of G iff G + e has the separations of G, and only pairs that
// no set separates can carry an edge; an edge e of the maximal graph N is
// dashed iff N - e has the separations of N. Each check re-searches only the
// (a, C) that the edge can affect. Exact up to kMaxExactNodes nodes.
#pragma once

#include <vector>

#include "graph/bit_graph.h"
#include "graph/dmg.h"
#include "graph/edge.h"
#include "base/status.h"

namespace locind::graph {

struct EquivalenceGraph {
  BitGraph maximal;
  std::vector<Edge> edges;   // edges of `maximal` in ListEdges order
  std::vector<bool> dashed;  // dashed[i] for edges[i]
};

// Fails beyond kMaxExactNodes nodes.
Result<BitGraph> MaximalGraph(const BitGraph& g);
Result<EquivalenceGraph> ComputeEquivalenceGraph(const BitGraph& g);

// Every member of the class of g (each a subgraph of the maximal graph that
// keeps the solid edges), in a fixed order. Fails when the class has more
// than `max_members` members.
Result<std::vector<BitGraph>> ClassMembers(const BitGraph& g, size_t max_members);

// Named versions; the equivalence graph's `maximal` keeps the names of g.
struct NamedEquivalenceGraph {
  Dmg maximal;
  std::vector<Edge> edges;
  std::vector<bool> dashed;
};
Result<NamedEquivalenceGraph> ComputeEquivalenceGraph(const Dmg& g);

}  // namespace locind::graph
