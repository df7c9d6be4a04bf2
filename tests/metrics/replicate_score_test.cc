#include "metrics/replicate_score.h"

#include <doctest/doctest.h>

#include <algorithm>
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
  // Missed dashed edges are not counted (results/README.md): the distance is
  // the number of solid edges.
  CHECK(s.hamming == Brute().solid);
  CHECK(std::isnan(s.mark_agreement));
}

// A hand-made class over a, b, c (marks chosen, not computed), sorted the
// way ComputeTruthClass sorts them:
//   a -> a solid, a -> b solid, b -> b dashed, b -> c solid, a <-> b dashed.
TruthClass HandClass() {
  using graph::EdgeKind;
  TruthClass tc;
  tc.projected = graph::Dmg({"a", "b", "c"});
  std::vector<std::pair<graph::Edge, bool>> marked = {
      {{0, 0, EdgeKind::kDirected}, false}, {{0, 1, EdgeKind::kDirected}, false},
      {{1, 1, EdgeKind::kDirected}, true},  {{1, 2, EdgeKind::kDirected}, false},
      {{0, 1, EdgeKind::kBidirected}, true}};
  std::sort(marked.begin(), marked.end());
  for (const auto& [e, dashed] : marked) {
    tc.edges.push_back(e);
    tc.dashed.push_back(dashed);
  }
  return tc;
}

TEST_CASE("Hamming distance and class recovery leave dashed edges out") {
  const TruthClass tc = HandClass();
  // Learned: a -> a, a -> b (solid, found), a <-> b (dashed, reported: not
  // false), c -> a (not in N: false). Missed: b -> c (solid, an error) and
  // b -> b (dashed, no error). Distance = 1 missed solid + 1 false = 2; the
  // old count of every edge of N not reported would have been 3.
  graph::Dmg learned(tc.projected.names());
  learned.AddDirected(0, 0);
  learned.AddDirected(0, 1);
  learned.AddBidirected(0, 1);
  learned.AddDirected(2, 0);
  const ReplicateScore s = ScoreGraph(tc, learned);
  CHECK(s.total.solid == 3);
  CHECK(s.total.solid_found == 2);
  CHECK(s.total.dashed == 2);
  CHECK(s.total.dashed_found == 1);
  CHECK(s.total.false_edges == 1);
  CHECK(s.total.in_class == 3);
  CHECK(s.hamming == 2);
  CHECK_FALSE(s.class_recovered);
  CHECK(s.by_group[int(EdgeGroup::kBidirected)].false_edges == 0);
  // Only the three solid edges: every solid edge found, nothing outside N,
  // so distance 0 and the class counts as recovered although both dashed
  // edges are missing.
  graph::Dmg solid_only(tc.projected.names());
  solid_only.AddDirected(0, 0);
  solid_only.AddDirected(0, 1);
  solid_only.AddDirected(1, 2);
  const ReplicateScore r = ScoreGraph(tc, solid_only);
  CHECK(r.hamming == 0);
  CHECK(r.class_recovered);
  CHECK(r.power == 1.0);
}

TEST_CASE("mark agreement compares the learner's marks on reported edges in N") {
  const TruthClass tc = HandClass();
  graph::Dmg learned(tc.projected.names());
  learned.AddDirected(0, 0);    // marked dashed, solid in N: disagrees
  learned.AddDirected(0, 1);    // marked solid, solid in N: agrees
  learned.AddBidirected(0, 1);  // marked dashed, dashed in N: agrees
  learned.AddDirected(2, 0);    // not in N: not compared
  const std::vector<graph::Edge> dashed = {{0, 0, graph::EdgeKind::kDirected},
                                           {0, 1, graph::EdgeKind::kBidirected},
                                           {2, 0, graph::EdgeKind::kDirected}};
  const ReplicateScore s = ScoreGraph(tc, learned, dashed);
  CHECK(s.marks_compared == 3);
  CHECK(s.marks_agree == 2);
  CHECK(s.mark_agreement == doctest::Approx(2.0 / 3.0));
  // The marks change nothing else.
  const ReplicateScore plain = ScoreGraph(tc, learned);
  CHECK(plain.hamming == s.hamming);
  CHECK(plain.marks_compared == 0);
  CHECK(std::isnan(plain.mark_agreement));
}

