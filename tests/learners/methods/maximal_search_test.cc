#include "learners/methods/maximal_search.h"

#include <doctest/doctest.h>

#include "graph/equivalence_graph.h"
#include "graph/separation_model.h"
#include "learners/independence/oracle_test.h"
#include "tests/learners/learner_fixtures.h"

namespace locind::learners {
namespace {

using graph::BitGraph;
using graph::EdgeKind;

LearnResult RunOnGraph(const BitGraph& g) {
  OracleTest oracle(graph::ToDmg(g, testing::Names(g.n)));
  MaximalSearch method;
  return *method.Learn(LearnInput{&oracle, 0.05});
}

TEST_CASE("worked example: a hidden common driver") {
  // Truth x1 <- h -> x2 with loops everywhere; projected: x1 <-> x2 plus loops.
  // With both loops present, x1 -> x2 and x2 -> x1 add no walk that x1 <-> x2
  // does not already give, so the maximal graph holds them too.
  BitGraph g(2);
  g.Add({0, 0, EdgeKind::kDirected});
  g.Add({1, 1, EdgeKind::kDirected});
  g.Add({0, 1, EdgeKind::kBidirected});
  const LearnResult r = RunOnGraph(g);
  const BitGraph learned = *graph::ToBitGraph(r.graph);
  // The maximal graph adds the two directed edges x1 -> x2 and x2 -> x1
  // (asserted below; checked against the engine).
  CHECK(learned == *graph::MaximalGraph(g));
  CHECK(learned.HasBidirected(0, 1));
  CHECK(learned.HasDirected(0, 1));
  CHECK(learned.HasDirected(1, 0));
  CHECK(r.tests == static_cast<int>(r.log.size()));
  CHECK(r.tests > 0);
  CHECK(r.not_estimable == 0);
}

TEST_CASE("exact on every DMG with 3 nodes (all 4,096)") {
  int mismatches = 0;
  long tests = 0;
  for (int bits = 0; bits < 4096; ++bits) {
    const BitGraph g = testing::ThreeNodeGraph(bits);
    const LearnResult r = RunOnGraph(g);
    tests += r.tests;
    std::string why;
    if (!testing::SameEquivalenceGraph(r, *graph::ComputeEquivalenceGraph(g), why)) {
      if (mismatches++ < 5) MESSAGE("graph bits " << bits << ": " << why);
    }
  }
  CHECK(mismatches == 0);
  // Exhaustive asks 3 * 3 * 4 = 36 questions per graph; this search fewer.
  MESSAGE("mean tests per 3-node graph: " << double(tests) / 4096);
  CHECK(tests < 36L * 4096);
}

TEST_CASE("exact on 2,000 random graphs with 4 to 7 observed nodes, hidden nodes and loops") {
  int mismatches = 0;
  int with_hidden = 0;
  int with_loops = 0;
  for (int i = 0; i < 2000; ++i) {
    const graph::TruthGraph truth = testing::SuiteTruth(2018, i);
    with_hidden += !truth.hidden.empty();
    Result<OracleTest> oracle = OracleTest::FromTruth(truth);
    const graph::Dmg projected = *graph::LatentProjection(truth.graph, truth.hidden);
    for (int v = 0; v < projected.size(); ++v) {
      if (projected.HasDirected(v, v)) {
        ++with_loops;
        break;
      }
    }
    MaximalSearch method;
    const LearnResult r = *method.Learn(LearnInput{&oracle.value(), 0.05});
    const auto expected = graph::ComputeEquivalenceGraph(*graph::ToBitGraph(projected));
    std::string why;
    if (!testing::SameEquivalenceGraph(r, *expected, why)) {
      if (mismatches++ < 5) MESSAGE("random graph " << i << ": " << why);
    }
  }
  CHECK(mismatches == 0);
  CHECK(with_hidden > 1000);
  CHECK(with_loops > 500);
}

TEST_CASE("same input, same output") {
  const graph::TruthGraph truth = testing::SuiteTruth(7, 3);
  Result<OracleTest> o1 = OracleTest::FromTruth(truth);
  Result<OracleTest> o2 = OracleTest::FromTruth(truth);
  MaximalSearch m1, m2;
  const LearnResult r1 = *m1.Learn(LearnInput{&o1.value(), 0.05});
  const LearnResult r2 = *m2.Learn(LearnInput{&o2.value(), 0.05});
  CHECK(r1.graph == r2.graph);
  CHECK(r1.dashed == r2.dashed);
  REQUIRE(r1.log.size() == r2.log.size());
  for (size_t i = 0; i < r1.log.size(); ++i) {
    CHECK(r1.log[i].target == r2.log[i].target);
    CHECK(r1.log[i].sources == r2.log[i].sources);
    CHECK(r1.log[i].given == r2.log[i].given);
  }
}

TEST_CASE("refused beyond the exact limit") {
  graph::Dmg big(testing::Names(graph::kMaxExactNodes + 1));
  OracleTest oracle(big);
  MaximalSearch method;
  Result<LearnResult> r = method.Learn(LearnInput{&oracle, 0.05});
  REQUIRE_FALSE(r.ok());
  CHECK(r.status().message().find("18") != std::string::npos);
}

}  // namespace
}  // namespace locind::learners
