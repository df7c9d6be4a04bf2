// Shared helpers for the graph tests: conversions between the engine's
// BitGraph and the brute force's BruteGraph, and random test graphs.
#pragma once

#include "graph/bit_graph.h"
#include "base/random_stream.h"
#include "graph/truth_graph.h"
#include "tests/graph/brute_force.h"

namespace locind::testing {

inline BruteGraph ToBrute(const graph::BitGraph& g) {
  BruteGraph out(g.n);
  for (int u = 0; u < g.n; ++u)
    for (int v = 0; v < g.n; ++v) {
      out.dir[u][v] = g.HasDirected(u, v);
      out.bi[u][v] = u != v && g.HasBidirected(u, v);
    }
  return out;
}

inline graph::BitGraph FromBrute(const BruteGraph& g) {
  graph::BitGraph out(g.n);
  for (int u = 0; u < g.n; ++u)
    for (int v = 0; v < g.n; ++v) {
      if (g.dir[u][v]) out.Add({u, v, graph::EdgeKind::kDirected});
      if (u < v && g.bi[u][v]) out.Add({u, v, graph::EdgeKind::kBidirected});
    }
  return out;
}

// A random mixed graph on `nodes` nodes: loops with probability 1/2 when
// `loops`, directed edges with probability p, bidirected with probability q.
inline graph::BitGraph RandomMixedGraph(int nodes, double p, double q, bool loops,
                                        base::RandomStream& random) {
  graph::RandomGraphOptions o;
  o.nodes = nodes;
  o.edge_probability = p;
  o.bidirected_probability = q;
  o.loops = loops ? graph::LoopPolicy::kRandom : graph::LoopPolicy::kNone;
  return *graph::ToBitGraph(graph::RandomTruthGraph(o, random).graph);
}

// a -> c -> b with a loop on every node (indices a = 0, c = 1, b = 2): b is
// separated from a given {b, c}, not given {b}.
inline graph::Dmg ChainWithLoops() {
  graph::Dmg g({"a", "c", "b"});
  g.AddDirected(0, 1);
  g.AddDirected(1, 2);
  for (int v = 0; v < 3; ++v) g.AddDirected(v, v);
  return g;
}

}  // namespace locind::testing
