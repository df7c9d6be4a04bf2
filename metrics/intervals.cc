#include "metrics/intervals.h"

#include <algorithm>
#include <cassert>
#include <cmath>
#include <limits>

#include <boost/math/distributions/beta.hpp>
#include <boost/math/distributions/normal.hpp>

namespace locind::metrics {
namespace {

constexpr double kNaN = std::numeric_limits<double>::quiet_NaN();

double NormalQuantile(double p) { return boost::math::quantile(boost::math::normal(), p); }

// Sorted resampled statistics -> percentile bounds (the same index rule as
// BootstrapMeanInterval).
std::pair<double, double> PercentileBounds(std::vector<double>& stats, double confidence) {
  if (stats.empty()) return {kNaN, kNaN};
  std::sort(stats.begin(), stats.end());
  const double alpha = 1 - confidence;
  const size_t n = stats.size();
  const size_t lo = static_cast<size_t>(std::floor(alpha / 2 * n));
  const size_t hi = static_cast<size_t>(std::ceil((1 - alpha / 2) * n)) - 1;
  return {stats[std::min(lo, n - 1)], stats[std::min(hi, n - 1)]};
}

size_t Draw(base::RandomStream& random, size_t n) {
  return std::min(n - 1, static_cast<size_t>(random.Uniform() * n));
}

// Clusters in order of first appearance, so the draws depend only on the
// order of the values, never on the cluster numbers themselves.
template <typename Value>
std::vector<std::vector<const Value*>> GroupByCluster(const std::vector<Value>& values) {
  std::vector<int> ids;
  std::vector<std::vector<const Value*>> clusters;
  for (const Value& v : values) {
    auto it = std::find(ids.begin(), ids.end(), v.cluster);
    if (it == ids.end()) {
      ids.push_back(v.cluster);
      clusters.emplace_back();
      it = ids.end() - 1;
    }
    clusters[it - ids.begin()].push_back(&v);
  }
  return clusters;
}

// The two-stage resamples of ClusteredRatioInterval (where the design is
// explained): `statistic` maps the values drawn in one resample to a number,
// NaN when it is undefined there (such resamples are left out).
template <typename Value, typename Statistic>
std::vector<double> TwoStageResamples(const std::vector<Value>& values, int resamples,
                                      base::RandomStream& random, Statistic statistic) {
  const std::vector<std::vector<const Value*>> clusters = GroupByCluster(values);
  std::vector<double> stats;
  stats.reserve(resamples);
  std::vector<const Value*> drawn;
  for (int b = 0; b < resamples; ++b) {
    drawn.clear();
    for (size_t c = 0; c < clusters.size(); ++c) {
      const std::vector<const Value*>& chosen = clusters[Draw(random, clusters.size())];
      for (size_t i = 0; i < chosen.size(); ++i) drawn.push_back(chosen[Draw(random, chosen.size())]);
    }
    const double stat = statistic(drawn);
    if (!std::isnan(stat)) stats.push_back(stat);
  }
  return stats;
}

double Ratio(const std::vector<const ClusteredValue*>& values) {
  double num = 0, den = 0;
  for (const ClusteredValue* v : values) {
    num += v->numerator;
    den += v->denominator;
  }
  return den > 0 ? num / den : kNaN;
}

double RatioDifference(const std::vector<const PairedValue*>& values) {
  double num = 0, den = 0, ref_num = 0, ref_den = 0;
  for (const PairedValue* v : values) {
    num += v->numerator;
    den += v->denominator;
    ref_num += v->reference_numerator;
    ref_den += v->reference_denominator;
  }
  return den > 0 && ref_den > 0 ? num / den - ref_num / ref_den : kNaN;
}

template <typename Value>
std::vector<const Value*> Pointers(const std::vector<Value>& values) {
  std::vector<const Value*> out;
  for (const Value& v : values) out.push_back(&v);
  return out;
}

}  // namespace

Interval WilsonInterval(int64_t successes, int64_t trials, double confidence) {
  assert(successes >= 0 && successes <= trials && confidence > 0 && confidence < 1);
  if (trials == 0) return {kNaN, kNaN, kNaN};
  const double n = static_cast<double>(trials);
  const double p = successes / n;
  const double z = NormalQuantile(0.5 + confidence / 2);
  const double z2 = z * z;
  const double centre = (p + z2 / (2 * n)) / (1 + z2 / n);
  const double half = z / (1 + z2 / n) * std::sqrt(p * (1 - p) / n + z2 / (4 * n * n));
  // At 0 or n successes the bound is exactly 0 or 1; rounding would leave
  // values like 7e-18.
  const double low = successes == 0 ? 0.0 : std::max(0.0, centre - half);
  const double high = successes == trials ? 1.0 : std::min(1.0, centre + half);
  return {p, low, high};
}

Interval BootstrapMeanInterval(const std::vector<double>& values, int resamples,
                               base::RandomStream& random, double confidence) {
  if (values.empty()) return {kNaN, kNaN, kNaN};
  const size_t n = values.size();
  double sum = 0;
  for (double v : values) sum += v;
  const double mean = sum / n;
  if (n == 1 || resamples < 1) return {mean, mean, mean};
  std::vector<double> means(resamples);
  for (double& m : means) {
    double s = 0;
    for (size_t i = 0; i < n; ++i) s += values[std::min(n - 1, size_t(random.Uniform() * n))];
    m = s / n;
  }
  std::sort(means.begin(), means.end());
  const double alpha = 1 - confidence;
  const size_t lo = static_cast<size_t>(std::floor(alpha / 2 * resamples));
  const size_t hi = static_cast<size_t>(std::ceil((1 - alpha / 2) * resamples)) - 1;
  return {mean, means[std::min(lo, means.size() - 1)], means[std::min(hi, means.size() - 1)]};
}

// --- Exact binomial interval ------------------------------------------------

Interval ClopperPearsonInterval(int64_t successes, int64_t trials, double confidence) {
  assert(successes >= 0 && successes <= trials && confidence > 0 && confidence < 1);
  if (trials == 0) return {kNaN, kNaN, kNaN};
  const double x = static_cast<double>(successes);
  const double n = static_cast<double>(trials);
  const double tail = (1 - confidence) / 2;
  // The Beta quantiles are the inversions of the two binomial tail
  // probabilities (Clopper & Pearson 1934); the ends have no Beta law (a
  // parameter would be 0) and are exact.
  const double low =
      successes == 0 ? 0.0 : boost::math::quantile(boost::math::beta_distribution<double>(x, n - x + 1), tail);
  const double high = successes == trials
                          ? 1.0
                          : boost::math::quantile(boost::math::beta_distribution<double>(x + 1, n - x), 1 - tail);
  return {x / n, low, high};
}

Interval ClusteredRatioInterval(const std::vector<ClusteredValue>& values, int resamples,
                                base::RandomStream& random, double confidence) {
  const double estimate = Ratio(Pointers(values));
  if (std::isnan(estimate)) return {kNaN, kNaN, kNaN};
  // Stage 1 resamples the clusters (truths), stage 2 the replicates within
  // each drawn cluster, both with replacement (Davison & Hinkley 1997, sec.
  // 3.8 on hierarchical data, section number from memory; Field & Welsh
  // 2007, J. R. Statist. Soc. B 69(3), show resampling clusters is consistent
  // under a random-effect model). Keeping each drawn cluster whole (no stage
  // 2) is the usual choice when clusters are many; with 2 truths, stage 1 alone has
  // only 3 distinct resamples and halves the between-truth variance, so
  // stage 2 with replacement adds the within-truth variation back, which
  // makes the interval somewhat conservative when truths do not differ
  // (tests/metrics/cluster_coverage_test.cc measures it).
  std::vector<double> stats = TwoStageResamples(values, resamples, random, Ratio);
  const auto [low, high] = PercentileBounds(stats, confidence);
  return {estimate, low, high};
}

Interval ClusteredRatioDifferenceInterval(const std::vector<PairedValue>& values, int resamples,
                                          base::RandomStream& random, double confidence) {
  const double estimate = RatioDifference(Pointers(values));
  if (std::isnan(estimate)) return {kNaN, kNaN, kNaN};
  // Each replicate is drawn with both learners' shares: the resamples keep
  // the pairing, so what the two learners share (the data) cancels.
  std::vector<double> stats = TwoStageResamples(values, resamples, random, RatioDifference);
  const auto [low, high] = PercentileBounds(stats, confidence);
  return {estimate, low, high};
}

}  // namespace locind::metrics
