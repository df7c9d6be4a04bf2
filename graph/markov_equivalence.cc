#include "graph/markov_equivalence.h"

#include "graph/mu_separation.h"
#include "graph/separation_model.h"

namespace locind::graph {

Result<bool> MarkovEquivalent(const BitGraph& g1, const BitGraph& g2) {
  if (g1.n != g2.n) return Status::Error("graphs have different numbers of nodes");
  if (g1.n > kMaxExactNodes) {
    return NodeLimitError("Markov equivalence", g1.n, kMaxExactNodes);
  }
  // Cheap necessary condition first: the same separable pairs (F1).
  for (int a = 0; a < g1.n; ++a) {
    for (int b = 0; b < g1.n; ++b) {
      if (Separable(g1, a, b) != Separable(g2, a, b)) return false;
    }
  }
  const Mask sets = Mask{1} << g1.n;
  for (Mask c = 0; c < sets; ++c) {
    const Mask anc1 = Ancestors(g1, c);
    const Mask anc2 = Ancestors(g2, c);
    for (int a = 0; a < g1.n; ++a) {
      if (Contains(c, a)) continue;
      if (Explore(g1, a, c, anc1).head != Explore(g2, a, c, anc2).head) return false;
    }
  }
  return true;
}

Result<bool> MarkovEquivalent(const Dmg& g1, const Dmg& g2) {
  if (g1.names() != g2.names()) {
    return Status::Error("graphs must have the same nodes in the same order");
  }
  Result<BitGraph> b1 = ToBitGraph(g1);
  if (!b1.ok()) return b1.status();
  Result<BitGraph> b2 = ToBitGraph(g2);
  if (!b2.ok()) return b2.status();
  return MarkovEquivalent(*b1, *b2);
}

}  // namespace locind::graph
