// screen: separation search with small conditioning sets. For each ordered
// pair (a, b) it tries C = {b} + D for every D of at most k other processes
// (C = D, D without b, for a loop b -> b), smallest first; a -> b is dropped
// at the first C that separates, a <-> b when either direction is dropped.
// Tests: at most n^2 * sum_{j <= k} binom(n - 1, j). No marks.
//
// What it guarantees under the oracle (exactly):
//  - every edge of the maximal graph N is kept (N has edges only on pairs no
//    set separates, docs/theory.md F5), so the output contains N;
//  - a -> b is kept iff no set of that shape separates b from a; when
//    An({a, b}) has at most k processes besides a and b, that is exactly
//    "b is inseparable from a" (docs/theory.md F1), and likewise for a <-> b in
//    both directions;
//  - it never applies the further conditions that drop inseparable pairs
//    from N (learners/methods/maximal_criterion.h), so inseparable pairs outside N
//    stay. With k >= n - 1 (loops may need every other process) the output
//    is the graph of all inseparable pairs.
// It does not promise anything about dashed marks (it has none).
#pragma once

#include "learners/methods/learner.h"

namespace locind::learners {

class ScreeningLearner : public Learner {
 public:
  // REQUIRES: max_extra >= 0.
  explicit ScreeningLearner(int max_extra = 1) : max_extra_(max_extra) {}
  Result<LearnResult> Learn(const LearnInput& input) override;

 private:
  int max_extra_;
};

}  // namespace locind::learners
