#include "graph/separation_model.h"

#include <bit>

namespace locind::graph {

Result<SeparationModel> SeparationModel::Compute(const BitGraph& g) {
  if (g.n > kMaxExactNodes) {
    return NodeLimitError("the exact equivalence class", g.n, kMaxExactNodes);
  }
  SeparationModel model(g.n);
  const size_t sets = size_t{1} << g.n;
  model.head_.assign(sets * g.n, 0);
  model.tail_.assign(sets * g.n, 0);
  model.ancestors_.assign(sets, 0);
  for (Mask c = 0; c < sets; ++c) {
    const Mask anc = graph::Ancestors(g, c);
    model.ancestors_[c] = anc;
    for (int a = 0; a < g.n; ++a) {
      if (Contains(c, a)) continue;
      const Reach reach = Explore(g, a, c, anc);
      model.head_[model.Index(a, c)] = reach.head;
      model.tail_[model.Index(a, c)] = reach.tail;
    }
  }
  return model;
}

// A walk that first uses `edge` has a prefix that is a walk of the modelled
// graph, so it must be able to step onto the edge from a state that the
// modelled search reached (or from the start node a itself).
bool SeparationModel::MayTraverse(int a, Mask c, const Edge& edge) const {
  const Mask head = head_[Index(a, c)];
  const Mask tail = tail_[Index(a, c)];
  const Mask anc = ancestors_[c];
  auto leave_by_tail = [&](int x) {
    return x == a || (Contains(head | tail, x) && !Contains(c, x));
  };
  auto leave_by_head = [&](int x) {
    return x == a || (Contains(tail, x) && !Contains(c, x)) ||
           (Contains(head, x) && Contains(anc, x));
  };
  if (edge.kind == EdgeKind::kDirected) {
    return leave_by_tail(edge.from) || leave_by_head(edge.to);
  }
  return leave_by_head(edge.from) || leave_by_head(edge.to);
}

bool SeparationModel::SameAfterChange(const BitGraph& changed, const Edge& edge) const {
  return changed.Has(edge) ? SameAfterAdding(changed, edge) : SameAfterRemoving(changed, edge);
}

// Adding u -> v: An(u) does not change (a directed path into u that used the
// new edge would pass u before it), and An(C) gains An(u) exactly when v is
// in An(C); a bidirected edge changes no ancestor set.
bool SeparationModel::SameAfterAdding(const BitGraph& changed, const Edge& edge) const {
  const bool directed = edge.kind == EdgeKind::kDirected;
  const Mask ancestors_of_from = directed ? graph::Ancestors(changed, Bit(edge.from)) : 0;
  const Mask sets = Mask{1} << n_;
  for (Mask c = 0; c < sets; ++c) {
    const Mask old_anc = ancestors_[c];
    const Mask anc = directed && Contains(old_anc, edge.to) ? old_anc | ancestors_of_from : old_anc;
    const Mask joined = anc & ~old_anc;  // colliders that opened
    for (int a = 0; a < n_; ++a) {
      if (Contains(c, a)) continue;
      const Reach reach{head_[Index(a, c)], tail_[Index(a, c)]};
      // Leaving x along its tail end (x -> w) / along an arrowhead at x, in
      // the changed graph, from the start node or a stored state.
      auto leaves_by_tail = [&](int x) {
        return x == a || (Contains(reach.head | reach.tail, x) && !Contains(c, x));
      };
      auto leaves_by_head = [&](int x) {
        return x == a || (Contains(reach.tail, x) && !Contains(c, x)) ||
               (Contains(reach.head, x) && Contains(anc, x));
      };
      Mask seed_head = 0, seed_tail = 0;
      if (directed) {
        if (leaves_by_tail(edge.from)) seed_head |= Bit(edge.to);
        if (leaves_by_head(edge.to)) seed_tail |= Bit(edge.from);
      } else {
        if (leaves_by_head(edge.from)) seed_head |= Bit(edge.to);
        if (leaves_by_head(edge.to)) seed_head |= Bit(edge.from);
      }
      for (Mask open = reach.head & joined; open != 0; open &= open - 1) {
        const int x = std::countr_zero(open);
        seed_head |= changed.siblings[x];
        seed_tail |= changed.parents[x];
      }
      if ((seed_head | seed_tail) == 0) continue;
      if (ReachGrows(changed, c, anc, reach, seed_head, seed_tail)) return false;
    }
  }
  return true;
}

// Removing u -> v changes An(C) only when both u and v are in An(C).
// Equivalent graphs separate the same pairs (docs/theory.md F1), and a pair
// is separable iff C = An({x, y}) \ {x} separates it: n^2 searches that
// settle most removals (typically the edge's own pair becomes separable)
// before the sweep over every C.
bool SeparationModel::SameAfterRemoving(const BitGraph& changed, const Edge& edge) const {
  for (int x = 0; x < n_; ++x) {
    for (int y = 0; y < n_; ++y) {
      const Mask c = ancestors_[Bit(x) | Bit(y)] & ~Bit(x);
      if (Separable(changed, x, y) != !Contains(Connected(x, c), y)) return false;
    }
  }
  const bool directed = edge.kind == EdgeKind::kDirected;
  const Mask sets = Mask{1} << n_;
  for (Mask c = 0; c < sets; ++c) {
    const Mask old_anc = ancestors_[c];
    const bool on_path = directed && Contains(old_anc, edge.to) && Contains(old_anc, edge.from);
    const Mask anc = on_path ? graph::Ancestors(changed, c) : old_anc;
    const bool anc_moved = anc != old_anc;
    for (int a = 0; a < n_; ++a) {
      if (Contains(c, a)) continue;
      if (!anc_moved && !MayTraverse(a, c, edge)) continue;
      if (!ReachesExactly(changed, a, c, anc, head_[Index(a, c)])) return false;
    }
  }
  return true;
}

}  // namespace locind::graph
