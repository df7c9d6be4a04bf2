#include "learners/methods/learner_registry.h"

#include <doctest/doctest.h>

#include <set>
#include <string>

#include "learners/independence/oracle_test.h"
#include "tests/learners/learner_fixtures.h"

namespace locind::learners {
namespace {

TEST_CASE("names are unique, descriptions one line without tabs") {
  std::set<std::string> names;
  for (const MethodEntry& m : LearningMethods()) {
    CHECK(names.insert(m.name).second);
    const std::string d = m.description;
    CHECK_FALSE(d.empty());
    CHECK(d.find('\t') == std::string::npos);
    CHECK(d.find('\n') == std::string::npos);
    CHECK(FindMethod(m.name) == &m);
  }
  CHECK(names.count("pairwise") == 1);
  CHECK(names.count("maximal-search") == 1);
  CHECK(names.count("exhaustive") == 1);
  CHECK(names.count("screen") == 1);
  CHECK(FindMethod("no-such-method") == nullptr);
}

TEST_CASE("every test-based method runs on the oracle and names its method") {
  graph::Dmg g(testing::Names(3));
  g.AddDirected(0, 1);
  g.AddDirected(1, 1);
  OracleTest oracle(g);
  for (const MethodEntry& m : LearningMethods()) {
    if (!m.uses_tests) continue;
    Result<LearnResult> r = m.make(MethodSettings{})->Learn(LearnInput{&oracle, 0.05});
    REQUIRE(r.ok());
    CHECK(r->method == m.name);
    CHECK(r->test_kind == "oracle");
    CHECK(r->graph.HasDirected(0, 1));
    CHECK(r->tests == static_cast<int>(r->log.size()));
  }
}

TEST_CASE("each method's declared reach matches what it outputs on the oracle") {
  // a <-> b (a hidden common driver), a -> a, b -> b, a -> c: the oracle's
  // graph has every group. A method outputs an edge of a group only when it
  // declares that group, and the methods declaring bidirected edges find
  // a <-> b here (under the oracle the maximal graph has it: b depends on a
  // given any set through the bidirected edge, and so does a on b).
  graph::Dmg g(testing::Names(3));
  g.AddBidirected(0, 1);
  g.AddDirected(0, 0);
  g.AddDirected(1, 1);
  g.AddDirected(0, 2);
  OracleTest oracle(g);
  for (const MethodEntry& m : LearningMethods()) {
    if (!m.uses_tests) continue;
    CAPTURE(m.name);
    Result<LearnResult> r = m.make(MethodSettings{})->Learn(LearnInput{&oracle, 0.05});
    REQUIRE(r.ok());
    bool loop = false, directed = false, bidirected = false;
    for (const graph::Edge& e : graph::ListEdges(r->graph)) {
      if (e.kind == graph::EdgeKind::kBidirected) {
        bidirected = true;
      } else {
        (e.from == e.to ? loop : directed) = true;
      }
    }
    CHECK((!directed || (m.reports & kReportsDirected)));
    CHECK((!loop || (m.reports & kReportsLoops)));
    CHECK(bidirected == bool(m.reports & kReportsBidirected));
    CHECK(r->has_marks == bool(m.reports & kReportsMarks));
  }
  // Declared by reading the code: pairwise and penalized-fit only add a -> b.
  CHECK(FindMethod("pairwise")->reports == (kReportsDirected | kReportsLoops));
  CHECK(FindMethod("penalized-fit")->reports == (kReportsDirected | kReportsLoops));
}

}  // namespace
}  // namespace locind::learners
