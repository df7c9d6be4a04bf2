#include "graph/equivalence_graph.h"

#include <doctest/doctest.h>

#include <map>

#include "graph/latent_projection.h"
#include "graph/markov_equivalence.h"
#include "graph/separation_model.h"
#include "tests/graph/graph_fixtures.h"

namespace locind::graph {
namespace {

using testing::BruteGraph;
using testing::FromBrute;
using testing::ToBrute;

constexpr EdgeKind D = EdgeKind::kDirected;
constexpr EdgeKind B = EdgeKind::kBidirected;


TEST_CASE("worked example: the class of a hidden common parent") {
  // Projection of h -> a, h -> b: {a -> a, b -> b, a <-> b}. With a <-> b and
  // both loops every node is connected from every other node given any set
  // not holding the source, so adding a -> b and b -> a changes nothing: the
  // maximal graph has all five edges. Each single edge can also be removed
  // (e.g. without a -> a, a reaches a by a -> b -> a, or a <-> b <-> a when b
  // is conditioned on), so all five are dashed.
  BitGraph g(2);
  g.Add({0, 0, D});
  g.Add({1, 1, D});
  g.Add({0, 1, B});
  Result<EquivalenceGraph> eg = ComputeEquivalenceGraph(g);
  REQUIRE(eg.ok());
  CHECK(eg->edges.size() == 5);
  CHECK(eg->maximal.HasDirected(0, 1));
  CHECK(eg->maximal.HasDirected(1, 0));
  for (bool d : eg->dashed) CHECK(d);
}

TEST_CASE("worked example: a single edge with loops is its own class") {
  // {a -> a, b -> b, a -> b}: a is separable from b (given {a}, the walk
  // b <- a -> a is blocked at a), so no b -> a and no a <-> b can be added.
  // Removing any edge loses a connection (a -> a: a from a given nothing).
  BitGraph g(2);
  g.Add({0, 0, D});
  g.Add({1, 1, D});
  g.Add({0, 1, D});
  Result<EquivalenceGraph> eg = ComputeEquivalenceGraph(g);
  REQUIRE(eg.ok());
  CHECK(eg->maximal == g);
  for (bool d : eg->dashed) CHECK_FALSE(d);
}

// Every DMG on 3 nodes: 9 directed edges (loops included) and 3 bidirected.
TEST_CASE("all 4,096 graphs on 3 nodes: classes, maximal graphs, marks, equivalence") {
  constexpr int n = 3;
  std::map<std::vector<bool>, std::vector<uint64_t>> classes;
  for (uint64_t code = 0; code < 4096; ++code) {
    classes[testing::SeparationList(testing::FromCode(n, code))].push_back(code);
  }
  CHECK(classes.size() > 1);
  int graphs_checked = 0;
  for (const auto& [separations, members] : classes) {
    // The brute-force maximal element: the union of the members' edges, which
    // must itself be a member (uniqueness of the maximal graph).
    uint64_t union_code = 0, intersection = ~uint64_t{0};
    for (uint64_t code : members) {
      union_code |= code;
      intersection &= code;
    }
    REQUIRE(std::find(members.begin(), members.end(), union_code) != members.end());
    const BitGraph expected_max = FromBrute(testing::FromCode(n, union_code));
    for (uint64_t code : members) {
      const BitGraph g = FromBrute(testing::FromCode(n, code));
      Result<EquivalenceGraph> eg = ComputeEquivalenceGraph(g);
      REQUIRE(eg.ok());
      REQUIRE(eg->maximal == expected_max);
      // Dashed = in the maximal graph but missing from some member.
      const auto edges = testing::AllEdges(n);
      size_t k = 0;
      for (size_t i = 0; i < edges.size(); ++i) {
        if (!((union_code >> i) & 1)) continue;
        REQUIRE(eg->dashed[k++] == !((intersection >> i) & 1));
      }
      // Equivalent to the class's first member; not to another class's.
      CHECK(*MarkovEquivalent(g, FromBrute(testing::FromCode(n, members.front()))));
      ++graphs_checked;
    }
    // The class members found by the engine are exactly the brute-force ones.
    Result<std::vector<BitGraph>> listed =
        ClassMembers(FromBrute(testing::FromCode(n, members.front())), 5000);
    REQUIRE(listed.ok());
    CHECK(listed->size() == members.size());
  }
  CHECK(graphs_checked == 4096);
  // Non-equivalence across classes, for consecutive class representatives.
  std::vector<uint64_t> reps;
  for (const auto& [s, m] : classes) reps.push_back(m.front());
  for (size_t i = 1; i < reps.size(); ++i) {
    CHECK_FALSE(*MarkovEquivalent(FromBrute(testing::FromCode(n, reps[i - 1])),
                                  FromBrute(testing::FromCode(n, reps[i]))));
  }
}

TEST_CASE("random graphs on 4 to 6 nodes agree with the brute force") {
  base::RandomStream random(31);
  const int total = 2000;
  for (int trial = 0; trial < total; ++trial) {
    const int n = 4 + trial % 3;
    const bool loops = trial % 2 == 0;
    const double q = (trial / 2) % 2 ? 0.15 : 0.0;
    BitGraph g = testing::RandomMixedGraph(n, n == 6 ? 0.25 : 0.3, q, loops, random);
    if (trial % 5 == 0) {
      // Half of these come from a larger graph with hidden nodes, projected.
      graph::RandomGraphOptions o;
      o.nodes = n + 2;
      o.edge_probability = 0.25;
      o.loops = loops ? LoopPolicy::kRandom : LoopPolicy::kNone;
      o.hidden_count = 2;
      const TruthGraph truth = RandomTruthGraph(o, random);
      Mask hidden = 0;
      for (int h : truth.hidden) hidden |= Bit(h);
      g = LatentProjection(*ToBitGraph(truth.graph), hidden);
    }
    const BruteGraph brute_max = testing::BruteMaximal(ToBrute(g));
    Result<EquivalenceGraph> eg = ComputeEquivalenceGraph(g);
    REQUIRE(eg.ok());
    REQUIRE(ToBrute(eg->maximal) == brute_max);
    REQUIRE(eg->dashed == testing::BruteDashed(brute_max));
    if (trial % 10 == 0) {
      CHECK(*MarkovEquivalent(g, eg->maximal));
    }
  }
}

TEST_CASE("SameAfterChange agrees with recomputed separation tables for every added or removed edge") {
  // The incremental check (continued search for an added edge, early-exit
  // re-search and the pair prefilter for a removed one) against the full
  // table of the changed graph, for every edge on 150 random graphs on 4-7
  // nodes, with and without loops and bidirected edges.
  base::RandomStream random(57);
  int added_same = 0, removed_same = 0, checks = 0;
  for (int trial = 0; trial < 150; ++trial) {
    const int n = 4 + trial % 4;
    const BitGraph g =
        testing::RandomMixedGraph(n, 0.3, trial % 2 ? 0.15 : 0.0, trial % 3 != 0, random);
    const Result<SeparationModel> model = SeparationModel::Compute(g);
    REQUIRE(model.ok());
    BitGraph complete = CompleteGraph(n);
    for (const Edge& e : ListEdges(complete)) {
      BitGraph changed = g;
      const bool adding = !g.Has(e);
      if (adding) changed.Add(e); else changed.Remove(e);
      const bool same = SeparationModel::Compute(changed)->SameSeparations(*model);
      REQUIRE(model->SameAfterChange(changed, e) == same);
      ++checks;
      if (same) ++(adding ? added_same : removed_same);
    }
  }
  // Both answers occur in both directions (the check is not vacuous).
  CHECK(checks > 5000);
  CHECK(added_same > 100);
  CHECK(removed_same > 10);
}

TEST_CASE("class work is refused beyond the exact limit with a clear message") {
  BitGraph g(kMaxExactNodes + 1);
  Result<EquivalenceGraph> eg = ComputeEquivalenceGraph(g);
  REQUIRE_FALSE(eg.ok());
  CHECK(eg.status().message() ==
        "the exact equivalence class is exact only up to 18 nodes; this graph has 19");
}

}  // namespace
}  // namespace locind::graph
