// Test helper: the one-sample Kolmogorov-Smirnov test against Exp(1), used
// for the time-rescaling checks (Brown, Barbieri, Ventura, Kass & Frank 2002,
// Neural Computation 14(2), sec. 2.2).
//
// The Exp(1) distribution function comes from Boost.Math. Boost 1.74 has no
// Kolmogorov distribution (it arrived in 1.75), so the p-value uses the
// limiting series P(sqrt(n) D > x) = 2 sum_{k>=1} (-1)^{k-1} exp(-2 k^2 x^2)
// (Kolmogorov 1933, G. Ist. Ital. Attuari 4) with Stephens' small-sample
// factor sqrt(n) + 0.12 + 0.11 / sqrt(n) (Stephens 1970, J. R. Stat. Soc. B
// 32(1)).
#pragma once

#include <algorithm>
#include <cmath>
#include <vector>

#include <boost/math/distributions/exponential.hpp>

namespace locind::test {

struct KsResult {
  double statistic = 0;
  double p_value = 1;
};

inline double KolmogorovTail(double x) {
  if (x < 0.2) return 1.0;
  double sum = 0;
  for (int k = 1; k <= 100; ++k) {
    const double term = std::exp(-2.0 * k * k * x * x);
    sum += (k % 2 ? 1 : -1) * term;
    if (term < 1e-16) break;
  }
  return std::clamp(2 * sum, 0.0, 1.0);
}

// KS test of `samples` against Exp(1).
inline KsResult KsAgainstUnitExponential(std::vector<double> samples) {
  const boost::math::exponential_distribution<double> unit(1.0);
  std::sort(samples.begin(), samples.end());
  const double n = static_cast<double>(samples.size());
  double d = 0;
  for (size_t i = 0; i < samples.size(); ++i) {
    const double f = boost::math::cdf(unit, std::max(samples[i], 0.0));
    d = std::max({d, (i + 1) / n - f, f - i / n});
  }
  const double root = std::sqrt(n);
  return KsResult{d, KolmogorovTail(d * (root + 0.12 + 0.11 / root))};
}

// Increments of a compensator evaluated at successive events.
inline std::vector<double> Increments(const std::vector<double>& compensator) {
  std::vector<double> out;
  double previous = 0;
  for (double c : compensator) {
    out.push_back(c - previous);
    previous = c;
  }
  return out;
}

}  // namespace locind::test
