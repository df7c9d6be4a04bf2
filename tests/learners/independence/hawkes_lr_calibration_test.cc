// Calibration and power of the point-process likelihood-ratio test.
//
// Under the null, data are simulated from linear Hawkes truths where b is
// mu-separated from a given C in the (projected) truth; p-values should be
// uniform (Kolmogorov-Smirnov) and the rejection count at level 0.05 should
// lie in its exact binomial interval, both sized by the rule in
// calibration_checks.h (family-wise 0.001, Bonferroni over the file's 8 null
// checks). The linear model with the plain
// chi-squared reference is conservative at the boundary theta_A = 0 (see
// learners/independence/hawkes_lr_test.h): there we assert only that the rejection rate
// is not above the interval's upper end and record the measured rate.
#include <cstdio>

#include <doctest/doctest.h>

#include "graph/dmg.h"
#include "base/random_stream.h"
#include "learners/independence/hawkes_lr_test.h"
#include "sim/hawkes_model.h"
#include "sim/hawkes_simulator.h"
#include "tests/learners/independence/calibration_checks.h"

namespace locind::learners {
namespace {

constexpr int kReplicates = 300;
// Null checks of this file: per null case, the chi-squared upper end, the
// chi-bar-squared interval, the signed interval and the signed KS distance
// (CheckNull), times two null cases.
constexpr int kNullChecks = 8;
// SciPy 1.10: stats.kstwo.ppf(1 - 0.001 / 8, 300) = 0.126284 (the critical
// value of the Kolmogorov-Smirnov distance for n = 300 at level 0.001 / 8).
constexpr double kKsCritical = 0.126284;

// a -> c -> b (null for b given {b, c}), optionally with a hidden mediator
// c -> h -> b; or a -> b (alternative, `weight` on the edge).
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
  graph::Dmg g({"a", "c", "h", "b"});
  g.AddDirected(0, 1);
  g.AddDirected(1, 2);
  g.AddDirected(2, 3);
  for (int v = 0; v < 4; ++v) g.AddDirected(v, v);
  return {g, {2}};
}

struct Outcome {
  std::vector<double> p;  // per variant index
};

// p-values of the three variants (linear chi^2, linear chi-bar^2, signed)
// over `replicates` draws.
std::vector<std::vector<double>> Run(Setting s, double weight, double horizon, int replicates,
                                     uint64_t seed) {
  const graph::TruthGraph truth = Truth(s);
  const sim::HawkesModel model = sim::ExponentialHawkes(truth, 0.5, weight, 2.0, 0.2);
  sim::HawkesRunOptions o;
  o.horizon = horizon;
  o.burn_in = 50;
  std::vector<std::vector<double>> p(3);
  for (int r = 0; r < replicates; ++r) {
    base::RandomStream random(base::StreamKey{seed, uint64_t(s), uint64_t(r), 0});
    sim::EventData d = sim::SimulateHawkes(model, o, random).value();
    // Observed order: a, (c), b; query b given {b, c} or {b}.
    const int b = d.processes() - 1;
    const TestQuery q = s == Setting::kAlternative ? TestQuery{b, {0}, {b}} : TestQuery{b, {0}, {1, b}};
    auto features = std::make_shared<HawkesFeatures>(
        HawkesFeatures::Create(std::move(d), {0.5, 2.0, 8.0}).value());
    HawkesLrTest variants[] = {
        HawkesLrTest(features),
        HawkesLrTest(features, {.boundary = BoundaryReference::kChiBarSquared, .chi_bar_draws = 2000}),
        HawkesLrTest(features, {.link = HawkesLink::kSoftplus})};
    for (int v = 0; v < 3; ++v) {
      const TestResult t = variants[v].Run(q);
      REQUIRE(t.status == TestStatus::kOk);
      p[v].push_back(t.p_value);
    }
  }
  return p;
}

void Report(const char* name, const std::vector<std::vector<double>>& p) {
  const char* variants[] = {"linear chi2", "linear chi-bar2", "signed chi2"};
  for (int v = 0; v < 3; ++v) {
    std::printf("%s, %s: rejections at 0.05: %d / %zu, at 0.01: %d, KS distance %.4f\n", name,
                variants[v], CountBelow(p[v], 0.05), p[v].size(), CountBelow(p[v], 0.01),
                KolmogorovSmirnovDistance(p[v]));
  }
}

void CheckNull(const std::vector<std::vector<double>>& p) {
  // [3, 31] for n = 300 (SciPy 1.10: stats.binom.ppf([0.001 / 16,
  // 1 - 0.001 / 16], 300, 0.05)); a rate of 10.5% exceeds 31 half the time.
  const auto [lo, hi] = BinomialInterval(kReplicates, 0.05, PerCheckCoverage(kNullChecks));
  // Linear, chi-squared reference: conservative at the boundary, so only the
  // upper end is asserted.
  CHECK(CountBelow(p[0], 0.05) <= hi);
  // Linear, chi-bar-squared: p-values have an atom at 1 (statistic 0), so
  // they are not uniform on (0, 1), but rejection counts at usual levels
  // should match the level.
  CHECK(CountBelow(p[1], 0.05) >= lo);
  CHECK(CountBelow(p[1], 0.05) <= hi);
  // Signed effects: interior null, regular chi-squared: uniform p-values.
  CHECK(CountBelow(p[2], 0.05) >= lo);
  CHECK(CountBelow(p[2], 0.05) <= hi);
  CHECK(KolmogorovSmirnovDistance(p[2]) < kKsCritical);
}

// Seed history: this case was written with seed 101. With the earlier
// per-check 99% interval [6, 25] (eight such checks: about an 8% chance that
// one fails for calibrated tests) the signed variant, then with a softplus
// scale of a tenth of the rate, rejected 26 of 300 here and the seed was
// moved to 111. That was wrong; the seed is back at 101 and the bands are
// sized for the number of checks (calibration_checks.h). On 2026-12-02 the
// signed variant still rejects 26 of 300 at seed 101 (printed by Report):
// inside [3, 31], but P(X >= 26) = 0.005 for a calibrated test (SciPy
// binom.sf(25, 300, 0.05)), so its calibration deserves a longer look.
// Runs of 1,000 replicates of this case (seed 11) were measured once by hand
// on 2026-12-01, not re-run by the suite: rejections at 0.05 / 0.01 / 0.10
// were 48, 10, 105 (signed), 42, 9, 89 (chi-bar-squared), 6, 0, 13
// (chi-squared).
TEST_CASE("null without hidden processes: a -> c -> b, b given {b, c}") {
  const auto p = Run(Setting::kNull, 0.3, 1000, kReplicates, 101);
  Report("hawkes null", p);
  CheckNull(p);
}

TEST_CASE("null with a hidden mediator: a -> c -> h -> b, h hidden, b given {b, c}") {
  const auto p = Run(Setting::kNullHidden, 0.3, 1000, kReplicates, 102);
  Report("hawkes null hidden", p);
  CheckNull(p);
}

TEST_CASE("strong alternative with a long window: a -> b") {
  const auto p = Run(Setting::kAlternative, 0.3, 2000, 50, 103);
  Report("hawkes alternative w=0.3 T=2000", p);
  // Power check (not sized by the null rule; threshold from the printed counts).
  for (int v = 0; v < 3; ++v) CHECK(CountBelow(p[v], 0.05) >= 49);
}

TEST_CASE("power grows with the window for a weak effect") {
  const auto short_window = Run(Setting::kAlternative, 0.05, 200, 100, 104);
  const auto long_window = Run(Setting::kAlternative, 0.05, 2000, 100, 105);
  Report("hawkes alternative w=0.05 T=200", short_window);
  Report("hawkes alternative w=0.05 T=2000", long_window);
  CHECK(CountBelow(long_window[0], 0.05) > CountBelow(short_window[0], 0.05));
  CHECK(CountBelow(long_window[1], 0.05) > CountBelow(short_window[1], 0.05));
  CHECK(CountBelow(long_window[2], 0.05) > CountBelow(short_window[2], 0.05));
  // Property, true by construction and not a measurement: the chi-bar-squared
  // survival is a mixture of chi^2_i survivals with i <= df, each no larger
  // than the chi^2_df one at the same statistic, so its p-value is never
  // above the chi-squared p-value and its rejection count never below.
  CHECK(CountBelow(long_window[1], 0.05) >= CountBelow(long_window[0], 0.05));
  // Power check (not sized by the null rule): at least half of the 100
  // replicates reject; the threshold is set from the counts printed above.
  CHECK(CountBelow(long_window[1], 0.05) >= 50);
}

}  // namespace
}  // namespace locind::learners
