#include "sim/hawkes_model.h"

#include <doctest/doctest.h>

#include "sim/stability.h"

namespace locind::sim {
namespace {

graph::TruthGraph Chain3() {
  graph::Dmg g({"x1", "x2", "x3"});
  g.AddDirected(0, 1);
  g.AddDirected(1, 2);
  g.AddDirected(2, 0);
  g.AddDirected(0, 0);
  return graph::TruthGraph{g, {}};
}

TEST_CASE("kernel integrals, values and cumulative integrals") {
  const Kernel e = Kernel::Exponential(0.4, 2.0);
  CHECK(e.Integral() == doctest::Approx(0.4));
  CHECK(e.Value(0.5) == doctest::Approx(0.4 * 2 * std::exp(-1.0)));
  CHECK(e.Cumulative(0.5) == doctest::Approx(0.4 * (1 - std::exp(-1.0))));
  CHECK(e.Value(-1) == 0);
  const Kernel s = Kernel::SumOfExponentials({{0.2, 1.0}, {-0.1, 5.0}});
  CHECK(s.Integral() == doctest::Approx(0.1));
  CHECK(s.AbsoluteIntegral() == doctest::Approx(0.3));
  // Erlang(shape 2, rate 3) density 9 u e^{-3u} and cdf 1 - e^{-3u}(1 + 3u), by hand.
  const Kernel g = Kernel::DelayedGamma(0.5, 1.0, 2.0, 3.0);
  CHECK(g.Value(0.9) == 0);
  CHECK(g.Value(1.5) == doctest::Approx(0.5 * 9 * 0.5 * std::exp(-1.5)));
  CHECK(g.Cumulative(1.5) == doctest::Approx(0.5 * (1 - std::exp(-1.5) * 2.5)));
  CHECK(g.Cumulative(1e6) == doctest::Approx(0.5));
}

TEST_CASE("builder puts one kernel on every edge and none elsewhere") {
  const HawkesModel m = ExponentialHawkes(Chain3(), 0.3, 0.25, 2.0, 0.1);
  CHECK(m.kernels.size() == 4);
  CHECK(Validate(m).ok());
  const Eigen::MatrixXd k = m.KernelIntegrals();
  CHECK(k(1, 0) == doctest::Approx(0.25));  // x1 -> x2 is row x2, column x1
  CHECK(k(0, 0) == doctest::Approx(0.1));   // loop weight
  CHECK(k(0, 1) == 0);
}

TEST_CASE("validation names the problem") {
  HawkesModel m = ExponentialHawkes(Chain3(), 0.3, 0.25, 2.0);
  m.kernels.push_back(EdgeKernel{1, 0, Kernel::Exponential(0.1, 1)});
  CHECK(Validate(m).message().find("x2 -> x1: the truth graph has no such edge") != std::string::npos);
  m = ExponentialHawkes(Chain3(), 0.3, 0.25, 2.0);
  m.kernels.pop_back();
  CHECK(Validate(m).message().find("has no kernel") != std::string::npos);
  m = ExponentialHawkes(Chain3(), 0.3, -0.25, 2.0);
  CHECK(Validate(m).message().find("softplus or rectified") != std::string::npos);
  m.link = Link::kSoftplus;
  CHECK(Validate(m).ok());
  m.kernels[0].kernel = Kernel::DelayedGamma(0.1, 0.5, 2, 1);
  CHECK(Validate(m).message().find("delayed gamma kernel needs the linear link") != std::string::npos);
}

TEST_CASE("spectral radius, stationarity refusal and mean intensity") {
  // 3-cycle with weights w has K = w P (P a cyclic permutation), radius w; a
  // loop of 0.1 on x1 only adds to it. Value from hand computation for w = 0.5,
  // loop 0: radius 0.5.
  HawkesModel m = ExponentialHawkes(Chain3(), 0.3, 0.5, 2.0, 0.0);
  CHECK(*HawkesSpectralRadius(m) == doctest::Approx(0.5));
  CHECK(CheckStationary(m).ok());
  // (I - K)^{-1} mu for the cycle: every rate is mu / (1 - w) by symmetry.
  const Eigen::VectorXd rate = *StationaryIntensity(m);
  CHECK(rate(0) == doctest::Approx(0.6));
  CHECK(rate(2) == doctest::Approx(0.6));
  m = ExponentialHawkes(Chain3(), 0.3, 1.2, 2.0, 0.0);
  const Status s = CheckStationary(m);
  REQUIRE_FALSE(s.ok());
  CHECK(s.message().find("spectral radius") != std::string::npos);
  CHECK(s.message().find("1.2") != std::string::npos);
  CHECK_FALSE(StationaryIntensity(m).ok());
  CHECK_FALSE(SpectralRadius(Eigen::MatrixXd(2, 3)).ok());
}

}  // namespace
}  // namespace locind::sim
