#include "metrics/intervals.h"

#include <doctest/doctest.h>

#include <cmath>

namespace locind::metrics {
namespace {

TEST_CASE("Wilson intervals match SciPy") {
  // Reference values: SciPy 1.10.1,
  // scipy.stats.binomtest(k, n).proportion_ci(confidence_level=0.95, method='wilson').
  struct Row { int k, n; double low, high; };
  const Row rows[] = {
      {0, 10, 0.0, 0.27753279986288926},
      {3, 10, 0.10779126740630102, 0.6032218525388546},
      {10, 10, 0.7224672001371109, 1.0},
      {45, 50, 0.7863976856252034, 0.9565242350681095},
      {1, 200, 0.0008831687156009762, 0.02777370439789293},
      {120, 300, 0.3461651905860969, 0.4563634036588123},
  };
  for (const Row& r : rows) {
    const Interval i = WilsonInterval(r.k, r.n);
    CHECK(i.estimate == doctest::Approx(double(r.k) / r.n));
    CHECK(i.low == doctest::Approx(r.low).epsilon(1e-9));
    CHECK(i.high == doctest::Approx(r.high).epsilon(1e-9));
  }
  // Same source, confidence_level=0.99.
  const Interval i99 = WilsonInterval(7, 20, 0.99);
  CHECK(i99.low == doctest::Approx(0.14639344137693885).epsilon(1e-9));
  CHECK(i99.high == doctest::Approx(0.6283381789526872).epsilon(1e-9));
}

TEST_CASE("no trials gives an undefined interval") {
  const Interval i = WilsonInterval(0, 0);
  CHECK(std::isnan(i.estimate));
  CHECK(std::isnan(i.low));
}

TEST_CASE("bootstrap interval of a mean") {
  base::RandomStream random(3);
  // A constant sample has a zero-width interval.
  const Interval constant = BootstrapMeanInterval({2.5, 2.5, 2.5, 2.5}, 500, random);
  CHECK(constant.estimate == 2.5);
  CHECK(constant.low == 2.5);
  CHECK(constant.high == 2.5);
  // For the mean of a large sample the percentile interval is close to the
  // normal-theory interval mean +- 1.96 s / sqrt(n) (Efron & Tibshirani 1993,
  // An Introduction to the Bootstrap, ch. 13). Values 0..399: mean 199.5,
  // s = 115.61 (population sd 115.47), half-width 11.33.
  std::vector<double> values;
  for (int i = 0; i < 400; ++i) values.push_back(i);
  const Interval wide = BootstrapMeanInterval(values, 4000, random);
  CHECK(wide.estimate == doctest::Approx(199.5));
  CHECK((wide.high - wide.low) / 2 == doctest::Approx(11.33).epsilon(0.1));
  CHECK(wide.low < 199.5);
  CHECK(wide.high > 199.5);
  // Same stream key, same interval.
  base::RandomStream again(3);
  BootstrapMeanInterval({2.5, 2.5, 2.5, 2.5}, 500, again);
  const Interval repeat = BootstrapMeanInterval(values, 4000, again);
  CHECK(repeat.low == wide.low);
  CHECK(repeat.high == wide.high);
}

TEST_CASE("Clopper-Pearson interval matches SciPy's Beta quantiles") {
  // Expected values: SciPy 1.10.1 (Debian 12 /usr/bin/python3),
  // lo = scipy.stats.beta.ppf(a / 2, x, n - x + 1) and
  // hi = scipy.stats.beta.ppf(1 - a / 2, x + 1, n - x), a = 1 - confidence,
  // with lo = 0 at x = 0 and hi = 1 at x = n (Clopper & Pearson 1934).
  struct Case {
    int64_t x, n;
    double confidence, low, high;
  };
  const Case cases[] = {
      {0, 20, 0.95, 0.0, 0.1684334709830853},
      {1, 20, 0.95, 0.0012650894979498038, 0.24873276277202777},
      {7, 50, 0.95, 0.0581917003403721, 0.2673960024970084},
      {50, 50, 0.95, 0.9288782635358024, 1.0},
      {3, 200, 0.95, 0.003104107621553509, 0.0432082819177126},
      {12, 80, 0.95, 0.07998156130971382, 0.2473641115928976},
      {1, 1, 0.95, 0.025, 1.0},
      {4, 30, 0.90, 0.046854826914600675, 0.2796151658934821},
  };
  for (const Case& c : cases) {
    const Interval i = ClopperPearsonInterval(c.x, c.n, c.confidence);
    CAPTURE(c.x);
    CAPTURE(c.n);
    CHECK(i.estimate == doctest::Approx(static_cast<double>(c.x) / c.n).epsilon(1e-15));
    CHECK(i.low == doctest::Approx(c.low).epsilon(1e-10));
    CHECK(i.high == doctest::Approx(c.high).epsilon(1e-10));
  }
  // The ends are exact, and no trials give NaN.
  CHECK(ClopperPearsonInterval(0, 20).low == 0.0);
  CHECK(ClopperPearsonInterval(50, 50).high == 1.0);
  CHECK(std::isnan(ClopperPearsonInterval(0, 0).estimate));
  // The exact interval contains the Wilson interval's estimate and is wider
  // at small counts (it is conservative; common practice, no source).
  const Interval exact = ClopperPearsonInterval(2, 40);
  const Interval wilson = WilsonInterval(2, 40);
  CHECK(exact.low < wilson.low);
  CHECK(exact.high > wilson.high);
}

TEST_CASE("clustered ratio interval: estimate, zero width when values agree, undefined cases") {
  base::RandomStream random(5);
  // 2 truths x 8 replicates, each 3 of 6 solid edges found: every resample
  // gives 24/48 = 0.5 exactly, so the interval is [0.5, 0.5] (the Wilson
  // interval over the 96 pooled edges would be [0.40, 0.60]).
  std::vector<ClusteredValue> same;
  for (int r = 0; r < 16; ++r) same.push_back({r % 2, 3, 6});
  const Interval flat = ClusteredRatioInterval(same, 1000, random);
  CHECK(flat.estimate == 0.5);
  CHECK(flat.low == 0.5);
  CHECK(flat.high == 0.5);
  // The estimate is the ratio of sums, not the mean of ratios: (1 + 4) / (2 + 8).
  const Interval ratio = ClusteredRatioInterval({{0, 1, 2}, {1, 4, 8}}, 200, random);
  CHECK(ratio.estimate == doctest::Approx(0.5));
  // Nothing to divide by.
  CHECK(std::isnan(ClusteredRatioInterval({{0, 0, 0}}, 100, random).estimate));
  CHECK(std::isnan(ClusteredRatioInterval({}, 100, random).low));
}

TEST_CASE("clustered ratio interval: truths that differ widen it; cluster ids only group") {
  // Truth 0 finds 1 of 6 in every replicate, truth 1 finds 5 of 6: the
  // between-truth difference is the whole variation. Resamples that draw
  // truth 0 twice give 1/6, truth 1 twice 5/6 (probability 1/4 each), so the
  // 2.5% and 97.5% percentiles are exactly 1/6 and 5/6.
  std::vector<ClusteredValue> split;
  for (int r = 0; r < 8; ++r) split.push_back({r % 2, r % 2 == 0 ? 1.0 : 5.0, 6});
  base::RandomStream a(11);
  const Interval wide = ClusteredRatioInterval(split, 2000, a);
  CHECK(wide.estimate == doctest::Approx(0.5));
  CHECK(wide.low == doctest::Approx(1.0 / 6.0));
  CHECK(wide.high == doctest::Approx(5.0 / 6.0));
  // Renumbering the clusters (same grouping, same order) changes nothing.
  std::vector<ClusteredValue> renamed = split;
  for (ClusteredValue& v : renamed) v.cluster = v.cluster == 0 ? 42 : 7;
  base::RandomStream b(11);
  const Interval again = ClusteredRatioInterval(renamed, 2000, b);
  CHECK(again.low == wide.low);
  CHECK(again.high == wide.high);
}

}  // namespace
}  // namespace locind::metrics
