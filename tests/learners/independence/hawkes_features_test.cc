#include "learners/independence/hawkes_features.h"

#include <cmath>

#include <doctest/doctest.h>

#include "base/random_stream.h"

namespace locind::learners {
namespace {

sim::EventData TwoStreams() {
  sim::EventData d;
  d.names = {"a", "b"};
  d.times = {{1.0, 2.0, 4.5}, {2.0, 3.0, 5.0}};
  d.start = 0;
  d.end = 6;
  return d;
}

TEST_CASE("features at events are left limits of the kernel sums") {
  auto f = HawkesFeatures::Create(TwoStreams(), {1.0, 2.0}).value();
  const Eigen::MatrixXd& x = f.AtEvents(1, 0);  // a's history at b's events 2, 3, 5
  REQUIRE(x.rows() == 3);
  // At t = 2 the a-event at 2 is not yet in the past: only s = 1 counts.
  CHECK(x(0, 0) == doctest::Approx(std::exp(-1.0)));
  CHECK(x(0, 1) == doctest::Approx(2 * std::exp(-2.0)));
  CHECK(x(1, 0) == doctest::Approx(std::exp(-2.0) + std::exp(-1.0)));
  CHECK(x(2, 1) == doctest::Approx(2 * (std::exp(-8.0) + std::exp(-6.0) + std::exp(-1.0))));
  // Own past: b at 3 sees its event at 2 only.
  CHECK(f.AtEvents(1, 1)(1, 0) == doctest::Approx(std::exp(-1.0)));
  CHECK(f.AtEvents(1, 1)(0, 0) == 0.0);
}

TEST_CASE("integrals over the window are closed-form") {
  auto f = HawkesFeatures::Create(TwoStreams(), {1.0, 2.0}).value();
  const Eigen::VectorXd& i = f.Integrals(0);
  CHECK(i[0] == doctest::Approx(3 - std::exp(-5.0) - std::exp(-4.0) - std::exp(-1.5)));
  CHECK(i[1] == doctest::Approx(3 - std::exp(-10.0) - std::exp(-8.0) - std::exp(-3.0)));
}

TEST_CASE("the recursion matches direct sums on random streams") {
  base::RandomStream random(3);
  sim::EventData d;
  d.names = {"a", "b"};
  d.end = 50;
  for (int p = 0; p < 2; ++p) {
    std::vector<double> t;
    for (int k = 0; k < 200; ++k) t.push_back(50 * random.Uniform());
    std::sort(t.begin(), t.end());
    d.times.push_back(t);
  }
  auto f = HawkesFeatures::Create(d, {0.3, 1.0, 5.0}).value();
  const Eigen::MatrixXd& x = f.AtEvents(0, 1);
  double worst = 0;
  for (size_t i = 0; i < d.times[0].size(); ++i) {
    for (int k = 0; k < 3; ++k) {
      const double r = f.rates()[k];
      double direct = 0;
      for (double s : d.times[1]) {
        if (s < d.times[0][i]) direct += r * std::exp(-r * (d.times[0][i] - s));
      }
      worst = std::max(worst, std::abs(direct - x(Eigen::Index(i), k)) / (1 + direct));
    }
  }
  CHECK(worst < 1e-12);
}

TEST_CASE("the quadrature grid integrates the features to their closed form") {
  base::RandomStream random(4);
  sim::EventData d;
  d.names = {"a", "b"};
  d.end = 100;
  for (int p = 0; p < 2; ++p) {
    std::vector<double> t;
    for (int k = 0; k < 120; ++k) t.push_back(100 * random.Uniform());
    std::sort(t.begin(), t.end());
    d.times.push_back(t);
  }
  auto f = HawkesFeatures::Create(d, DefaultHawkesRates(d)).value();
  const Eigen::VectorXd by_grid = f.AtGrid(1).transpose() * f.QuadratureGrid().weights;
  const Eigen::VectorXd exact = f.Integrals(1);
  // Error bound of the rule: (r h)^6 / 2e6 <= 5e-7 relative per part.
  for (int k = 0; k < 3; ++k) CHECK(by_grid[k] == doctest::Approx(exact[k]).epsilon(1e-6));
  CHECK(f.QuadratureGrid().weights.sum() == doctest::Approx(100.0).epsilon(1e-12));
}

TEST_CASE("default rates follow the mean inter-event time") {
  sim::EventData d = TwoStreams();  // 6 events, 2 processes, duration 6: tau = 2
  const std::vector<double> r = DefaultHawkesRates(d);
  REQUIRE(r.size() == 3);
  CHECK(r[0] == doctest::Approx(0.125));
  CHECK(r[1] == doctest::Approx(0.5));
  CHECK(r[2] == doctest::Approx(2.0));
}

TEST_CASE("blocks are computed once and shared") {
  auto f = HawkesFeatures::Create(TwoStreams(), {1.0}).value();
  const Eigen::MatrixXd* first = &f.AtEvents(1, 0);
  CHECK(&f.AtEvents(1, 0) == first);
  CHECK(f.computed_blocks() == 1);
  f.ComputeAll();
  CHECK(f.computed_blocks() == 4);
}

TEST_CASE("invalid data and rates are refused") {
  sim::EventData d = TwoStreams();
  d.times[0] = {2.0, 1.0};
  CHECK(!HawkesFeatures::Create(d, {1.0}).ok());
  d = TwoStreams();
  d.times[1].push_back(7.0);  // after the window
  CHECK(!HawkesFeatures::Create(d, {1.0}).ok());
  CHECK(!HawkesFeatures::Create(TwoStreams(), {0.0}).ok());
  CHECK(!HawkesFeatures::Create(TwoStreams(), {}).ok());
}

// Two trials on their own clocks: trial 1 on [0, 5] (x at 1, 2; y at 3),
// trial 2 on [0, 4] (x at 0.5; y at 1.5, 3).
sim::EventData TwoTrials() {
  sim::EventData one, two;
  one.names = two.names = {"x", "y"};
  one.times = {{1.0, 2.0}, {3.0}};
  one.end = 5;
  two.times = {{0.5}, {1.5, 3.0}};
  two.end = 4;
  sim::EventData d;
  sim::AppendTrial(d, one);
  sim::AppendTrial(d, two);
  return d;
}

TEST_CASE("with trials the filters restart at each trial's start") {
  auto f = HawkesFeatures::Create(TwoTrials(), {1.0}).value();
  REQUIRE(f.data().trial_count() == 2);
  CHECK(f.data().duration() == 9.0);
  // Hand-computed kernel sums exp(-(t - s)) over the same trial's x events.
  const Eigen::MatrixXd& x = f.AtEvents(1, 0);
  REQUIRE(x.rows() == 3);
  CHECK(x(0, 0) == doctest::Approx(std::exp(-2.0) + std::exp(-1.0)));
  CHECK(x(1, 0) == doctest::Approx(std::exp(-1.0)));  // trial 2 sees only x at 0.5
  CHECK(x(2, 0) == doctest::Approx(std::exp(-2.5)));
  // Own past of y: its first event of trial 2 has none (y at 3 of trial 1 is another trial).
  CHECK(f.AtEvents(1, 1)(1, 0) == 0.0);
  CHECK(f.AtEvents(1, 1)(2, 0) == doctest::Approx(std::exp(-1.5)));
  // Integrals stop at each trial's end: (1 - e^-4) + (1 - e^-3) + (1 - e^-3.5).
  CHECK(f.Integrals(0)[0] == doctest::Approx(3 - std::exp(-4.0) - std::exp(-3.0) - std::exp(-3.5)));
  // The quadrature grid covers both windows (total weight 9) and its nodes
  // integrate the features exactly as the closed form does.
  CHECK(f.QuadratureGrid().weights.sum() == doctest::Approx(9.0).epsilon(1e-12));
  const double by_grid = f.AtGrid(0).col(0).dot(f.QuadratureGrid().weights);
  CHECK(by_grid == doctest::Approx(f.Integrals(0)[0]).epsilon(1e-6));
  // Stacked clock: trial 2 starts where trial 1 ends (5).
  CHECK(f.StackedTimes(1) == std::vector<double>{3.0, 6.5, 8.0});
  CHECK(f.TrialOfEvents(1) == std::vector<int>{0, 1, 1});
}

TEST_CASE("the same events on one clock carry history across the gap") {
  // Trial 2 moved to [5, 9] of one window [0, 9]: y at 6.5 now also sees x at
  // 1 and 2 of trial 1 (hand-computed), unlike the two-trial data above.
  sim::EventData d;
  d.names = {"x", "y"};
  d.times = {{1.0, 2.0, 5.5}, {3.0, 6.5, 8.0}};
  d.end = 9;
  auto f = HawkesFeatures::Create(d, {1.0}).value();
  CHECK(f.AtEvents(1, 0)(1, 0) == doctest::Approx(std::exp(-5.5) + std::exp(-4.5) + std::exp(-1.0)));
}

TEST_CASE("a trial list is checked trial by trial") {
  sim::EventData d = TwoTrials();
  CHECK(ValidateEventData(d).ok());
  d.times[1][2] = 4.5;  // beyond trial 2's end (4)
  CHECK(ValidateEventData(d).message().find("trial 2") != std::string::npos);
  d = TwoTrials();
  d.trials.pop_back();  // one trial in a trial list
  CHECK(!ValidateEventData(d).ok());
}

}  // namespace
}  // namespace locind::learners
