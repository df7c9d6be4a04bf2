// Which tests had a true null, and the uniform QQ view of their p-values.
#include "metrics/pvalue_calibration.h"

#include <doctest/doctest.h>

#include <cmath>

#include "graph/latent_projection.h"
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

TEST_CASE("first test of each target and sources; only answered tests count as earlier") {
  const std::vector<learners::TestRecord> log = {
      Record(2, {0}, {2}, 0.01),                                        // first of (c, {a})
      Record(2, {0}, {1, 2}, 0.40),                                     // follow-up of (c, {a})
      Record(2, {1}, {2}, 0.40),                                        // first of (c, {b})
      Record(0, {2}, {0}, 0.90, learners::TestStatus::kNotEstimable),  // first of (a, {c}), no answer
      Record(0, {2}, {0, 1}, 0.70),                                     // still first: no earlier answer
      Record(2, {0, 1}, {2}, 0.50),                                     // another source set: first
      Record(2, {0}, {2}, 0.01),                                        // the first query again: follow-up
  };
  CHECK(FirstOfPair(log) == std::vector<bool>{true, false, true, true, true, true, false});
  CHECK(FirstOfPair({}).empty());
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

// The truth's latent projection onto its observed nodes (the graph the tag
// is computed on in a run).
graph::Dmg Projected(const graph::Dmg& truth, const std::vector<int>& hidden) {
  return graph::LatentProjection(truth, hidden).value();
}

bool NullHolds(const graph::Dmg& projected, int target, std::vector<int> sources, std::vector<int> given) {
  return NullHoldingTests(projected, {Record(target, std::move(sources), std::move(given), 0.5)}, 2).size() == 1;
}

TEST_CASE("all parents given: a chain with a hidden mediator") {
  // Truth a -> h -> b with h hidden, c apart, no loops. The projection
  // (observed a, b, c = 0, 1, 2) has a -> b: the directed walk a -> h -> b
  // has only hidden inner nodes (Mogensen & Hansen 2020, Sec. 3). It also
  // has the loop b -> b: the walk b <- h -> b has arrowheads at both ends,
  // no collider and only h inside, a bidirected loop that the projection
  // keeps as b -> b (graph/latent_projection.h). So b's own past is a
  // parent too: the hidden h carries b's past effect on itself.
  graph::Dmg truth({"a", "h", "b", "c"});
  truth.AddDirected(0, 1);
  truth.AddDirected(1, 2);
  const graph::Dmg p = Projected(truth, {1});
  REQUIRE(p.HasDirected(0, 1));
  REQUIRE(p.Parents(1) == std::vector<int>{0, 1});
  REQUIRE(p.Siblings(1).empty());
  // b independent of c given {b}: the null holds (c is apart), but b's
  // intensity depends on a's past through the hidden h and a is not given.
  CHECK(NullHolds(p, 1, {2}, {1}));
  CHECK_FALSE(AllParentsGiven(p, 1, {1}));
  // Given {a, b}: both projected parents are there and b has no bidirected
  // edge, so the parent set of the test's model is right.
  CHECK(NullHolds(p, 1, {2}, {0, 1}));
  CHECK(AllParentsGiven(p, 1, {0, 1}));
  // Given {a} only: b's own past (the loop through h) is left out.
  CHECK_FALSE(AllParentsGiven(p, 1, {0}));
  // a has no parents at all: any C will do, even the empty set.
  CHECK(AllParentsGiven(p, 0, {}));
}

TEST_CASE("all parents given: an omitted parent and a fully given parent set") {
  // All observed: a -> b, c -> b, b -> b, d apart.
  graph::Dmg g({"a", "b", "c", "d"});
  g.AddDirected(0, 1);
  g.AddDirected(2, 1);
  g.AddDirected(1, 1);
  // b independent of d given {a, b}: true null, but the parent c is omitted.
  CHECK(NullHolds(g, 1, {3}, {0, 1}));
  CHECK_FALSE(AllParentsGiven(g, 1, {0, 1}));
  // Given {a, b, c}: every parent of b (a, c and b itself through the loop).
  CHECK(NullHolds(g, 1, {3}, {0, 1, 2}));
  CHECK(AllParentsGiven(g, 1, {0, 1, 2}));
  // Given {a, c} without b: the loop b -> b makes b its own parent, and the
  // tests model b's own past only when b is in C, so the model is wrong.
  CHECK_FALSE(AllParentsGiven(g, 1, {0, 2}));
}

TEST_CASE("all parents given: a hidden common driver makes every C wrong") {
  // Truth h -> b, h -> c with h hidden, a apart. The projection (a, b, c =
  // 0, 1, 2) has b <-> c: the walk b <- h -> c has arrowheads at both ends,
  // no collider and the hidden h inside.
  graph::Dmg truth({"a", "b", "c", "h"});
  truth.AddDirected(3, 1);
  truth.AddDirected(3, 2);
  const graph::Dmg p = Projected(truth, {3});
  REQUIRE(p.HasBidirected(1, 2));
  // b independent of a given {b, c}: true null, yet b's hidden parent h is in
  // no observed history, even with every observed process given.
  CHECK(NullHolds(p, 1, {0}, {1, 2}));
  CHECK_FALSE(AllParentsGiven(p, 1, {1, 2}));
  CHECK_FALSE(AllParentsGiven(p, 1, {0, 1, 2}));
  // a is untouched by h: its (empty) parent set is given.
  CHECK(AllParentsGiven(p, 0, {0}));
}

TEST_CASE("all parents given: a hidden driver of one process alone is its own loop") {
  // Truth h -> b with h hidden: the walk b <- h -> b would be a bidirected
  // loop, which the projection keeps as the directed loop b -> b (same
  // separations; graph/latent_projection.h). So it counts as b's own past.
  graph::Dmg truth({"a", "b", "h"});
  truth.AddDirected(2, 1);
  const graph::Dmg p = Projected(truth, {2});
  REQUIRE(p.HasDirected(1, 1));
  REQUIRE(p.Siblings(1).empty());
  CHECK(AllParentsGiven(p, 1, {1}));
  CHECK_FALSE(AllParentsGiven(p, 1, {0}));
}

}  // namespace
}  // namespace locind::metrics
