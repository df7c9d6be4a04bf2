#include "learners/methods/pairwise_learner.h"

#include <doctest/doctest.h>

#include "graph/latent_projection.h"
#include "learners/independence/oracle_test.h"
#include "tests/learners/learner_fixtures.h"

namespace locind::learners {
namespace {

TEST_CASE("exactly the truth on 500 fully observed directed graphs") {
  int mismatches = 0;
  for (int i = 0; i < 500; ++i) {
    graph::RandomGraphOptions o;
    o.nodes = 3 + i % 6;
    o.edge_probability = 0.15 + 0.1 * (i % 4);
    base::RandomStream random(base::StreamKey{31, 0, static_cast<uint64_t>(i), 0});
    const graph::TruthGraph truth = graph::RandomTruthGraph(o, random);
    OracleTest oracle(truth.graph);
    PairwiseLearner method;
    const LearnResult r = *method.Learn(LearnInput{&oracle, 0.05});
    CHECK(r.tests == o.nodes * o.nodes);
    CHECK(r.largest_given == o.nodes - 1);
    CHECK_FALSE(r.has_marks);
    if (!(r.graph == truth.graph)) ++mismatches;
  }
  CHECK(mismatches == 0);
}

TEST_CASE("a hidden driver adds the edges of its projection") {
  // x1 <- h -> x2, loops on x1 and x2: given its own past, x2 still depends
  // on x1's (x1 carries information about h), and the other way round.
  graph::Dmg g({"x1", "x2", "h"});
  g.AddDirected(2, 0);
  g.AddDirected(2, 1);
  g.AddDirected(0, 0);
  g.AddDirected(1, 1);
  Result<OracleTest> oracle = OracleTest::FromTruth(graph::TruthGraph{g, {2}});
  PairwiseLearner method;
  const LearnResult r = *method.Learn(LearnInput{&oracle.value(), 0.05});
  CHECK(r.graph.HasDirected(0, 1));
  CHECK(r.graph.HasDirected(1, 0));
  CHECK(r.graph.BidirectedEdgeCount() == 0);
}

TEST_CASE("needs a test") {
  PairwiseLearner method;
  CHECK_FALSE(method.Learn(LearnInput{}).ok());
}

}  // namespace
}  // namespace locind::learners
