#include "graph/latent_projection.h"

#include <doctest/doctest.h>

#include "graph/mu_separation.h"
#include "tests/graph/graph_fixtures.h"

namespace locind::graph {
namespace {

constexpr EdgeKind D = EdgeKind::kDirected;
constexpr EdgeKind B = EdgeKind::kBidirected;

TEST_CASE("worked example: a hidden common parent gives a <-> b and two loops") {
  // h -> a, h -> b with h hidden. The walk a <- h -> b has arrowheads at both
  // ends and a non-collider h, so a <-> b. The walk a <- h -> a (the edge used
  // twice) gives the loop a -> a (docs/theory.md F3), and likewise b -> b.
  Dmg g({"a", "b", "h"});
  g.AddDirected(2, 0);
  g.AddDirected(2, 1);
  Result<Dmg> p = LatentProjection(g, {2});
  REQUIRE(p.ok());
  CHECK(p->names() == std::vector<std::string>{"a", "b"});
  CHECK(p->HasBidirected(0, 1));
  CHECK(p->HasDirected(0, 0));
  CHECK(p->HasDirected(1, 1));
  CHECK_FALSE(p->HasDirected(0, 1));
  CHECK_FALSE(p->HasDirected(1, 0));
}

TEST_CASE("worked example: a hidden mediator gives a directed edge") {
  // a -> h -> b: the directed walk through hidden h gives a -> b; b also gets
  // a loop through b <- h -> b. a has no hidden parent, so no loop at a.
  Dmg g({"a", "h", "b"});
  g.AddDirected(0, 1);
  g.AddDirected(1, 2);
  Result<Dmg> p = LatentProjection(g, {1});
  REQUIRE(p.ok());
  CHECK(p->HasDirected(0, 1));
  CHECK(p->HasDirected(1, 1));
  CHECK_FALSE(p->HasDirected(0, 0));
  CHECK_FALSE(p->HasBidirected(0, 1));
  CHECK(p->DirectedEdgeCount() == 2);
}

TEST_CASE("worked example: a hidden collider adds nothing") {
  // a -> h <- b: every walk through h has a collider at h, so no edge.
  Dmg g({"a", "h", "b"});
  g.AddDirected(0, 1);
  g.AddDirected(2, 1);
  Result<Dmg> p = LatentProjection(g, {1});
  REQUIRE(p.ok());
  CHECK(p->DirectedEdgeCount() == 0);
  CHECK(p->BidirectedEdgeCount() == 0);
}

TEST_CASE("projection with nothing hidden is the identity") {
  base::RandomStream random(21);
  for (int trial = 0; trial < 50; ++trial) {
    const BitGraph g = testing::RandomMixedGraph(5, 0.3, 0.2, true, random);
    CHECK(LatentProjection(g, 0) == g);
  }
}

TEST_CASE("F3: the projection keeps every separation among observed nodes") {
  // docs/theory.md F3, checked against the brute force on the full graph.
  base::RandomStream random(22);
  for (int trial = 0; trial < 400; ++trial) {
    const int n = 4 + trial % 3;
    graph::RandomGraphOptions o;
    o.nodes = n;
    o.edge_probability = 0.3;
    o.bidirected_probability = trial % 4 == 0 ? 0.15 : 0.0;
    o.loops = trial % 2 ? LoopPolicy::kRandom : LoopPolicy::kNone;
    o.hidden_count = 1 + trial % 2;
    const TruthGraph truth = RandomTruthGraph(o, random);
    const BitGraph full = *ToBitGraph(truth.graph);
    Mask hidden = 0;
    for (int h : truth.hidden) hidden |= Bit(h);
    const BitGraph projected = LatentProjection(full, hidden);
    const testing::BruteSearcher brute(testing::ToBrute(full));
    const std::vector<int> observed = truth.Observed();
    const int m = static_cast<int>(observed.size());
    for (int x = 0; x < m; ++x)
      for (Mask cs = 0; cs < (Mask{1} << m); ++cs) {
        uint32_t full_cs = 0;
        for (int i = 0; i < m; ++i)
          if (Contains(cs, i)) full_cs |= 1u << observed[i];
        const Mask connected = ConnectedFrom(projected, x, cs);
        for (int y = 0; y < m; ++y) {
          REQUIRE(Contains(connected, y) ==
                  brute.Connected(observed[x], observed[y], full_cs));
        }
      }
  }
}

TEST_CASE("projection refuses graphs beyond the bit-graph limit") {
  std::vector<std::string> names;
  for (int i = 0; i < 65; ++i) {
    names.emplace_back(1, 'v');  // not "v" + to_string(): a g++ 12 -Wrestrict false positive
    names.back() += std::to_string(i);
  }
  Result<Dmg> p = LatentProjection(Dmg(names), {0});
  REQUIRE_FALSE(p.ok());
  CHECK(p.status().message().find("64") != std::string::npos);
}

}  // namespace
}  // namespace locind::graph
