#include "learners/methods/test_runner.h"

#include <doctest/doctest.h>

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

TEST_CASE("reject at p <= level, keep not estimable as dependent, ask once") {
  FixedTest test;
  TestRunner runner(test, 0.05);
  CHECK(runner.Dependent(1, 0, graph::Bit(0)));        // p = 0.05 <= 0.05
  CHECK_FALSE(runner.Dependent(0, 1, graph::Bit(1)));  // p = 0.2
  CHECK(runner.Dependent(0, 2, graph::Bit(1) | graph::Bit(2)));  // not estimable
  CHECK(runner.Dependent(1, 0, graph::Bit(0)));        // from memory
  CHECK(test.calls == 3);
  REQUIRE(runner.Known(0, 1, graph::Bit(1)) != nullptr);
  CHECK_FALSE(*runner.Known(0, 1, graph::Bit(1)));
  CHECK(runner.Known(2, 1, 0) == nullptr);
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
  CHECK(r.log[2].dependent);
  CHECK(r.log[1].p_value == 0.2);
  CHECK_FALSE(r.log[1].dependent);
}

TEST_CASE("mask helpers") {
  CHECK(MaskToList(0b101001) == std::vector<int>{0, 3, 5});
  CHECK(ListToMask({0, 3, 5}) == graph::Mask{0b101001});
  CHECK(MaskToList(0).empty());
}

}  // namespace
}  // namespace locind::learners
