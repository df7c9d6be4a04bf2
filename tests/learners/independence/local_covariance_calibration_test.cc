// Calibration and power of the local covariance test (event-local-covariance,
// supremum statistic; and its end-point variant) next to the Hawkes
// likelihood-ratio test with its default chi-bar-squared reference.
//
// Nulls (b locally independent of a given C in the truth: b is mu-separated
// from a given C in the latent projection):
//   * specified: a -> c -> b, b given {b, c}, kernel decay 2 on the rate grid
//     {0.5, 2, 8}: b's intensity given {b, c} is a linear Hawkes intensity of
//     the test's basis;
//   * omitted parent (the demo truth of configs/demo.yaml with fixed
//     parameters: weights 0.6, loops 0.55, slow and fast kernels): flow_alert given {flow_alert, valve_alarm}, source
//     operator_log; flow_alert's parent pressure_alert is left out of C and
//     two drivers are hidden, so flow_alert's intensity given C is not a
//     linear Hawkes intensity, and operator_log (a child of flow_alert) is a
//     noisy copy of flow_alert's past; default rate grid, as in studies;
//   * hidden process: a -> c -> h -> b with h hidden, b given {b, c}.
// Windows 1,000, 4,000 and 16,000.
//
// Bands (the rule): each rejection count is compared with the central
// interval of the exact Binomial(n, level) distribution (BinomialInterval,
// Boost.Math) of coverage 1 - 0.01 / kChecks, kChecks = the number of such
// interval checks in this file (Bonferroni: the file fails by chance with
// probability below 1%). On the nulls with an omitted parent or a hidden
// process only the upper end is asserted, and only for the local covariance
// test; the likelihood-ratio counts are printed (the LR over-rejects there:
// that is what the local covariance test is for). The printed 95%
// Clopper-Pearson upper bounds are the measured targets.
//
// Seeds: 7 was used while developing (results in docs/tests.md); the seeds
// below were run once, after the code was fixed.
#include <cstdio>
#include <utility>
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

// Interval checks in this file (see the rule above).
constexpr int kChecks = 24;
constexpr double kCoverage = 1 - 0.01 / kChecks;

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
      // configs/demo.yaml: observed first, hidden power_dip and maintenance last.
      graph::Dmg g({"pump_alarm", "pressure_alert", "flow_alert", "valve_alarm", "operator_log",
                    "power_dip", "maintenance"});
      g.AddDirected(0, 1);
      g.AddDirected(1, 2);
      g.AddDirected(3, 2);
      g.AddDirected(2, 4);
      g.AddDirected(5, 0);
      g.AddDirected(5, 1);
      g.AddDirected(6, 3);
      g.AddDirected(6, 4);
      for (int v : {0, 2, 4, 5}) g.AddDirected(v, v);
      return {g, {5, 6}};
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
  if (s == Setting::kOmittedParent) return {2, {4}, {2, 3}};  // pressure_alert (1) omitted
  return {2, {0}, {1, 2}};
}

// p-values per test: 0 LR chi-bar-squared (the default), 1 local covariance
// (supremum), 2 local covariance (end point).
constexpr int kTests = 3;
const char* kTestNames[kTests] = {"hawkes-lr", "local-cov sup", "local-cov end"};

std::vector<std::vector<double>> Run(Setting s, double horizon, int replicates, uint64_t seed) {
  const graph::TruthGraph truth = Truth(s);
  sim::HawkesModel model =
      s == Setting::kOmittedParent ? sim::ExponentialHawkes(truth, 0.3, 0.6, 3.0, 0.55)
      : s == Setting::kAlternative ? sim::ExponentialHawkes(truth, 0.5, 0.1, 2.0, 0.2)
                                   : sim::ExponentialHawkes(truth, 0.5, 0.3, 2.0, 0.2);
  if (s == Setting::kOmittedParent) {
    // Slow kernels (decay 0.5) out of the hidden drivers and on the omitted
    // parent's edge, fast ones (decay 3) elsewhere: time scales a factor 6
    // apart, as the demo's decays in [1, 3] and more. Spectral radius 0.55
    // (the loops; the rest is acyclic).
    for (sim::EdgeKernel& e : model.kernels) {
      if (e.from >= 5 || (e.from == 1 && e.to == 2)) e.kernel.terms[0].decay = 0.5;
    }
  }
  sim::HawkesRunOptions o;
  o.horizon = horizon;
  o.burn_in = 50;
  std::vector<std::vector<double>> p(kTests);
  for (int r = 0; r < replicates; ++r) {
    base::RandomStream random(base::StreamKey{seed, uint64_t(s), uint64_t(r), uint64_t(horizon)});
    sim::EventData d = sim::SimulateHawkes(model, o, random).value();
    std::vector<double> rates = {0.5, 2.0, 8.0};
    if (s == Setting::kOmittedParent) rates = DefaultHawkesRates(d);
    auto features =
        std::make_shared<HawkesFeatures>(HawkesFeatures::Create(std::move(d), rates).value());
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
    const int n = int(p[v].size()), k5 = CountBelow(p[v], 0.05), k1 = CountBelow(p[v], 0.01);
    std::printf("%s T=%g %s: at 0.05 %d / %d (95%% upper %.3f), at 0.01 %d (95%% upper %.3f)\n",
                name, horizon, kTestNames[v], k5, n, ClopperPearsonUpper(k5, n, 0.95), k1,
                ClopperPearsonUpper(k1, n, 0.95));
  }
  std::fflush(stdout);
}

