// Coverage of the summary's power interval (metrics::ClusteredRatioInterval)
// in simulated studies of the demo's size: 2 truths x 8 replicates x 6 solid
// edges, 1,000 studies per scenario.
//
// Model: replicate-level random effects. Each replicate draws its own power
// p_r ~ Beta(a, b) and finds Binomial(6, p_r) of its solid edges: the
// beta-binomial model of clustered binary data (Williams 1975, Biometrics 31,
// "The analysis of binary responses from toxicological experiments involving
// reproduction and teratogenicity"), intra-replicate correlation
// 1 / (a + b + 1). The known power is E[p_r] = a / (a + b). A Beta(a, b)
// draw with whole a, b is the a-th smallest of a + b - 1 uniforms (order
// statistics of the uniform; David & Nagaraja 2003, Order Statistics, sec.
// 2.1, value from memory).
//
// A third scenario puts the variation between truths instead: each truth
// draws its power q_t ~ Beta(4, 4) (mean 0.5, sd 0.17) and all its
// replicates find Binomial(6, q_t); with 10 truths x 2 replicates the
// truth-level resampling has to carry the interval. (With 2 truths x 8
// replicates the same model covers only 716 of 1,000 on seed 777: the limit
// documented in metrics/cell_summary.h, not checked here.)
//
// The rule: a nominal 95% interval whose true coverage is at least 95%
// covers in X ~ Binomial(1000, 0.95) studies or more; P(X <= 929) = 0.0023
// (SciPy 1.10.1, scipy.stats.binom.cdf(929, 1000, 0.95)). Requiring at least
// 930 covered in each of the 3 scenarios gives a false alarm below
// 3 x 0.0023 = 0.007 (Bonferroni over the 3 checks of this file), while a
// method covering only 94% fails with probability 1 - 0.084 per scenario
// (binom.cdf(929, 1000, 0.94) = 0.084).
//
// Seeds: developed on 20261202 and 20261203 (962 and 954 covered) and 777
// for the between-truths scenario (955); the checked seeds below (8101,
// 8102, 8103) were run once, after the method was fixed: 963, 948 and 945
// covered. About 1.5 s of CPU, so no calibration label.
#include "metrics/intervals.h"

#include <doctest/doctest.h>

#include <algorithm>
#include <vector>

#include "base/random_stream.h"

namespace locind::metrics {
namespace {

constexpr int kTruths = 2;
constexpr int kReplicates = 8;   // per truth
constexpr int kSolidEdges = 6;   // per replicate
constexpr int kStudies = 1000;

double Beta(int a, int b, base::RandomStream& random) {
  std::vector<double> u(a + b - 1);
  for (double& x : u) x = random.Uniform();
  std::nth_element(u.begin(), u.begin() + (a - 1), u.end());
  return u[a - 1];
}

// Studies (out of kStudies) whose 95% interval covers a / (a + b).
int Covered(int a, int b, uint64_t seed) {
  const double power = double(a) / (a + b);
  int covered = 0;
  for (int study = 0; study < kStudies; ++study) {
    base::RandomStream data(base::StreamKey{seed, 0, static_cast<uint64_t>(study), 1});
    std::vector<ClusteredValue> values;
    for (int t = 0; t < kTruths; ++t) {
      for (int r = 0; r < kReplicates; ++r) {
        const double p = Beta(a, b, data);
        int found = 0;
        for (int e = 0; e < kSolidEdges; ++e) found += data.Uniform() < p ? 1 : 0;
        values.push_back({t, double(found), double(kSolidEdges)});
      }
    }
    base::RandomStream resample(base::StreamKey{seed, 0, static_cast<uint64_t>(study), 2});
    const Interval i = ClusteredRatioInterval(values, 2000, resample);
    if (i.low <= power && power <= i.high) ++covered;
  }
  return covered;
}

TEST_CASE("95% cluster-bootstrap power intervals cover the known power in >= 93% of 1,000 studies") {
  // Power 0.5 (the demo's maximal-search level), correlation 1/5.
  const int half = Covered(2, 2, 8101);
  MESSAGE("power 0.5: covered in " << half << " of " << kStudies);
  CHECK(half >= 930);
  // Power 0.75, correlation 1/5.
  const int three_quarters = Covered(3, 1, 8102);
  MESSAGE("power 0.75: covered in " << three_quarters << " of " << kStudies);
  CHECK(three_quarters >= 930);
}

// Studies (out of kStudies) with `truths` truths of `replicates` replicates
// whose interval covers 0.5 when each truth draws its power from Beta(4, 4).
int CoveredBetweenTruths(int truths, int replicates, uint64_t seed) {
  int covered = 0;
  for (int study = 0; study < kStudies; ++study) {
    base::RandomStream data(base::StreamKey{seed, 1, static_cast<uint64_t>(study), 1});
    std::vector<ClusteredValue> values;
    for (int t = 0; t < truths; ++t) {
      const double q = Beta(4, 4, data);
      for (int r = 0; r < replicates; ++r) {
        int found = 0;
        for (int e = 0; e < kSolidEdges; ++e) found += data.Uniform() < q ? 1 : 0;
        values.push_back({t, double(found), double(kSolidEdges)});
      }
    }
    base::RandomStream resample(base::StreamKey{seed, 1, static_cast<uint64_t>(study), 2});
    const Interval i = ClusteredRatioInterval(values, 2000, resample);
    if (i.low <= 0.5 && 0.5 <= i.high) ++covered;
  }
  return covered;
}

TEST_CASE("with 10 truths the truth level carries the interval when truths differ") {
  const int covered = CoveredBetweenTruths(10, 2, 8103);
  MESSAGE("10 truths x 2 replicates, truth power ~ Beta(4, 4): covered in " << covered << " of " << kStudies);
  CHECK(covered >= 930);
}

}  // namespace
}  // namespace locind::metrics
