#include "learners/methods/screening_learner.h"

#include <doctest/doctest.h>

#include "graph/equivalence_graph.h"
#include "graph/mu_separation.h"
#include "learners/independence/oracle_test.h"
#include "tests/learners/learner_fixtures.h"

namespace locind::learners {
namespace {

using graph::BitGraph;
using graph::EdgeKind;

// The graph of inseparable pairs (docs/theory.md F1, F5): a -> b when no set
// separates b from a; a <-> b when both directions are inseparable.
BitGraph InseparablePairs(const BitGraph& g) {
  BitGraph out(g.n);
  for (int a = 0; a < g.n; ++a)
    for (int b = 0; b < g.n; ++b)
      if (!graph::Separable(g, a, b)) out.Add({a, b, EdgeKind::kDirected});
  for (int a = 0; a < g.n; ++a)
    for (int b = a + 1; b < g.n; ++b)
      if (out.HasDirected(a, b) && out.HasDirected(b, a)) out.Add({a, b, EdgeKind::kBidirected});
  return out;
}

bool Contains(const BitGraph& big, const BitGraph& small) {
  for (const graph::Edge& e : graph::ListEdges(small))
    if (!big.Has(e)) return false;
  return true;
}

TEST_CASE("keeps the maximal graph, and with k = n - 1 it is the graph of inseparable pairs") {
  int not_superset = 0;
  int differs_full = 0;
  int strictly_larger = 0;
  for (int i = 0; i < 400; ++i) {
    const graph::TruthGraph truth = testing::SuiteTruth(404, i);
    const BitGraph projected =
        *graph::ToBitGraph(*graph::LatentProjection(truth.graph, truth.hidden));
    const BitGraph maximal = *graph::MaximalGraph(projected);
    Result<OracleTest> oracle = OracleTest::FromTruth(truth);
    ScreeningLearner one(1);
    const LearnResult r1 = *one.Learn(LearnInput{&oracle.value(), 0.05});
    const BitGraph learned1 = *graph::ToBitGraph(r1.graph);
    if (!Contains(learned1, maximal)) ++not_superset;
    if (!(learned1 == maximal)) ++strictly_larger;
    CHECK(r1.largest_given <= 2);
    ScreeningLearner full(projected.n - 1);
    const LearnResult rf = *full.Learn(LearnInput{&oracle.value(), 0.05});
    if (!(*graph::ToBitGraph(rf.graph) == InseparablePairs(projected))) ++differs_full;
  }
  CHECK(not_superset == 0);
  CHECK(differs_full == 0);
  // It is approximate: on some graphs it keeps edges the maximal graph lacks.
  CHECK(strictly_larger > 0);
  MESSAGE("screen (k = 1) larger than the maximal graph on " << strictly_larger << " of 400");
}

TEST_CASE("test count: at most n^2 * (1 + (n - 1)) with k = 1") {
  graph::Dmg empty(testing::Names(6));  // nothing connected: first test separates
  OracleTest oracle(empty);
  ScreeningLearner method(1);
  const LearnResult r = *method.Learn(LearnInput{&oracle, 0.05});
  CHECK(r.tests == 36);
  CHECK(r.graph.DirectedEdgeCount() == 0);
  graph::Dmg complete(testing::Names(4));
  for (int a = 0; a < 4; ++a)
    for (int b = 0; b < 4; ++b) complete.AddDirected(a, b);
  OracleTest full(complete);
  const LearnResult rc = *method.Learn(LearnInput{&full, 0.05});
  // Nothing separates: loops try 1 + 3 sets, other pairs 1 + 2.
  CHECK(rc.tests == 4 * 4 + 12 * 3);
  CHECK(rc.graph.DirectedEdgeCount() == 16);
  CHECK(rc.graph.BidirectedEdgeCount() == 6);
}

}  // namespace
}  // namespace locind::learners
