// Confidence intervals for the study summary.
//
//  - Wilson score interval for a binomial proportion (Wilson 1927, J. Amer.
//    Statist. Assoc. 22(158)): used for power, false-edge rate and class
//    recovery, pooled over replicates.
//  - Percentile bootstrap interval for a mean (Efron & Tibshirani 1993, An
//    Introduction to the Bootstrap, ch. 13): used for Hamming distance, tests
//    made and seconds. Resamples are drawn from a RandomStream keyed by the
//    caller, so intervals are reproducible.
//  - Two-stage (cluster) bootstrap for a ratio estimator over replicates
//    nested in truths (Davison & Hinkley 1997, Bootstrap Methods and their
//    Application, sec. 3.8, "Hierarchical data"): used by the study summary
//    for every rate and mean (metrics/cell_summary.h says why), and paired
//    for the difference of two learners on the same replicates
//    (metrics/learner_comparison.h).
#pragma once

#include <cstdint>
#include <vector>

#include "base/random_stream.h"

namespace locind::metrics {

struct Interval {
  double estimate = 0;  // NaN when undefined (no trials, no values)
  double low = 0;
  double high = 0;
};

// REQUIRES: 0 <= successes <= trials; 0 < confidence < 1.
Interval WilsonInterval(int64_t successes, int64_t trials, double confidence = 0.95);

// Mean of `values` with a percentile bootstrap interval from `resamples`
// resamples. A single value gives a zero-width interval.
Interval BootstrapMeanInterval(const std::vector<double>& values, int resamples,
                               base::RandomStream& random, double confidence = 0.95);

// --- Exact binomial interval ------------------------------------------------
// Clopper-Pearson interval for a binomial proportion (Clopper & Pearson 1934,
// Biometrika 26(4)): the bounds are quantiles of Beta(x, n - x + 1) and
// Beta(x + 1, n - x) at (1 - confidence) / 2 and (1 + confidence) / 2; the
// lower bound is 0 at x = 0 and the upper bound 1 at x = n. Coverage is at
// least `confidence` for every true proportion (it is conservative), which
// is what a "rejects too often" warning needs. Used for the rejection share
// of true-null tests (calibration.csv). No trials: all three NaN.
// REQUIRES: 0 <= successes <= trials; 0 < confidence < 1.
Interval ClopperPearsonInterval(int64_t successes, int64_t trials, double confidence = 0.95);

// One replicate's share of a ratio estimator sum(numerator) / sum(denominator),
// and the cluster (truth) it belongs to. A mean is the ratio with
// denominator 1 for every replicate.
struct ClusteredValue {
  int cluster = 0;
  double numerator = 0;
  double denominator = 1;
};

// Ratio sum(numerator) / sum(denominator) with a two-stage percentile
// bootstrap interval: each resample draws as many clusters as there are, with
// replacement, then within each drawn cluster as many of its values as it
// has, with replacement. Resamples whose denominator sums to 0 are left out.
// The estimate is NaN when the denominators sum to 0; low and high are NaN
// when no resample is defined. When every resample gives the same ratio (all
// values agree) the interval has zero width, however few clusters there are.
Interval ClusteredRatioInterval(const std::vector<ClusteredValue>& values, int resamples,
                                base::RandomStream& random, double confidence = 0.95);

// Two learners' shares of the same ratio on one replicate (the same data):
// the learner's and the reference learner's numerator and denominator.
struct PairedValue {
  int cluster = 0;
  double numerator = 0;
  double denominator = 1;
  double reference_numerator = 0;
  double reference_denominator = 1;
};

// The paired difference sum(numerator) / sum(denominator) -
// sum(reference_numerator) / sum(reference_denominator) with the two-stage
// percentile bootstrap of ClusteredRatioInterval, each replicate drawn with
// both shares (paired comparison; Efron & Tibshirani 1993, An Introduction to
// the Bootstrap, ch. 13, for percentile intervals). Variation that the two
// learners share, the draw of the data, cancels, so the interval of the
// difference is usually much narrower than the two single intervals suggest.
// Resamples in which either denominator sums to 0 are left out; the estimate
// is NaN when either denominator sums to 0.
Interval ClusteredRatioDifferenceInterval(const std::vector<PairedValue>& values, int resamples,
                                          base::RandomStream& random, double confidence = 0.95);

}  // namespace locind::metrics
