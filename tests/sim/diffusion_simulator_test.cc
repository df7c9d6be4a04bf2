// Diffusion simulators: closed forms, grid, refusals. The statistical
// reference checks are in ou_reference_test.cc.
#include "sim/diffusion_simulator.h"

#include <cmath>

#include <doctest/doctest.h>

#include "tests/sim/sim_fixtures.h"

namespace locind::sim {
namespace {

using testing::Cycle;
using testing::Draw;
using testing::Graph;

TEST_CASE("Lyapunov solution: 1-D closed form and 3-D residual") {
  const double theta = 1.5, sigma = 0.8;
  const Eigen::MatrixXd s1 = *StationaryCovariance(Eigen::MatrixXd::Constant(1, 1, -theta),
                                                   Eigen::VectorXd::Constant(1, sigma));
  // sigma^2 / (2 theta): Gardiner, Handbook of Stochastic Methods, sec. 4.4.4.
  CHECK(s1(0, 0) == doctest::Approx(sigma * sigma / (2 * theta)).epsilon(1e-12));
  const DiffusionModel m = Cycle();
  const Eigen::MatrixXd s = *StationaryCovariance(m.M, m.sigma);
  const Eigen::MatrixXd residual =
      m.M * s + s * m.M.transpose() + Eigen::MatrixXd(m.sigma.array().square().matrix().asDiagonal());
  CHECK(residual.cwiseAbs().maxCoeff() < 1e-12);  // M S + S M^T + diag(sigma^2) = 0
  CHECK_FALSE(StationaryCovariance(Eigen::MatrixXd::Identity(2, 2), Eigen::VectorXd::Ones(2)).ok());
}

TEST_CASE("tanh drift: value, simulation with sigma = 0 is the Euler recursion") {
  DiffusionModel m = TanhDiffusion(Graph({"x1", "x2"}, {{0, 0}, {1, 1}, {0, 1}}), 2.0, 1.5, 0.0);
  m.c << 0.1, 0.0;
  Eigen::VectorXd x(2), f(2);
  x << 0.8, -0.3;
  m.Drift(x, f);
  CHECK(f(0) == doctest::Approx(0.1 - 2.0 * 0.8));
  CHECK(f(1) == doctest::Approx(-2.0 * -0.3 + 1.5 * std::tanh(0.8)));
  PathRunOptions o;
  o.horizon = 0.01;
  o.interval = 0.01;
  o.step = 0.01;
  o.initial = x;
  const PathData d = Draw(m, o, 6);
  CHECK(d.values(1, 1) == doctest::Approx(x(1) + 0.01 * f(1)).epsilon(1e-12));
  o.method = PathMethod::kExact;
  base::RandomStream random(1);
  Result<PathData> r = SimulateDiffusion(m, o, random);
  REQUIRE_FALSE(r.ok());
  CHECK(r.status().message().find("linear drift") != std::string::npos);
}

TEST_CASE("grid, hidden columns dropped, reproducibility") {
  DiffusionModel m = LinearDiffusion(Graph({"x1", "h", "x2"}, {{0, 0}, {1, 1}, {2, 2}, {1, 0}, {1, 2}},
                                           {1}),
                                     1.0, 0.8, 1.0);
  PathRunOptions o;
  o.horizon = 10;
  o.step = 0.01;
  o.interval = 0.1;
  o.burn_in = 5;
  const PathData d = Draw(m, o, 7);
  CHECK(d.names == std::vector<std::string>{"x1", "x2"});
  CHECK(d.samples() == 101);
  CHECK(d.time.back() == doctest::Approx(10.0));
  CHECK(d.values.cols() == 2);
  CHECK(Draw(m, o, 7).values == d.values);
  CHECK(Draw(m, o, 8).values != d.values);
  o.interval = 0.015;
  base::RandomStream random(1);
  Result<PathData> r = SimulateDiffusion(m, o, random);
  REQUIRE_FALSE(r.ok());
  CHECK(r.status().message().find("not a multiple of the step") != std::string::npos);
}

TEST_CASE("stability refusals name the cause") {
  DiffusionModel m = Cycle(3.0);  // strong cycle: an eigenvalue crosses zero
  Status s = CheckStable(m);
  REQUIRE_FALSE(s.ok());
  CHECK(s.message().find("unstable: the drift matrix has an eigenvalue with real part") !=
        std::string::npos);
  base::RandomStream random(1);
  CHECK_FALSE(SimulateDiffusion(m, PathRunOptions(), random).ok());
  // No loop on x2: no self term, so x2 is a random walk.
  m = LinearDiffusion(Graph({"x1", "x2"}, {{0, 0}, {0, 1}}), 1.0, 0.5, 1.0);
  s = CheckStable(m);
  REQUIRE_FALSE(s.ok());
  CHECK(s.message().find("node x2 has no loop x2 -> x2") != std::string::npos);
  m.M(0, 1) = 0.3;  // x2 -> x1 is not in the graph
  CHECK(Validate(m).message().find("no edge x2 -> x1") != std::string::npos);
  m = TanhDiffusion(Graph({"x1", "x2"}, {{0, 0}, {0, 1}}), 1.0, 0.5, 1.0);
  CHECK(CheckStable(m).message().find("node x2 has no mean reversion") != std::string::npos);
}

TEST_CASE("path trials are successive draws, stacked with their starts marked") {
  DiffusionModel m = LinearDiffusion(Graph({"x1", "x2"}, {{0, 0}, {1, 1}, {0, 1}}), 1.0, 0.5, 1.0);
  PathRunOptions o;
  o.horizon = 5;
  o.step = 0.01;
  o.interval = 0.1;
  base::RandomStream random(19), same(19);
  const Result<PathData> trials = SimulateDiffusionTrials(m, o, 2, random);
  REQUIRE(trials.ok());
  CHECK(trials->trial_starts == std::vector<int>{51});
  CHECK(trials->increments() == 100);
  const PathData first = SimulateDiffusion(m, o, same).value();
  const PathData second = SimulateDiffusion(m, o, same).value();
  CHECK(trials->values.topRows(51) == first.values);
  CHECK(trials->values.bottomRows(51) == second.values);
}

}  // namespace
}  // namespace locind::sim
