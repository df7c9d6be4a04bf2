#include "learners/methods/test_runner.h"

#include <doctest/doctest.h>

#include <cmath>

namespace locind::learners {
namespace {

// A test answering from a fixed p-value rule: p = 0.05 for target 0, 0.2 for
// target 1, not estimable for target 2.
class FixedTest : public IndependenceTest {
 public:
  int processes() const override { return 3; }
  const std::vector<std::string>& names() const override { return names_; }
  std::string kind() const override { return "fixed"; }
  TestResult Run(const TestQuery& q) override {
    ++calls;
    TestResult r;
    r.statistic = 3.5;
    r.df = 2;
    r.p_value = q.target == 0 ? 0.05 : 0.2;
    if (q.target == 2) r.status = TestStatus::kNotEstimable;
    return r;
  }
  int calls = 0;

 private:
  std::vector<std::string> names_ = {"a", "b", "c"};
};

TEST_CASE("reject at p <= level, not estimable is unknown (never a separation), ask once") {
  FixedTest test;
  TestRunner runner(test, 0.05);
  CHECK(runner.Dependent(1, 0, graph::Bit(0)));        // p = 0.05 <= 0.05
  CHECK_FALSE(runner.Dependent(0, 1, graph::Bit(1)));  // p = 0.2
  CHECK(runner.Ask(0, 2, graph::Bit(1) | graph::Bit(2)) == Answer::kUnknown);
  CHECK(runner.Dependent(0, 2, graph::Bit(1) | graph::Bit(2)));  // unknown: no separation
  CHECK(runner.Dependent(1, 0, graph::Bit(0)));        // from memory
  CHECK(test.calls == 3);
  REQUIRE(runner.Known(0, 1, graph::Bit(1)).has_value());
  CHECK(*runner.Known(0, 1, graph::Bit(1)) == Answer::kSeparated);
  CHECK(*runner.Known(1, 0, graph::Bit(0)) == Answer::kConnected);
  CHECK_FALSE(runner.Known(2, 1, 0).has_value());
  LearnResult r;
  runner.Fill(r);
  CHECK(r.tests == 3);
  CHECK(r.not_estimable == 1);
  CHECK(r.largest_given == 2);
  CHECK(r.test_kind == "fixed");
  REQUIRE(r.log.size() == 3);
  CHECK(r.log[2].target == 2);
  CHECK(r.log[2].sources == std::vector<int>{0});
  CHECK(r.log[2].given == std::vector<int>{1, 2});
  CHECK(r.log[2].status == TestStatus::kNotEstimable);
  // Neither dependent nor a p-value: the in-memory p = 1 of the test's
  // result must not read as evidence of independence.
  CHECK_FALSE(r.log[2].dependent);
  CHECK(std::isnan(r.log[2].p_value));
  CHECK(r.log[2].reason == "not estimable");  // FixedTest gives no reason
  CHECK(r.log[1].p_value == 0.2);
  CHECK_FALSE(r.log[1].dependent);
}

TEST_CASE("witnesses: the log entry when it gave the answer, else an implied record") {
  FixedTest test;
  TestRunner runner(test, 0.05);
  runner.Ask(0, 1, graph::Bit(1));  // separated, p = 0.2
  const TestRecord made = runner.Witness(0, 1, graph::Bit(1), false);
  CHECK_FALSE(made.implied);
  CHECK(made.p_value == 0.2);
  // The same query claimed connected (as a graph might imply) is not that test.
  const TestRecord other = runner.Witness(0, 1, graph::Bit(1), true);
  CHECK(other.implied);
  CHECK(other.dependent);
  CHECK(std::isnan(other.p_value));
  const TestRecord never = runner.Witness(2, 0, 0, false);
  CHECK(never.implied);
  CHECK_FALSE(never.dependent);
  CHECK(never.target == 0);
  CHECK(never.sources == std::vector<int>{2});
}

TEST_CASE("FinishDecisions: marks, own-pair evidence, undecided when an own test is not estimable") {
  FixedTest test;
  TestRunner runner(test, 0.05);
  runner.Ask(1, 0, graph::Bit(0));               // connected, p = 0.05
  runner.Ask(1, 0, graph::Bit(0) | graph::Bit(2));  // connected, p = 0.05
  runner.Ask(0, 2, graph::Bit(2));               // not estimable
  LearnResult r;
  runner.Fill(r);
  const graph::Edge e10{1, 0, graph::EdgeKind::kDirected};
  const graph::Edge e02{0, 2, graph::EdgeKind::kDirected};
  r.has_marks = true;
  r.edges = {e02, e10};
  r.dashed = {false, true};
  r.decisions.push_back(MakeDecision(e10, true, "final", "conditions hold"));
  r.decisions.push_back(MakeDecision(e02, true, "final", "conditions hold"));
  FinishDecisions(r);
  REQUIRE(r.decisions.size() == 2);
  // Sorted by edge: 0 -> 2 before 1 -> 0.
  CHECK(r.decisions[0].edge == e02);
  CHECK(r.decisions[0].undecided);
  CHECK(r.decisions[0].rule == "not estimable");
  CHECK(r.decisions[0].mark == "solid");
  REQUIRE(r.decisions[0].witnesses.size() == 1);
  CHECK(r.decisions[0].witnesses[0].status == TestStatus::kNotEstimable);
  CHECK(r.decisions[1].mark == "dashed");
  CHECK_FALSE(r.decisions[1].undecided);
  // Both own tests have p = 0.05: the first with the largest p-value is kept.
  REQUIRE(r.decisions[1].witnesses.size() == 1);
  CHECK(r.decisions[1].witnesses[0].given == std::vector<int>{0});
}

TEST_CASE("mask helpers") {
  CHECK(MaskToList(0b101001) == std::vector<int>{0, 3, 5});
  CHECK(ListToMask({0, 3, 5}) == graph::Mask{0b101001});
  CHECK(MaskToList(0).empty());
}

}  // namespace
}  // namespace locind::learners
