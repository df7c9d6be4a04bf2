// Shared helpers for the learning-method tests: the graphs to learn and the
// reference answer from the graph engine.
#pragma once

#include <string>

#include "graph/bit_graph.h"
#include "graph/equivalence_graph.h"
#include "graph/latent_projection.h"
#include "graph/truth_graph.h"
#include "learners/methods/learner.h"

namespace locind::testing {

// The DMG on 3 nodes numbered by `bits`: bits 0..8 the directed edges
// a -> b (a major), bits 9..11 the bidirected edges 0<->1, 0<->2, 1<->2.
inline graph::BitGraph ThreeNodeGraph(int bits) {
  graph::BitGraph g(3);
  int k = 0;
  for (int a = 0; a < 3; ++a)
    for (int b = 0; b < 3; ++b)
      if ((bits >> k++) & 1) g.Add({a, b, graph::EdgeKind::kDirected});
  for (int a = 0; a < 3; ++a)
    for (int b = a + 1; b < 3; ++b)
      if ((bits >> k++) & 1) g.Add({a, b, graph::EdgeKind::kBidirected});
  return g;
}

inline std::vector<std::string> Names(int n) {
  std::vector<std::string> out;
  for (int v = 0; v < n; ++v) {
    out.emplace_back(1, 'x');  // not "x" + to_string(): a g++ 12 -Wrestrict false positive
    out.back() += std::to_string(v + 1);
  }
  return out;
}

// The i-th random truth of the exactness suite: 4 to 7 observed nodes,
// cycling through (no hidden, 1 hidden, 2 hidden) x (loops random, none),
// density varying with i. Fixed by `seed` and i.
inline graph::TruthGraph SuiteTruth(uint64_t seed, int i) {
  graph::RandomGraphOptions o;
  const int observed = 4 + i % 4;
  o.hidden_count = (i / 4) % 3;
  o.nodes = observed + o.hidden_count;
  o.edge_probability = 0.15 + 0.05 * ((i / 12) % 5);
  o.loops = (i / 60) % 2 == 0 ? graph::LoopPolicy::kRandom : graph::LoopPolicy::kNone;
  base::RandomStream random(base::StreamKey{seed, 0, static_cast<uint64_t>(i), 0});
  return graph::RandomTruthGraph(o, random);
}

// True when `result` is exactly the equivalence graph `expected` (edges and
// marks); `why` receives a description of the first difference.
inline bool SameEquivalenceGraph(const learners::LearnResult& result,
                                 const graph::EquivalenceGraph& expected, std::string& why) {
  const graph::BitGraph learned = *graph::ToBitGraph(result.graph);
  if (!(learned == expected.maximal)) {
    why = "graph differs";
    return false;
  }
  if (!result.has_marks || result.edges != expected.edges || result.dashed != expected.dashed) {
    why = "marks differ";
    return false;
  }
  return true;
}

}  // namespace locind::testing
