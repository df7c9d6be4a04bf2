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
