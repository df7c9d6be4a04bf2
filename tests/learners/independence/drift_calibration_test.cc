// Calibration and power of the drift-regression test.
//
// Under the null, paths are simulated from linear (Ornstein-Uhlenbeck)
// truths where b is mu-separated from a given C in the (projected) truth;
// p-values should be uniform (Kolmogorov-Smirnov) and the rejection count at
// level 0.05 should lie in its exact binomial interval, for the F test and
// the robust Wald variant; both bands are sized by the rule in
// calibration_checks.h (family-wise 0.001, Bonferroni over the file's 8 null
// checks). Sampling at interval dt makes the discrete
// transition e^{M dt} couple a to b through c at order dt^2 (here
// 0.5 * 0.5 * 0.1^2 / 2 per unit), far below what 5,000 increments detect.
#include <cstdio>

#include <doctest/doctest.h>

#include "graph/dmg.h"
#include "base/random_stream.h"
#include "learners/independence/drift_test.h"
#include "sim/diffusion_model.h"
#include "sim/diffusion_simulator.h"
#include "tests/learners/independence/calibration_checks.h"

namespace locind::learners {
namespace {

constexpr int kReplicates = 300;
// Null checks of this file: per null case and variant, the rejection-count
// interval and the KS distance (CheckNull): 2 x 2 x 2.
constexpr int kNullChecks = 8;
// SciPy 1.10: stats.kstwo.ppf(1 - 0.001 / 8, 300) = 0.126284.
constexpr double kKsCritical = 0.126284;

enum class Setting { kNull, kNullHidden, kAlternative };

graph::TruthGraph Truth(Setting s) {
  if (s == Setting::kAlternative) {
    graph::Dmg g({"a", "b"});
    g.AddDirected(0, 1);
    for (int v = 0; v < 2; ++v) g.AddDirected(v, v);
    return {g, {}};
  }
  if (s == Setting::kNull) {
    graph::Dmg g({"a", "c", "b"});
    g.AddDirected(0, 1);
    g.AddDirected(1, 2);
    for (int v = 0; v < 3; ++v) g.AddDirected(v, v);
    return {g, {}};
  }
  // The hidden mediator h makes b's drift depend on c's past, not only on
  // its present: the filtered histories are needed.
  graph::Dmg g({"a", "c", "h", "b"});
  g.AddDirected(0, 1);
  g.AddDirected(1, 2);
  g.AddDirected(2, 3);
  for (int v = 0; v < 4; ++v) g.AddDirected(v, v);
  return {g, {2}};
}

// p-values of the F test and the robust Wald test over `replicates` draws.
std::vector<std::vector<double>> Run(Setting s, double coupling, double horizon, int replicates,
                                     uint64_t seed) {
  const sim::DiffusionModel model = sim::LinearDiffusion(Truth(s), 1.0, coupling, 1.0);
  sim::PathRunOptions o;
  o.horizon = horizon;
  o.interval = 0.1;
  o.step = 0.01;
  o.burn_in = 20;
  std::vector<std::vector<double>> p(2);
  for (int r = 0; r < replicates; ++r) {
    base::RandomStream random(base::StreamKey{seed, uint64_t(s), uint64_t(r), 0});
    sim::PathData d = sim::SimulateDiffusion(model, o, random).value();
    const int b = d.processes() - 1;
    const TestQuery q = s == Setting::kAlternative ? TestQuery{b, {0}, {b}} : TestQuery{b, {0}, {1, b}};
    for (int v = 0; v < 2; ++v) {
      const DriftStatistic stat = v == 0 ? DriftStatistic::kF : DriftStatistic::kRobustWald;
      auto test = DriftTest::Create(d, {.statistic = stat}).value();
      const TestResult t = test.Run(q);
      REQUIRE(t.status == TestStatus::kOk);
      p[v].push_back(t.p_value);
    }
  }
  return p;
}

void Report(const char* name, const std::vector<std::vector<double>>& p) {
  const char* variants[] = {"F", "robust Wald"};
  for (int v = 0; v < 2; ++v) {
    std::printf("%s, %s: rejections at 0.05: %d / %zu, at 0.01: %d, KS distance %.4f\n", name,
                variants[v], CountBelow(p[v], 0.05), p[v].size(), CountBelow(p[v], 0.01),
                KolmogorovSmirnovDistance(p[v]));
  }
}

void CheckNull(const std::vector<std::vector<double>>& p) {
  // [3, 31] (SciPy binom.ppf, checked in the first test case).
  const auto [lo, hi] = BinomialInterval(kReplicates, 0.05, PerCheckCoverage(kNullChecks));
  for (int v = 0; v < 2; ++v) {
    CHECK(CountBelow(p[v], 0.05) >= lo);
    CHECK(CountBelow(p[v], 0.05) <= hi);
    CHECK(KolmogorovSmirnovDistance(p[v]) < kKsCritical);
  }
}

TEST_CASE("the binomial interval matches SciPy") {
  // SciPy 1.10: stats.binom.ppf([0.005, 0.995], 300, 0.05) = [6, 25];
  // stats.binom.ppf([0.005, 0.995], 200, 0.05) = [3, 19];
  // stats.binom.ppf([0.001 / 16, 1 - 0.001 / 16], 300, 0.05) = [3, 31] (the
  // band of both calibration files, 8 null checks each).
  CHECK(BinomialInterval(300, 0.05, 0.99) == std::make_pair(6, 25));
  CHECK(BinomialInterval(200, 0.05, 0.99) == std::make_pair(3, 19));
  CHECK(BinomialInterval(300, 0.05, PerCheckCoverage(8)) == std::make_pair(3, 31));
  CHECK(KolmogorovSmirnovDistance({0.25, 0.75}) == doctest::Approx(0.25));
}

TEST_CASE("null without hidden processes: a -> c -> b, b given {b, c}") {
  const auto p = Run(Setting::kNull, 0.5, 500, kReplicates, 201);
  Report("drift null", p);
  CheckNull(p);
}

TEST_CASE("null with a hidden mediator: a -> c -> h -> b, h hidden, b given {b, c}") {
  const auto p = Run(Setting::kNullHidden, 0.5, 500, kReplicates, 202);
  Report("drift null hidden", p);
  CheckNull(p);
}

TEST_CASE("strong alternative with a long window: a -> b") {
  const auto p = Run(Setting::kAlternative, 0.5, 500, 50, 203);
  Report("drift alternative c=0.5 T=500", p);
  // Power check (not sized by the null rule; threshold from the printed counts).
  for (int v = 0; v < 2; ++v) CHECK(CountBelow(p[v], 0.05) >= 49);
}

TEST_CASE("power grows with the window for a weak coupling") {
  const auto short_window = Run(Setting::kAlternative, 0.1, 50, 100, 204);
  const auto long_window = Run(Setting::kAlternative, 0.1, 500, 100, 205);
  Report("drift alternative c=0.1 T=50", short_window);
  Report("drift alternative c=0.1 T=500", long_window);
  for (int v = 0; v < 2; ++v) {
    CHECK(CountBelow(long_window[v], 0.05) > CountBelow(short_window[v], 0.05));
  }
}

}  // namespace
}  // namespace locind::learners
