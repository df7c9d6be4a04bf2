// P-value calibration: which tests of a learner had a true null hypothesis,
// and the uniform quantile-quantile view of their p-values.
//
// A test "b locally independent of A given C" has a true null when b is
// mu-separated from every a in A given C in the latent projection of the
// truth (Mogensen & Hansen 2020, Thm. on mu-separation and local
// independence, under faithfulness). Its p-values should then be uniform on
// [0, 1] (or stochastically larger, for a conservative test). The QQ view
// puts the i-th smallest of n p-values against its expected value i/(n+1)
// with a pointwise band from the Beta(i, n+1-i) law of the i-th order
// statistic of n uniforms (David & Nagaraja 2003, Order Statistics, sec. 2.2).
#pragma once

#include <cstddef>
#include <vector>

#include "graph/dmg.h"
#include "learners/methods/learner.h"

namespace locind::metrics {

// Indices into `log` of the tests with status ok whose null holds in
// `projected` (all nodes observed, in the test's process order), one per
// distinct query, in log order. When more than `cap` qualify, `cap` of them
// evenly spaced over that order (the first and last included).
// REQUIRES: projected has at most graph::kMaxBitGraphNodes nodes; cap >= 2.
std::vector<size_t> NullHoldingTests(const graph::Dmg& projected,
                                     const std::vector<learners::TestRecord>& log, size_t cap);

// --- Was the test asked only because of an earlier one? ---------------------
// For each entry of `log`: true when no earlier test with status ok has the
// same target and sources (any conditioning set). A learner that tries a
// pair (a, b) with a larger conditioning set only after a smaller one
// rejected (screen, the PC-style searches) asks its follow-up tests because
// of a rejection on the same data, and the two statistics share most of
// their information; a follow-up of a falsely rejected null then rejects far
// more often than the level (measured in docs/tests.md, drift-exact-lr). The
// first test of each pair is asked whatever that pair's data say, so only
// it is a fair trial of the level.
std::vector<bool> FirstOfPair(const std::vector<learners::TestRecord>& log);

// --- Can the test's model be right? -----------------------------------------
// True when the given set C holds every parent of `target` b in `projected`
// (the truth's latent projection) and b has no bidirected edge there; then
// a model of b's intensity (or drift) on the histories of C has the true
// parent set, and a true-null test of it can hold its level. In detail:
//  - every x with x -> b must be in C; this includes the loop b -> b, so a
//    self-exciting (or mean-reverting) b needs b in C: the tests put b's own
//    past in the model only when b is in C (learners/independence/
//    hawkes_lr_test.h, drift_test.h). A parent through a hidden mediator
//    (a -> h -> b projects to a -> b) is a parent here too, and a hidden
//    parent h gives b the loop b -> b (the walk b <- h -> b), so b must then
//    be in C as well. The answer is read off the projection, which cannot
//    tell a hidden process that drives b alone from b's own loop: such a b
//    counts as fully given when b is in C.
//  - a bidirected edge b <-> x (any x) means a hidden process drives b and
//    x: its past is in no observed history, yet it moves both, so no C
//    makes the model right, and the answer is false whatever C is.
// A true answer is about the parent set only: the kernel shape can still
// differ from the test's (an effect through a hidden mediator is a
// convolution of kernels).
// REQUIRES: 0 <= target < projected.size(); given holds node indices.
bool AllParentsGiven(const graph::Dmg& projected, int target, const std::vector<int>& given);

struct QqPoint {
  double expected = 0;   // i / (n + 1)
  double observed = 0;   // i-th smallest p-value
  double band_low = 0;   // pointwise quantiles of Beta(i, n + 1 - i)
  double band_high = 0;
};

// The QQ points of `p_values` (any order), sorted by expected value, with a
// pointwise band of the given coverage. Empty for no p-values.
// REQUIRES: 0 < coverage < 1.
std::vector<QqPoint> UniformQq(std::vector<double> p_values, double coverage = 0.95);

// Share of p-values at or below `level` (the empirical type I error rate).
double ShareAtOrBelow(const std::vector<double>& p_values, double level);

}  // namespace locind::metrics
