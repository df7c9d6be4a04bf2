#include "graph/separation_model.h"

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
  const Mask sets = Mask{1} << n_;
  for (Mask c = 0; c < sets; ++c) {
    const Mask anc = graph::Ancestors(changed, c);
    const bool anc_moved = anc != ancestors_[c];
    for (int a = 0; a < n_; ++a) {
      if (Contains(c, a)) continue;
      if (!anc_moved && !MayTraverse(a, c, edge)) continue;
      if (Explore(changed, a, c, anc).head != head_[Index(a, c)]) return false;
    }
  }
  return true;
}

}  // namespace locind::graph
