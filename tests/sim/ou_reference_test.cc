// Statistical reference checks of the diffusion simulators (labelled
// calibration: a second in Release, minutes under the sanitizers).
#include "sim/diffusion_simulator.h"

#include <cmath>

#include <doctest/doctest.h>

#include "sim/ou_transition.h"
#include "tests/sim/sim_fixtures.h"

namespace locind::sim {
namespace {

using testing::Cycle;
using testing::Draw;
using testing::Graph;

Eigen::MatrixXd SampleCovariance(const Eigen::MatrixXd& rows) {
  const Eigen::MatrixXd centred = rows.rowwise() - rows.colwise().mean();
  return centred.transpose() * centred / double(rows.rows() - 1);
}

TEST_CASE("1-D OU: Lyapunov solution and simulated variance equal sigma^2 / (2 theta)") {
  const double theta = 1.5, sigma = 0.8;
  const double expected = sigma * sigma / (2 * theta);  // Gardiner, Handbook of Stochastic Methods, sec. 4.4.4
  const Eigen::MatrixXd s = *StationaryCovariance(Eigen::MatrixXd::Constant(1, 1, -theta),
                                                  Eigen::VectorXd::Constant(1, sigma));
  CHECK(s(0, 0) == doctest::Approx(expected).epsilon(1e-12));
  const DiffusionModel m = LinearDiffusion(Graph({"x"}, {{0, 0}}), theta, 0, sigma);
  PathRunOptions o;
  o.horizon = 40000;
  o.interval = 0.5;
  o.step = 0.5;
  o.burn_in = 10;
  o.method = PathMethod::kExact;
  const PathData exact = Draw(m, o, 1);
  // 80000 samples with lag-one correlation e^{-0.75}: about 27000 effective
  // samples, standard error of the variance 0.9%; tolerance 4% (common
  // practice, no source).
  // scale(0): 4% of the value (doctest's default scale 1 would make it 4% of
  // 1 + value, 23% of this variance).
  CHECK(SampleCovariance(exact.values)(0, 0) == doctest::Approx(expected).epsilon(0.04).scale(0));
  o.method = PathMethod::kEuler;
  o.horizon = 4000;
  o.step = 0.001;
  o.interval = 0.1;
  const PathData euler = Draw(m, o, 2);
  // Euler bias theta h / 2 = 0.08% (Kloeden & Platen 1992); sampling error ~3%.
  CHECK(SampleCovariance(euler.values)(0, 0) == doctest::Approx(expected).epsilon(0.10).scale(0));
}

TEST_CASE("3-D OU: Lyapunov residual and the simulated stationary covariance") {
  const DiffusionModel m = Cycle();
  REQUIRE(CheckStable(m).ok());
  const Eigen::MatrixXd s = *StationaryCovariance(m.M, m.sigma);
  const Eigen::MatrixXd residual =
      m.M * s + s * m.M.transpose() + Eigen::MatrixXd(m.sigma.array().square().matrix().asDiagonal());
  CHECK(residual.cwiseAbs().maxCoeff() < 1e-12);  // M S + S M^T + diag(sigma^2) = 0
  PathRunOptions o;
  o.horizon = 30000;
  o.interval = 0.5;
  o.burn_in = 20;
  o.method = PathMethod::kExact;
  const PathData data = Draw(m, o, 3);
  const Eigen::MatrixXd sample = SampleCovariance(data.values);
  // Tolerance 0.02 absolute on entries of size 0.05-0.5 (about 4 standard
  // errors; common practice, no source).
  CHECK((sample - s).cwiseAbs().maxCoeff() < 0.02);
  const Eigen::VectorXd mean = *StationaryMean(m);
  CHECK((data.values.colwise().mean().transpose() - mean).cwiseAbs().maxCoeff() < 0.03);
}

// One transition of length `interval` from x0, repeated: mean and covariance.
void TransitionMoments(const DiffusionModel& m, PathMethod method, double step, uint64_t seed,
                       const Eigen::VectorXd& x0, Eigen::VectorXd& mean, Eigen::MatrixXd& cov) {
  PathRunOptions o;
  o.horizon = 0.5;
  o.interval = 0.5;
  o.step = step;
  o.method = method;
  o.initial = x0;
  const int draws = 20000;
  Eigen::MatrixXd ends(draws, m.nodes());
  base::RandomStream random(seed);
  for (int i = 0; i < draws; ++i) {
    Result<PathData> d = SimulateDiffusion(m, o, random);
    if (!d.ok() || d->samples() != 2) FAIL("transition draw failed");
    ends.row(i) = d->values.row(1);
  }
  mean = ends.colwise().mean().transpose();
  cov = SampleCovariance(ends);
}

TEST_CASE("exact OU transition against Euler-Maruyama at small h") {
  const DiffusionModel m = Cycle();
  Eigen::VectorXd x0(3);
  x0 << 1.0, -2.0, 0.5;
  const OuTransition t = *ExactTransition(m.M, m.c, m.sigma, 0.5);
  const Eigen::VectorXd exact_mean = t.F * x0 + t.offset;
  // The exact mean solves dm/dt = c + M m, so a deterministic Euler
  // recursion with a tiny step converges to it (Kloeden & Platen 1992); e^{M D}
  // itself is checked against SciPy in tests/reference/ou_lyapunov_scipy.py.
  Eigen::VectorXd m_ode = x0;
  for (int i = 0; i < 500000; ++i) m_ode += 1e-6 * (m.c + m.M * m_ode);
  double gap = 0;
  for (int i = 0; i < 3; ++i) gap = std::max(gap, std::abs(m_ode(i) - exact_mean(i)));
  CHECK(gap < 1e-5);
  Eigen::VectorXd mean_e, mean_x;
  Eigen::MatrixXd cov_e, cov_x;
  TransitionMoments(m, PathMethod::kEuler, 0.005, 4, x0, mean_e, cov_e);
  TransitionMoments(m, PathMethod::kExact, 0.5, 5, x0, mean_x, cov_x);
  // 20000 draws: mean standard error <= 0.005, covariance about 1% of the
  // variances; Euler bias O(h) = 0.5%. Tolerances about 4 standard errors.
  CHECK((mean_x - exact_mean).cwiseAbs().maxCoeff() < 0.02);
  CHECK((mean_e - exact_mean).cwiseAbs().maxCoeff() < 0.02);
  CHECK((cov_x - t.covariance).cwiseAbs().maxCoeff() < 0.01);
  CHECK((cov_e - t.covariance).cwiseAbs().maxCoeff() < 0.01);
}

}  // namespace
}  // namespace locind::sim
