// Helpers shared by the calibration suites: the Kolmogorov-Smirnov distance to
// U(0, 1), the exact binomial acceptance interval of a rejection count, and
// the rule that sizes every null check of a calibration file.
//
// Sizing rule (common practice, no source beyond Bonferroni's inequality): a
// calibrated test fails some null check of a file with probability at most
// kFamilyLevel = 0.001. The level is split Bonferroni over the k null checks
// of the file, each getting 0.001 / k: a rejection count must lie in its
// exact binomial interval with at most 0.001 / (2k) in each tail
// (BinomialInterval with coverage PerCheckCoverage(k)); a Kolmogorov-Smirnov
// distance must stay below the critical value of level 0.001 / k (SciPy
// stats.kstwo.ppf, Boost 1.74 has no Kolmogorov distribution). A one-sided
// check uses the same interval's upper end (conservative). Seeds are never
// changed after a failure; a failure means a miscalibrated test or a wrong
// band, to be found out. Power checks are not sized by this rule: their
// false-failure rate depends on the unknown power.
#pragma once

#include <algorithm>
#include <cmath>
#include <utility>
#include <vector>

#include <boost/math/distributions/binomial.hpp>

namespace locind::learners {

constexpr double kFamilyLevel = 0.001;

// Coverage of each of the `checks` null checks of a file under the rule above.
inline double PerCheckCoverage(int checks) { return 1 - kFamilyLevel / checks; }

// sup_u |F_n(u) - u| for the empirical distribution F_n of `p`.
inline double KolmogorovSmirnovDistance(std::vector<double> p) {
  std::sort(p.begin(), p.end());
  const double n = double(p.size());
  double d = 0;
  for (size_t i = 0; i < p.size(); ++i) {
    d = std::max({d, (double(i) + 1) / n - p[i], p[i] - double(i) / n});
  }
  return d;
}

// [lo, hi]: the central interval holding a Binomial(n, rate) count with
// probability >= coverage, from the exact distribution (Boost.Math):
// lo = smallest k with P(X <= k) >= (1 - coverage)/2, hi = smallest k with
// P(X <= k) >= (1 + coverage)/2.
inline std::pair<int, int> BinomialInterval(int n, double rate, double coverage) {
  const boost::math::binomial_distribution<> b(n, rate);
  int lo = 0, hi = 0;
  while (boost::math::cdf(b, lo) < (1 - coverage) / 2) ++lo;
  while (boost::math::cdf(b, hi) < (1 + coverage) / 2) ++hi;
  return {lo, hi};
}

inline int CountBelow(const std::vector<double>& p, double level) {
  return int(std::count_if(p.begin(), p.end(), [level](double x) { return x <= level; }));
}

}  // namespace locind::learners
