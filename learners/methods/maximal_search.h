// maximal-search: a search for the maximal graph and its equivalence graph
// under partial observation. Under the oracle it returns exactly the maximal
// graph on every graph checked (all 3-node graphs, thousands of random ones);
// the sufficiency of its final-phase criterion is checked, not proved.
//
// It follows the learning algorithm of Mogensen, Malinsky & Hansen (2018,
// UAI, Sec. 4) in four phases:
//  (i)   separation: start from the complete graph (every a -> b including
//        loops, every a <-> b). Level by level (k = 0, 1, ...), for each
//        ordered pair still joined, look for C = {b} + D (C = D for a loop)
//        with D a k-subset of the current possible ancestors of {a, b}
//        (An({a, b}) in the current graph, minus a and b), subsets of b's
//        current neighbours first, as in the PC/FCI family; sets D with a
//        node that has no directed path to {a, b} inside D + {a, b} are
//        skipped (the deciding set never has one). A separation
//        removes a -> b and a <-> b and is remembered. Complete under the
//        oracle: the current graph always contains the maximal graph N, so
//        An_N({a, b}) - {a} is among the sets tried, and it separates every
//        separable pair (docs/theory.md F1).
//  (ii)  pruning, no new tests: an edge is removed when a remembered
//        separation together with answers already known violates one of the
//        necessary conditions of learners/methods/maximal_criterion.h or docs/theory.md F6.
//  (iii) final phase: each remaining edge is decided by the complete
//        criterion (learners/methods/maximal_criterion.h). Answers implied by graphs
//        are not asked: a query separated in the current graph (a supergraph
//        of N) is separated, and one connected in the graph of edges already
//        accepted (a subgraph of N), or on a pair found inseparable, is
//        connected; only the rest goes to the test.
//  (iv)  marks: dashed iff dropping the edge keeps every separation (F4).
// Every candidate edge gets one decision record (learners/methods/learner.h):
// the phase that decided it, the rule (a separation, D2, D3, B2, F6(i),
// F6(ii), or the criterion holding) and the witness answers. Tests that
// could not be computed never remove an edge nor serve as a rule's premise.
// Under the oracle the result is exactly the maximal graph and equivalence
// graph (checked in tests/learners/methods/maximal_search_test.cc). Refused beyond
// graph::kMaxExactNodes processes: phase (iii) enumerates conditioning sets.
#pragma once

#include "learners/methods/learner.h"

namespace locind::learners {

class MaximalSearch : public Learner {
 public:
  Result<LearnResult> Learn(const LearnInput& input) override;
};

}  // namespace locind::learners
