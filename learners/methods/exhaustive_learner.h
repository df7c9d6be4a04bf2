// exhaustive: the reference for maximal-search. It asks the test for every
// separation statement "d given C, from c" (every target d, source c and set
// C not holding c: n * n * 2^(n-1) tests), then decides every loop,
// directed and bidirected edge by the complete criterion of
// learners/methods/maximal_criterion.h on that full list, and marks the edges as
// maximal-search does (docs/theory.md F4). Exponential: refused beyond
// kMaxExhaustiveNodes processes.
#pragma once

#include "learners/methods/learner.h"

namespace locind::learners {

inline constexpr int kMaxExhaustiveNodes = 12;

class ExhaustiveLearner : public Learner {
 public:
  Result<LearnResult> Learn(const LearnInput& input) override;
};

}  // namespace locind::learners
