// TruthClass: what a learned graph is scored against, computed once per truth.
//
// The latent projection of the truth graph onto its observed nodes, its
// maximal graph N and its equivalence graph (solid/dashed marks). Learners
// can at best recover N: an edge outside N is false (no graph with the true
// separations has it), a solid edge of N is in every equivalent graph and
// counts towards power, a dashed edge is undetermined and reported apart.
#pragma once

#include <vector>

#include "graph/dmg.h"
#include "graph/edge.h"
#include "graph/equivalence_graph.h"
#include "base/status.h"
#include "graph/truth_graph.h"

namespace locind::metrics {

enum class TruthStatus { kSolid, kDashed, kAbsent };

struct TruthClass {
  graph::TruthGraph truth;
  graph::Dmg projected;  // observed nodes, in truth.Observed() order
  graph::Dmg maximal;    // maximal graph of the class of `projected`
  std::vector<graph::Edge> edges;  // edges of `maximal`, sorted by (from, to, kind)
  std::vector<bool> dashed;        // dashed[i] for edges[i]

  // Status of an edge (over the observed nodes) in the class.
  TruthStatus StatusOf(const graph::Edge& e) const;
};

// Fails when the projection has more than graph::kMaxExactNodes nodes (the
// message names the limit) or the truth more than 64 nodes.
Result<TruthClass> ComputeTruthClass(const graph::TruthGraph& truth);

const char* TruthStatusName(TruthStatus status);  // "solid", "dashed", "absent"

}  // namespace locind::metrics
