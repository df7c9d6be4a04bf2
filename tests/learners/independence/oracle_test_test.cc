// Worked examples for the oracle: answers follow mu-separation in the latent
// projection (Mogensen & Hansen 2020, Ann. Statist. 48(1), Sec. 2-3).
#include "learners/independence/oracle_test.h"

#include <doctest/doctest.h>

#include "tests/graph/graph_fixtures.h"

#include "graph/dmg.h"
#include "graph/truth_graph.h"

namespace locind::learners {
namespace {

graph::Dmg Chain() { return testing::ChainWithLoops(); }

TEST_CASE("a chain is blocked by conditioning on its middle node") {
  OracleTest oracle(Chain());
  CHECK(oracle.processes() == 3);
  CHECK(oracle.kind() == "oracle");
  CHECK(oracle.names() == std::vector<std::string>{"a", "c", "b"});
  // b given {b}: the walk a -> c -> b has the non-collider c outside C.
  TestResult open = oracle.Run({2, {0}, {2}});
  CHECK(open.status == TestStatus::kOk);
  CHECK(open.p_value == 0.0);
  // b given {b, c}: c is a non-collider in C, so the walk is blocked.
  TestResult blocked = oracle.Run({2, {0}, {1, 2}});
  CHECK(blocked.p_value == 1.0);
  // Local independence is not symmetric: a is separated from b given {a}.
  CHECK(oracle.Run({0, {2}, {0}}).p_value == 1.0);
}

TEST_CASE("answers are cached by query") {
  OracleTest oracle(Chain());
  oracle.Run({2, {0}, {2}});
  oracle.Run({2, {0}, {2}});
  oracle.Run({2, {0}, {1, 2}});
  CHECK(oracle.distinct_queries() == 2);
}

TEST_CASE("a hidden mediator becomes a directed edge") {
  // a -> h -> b with h hidden: the projection has a -> b, so no C without a
  // separates b from a.
  graph::Dmg g({"a", "h", "b"});
  g.AddDirected(0, 1);
  g.AddDirected(1, 2);
  Result<OracleTest> oracle = OracleTest::FromTruth(graph::TruthGraph{g, {1}});
  REQUIRE(oracle.ok());
  OracleTest test = std::move(oracle).value();
  CHECK(test.processes() == 2);  // observed: a, b
  CHECK(test.Run({1, {0}, {1}}).p_value == 0.0);
  CHECK(test.Run({1, {0}, {}}).p_value == 0.0);
}

TEST_CASE("a hidden common driver connects its children both ways") {
  // a <- h -> b with h hidden: a <-> b in the projection.
  graph::Dmg g({"a", "h", "b"});
  g.AddDirected(1, 0);
  g.AddDirected(1, 2);
  Result<OracleTest> oracle = OracleTest::FromTruth(graph::TruthGraph{g, {1}});
  REQUIRE(oracle.ok());
  OracleTest test = std::move(oracle).value();
  CHECK(test.Run({1, {0}, {1}}).p_value == 0.0);
  CHECK(test.Run({0, {1}, {0}}).p_value == 0.0);
  // Without the hidden node the two processes are unrelated.
  graph::Dmg apart({"a", "b"});
  OracleTest separate(apart);
  CHECK(separate.Run({1, {0}, {1}}).p_value == 1.0);
}

}  // namespace
}  // namespace locind::learners