// Both levels inside the interval (two interval checks per call).
void CheckHolds(const std::vector<double>& p) {
  for (double level : {0.05, 0.01}) {
    const auto [lo, hi] = BinomialInterval(int(p.size()), level, kCoverage);
    CHECK(CountBelow(p, level) >= lo);
    CHECK(CountBelow(p, level) <= hi);
  }
}

// Only the upper end at both levels (two checks per call).
void CheckNotAbove(const std::vector<double>& p) {
  for (double level : {0.05, 0.01}) {
    CHECK(CountBelow(p, level) <= BinomialInterval(int(p.size()), level, kCoverage).second);
  }
}

constexpr uint64_t kSeed = 2026;

}  // namespace

// Specified nulls: hawkes-lr and the local covariance test hold the level
// (4 interval checks per window: 12).
TEST_CASE("specified null: hawkes-lr and the local covariance test hold the level") {
  for (const auto& [horizon, reps] : {std::pair{1000.0, 200}, {4000.0, 80}, {16000.0, 25}}) {
    const auto p = Run(Setting::kSpecified, horizon, reps, kSeed);
    Report("specified", horizon, p);
    CheckHolds(p[0]);
    CheckHolds(p[1]);
  }
}

// Omitted parent and hidden drivers (demo truth): 2 upper-end checks per
// window (6).
TEST_CASE("omitted parent and hidden drivers: the local covariance test stays below the band") {
  for (const auto& [horizon, reps] : {std::pair{1000.0, 100}, {4000.0, 50}, {16000.0, 25}}) {
    const auto p = Run(Setting::kOmittedParent, horizon, reps, kSeed);
    Report("omitted parent (demo)", horizon, p);
    CheckNotAbove(p[1]);
  }
}

// Hidden mediator: 2 upper-end checks per window (6).
TEST_CASE("hidden mediator: the local covariance test stays below the band") {
  for (const auto& [horizon, reps] : {std::pair{1000.0, 100}, {4000.0, 50}, {16000.0, 25}}) {
    const auto p = Run(Setting::kHidden, horizon, reps, kSeed);
    Report("hidden mediator", horizon, p);
    CheckNotAbove(p[1]);
  }
}

// The development run (seed 7; skipped unless run with --no-skip).
TEST_CASE("development run on the tuning seed" * doctest::skip()) {
  for (Setting s : {Setting::kSpecified, Setting::kOmittedParent, Setting::kHidden}) {
    for (const auto& [horizon, reps] : {std::pair{1000.0, 100}, {4000.0, 50}, {16000.0, 20}}) {
      if (s != Setting::kOmittedParent && horizon < 16000) continue;
      Report(s == Setting::kSpecified ? "dev specified" : s == Setting::kHidden ? "dev hidden" : "dev omitted",
             horizon, Run(s, horizon, reps, 7));
    }
  }
}

// Power on a fixed alternative (a -> b directly, weight 0.1, besides
// a -> c -> b), window 2,000; the counts are compared, not banded.
TEST_CASE("power on a fixed alternative, next to hawkes-lr") {
  const auto p = Run(Setting::kAlternative, 2000, 60, kSeed);
  Report("alternative a -> b w=0.1", 2000, p);
  // Regression floor (measured, not from a source): both tests find the
  // effect in most replicates.
  CHECK(CountBelow(p[0], 0.05) >= 30);
  CHECK(CountBelow(p[1], 0.05) >= 20);
}

}  // namespace locind::learners
