// Helpers shared by the calibration suites: the Kolmogorov-Smirnov distance to
// U(0, 1) and the exact binomial acceptance interval of a rejection count.
#pragma once

#include <algorithm>
#include <cmath>
#include <utility>
#include <vector>

#include <boost/math/distributions/binomial.hpp>
#include <boost/math/special_functions/beta.hpp>

namespace locind::learners {

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

// Clopper-Pearson upper limit of a binomial proportion: the one-sided upper
// `confidence` bound for k successes in n, the beta quantile
// I^{-1}_{confidence}(k + 1, n - k) (Clopper & Pearson 1934, Biometrika
// 26(4)); 1 when k = n.
inline double ClopperPearsonUpper(int k, int n, double confidence) {
  if (k >= n) return 1;
  return boost::math::ibeta_inv(double(k) + 1, double(n - k), confidence);
}

inline int CountBelow(const std::vector<double>& p, double level) {
  return int(std::count_if(p.begin(), p.end(), [level](double x) { return x <= level; }));
}

}  // namespace locind::learners
