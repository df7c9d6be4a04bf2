// pairwise: a -> b unless b is locally independent of a given every other
// observed process (b included); a loop b -> b unless b is locally
// independent of its own past given every other process. One test per
// ordered pair, n^2 in all; a directed graph without marks.
//
// Under the oracle on a fully observed directed graph (no hidden process, no
// bidirected edge) this is exactly the truth: a walk from a into b other than
// a -> b ends with some u -> b, u in the conditioning set and a
// non-collider, so it is blocked. Hidden processes add the edges of the
// latent projection and more (the simplest method has no defence).
#pragma once

#include "learners/methods/learner.h"

namespace locind::learners {

class PairwiseLearner : public Learner {
 public:
  Result<LearnResult> Learn(const LearnInput& input) override;
};

}  // namespace locind::learners
