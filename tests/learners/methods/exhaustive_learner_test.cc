#include "learners/methods/exhaustive_learner.h"

#include <doctest/doctest.h>

#include "graph/equivalence_graph.h"
#include "learners/independence/oracle_test.h"
#include "tests/learners/learner_fixtures.h"

namespace locind::learners {
namespace {

TEST_CASE("exact on every DMG with 3 nodes (all 4,096), asking all 36 questions") {
  int mismatches = 0;
  for (int bits = 0; bits < 4096; ++bits) {
    const graph::BitGraph g = testing::ThreeNodeGraph(bits);
    OracleTest oracle(graph::ToDmg(g, testing::Names(3)));
    ExhaustiveLearner method;
    const LearnResult r = *method.Learn(LearnInput{&oracle, 0.05});
    // n * n * 2^(n-1) = 36 statements: target, source, set without the source.
    CHECK(r.tests == 36);
    std::string why;
    if (!testing::SameEquivalenceGraph(r, *graph::ComputeEquivalenceGraph(g), why)) {
      if (mismatches++ < 5) MESSAGE("graph bits " << bits << ": " << why);
    }
  }
  CHECK(mismatches == 0);
}

TEST_CASE("exact on 2,000 random graphs with 4 to 7 observed nodes, hidden nodes and loops") {
  int mismatches = 0;
  for (int i = 0; i < 2000; ++i) {
    const graph::TruthGraph truth = testing::SuiteTruth(2019, i);
    Result<OracleTest> oracle = OracleTest::FromTruth(truth);
    const graph::Dmg projected = *graph::LatentProjection(truth.graph, truth.hidden);
    ExhaustiveLearner method;
    const LearnResult r = *method.Learn(LearnInput{&oracle.value(), 0.05});
    const int n = projected.size();
    CHECK(r.tests == n * n * (1 << (n - 1)));
    std::string why;
    if (!testing::SameEquivalenceGraph(r, *graph::ComputeEquivalenceGraph(*graph::ToBitGraph(projected)),
                                       why)) {
      if (mismatches++ < 5) MESSAGE("random graph " << i << ": " << why);
    }
  }
  CHECK(mismatches == 0);
}

TEST_CASE("refused beyond its limit") {
  OracleTest oracle(graph::Dmg(testing::Names(kMaxExhaustiveNodes + 1)));
  ExhaustiveLearner method;
  CHECK_FALSE(method.Learn(LearnInput{&oracle, 0.05}).ok());
  CHECK_FALSE(method.Learn(LearnInput{}).ok());  // no test at all
}

}  // namespace
}  // namespace locind::learners
