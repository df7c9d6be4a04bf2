#include "graph/mu_separation.h"

#include <bit>

namespace locind::graph {

Mask Ancestors(const BitGraph& g, Mask c) {
  Mask found = c;
  Mask frontier = c;
  while (frontier != 0) {
    const int v = std::countr_zero(frontier);
    frontier &= frontier - 1;
    const Mask fresh = g.parents[v] & ~found;
    found |= fresh;
    frontier |= fresh;
  }
  return found;
}

namespace {

// The search of Explore, which ends early once `stop(reach)` holds (checked
// before each step). One template so that Explore and ReachesExactly share
// the loop; the predicate is inlined, so Explore pays nothing for it.
template <typename Stop>
Reach ExploreUntil(const BitGraph& g, int a, Mask c, Mask ancestors_of_c, Stop stop) {
  Reach reach;
  if (Contains(c, a)) return reach;
  Mask frontier_head = 0;
  Mask frontier_tail = 0;
  auto arrive = [&](Mask heads, Mask tails) {
    heads &= ~reach.head;
    tails &= ~reach.tail;
    reach.head |= heads;
    reach.tail |= tails;
    frontier_head |= heads;
    frontier_tail |= tails;
  };
  // The start node is not an inner node: every edge at a may be taken.
  arrive(g.children[a] | g.siblings[a], g.parents[a]);
  while ((frontier_head | frontier_tail) != 0) {
    if (stop(reach)) break;
    if (frontier_tail != 0) {
      // Arrived with a tail: v is a non-collider whatever edge leaves it.
      const int v = std::countr_zero(frontier_tail);
      frontier_tail &= frontier_tail - 1;
      if (!Contains(c, v)) arrive(g.children[v] | g.siblings[v], g.parents[v]);
      continue;
    }
    const int v = std::countr_zero(frontier_head);
    frontier_head &= frontier_head - 1;
    // Leaving along a tail makes v a non-collider; along an arrowhead, a collider.
    if (!Contains(c, v)) arrive(g.children[v], 0);
    if (Contains(ancestors_of_c, v)) arrive(g.siblings[v], g.parents[v]);
  }
  return reach;
}

}  // namespace

Reach Explore(const BitGraph& g, int a, Mask c, Mask ancestors_of_c) {
  return ExploreUntil(g, a, c, ancestors_of_c, [](const Reach&) { return false; });
}

bool ReachGrows(const BitGraph& g, Mask c, Mask ancestors_of_c, const Reach& reach, Mask seed_head,
                Mask seed_tail) {
  (void)ancestors_of_c;  // only moves out of tail states remain, and they ignore An(C)
  if ((seed_head & ~reach.head) != 0) return true;
  Mask tail = reach.tail;
  Mask frontier = seed_tail & ~tail;
  tail |= frontier;
  while (frontier != 0) {
    const int v = std::countr_zero(frontier);
    frontier &= frontier - 1;
    // Arrived with a tail: a non-collider, blocked in C, otherwise free to go on.
    if (Contains(c, v)) continue;
    if (((g.children[v] | g.siblings[v]) & ~reach.head) != 0) return true;
    const Mask fresh = g.parents[v] & ~tail;
    tail |= fresh;
    frontier |= fresh;
  }
  return false;
}

bool ReachesExactly(const BitGraph& g, int a, Mask c, Mask ancestors_of_c, Mask heads) {
  // Once all of `heads` is reached the search may stop: the caller knows the
  // result cannot fall short of it, so only a surplus head is left to see.
  const Reach reach = ExploreUntil(g, a, c, ancestors_of_c,
                                   [heads](const Reach& r) { return (r.head & heads) == heads; });
  return reach.head == heads;
}

Mask ConnectedFrom(const BitGraph& g, int a, Mask c) {
  return Explore(g, a, c, Ancestors(g, c)).head;
}

bool MuSeparated(const BitGraph& g, int a, int b, Mask c) {
  return !Contains(ConnectedFrom(g, a, c), b);
}

bool MuSeparated(const BitGraph& g, Mask a_set, Mask b_set, Mask c) {
  const Mask ancestors = Ancestors(g, c);
  for (Mask rest = a_set; rest != 0; rest &= rest - 1) {
    const int a = std::countr_zero(rest);
    if ((Explore(g, a, c, ancestors).head & b_set) != 0) return false;
  }
  return true;
}

bool Separable(const BitGraph& g, int a, int b) {
  const Mask c = Ancestors(g, Bit(a) | Bit(b)) & ~Bit(a);
  return MuSeparated(g, a, b, c);
}

}  // namespace locind::graph
