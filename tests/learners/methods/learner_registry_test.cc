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

}  // namespace
}  // namespace locind::learners
