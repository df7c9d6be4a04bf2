// Markov equivalence: two graphs on the same nodes are equivalent when they
// have exactly the same mu-separations (Mogensen & Hansen 2020, Ann. Statist.
// 48(1), Sec. 4).
#pragma once

#include "graph/bit_graph.h"
#include "graph/dmg.h"
#include "base/status.h"

namespace locind::graph {

// Fails when the graphs differ in size or exceed kMaxExactNodes nodes.
Result<bool> MarkovEquivalent(const BitGraph& g1, const BitGraph& g2);

// On named graphs: fails unless both have the same node names in the same order.
Result<bool> MarkovEquivalent(const Dmg& g1, const Dmg& g2);

}  // namespace locind::graph
