#include "metrics/replicate_score.h"

#include <doctest/doctest.h>

#include <cmath>

#include "metrics/cell_summary.h"
#include "tests/graph/brute_force.h"

namespace locind::metrics {
namespace {

// Truth: h -> a, h -> b (h hidden), a -> a, a -> c. Projection onto a, b, c:
// a -> a, b -> b (both also implied by the hidden parent), a <-> b, a -> c.
// The class is computed by the engine; its edge and solid counts are checked
// against the brute force (tests/graph/brute_force.h) on the projection
// written out by hand here, and the expected counts below use the brute force.
graph::TruthGraph Truth() {
  graph::Dmg g({"a", "b", "c", "h"});
  g.AddDirected(3, 0);
  g.AddDirected(3, 1);
  g.AddDirected(0, 0);
  g.AddDirected(0, 2);
  return {g, {3}};
}

struct BruteCounts {
  int edges = 0, solid = 0;
  testing::BruteGraph maximal{3};
};

// The hand projection a -> a, b -> b, a <-> b, a -> c, its maximal graph (F2)
// and dashed marks (F4) by the brute force.
BruteCounts Brute() {
  testing::BruteGraph projection(3);
  projection.dir[0][0] = projection.dir[1][1] = projection.dir[0][2] = true;
  projection.bi[0][1] = projection.bi[1][0] = true;
  BruteCounts out;
  out.maximal = testing::BruteMaximal(projection);
  for (bool dashed : testing::BruteDashed(out.maximal)) {
    ++out.edges;
    out.solid += !dashed;
  }
  return out;
}

TEST_CASE("the class's maximal graph and marks agree with the brute force") {
  const TruthClass tc = *ComputeTruthClass(Truth());
  const BruteCounts brute = Brute();
  for (int u = 0; u < 3; ++u) {
    for (int v = 0; v < 3; ++v) {
      CHECK(tc.maximal.HasDirected(u, v) == brute.maximal.dir[u][v]);
      if (u != v) CHECK(tc.maximal.HasBidirected(u, v) == brute.maximal.bi[u][v]);
    }
  }
  CHECK(int(tc.edges.size()) == brute.edges);
  int solid = 0;
  for (bool d : tc.dashed) solid += !d;
  CHECK(solid == brute.solid);
  MESSAGE("brute force: " << brute.edges << " edges, " << brute.solid << " solid");
}

TEST_CASE("the maximal graph itself is recovered with full power and no false edge") {
  const TruthClass tc = *ComputeTruthClass(Truth());
  const ReplicateScore s = ScoreGraph(tc, tc.maximal);
  CHECK(s.class_recovered);
  CHECK(s.hamming == 0);
  CHECK(s.power == 1.0);
  CHECK(s.false_edge_rate == 0.0);
  const BruteCounts brute = Brute();
  CHECK(s.total.reported == brute.edges);
  CHECK(s.total.solid == brute.solid);
  CHECK(s.total.solid + s.total.dashed == brute.edges);
}

TEST_CASE("counts by group for a hand-made learned graph") {
  const TruthClass tc = *ComputeTruthClass(Truth());
  // a -> c is solid: it is the only edge into c, and without it c would be
  // separated from a given any set.
  CHECK(tc.StatusOf({0, 2, graph::EdgeKind::kDirected}) == TruthStatus::kSolid);
  // c -> a would make a depend on c: not in any equivalent graph.
  CHECK(tc.StatusOf({2, 0, graph::EdgeKind::kDirected}) == TruthStatus::kAbsent);
  graph::Dmg learned(tc.projected.names());
  learned.AddDirected(0, 2);  // solid, found
  learned.AddDirected(2, 0);  // false directed edge
  learned.AddDirected(2, 2);  // loop: c has no hidden parent and no loop: false
  const ReplicateScore s = ScoreGraph(tc, learned);
  const EdgeCounts& directed = s.by_group[int(EdgeGroup::kDirected)];
  const EdgeCounts& loops = s.by_group[int(EdgeGroup::kLoop)];
  CHECK(directed.reported == 2);
  CHECK(directed.false_edges == 1);
  CHECK(directed.solid_found == 1);
  CHECK(loops.reported == 1);
  CHECK(loops.false_edges == 1);
  CHECK(s.total.false_edges == 2);
  CHECK(s.false_edge_rate == doctest::Approx(2.0 / 3.0));
  CHECK(s.power == doctest::Approx(1.0 / Brute().solid));
  CHECK_FALSE(s.class_recovered);
  // Audit rows: every reported edge and every solid edge of the truth.
  const auto audit = AuditEdges(tc, learned);
  int reported = 0, solid = 0;
  for (const EdgeAudit& row : audit) {
    reported += row.reported;
    solid += row.truth == TruthStatus::kSolid;
  }
  CHECK(reported == 3);
  CHECK(solid == Brute().solid);
}

TEST_CASE("an empty learned graph: power 0, false-edge rate undefined") {
  const TruthClass tc = *ComputeTruthClass(Truth());
  const ReplicateScore s = ScoreGraph(tc, graph::Dmg(tc.projected.names()));
  CHECK(s.power == 0.0);
  CHECK(std::isnan(s.false_edge_rate));
  CHECK(s.hamming == Brute().edges);
}

TEST_CASE("cell summaries pool counts and skip failed replicates") {
  const TruthClass tc = *ComputeTruthClass(Truth());
  std::vector<ReplicateRecord> records(3);
  records[0].score = ScoreGraph(tc, tc.maximal);
  records[0].tests = 10;
  records[1].score = ScoreGraph(tc, graph::Dmg(tc.projected.names()));
  records[1].tests = 20;
  records[2].ok = false;
  base::RandomStream random(9);
  const CellSummary s = Summarize(records, random, 200);
  CHECK(s.replicates == 3);
  CHECK(s.failed == 1);
  CHECK(s.power.estimate == doctest::Approx(0.5));
  CHECK(s.class_recovery.estimate == doctest::Approx(0.5));
  CHECK(s.tests.estimate == doctest::Approx(15));
  CHECK(s.false_edge_rate.estimate == 0.0);
}

}  // namespace
}  // namespace locind::metrics
