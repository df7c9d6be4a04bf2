// mu-separation in a directed mixed graph.
//
// A walk from a to b is mu-connecting given C when it has at least one edge,
// a is not in C, every collider is in An(C), every other inner node is outside
// C, and the last edge has an arrowhead at b; b is mu-separated from a given C
// when no such walk exists (Mogensen & Hansen 2020, Ann. Statist. 48(1),
// Sec. 2; Didelez 2008 for the directed case). One reachability search over
// the states (node, arrived with an arrowhead?) decides it for every b at once,
// in time linear in the graph.
#pragma once

#include "graph/bit_graph.h"

namespace locind::graph {

// C together with every node that has a directed path into C.
Mask Ancestors(const BitGraph& g, Mask c);

// States reached by a search from `a` given C: `head` holds the nodes reached
// along an edge with an arrowhead at them, `tail` those reached along an edge
// with a tail at them. Both are empty when a is in C.
struct Reach {
  Mask head = 0;
  Mask tail = 0;
};

// REQUIRES: ancestors_of_c == Ancestors(g, c).
Reach Explore(const BitGraph& g, int a, Mask c, Mask ancestors_of_c);

// Incremental forms for a graph that differs from the searched one by edges
// added (connections only grow: every walk stays a walk and An(C) can only
// grow). `reach` is Explore's result on the smaller graph, `seed_head` and
// `seed_tail` the states that the new moves enter from reach's states (via
// an added edge, or a collider that joined An(C)). True when the search in
// g, continued from there, reaches some node with an arrowhead that reach
// did not: only new tail states need expanding, since any new head state is
// already a difference. REQUIRES: ancestors_of_c == Ancestors(g, c).
bool ReachGrows(const BitGraph& g, Mask c, Mask ancestors_of_c, const Reach& reach, Mask seed_head,
                Mask seed_tail);

// Explore(g, a, c, ancestors_of_c).head == heads, for a graph g whose
// connections can only be fewer than `heads` (an edge removed): the search
// stops as soon as every node of `heads` is reached.
bool ReachesExactly(const BitGraph& g, int a, Mask c, Mask ancestors_of_c, Mask heads);

// The set of b that are mu-connected from a given C (b not separated).
Mask ConnectedFrom(const BitGraph& g, int a, Mask c);

// True when b is mu-separated from a given C.
bool MuSeparated(const BitGraph& g, int a, int b, Mask c);

// True when every b in B is mu-separated from every a in A given C.
// REQUIRES: A and C are disjoint.
bool MuSeparated(const BitGraph& g, Mask a_set, Mask b_set, Mask c);

// True when some C (not containing a) separates b from a. By Mogensen &
// Hansen (2020) it is enough to try C = An({a, b}) \ {a} (docs/theory.md F1).
bool Separable(const BitGraph& g, int a, int b);

}  // namespace locind::graph
