#include "metrics/intervals.h"

#include <algorithm>
#include <cassert>
#include <cmath>
#include <limits>

#include <boost/math/distributions/beta.hpp>
#include <boost/math/distributions/normal.hpp>

namespace locind::metrics {
namespace {

constexpr double kNaN = std::numeric_limits<double>::quiet_NaN();

double NormalQuantile(double p) { return boost::math::quantile(boost::math::normal(), p); }

}  // namespace

Interval WilsonInterval(int64_t successes, int64_t trials, double confidence) {
  assert(successes >= 0 && successes <= trials && confidence > 0 && confidence < 1);
  if (trials == 0) return {kNaN, kNaN, kNaN};
  const double n = static_cast<double>(trials);
  const double p = successes / n;
  const double z = NormalQuantile(0.5 + confidence / 2);
  const double z2 = z * z;
  const double centre = (p + z2 / (2 * n)) / (1 + z2 / n);
  const double half = z / (1 + z2 / n) * std::sqrt(p * (1 - p) / n + z2 / (4 * n * n));
  // At 0 or n successes the bound is exactly 0 or 1; rounding would leave
  // values like 7e-18.
  const double low = successes == 0 ? 0.0 : std::max(0.0, centre - half);
  const double high = successes == trials ? 1.0 : std::min(1.0, centre + half);
  return {p, low, high};
}

Interval BootstrapMeanInterval(const std::vector<double>& values, int resamples,
                               base::RandomStream& random, double confidence) {
  if (values.empty()) return {kNaN, kNaN, kNaN};
  const size_t n = values.size();
  double sum = 0;
  for (double v : values) sum += v;
  const double mean = sum / n;
  if (n == 1 || resamples < 1) return {mean, mean, mean};
  std::vector<double> means(resamples);
  for (double& m : means) {
    double s = 0;
    for (size_t i = 0; i < n; ++i) s += values[std::min(n - 1, size_t(random.Uniform() * n))];
    m = s / n;
  }
  std::sort(means.begin(), means.end());
  const double alpha = 1 - confidence;
  const size_t lo = static_cast<size_t>(std::floor(alpha / 2 * resamples));
  const size_t hi = static_cast<size_t>(std::ceil((1 - alpha / 2) * resamples)) - 1;
  return {mean, means[std::min(lo, means.size() - 1)], means[std::min(hi, means.size() - 1)]};
}

// --- Exact binomial interval ------------------------------------------------

Interval ClopperPearsonInterval(int64_t successes, int64_t trials, double confidence) {
  assert(successes >= 0 && successes <= trials && confidence > 0 && confidence < 1);
  if (trials == 0) return {kNaN, kNaN, kNaN};
  const double x = static_cast<double>(successes);
  const double n = static_cast<double>(trials);
  const double tail = (1 - confidence) / 2;
  // The Beta quantiles are the inversions of the two binomial tail
  // probabilities (Clopper & Pearson 1934); the ends have no Beta law (a
  // parameter would be 0) and are exact.
  const double low =
      successes == 0 ? 0.0 : boost::math::quantile(boost::math::beta_distribution<double>(x, n - x + 1), tail);
  const double high = successes == trials
                          ? 1.0
                          : boost::math::quantile(boost::math::beta_distribution<double>(x + 1, n - x), 1 - tail);
  return {x / n, low, high};
}

}  // namespace locind::metrics
