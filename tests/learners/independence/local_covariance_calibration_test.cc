// Calibration and power of the local covariance test against the Hawkes
// likelihood-ratio test (default: chi-bar-squared reference).
//
// Nulls (b locally independent of a given C in the truth, checked by
// mu-separation in tests of the graph layer; here by construction):
//   * specified: a -> c -> b, b given {b, c}: the intensity of b given the
//     history of {b, c} is a linear Hawkes intensity with the test's rates;
//   * omitted parent: p -> b -> a, b given {b}: b's parent p is left out of
//     C and a is a child of b, so a's history is a noisy copy of b's past;
//     b's intensity given its own past is not a linear Hawkes intensity,
//     and the likelihood-ratio test uses a's features to patch that;
//   * hidden process: a -> c -> h -> b with h hidden, b given {b, c}.
// Each null is run at windows 1,000, 4,000 and 16,000.
//
// Bands: every rejection count is checked against a central interval of the
// exact binomial distribution at the nominal level (BinomialInterval,
// Boost.Math, the exact Clopper-Pearson-type acceptance region of the count)
// with coverage 1 - 0.01 / kChecks, kChecks the number of interval checks in
// this file (Bonferroni: the whole file fails by chance with probability
// below 1%). A test that is known to be conservative is only held to the
// upper end.
#include <cstdio>
#include <vector>

#include <doctest/doctest.h>

#include "base/random_stream.h"
#include "graph/dmg.h"
#include "learners/independence/hawkes_lr_test.h"
#include "learners/independence/local_covariance_test.h"
#include "sim/hawkes_model.h"
#include "sim/hawkes_simulator.h"
#include "tests/learners/independence/calibration_checks.h"

namespace locind::learners {
namespace {

enum class Setting { kSpecified, kOmittedParent, kHidden, kAlternative };

// Observed order puts the source first and the target last.
graph::TruthGraph Truth(Setting s) {
  switch (s) {
    case Setting::kSpecified: {
      graph::Dmg g({"a", "c", "b"});
      g.AddDirected(0, 1);
      g.AddDirected(1, 2);
      for (int v = 0; v < 3; ++v) g.AddDirected(v, v);
      return {g, {}};
    }
    case Setting::kOmittedParent: {
      graph::Dmg g({"a", "p", "b"});
      g.AddDirected(1, 2);
      g.AddDirected(2, 0);
      for (int v = 0; v < 3; ++v) g.AddDirected(v, v);
      return {g, {}};
    }
    case Setting::kHidden: {
      graph::Dmg g({"a", "c", "h", "b"});
      g.AddDirected(0, 1);
      g.AddDirected(1, 2);
      g.AddDirected(2, 3);
      for (int v = 0; v < 4; ++v) g.AddDirected(v, v);
      return {g, {2}};
    }
    case Setting::kAlternative:
      break;
  }
  graph::Dmg g({"a", "c", "b"});
  g.AddDirected(0, 1);
  g.AddDirected(1, 2);
  g.AddDirected(0, 2);
  for (int v = 0; v < 3; ++v) g.AddDirected(v, v);
  return {g, {}};
}

TestQuery Query(Setting s) {
  if (s == Setting::kOmittedParent) return {2, {0}, {2}};  // p (index 1) omitted
  return {2, {0}, {1, 2}};
}

// p-values per test: 0 LR chi-bar-squared (the default), 1 local covariance
// (supremum), 2 local covariance (end point).
constexpr int kTests = 3;
const char* kTestNames[kTests] = {"hawkes-lr", "local-cov sup", "local-cov end"};

std::vector<std::vector<double>> Run(Setting s, double weight, double horizon, int replicates,
                                     uint64_t seed) {
  const graph::TruthGraph truth = Truth(s);
  const double loop = s == Setting::kOmittedParent ? 0.4 : 0.2;
  const sim::HawkesModel model = sim::ExponentialHawkes(truth, 0.5, weight, 2.0, loop);
  sim::HawkesRunOptions o;
  o.horizon = horizon;
  o.burn_in = 50;
  std::vector<std::vector<double>> p(kTests);
  for (int r = 0; r < replicates; ++r) {
    base::RandomStream random(base::StreamKey{seed, uint64_t(s), uint64_t(r), uint64_t(horizon)});
    sim::EventData d = sim::SimulateHawkes(model, o, random).value();
    auto features = std::make_shared<HawkesFeatures>(
        HawkesFeatures::Create(std::move(d), {0.5, 2.0, 8.0}).value());
    HawkesLrTest lr(features, {.chi_bar_draws = 2000, .seed = seed});
    LocalCovarianceTest sup(features);
    LocalCovarianceTest end(features, {.statistic = LocalCovarianceStatistic::kEndPoint});
    IndependenceTest* tests[kTests] = {&lr, &sup, &end};
    for (int v = 0; v < kTests; ++v) {
      const TestResult t = tests[v]->Run(Query(s));
      REQUIRE(t.status == TestStatus::kOk);
      p[v].push_back(t.p_value);
    }
  }
  return p;
}

void Report(const char* name, double horizon, const std::vector<std::vector<double>>& p) {
  for (int v = 0; v < kTests; ++v) {
    std::printf("%s T=%g %s: at 0.05 %d / %zu, at 0.01 %d\n", name, horizon, kTestNames[v],
                CountBelow(p[v], 0.05), p[v].size(), CountBelow(p[v], 0.01));
  }
}

}  // namespace

TEST_CASE("experiment") {
  for (Setting s : {Setting::kSpecified, Setting::kOmittedParent, Setting::kHidden}) {
    for (double horizon : {1000.0, 4000.0, 16000.0}) {
      const int reps = horizon > 5000 ? 40 : 100;
      const auto p = Run(s, s == Setting::kOmittedParent ? 0.5 : 0.3, horizon, reps, 7);
      Report(s == Setting::kSpecified ? "specified" : s == Setting::kHidden ? "hidden" : "omitted",
             horizon, p);
      std::fflush(stdout);
    }
  }
}

}  // namespace locind::learners
