// Stationary moments of a simulated tanh diffusion against values computed
// independently by quadrature (tests/reference/tanh_stationary_scipy.py),
// beyond the single Euler step checked in diffusion_simulator_test.cc.
// Labelled calibration (a statistical check, seconds under the sanitizers).
//
// Model (tanh family, c = 0, sigma = 1): x1 -> x2 with loops,
//   dX1 = -X1 dt + dW1,  dX2 = (-X2 + 1.5 tanh(X1)) dt + dW2.
// Both stationary means are 0 by symmetry (the drift is odd), so the second
// moments E[X2^2] and E[X1 X2] are the variance and the covariance.
#include "sim/diffusion_simulator.h"

#include <cmath>
#include <vector>

#include <boost/math/distributions/students_t.hpp>
#include <doctest/doctest.h>

#include "tests/sim/sim_fixtures.h"

namespace locind::sim {
namespace {

using testing::Draw;
using testing::Graph;

// SciPy 1.10 quadrature (tests/reference/tanh_stationary_scipy.py).
constexpr double kVarianceX2 = 0.8020845452072143;
constexpr double kCovariance = 0.2723713845237229;

struct BatchMean {
  double mean = 0;
  double standard_error = 0;
};

// Mean of `per_sample` over the samples, with the batch-means standard error
// over `batches` consecutive batches (common practice for correlated
// samples, no source).
template <typename F>
BatchMean BatchMeans(int samples, int batches, F per_sample) {
  const int size = samples / batches;
  std::vector<double> means(batches, 0.0);
  for (int b = 0; b < batches; ++b) {
    for (int i = b * size; i < (b + 1) * size; ++i) means[b] += per_sample(i);
    means[b] /= size;
  }
  double mean = 0, ss = 0;
  for (double m : means) mean += m / batches;
  for (double m : means) ss += (m - mean) * (m - mean);
  return {mean, std::sqrt(ss / (batches - 1) / batches)};
}

TEST_CASE("tanh diffusion: stationary variance and covariance against quadrature") {
  const DiffusionModel m = TanhDiffusion(Graph({"x1", "x2"}, {{0, 0}, {1, 1}, {0, 1}}), 1.0, 1.5, 1.0);
  PathRunOptions o;
  o.horizon = 50000;
  o.step = 0.005;
  o.interval = 0.1;
  o.burn_in = 20;
  const PathData d = Draw(m, o, 7001);
  const int batches = 50;  // 1,000 time units each, against correlation times about 1
  const BatchMean var2 = BatchMeans(d.samples(), batches, [&](int i) { return d.values(i, 1) * d.values(i, 1); });
  const BatchMean cov = BatchMeans(d.samples(), batches, [&](int i) { return d.values(i, 0) * d.values(i, 1); });
  MESSAGE("E[X2^2] " << var2.mean << " +- " << var2.standard_error << ", E[X1 X2] " << cov.mean << " +- "
                     << cov.standard_error);
  // Band: family-wise level 0.001 split Bonferroni over the 2 checks of this
  // file, two-sided: Student t with 49 degrees of freedom at 1 - 0.001 / 4
  // (Boost.Math; SciPy 1.10 stats.t.ppf gives 3.7284), times the batch
  // standard error, plus 1% of the value for the Euler bias at step 0.005:
  // by hand from the Euler recursion, the stationary variance of an OU
  // coordinate is sigma^2 / (2 theta - theta^2 h), 0.25% high, and the
  // cross-covariance carries (1 - h) / (1 - h / 2), 0.25% low.
  const double t = boost::math::quantile(boost::math::students_t(batches - 1), 1 - 0.001 / 4);
  CHECK(t == doctest::Approx(3.7284).epsilon(1e-4).scale(0));
  CHECK(std::abs(var2.mean - kVarianceX2) <= t * var2.standard_error + 0.01 * kVarianceX2);
  CHECK(std::abs(cov.mean - kCovariance) <= t * cov.standard_error + 0.01 * kCovariance);
}

}  // namespace
}  // namespace locind::sim
