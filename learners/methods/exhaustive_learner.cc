#include "learners/methods/exhaustive_learner.h"

#include "graph/bit_graph.h"
#include "learners/methods/equivalence_marks.h"
#include "learners/methods/maximal_criterion.h"
#include "learners/methods/test_runner.h"

namespace locind::learners {
namespace {

using graph::Bit;
using graph::EdgeKind;
using graph::Mask;

// Reads the answers of a runner that has already made every test.
class TableAnswers : public SeparationAnswers {
 public:
  explicit TableAnswers(const TestRunner& runner) : runner_(runner) {}
  int size() const override { return runner_.processes(); }
  Mask Connected(int c, Mask given, Mask targets) override {
    Mask out = 0;
    for (int d : MaskToList(targets)) {
      if (*runner_.Known(c, d, given)) out |= Bit(d);
    }
    return out;
  }
  Mask Possible(int, Mask) override { return graph::AllNodes(runner_.processes()); }
  Mask KnownAncestors(Mask given) override { return given; }
  Mask PossibleAncestors(Mask) override { return graph::AllNodes(size()); }
  Mask Certain(int c, Mask given) override { return Connected(c, given, graph::AllNodes(size())); }

 private:
  const TestRunner& runner_;
};

void AskEverything(TestRunner& runner) {
  const int n = runner.processes();
  for (Mask given = 0; given < Bit(n); ++given) {
    for (int c = 0; c < n; ++c) {
      if (graph::Contains(given, c)) continue;
      for (int d = 0; d < n; ++d) runner.Dependent(c, d, given);
    }
  }
}

graph::BitGraph DecideEveryEdge(TableAnswers& answers, int n) {
  graph::BitGraph g(n);
  for (int a = 0; a < n; ++a) {
    for (int b = 0; b < n; ++b) {
      if (!Inseparable(answers, a, b)) continue;
      if (a == b || DirectedConditionsHold(answers, a, b)) g.Add({a, b, EdgeKind::kDirected});
    }
  }
  for (int a = 0; a < n; ++a) {
    for (int b = a + 1; b < n; ++b) {
      if (InseparableBothWays(answers, a, b) && BidirectedConditionsHold(answers, a, b)) {
        g.Add({a, b, EdgeKind::kBidirected});
      }
    }
  }
  return g;
}

}  // namespace

Result<LearnResult> ExhaustiveLearner::Learn(const LearnInput& input) {
  if (input.test == nullptr) return Status::Error("exhaustive needs an independence test");
  const int n = input.test->processes();
  if (n > kMaxExhaustiveNodes) {
    return graph::NodeLimitError("exhaustive", n, kMaxExhaustiveNodes);
  }
  const auto start = std::chrono::steady_clock::now();
  TestRunner runner(*input.test, input.level);
  AskEverything(runner);
  TableAnswers answers(runner);
  LearnResult result;
  result.method = "exhaustive";
  SetGraphWithMarks(DecideEveryEdge(answers, n), input.test->names(), result);
  runner.Fill(result);
  result.seconds = SecondsSince(start);
  return result;
}

}  // namespace locind::learners
