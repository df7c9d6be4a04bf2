#include "graph/mu_separation.h"

#include <doctest/doctest.h>

#include "tests/graph/graph_fixtures.h"

namespace locind::graph {
namespace {


using testing::ToBrute;

constexpr int a = 0, b = 1, c = 2;

BitGraph Make(int n, std::initializer_list<Edge> edges) {
  BitGraph g(n);
  for (const Edge& e : edges) g.Add(e);
  return g;
}

constexpr EdgeKind D = EdgeKind::kDirected;
constexpr EdgeKind B = EdgeKind::kBidirected;

TEST_CASE("worked example: a chain a -> b -> c") {
  const BitGraph g = Make(3, {{a, b, D}, {b, c, D}});
  // a -> b -> c ends with an arrowhead at c and b is an open non-collider.
  CHECK_FALSE(MuSeparated(g, a, c, 0));
  // Conditioning on the non-collider b blocks the only walk.
  CHECK(MuSeparated(g, a, c, Bit(b)));
  // No edge has an arrowhead at a, so nothing is ever connected to a.
  CHECK(MuSeparated(g, c, a, 0));
  CHECK(MuSeparated(g, b, a, Bit(c)));
  // Local independence is not symmetric: b depends on a, a not on b.
  CHECK_FALSE(MuSeparated(g, a, b, 0));
  CHECK(MuSeparated(g, b, a, 0));
}

TEST_CASE("worked example: a collider a -> c <-> b") {
  const BitGraph g = Make(3, {{a, c, D}, {c, b, B}});
  // The walk a -> c <-> b has a collider at c: closed given the empty set...
  CHECK(MuSeparated(g, a, b, 0));
  // ...and opened by conditioning on c (c is in An({c})).
  CHECK_FALSE(MuSeparated(g, a, b, Bit(c)));
}

TEST_CASE("worked example: loops and the source in the conditioning set") {
  const BitGraph g = Make(2, {{b, b, D}, {a, b, D}});
  // The loop b -> b is a one-edge walk ending with an arrowhead at b.
  CHECK_FALSE(MuSeparated(g, b, b, 0));
  // A source inside C never starts a mu-connecting walk.
  CHECK(MuSeparated(g, b, b, Bit(b)));
  CHECK_FALSE(MuSeparated(g, a, b, Bit(b)));
}

TEST_CASE("worked example: a collider opened by a descendant in C") {
  // a -> c <- b... as a walk from a to b it would end with a tail at b, so
  // use a -> c <-> b with c -> d: conditioning on d (c in An({d})) opens c.
  const int d = 3;
  const BitGraph g = Make(4, {{a, c, D}, {c, b, B}, {c, d, D}});
  CHECK(MuSeparated(g, a, b, 0));
  CHECK_FALSE(MuSeparated(g, a, b, Bit(d)));
  CHECK(Ancestors(g, Bit(d)) == (Bit(a) | Bit(c) | Bit(d)));
}

TEST_CASE("set separation decomposes into pairs") {
  const BitGraph g = Make(3, {{a, b, D}, {b, c, D}});
  CHECK(MuSeparated(g, Bit(a) | Bit(b), Bit(a), 0));
  CHECK_FALSE(MuSeparated(g, Bit(a), Bit(b) | Bit(a), 0));
  CHECK_FALSE(MuSeparated(g, Bit(a) | Bit(b), Bit(c), 0));  // b -> c
}

TEST_CASE("engine agrees with the definition-level brute force on random graphs") {
  base::RandomStream random(11);
  int checked = 0;
  for (int trial = 0; trial < 300; ++trial) {
    const int n = 3 + trial % 4;
    const BitGraph g = testing::RandomMixedGraph(n, 0.3, 0.15, trial % 2 == 0, random);
    const testing::BruteSearcher brute(ToBrute(g));
    for (int x = 0; x < n; ++x)
      for (Mask cs = 0; cs < (Mask{1} << n); ++cs) {
        const Mask connected = ConnectedFrom(g, x, cs);
        for (int y = 0; y < n; ++y) {
          REQUIRE(Contains(connected, y) == brute.Connected(x, y, cs));
          ++checked;
        }
      }
  }
  CHECK(checked > 20000);
}

TEST_CASE("F1: some set separates b from a iff An({a,b}) minus a does") {
  // docs/theory.md F1 (Mogensen & Hansen 2020, Ann. Statist. 48(1)).
  base::RandomStream random(12);
  for (int trial = 0; trial < 300; ++trial) {
    const int n = 3 + trial % 3;
    const BitGraph g = testing::RandomMixedGraph(n, 0.35, 0.15, trial % 3 != 0, random);
    const testing::BruteSearcher brute(ToBrute(g));
    for (int x = 0; x < n; ++x)
      for (int y = 0; y < n; ++y) {
        bool some_separates = false;
        for (uint32_t cs = 0; cs < (1u << n) && !some_separates; ++cs) {
          if (!((cs >> x) & 1)) some_separates = !brute.Connected(x, y, cs);
        }
        REQUIRE(Separable(g, x, y) == some_separates);
      }
  }
}

}  // namespace
}  // namespace locind::graph
