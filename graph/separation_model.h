// SeparationModel: every mu-separation of a graph, for exact class work.
//
// For each conditioning set C and each a outside C it stores the set of b
// connected from a given C (and the search states, used to prune later
// checks). Two graphs are Markov equivalent exactly when these tables agree.
// Size and time grow as n * 2^n, so the table is refused beyond
// kMaxExactNodes nodes; deciding equivalence is coNP-complete in general
// (Mogensen 2025, Bernoulli 31(4)), so no exact method avoids this growth.
#pragma once

#include <vector>

#include "graph/bit_graph.h"
#include "graph/edge.h"
#include "graph/mu_separation.h"
#include "base/status.h"

namespace locind::graph {

// Largest number of (observed) nodes for exact equivalence-class work.
inline constexpr int kMaxExactNodes = 18;

class SeparationModel {
 public:
  // Fails when g has more than kMaxExactNodes nodes.
  static Result<SeparationModel> Compute(const BitGraph& g);

  int size() const { return n_; }
  // Nodes connected from a given C. REQUIRES: a not in C.
  Mask Connected(int a, Mask c) const { return head_[Index(a, c)]; }
  Mask Ancestors(Mask c) const { return ancestors_[c]; }
  bool SameSeparations(const SeparationModel& other) const { return head_ == other.head_; }

  // True when `changed` (the modelled graph plus or minus `edge`) has exactly
  // the separations of the modelled graph. Only (a, C) whose search could
  // traverse `edge`, or whose ancestor set moved, are searched again: an
  // added edge continues the stored search from the states that can step
  // onto the edge (ReachGrows), a removed edge re-runs it until it has
  // reached the stored heads (ReachesExactly). An(C) of the changed graph
  // is recomputed only where the edge lies on a directed path into C.
  // REQUIRES: this model was computed from a graph differing from `changed`
  // in `edge` alone.
  bool SameAfterChange(const BitGraph& changed, const Edge& edge) const;

 private:
  SeparationModel(int n) : n_(n) {}
  size_t Index(int a, Mask c) const { return static_cast<size_t>(c) * n_ + a; }
  bool MayTraverse(int a, Mask c, const Edge& edge) const;
  bool SameAfterAdding(const BitGraph& changed, const Edge& edge) const;
  bool SameAfterRemoving(const BitGraph& changed, const Edge& edge) const;

  int n_ = 0;
  std::vector<Mask> head_;       // Reach::head per (C, a)
  std::vector<Mask> tail_;       // Reach::tail per (C, a)
  std::vector<Mask> ancestors_;  // An(C) per C
};

}  // namespace locind::graph
