// LearnerComparison: one learner against a reference learner in one grid
// cell, on the replicates both ran. In a study every learner of a replicate
// sees the same simulated data, so the two learners' results are paired and
// their difference is measured far more precisely than the two summaries'
// intervals suggest: a difference of 0.02 in false-edge rate can be clear
// when both single intervals are 0.05 wide, and a tie in the point
// estimates can hide nothing at all.
//
// Each difference is learner minus reference of the pooled ratio of
// metrics/cell_summary.h (power = sum solid_found / sum solid, and so on),
// over the replicates where both ran, with the two-stage cluster bootstrap
// (truths, then replicates within truths) drawing each replicate with both
// learners' shares (metrics::ClusteredRatioDifferenceInterval). The same
// caveat as for the summary holds: with fewer than about 5 truths read the
// interval as conditional on the truths drawn.
#pragma once

#include <vector>

#include "base/random_stream.h"
#include "metrics/cell_summary.h"
#include "metrics/intervals.h"

namespace locind::metrics {

struct LearnerComparison {
  int paired = 0;  // replicates both learners ran
  int truths = 0;  // distinct truths among them
  // Learner minus reference, each with its 95% interval; NaN where a ratio
  // is undefined (no solid directed edge, nothing reported).
  Interval power;
  Interval directed_power;
  Interval false_edge_rate;
  Interval class_recovery;
};

// `learner` and `reference` hold the same replicates in the same order
// (record i of both comes from the same data); a replicate counts only when
// both ran. `random` drives the resamples (key it by study seed, cell and
// the two learners).
// REQUIRES: learner.size() == reference.size().
LearnerComparison Compare(const std::vector<ReplicateRecord>& learner,
                          const std::vector<ReplicateRecord>& reference, base::RandomStream& random,
                          int bootstrap_resamples = 2000);

}  // namespace locind::metrics
