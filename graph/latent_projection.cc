#include "graph/latent_projection.h"

#include <bit>

namespace locind::graph {
namespace {

// Hidden nodes with a directed path into x whose nodes, apart from x, are all
// hidden.
Mask HiddenAncestors(const BitGraph& g, int x, Mask hidden) {
  Mask found = g.parents[x] & hidden;
  Mask frontier = found;
  while (frontier != 0) {
    const int v = std::countr_zero(frontier);
    frontier &= frontier - 1;
    const Mask fresh = g.parents[v] & hidden & ~found;
    found |= fresh;
    frontier |= fresh;
  }
  return found;
}

Mask UnionOf(const std::vector<Mask>& rows, Mask set) {
  Mask out = 0;
  for (; set != 0; set &= set - 1) out |= rows[std::countr_zero(set)];
  return out;
}

}  // namespace

BitGraph LatentProjection(const BitGraph& g, Mask hidden) {
  hidden &= AllNodes(g.n);
  std::vector<int> observed;
  std::vector<Mask> hidden_anc(g.n, 0);
  std::vector<Mask> left(g.n, 0);  // x and its hidden ancestors through H
  for (int v = 0; v < g.n; ++v) {
    if (Contains(hidden, v)) continue;
    observed.push_back(v);
    hidden_anc[v] = HiddenAncestors(g, v, hidden);
    left[v] = hidden_anc[v] | Bit(v);
  }
  BitGraph out(static_cast<int>(observed.size()));
  for (int j = 0; j < out.n; ++j) {
    const int b = observed[j];
    // Directed: a parent of b or of a hidden ancestor of b through H.
    const Mask directed_parents = (g.parents[b] | UnionOf(g.parents, hidden_anc[b])) & ~hidden;
    const Mask left_siblings = UnionOf(g.siblings, left[b]);
    for (int i = 0; i < out.n; ++i) {
      const int a = observed[i];
      if (Contains(directed_parents, a)) out.Add({i, j, EdgeKind::kDirected});
      if (i > j) continue;
      // Collider-free walk a <-...<- x (<->)? y ->...-> b through H.
      const bool joined = (hidden_anc[a] & hidden_anc[b]) != 0 || (left_siblings & left[a]) != 0;
      if (!joined) continue;
      if (i == j) {
        out.Add({i, i, EdgeKind::kDirected});
      } else {
        out.Add({i, j, EdgeKind::kBidirected});
      }
    }
  }
  return out;
}

Result<Dmg> LatentProjection(const Dmg& g, const std::vector<int>& hidden) {
  Result<BitGraph> bits = ToBitGraph(g);
  if (!bits.ok()) return bits.status();
  Mask hidden_mask = 0;
  for (int h : hidden) {
    if (h < 0 || h >= g.size()) return Status::Error("hidden node index out of range");
    hidden_mask |= Bit(h);
  }
  std::vector<std::string> names;
  for (int v = 0; v < g.size(); ++v) {
    if (!Contains(hidden_mask, v)) names.push_back(g.name(v));
  }
  return ToDmg(LatentProjection(*bits, hidden_mask), names);
}

}  // namespace locind::graph