TEST_CASE("cell summaries by edge group, power ceiling and truths") {
  const TruthClass tc = HandClass();
  // The learned graph of the first test, twice, for two truths.
  graph::Dmg learned(tc.projected.names());
  learned.AddDirected(0, 0);
  learned.AddDirected(0, 1);
  learned.AddBidirected(0, 1);
  learned.AddDirected(2, 0);
  std::vector<ReplicateRecord> records(4);
  for (int i = 0; i < 4; ++i) {
    records[i].truth = i % 2;
    records[i].score = ScoreGraph(tc, learned, {});
  }
  LearnerReach reach;
  reach.groups[int(EdgeGroup::kLoop)] = false;  // say loops cannot be reported
  reach.marks = true;
  base::RandomStream random(17);
  const CellSummary s = Summarize(records, reach, random, 300);
  CHECK(s.truths == 2);
  // Directed: a -> b found, b -> c missed: 1/2 each replicate, so every
  // resample gives 1/2 and the interval has zero width.
  const GroupSummary& directed = s.groups[int(EdgeGroup::kDirected)];
  CHECK(directed.totals.solid == 8);
  CHECK(directed.power.estimate == 0.5);
  CHECK(directed.power.low == 0.5);
  CHECK(directed.power.high == 0.5);
  CHECK(directed.false_edge_rate.estimate == doctest::Approx(1.0 / 2.0));  // c -> a of a -> b, c -> a
  // Bidirected group: no solid edge, power undefined.
  CHECK(std::isnan(s.groups[int(EdgeGroup::kBidirected)].power.estimate));
  // Ceiling: solid edges outside loops / all solid = 2 / 3.
  CHECK(s.power_ceiling == doctest::Approx(2.0 / 3.0));
  // Marks: every reported edge in N marked solid (empty dashed list): a -> a
  // and a -> b agree, a <-> b (dashed in N) does not.
  CHECK(s.marks_compared == 12);
  CHECK(s.marks_agree == 8);
  CHECK(s.mark_agreement.estimate == doctest::Approx(2.0 / 3.0));
  CHECK(s.hamming.estimate == 2.0);
}

TEST_CASE("cell summaries pool counts and skip failed replicates") {
  const TruthClass tc = *ComputeTruthClass(Truth());
  std::vector<ReplicateRecord> records(3);
  records[0].score = ScoreGraph(tc, tc.maximal);
  records[0].tests = 10;
  records[1].score = ScoreGraph(tc, graph::Dmg(tc.projected.names()));
  records[1].tests = 20;
  records[2].ok = false;
  // Not-estimable and cause counts are sums over the replicates that ran
  // (summary.csv, results/README.md); the failed one's counts are left out.
  records[0].not_estimable = 2;
  records[0].attribution.missed_propagation = 1;
  records[0].attribution.tests.false_separation = 3;
  records[1].not_estimable = 1;
  records[1].attribution.missed_own_test = 2;
  records[1].attribution.false_not_estimable = 1;
  records[2].not_estimable = 50;
  records[2].attribution.missed_reach = 50;
  base::RandomStream random(9);
  const CellSummary s = Summarize(records, LearnerReach{}, random, 200);
  CHECK(s.not_estimable == 3);
  CHECK(s.attribution.missed_own_test == 2);
  CHECK(s.attribution.missed_propagation == 1);
  CHECK(s.attribution.missed_reach == 0);
  CHECK(s.attribution.false_not_estimable == 1);
  CHECK(s.attribution.tests.false_separation == 3);
  CHECK(s.replicates == 3);
  CHECK(s.failed == 1);
  CHECK(s.power.estimate == doctest::Approx(0.5));
  CHECK(s.class_recovery.estimate == doctest::Approx(0.5));
  CHECK(s.tests.estimate == doctest::Approx(15));
  CHECK(s.false_edge_rate.estimate == 0.0);
}

}  // namespace
}  // namespace locind::metrics
