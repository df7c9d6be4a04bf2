// Which tests had a true null, and the uniform QQ view of their p-values.
#include "metrics/pvalue_calibration.h"

#include <doctest/doctest.h>

#include <cmath>

#include "tests/graph/graph_fixtures.h"

namespace locind::metrics {
namespace {

learners::TestRecord Record(int target, std::vector<int> sources, std::vector<int> given,
                            double p, learners::TestStatus status = learners::TestStatus::kOk) {
  learners::TestRecord r;
  r.target = target;
  r.sources = std::move(sources);
  r.given = std::move(given);
  r.p_value = p;
  r.status = status;
  return r;
}

graph::Dmg Chain() { return testing::ChainWithLoops(); }

TEST_CASE("only ok tests whose null holds in the graph are kept, once per query") {
  const std::vector<learners::TestRecord> log = {
      Record(2, {0}, {2}, 0.01),     // a -> c -> b open: null false
      Record(2, {0}, {1, 2}, 0.40),  // blocked by c: null true
      Record(2, {0}, {1, 2}, 0.40),  // the same query again (cached answer)
      Record(0, {2}, {0}, 0.70),     // nothing reaches a from b: null true
      Record(0, {1}, {0}, 0.90, learners::TestStatus::kNotEstimable),  // not estimable
  };
  CHECK(NullHoldingTests(Chain(), log, 100) == std::vector<size_t>{1, 3});
}

TEST_CASE("a cap keeps evenly spaced tests including the first and the last") {
  std::vector<learners::TestRecord> log;
  // Targets a with every distinct conditioning set: all nulls hold (nothing enters a).
  for (int k = 0; k < 9; ++k) log.push_back(Record(0, {2}, k % 2 ? std::vector<int>{0} : std::vector<int>{0, 1}, 0.5));
  const std::vector<size_t> two = NullHoldingTests(Chain(), log, 2);
  CHECK(two == std::vector<size_t>{0, 1});  // only two distinct queries
  std::vector<learners::TestRecord> many;
  graph::Dmg empty({"a", "b", "c", "d", "e", "f"});
  for (int t = 0; t < 6; ++t) {
    for (int s = 0; s < 6; ++s) {
      if (s != t) many.push_back(Record(t, {s}, {t}, 0.5));
    }
  }
  REQUIRE(many.size() == 30);
  const std::vector<size_t> kept = NullHoldingTests(empty, many, 4);
  // Spacing 29/3: rounded positions 0, 10, 19, 29.
  CHECK(kept == std::vector<size_t>{0, 10, 19, 29});
}

TEST_CASE("QQ points and the Beta band of uniform order statistics") {
  std::vector<double> p;
  for (int i = 10; i >= 1; --i) p.push_back(i / 11.0);
  const std::vector<QqPoint> qq = UniformQq(p);
  REQUIRE(qq.size() == 10);
  for (size_t k = 0; k < qq.size(); ++k) {
    CHECK(qq[k].expected == doctest::Approx((k + 1) / 11.0));
    CHECK(qq[k].observed == doctest::Approx((k + 1) / 11.0));
  }
  // SciPy 1.10 scipy.stats.beta.ppf(q, i, n + 1 - i), n = 10.
  CHECK(qq[0].band_low == doctest::Approx(0.0025285785444617848).epsilon(1e-12));
  CHECK(qq[0].band_high == doctest::Approx(0.3084971078187608).epsilon(1e-12));
  CHECK(qq[4].band_low == doctest::Approx(0.18708602844739855).epsilon(1e-12));
  CHECK(qq[4].band_high == doctest::Approx(0.7376219233930549).epsilon(1e-12));
  CHECK(qq[9].band_low == doctest::Approx(0.6915028921812392).epsilon(1e-12));
  // One p-value: Beta(1, 1) is uniform, so the band is [0.025, 0.975].
  const std::vector<QqPoint> one = UniformQq({0.3});
  CHECK(one[0].expected == 0.5);
  CHECK(one[0].band_low == doctest::Approx(0.025));
  CHECK(one[0].band_high == doctest::Approx(0.975));
  // SciPy 1.10 beta.ppf(0.025 / 0.975, 17, 184): the 17th of 200.
  std::vector<double> flat(200, 0.5);
  const std::vector<QqPoint> big = UniformQq(flat);
  CHECK(big[16].band_low == doctest::Approx(0.050295918630257286).epsilon(1e-10));
  CHECK(big[16].band_high == doctest::Approx(0.12666485602208166).epsilon(1e-10));
  CHECK(UniformQq({}).empty());
}

TEST_CASE("share of p-values at or below the level") {
  CHECK(ShareAtOrBelow({0.01, 0.05, 0.2, 0.9}, 0.05) == 0.5);
  CHECK(std::isnan(ShareAtOrBelow({}, 0.05)));
}

}  // namespace
}  // namespace locind::metrics
