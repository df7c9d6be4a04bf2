// Latent projection of a directed mixed graph onto its observed nodes.
//
// With hidden set H and observed set O (Mogensen & Hansen 2020, Ann. Statist.
// 48(1), Sec. 3): a -> b when a directed walk a -> ... -> b has every inner
// node in H; a <-> b (a != b) when a walk between them has arrowheads at both
// ends, no collider and every inner node in H. When such a walk runs from a
// back to a, the projection gets the loop a -> a: a bidirected loop would have
// exactly the separations of a directed one (docs/theory.md F3). The projection
// keeps every mu-separation among observed nodes.
#pragma once

#include <vector>

#include "graph/bit_graph.h"
#include "graph/dmg.h"
#include "base/status.h"

namespace locind::graph {

// Projects g onto the nodes outside `hidden`; the result numbers the observed
// nodes 0, 1, ... in increasing order of their index in g.
BitGraph LatentProjection(const BitGraph& g, Mask hidden);

// The same on named graphs; the result keeps the observed names in order.
// Fails when g has more than 64 nodes or a hidden index is out of range.
Result<Dmg> LatentProjection(const Dmg& g, const std::vector<int>& hidden);

}  // namespace locind::graph
