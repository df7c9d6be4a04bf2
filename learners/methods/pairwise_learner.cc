#include "learners/methods/pairwise_learner.h"

#include "graph/bit_graph.h"
#include "learners/methods/test_runner.h"

namespace locind::learners {

Result<LearnResult> PairwiseLearner::Learn(const LearnInput& input) {
  if (input.test == nullptr) return Status::Error("pairwise needs an independence test");
  const int n = input.test->processes();
  if (n > graph::kMaxBitGraphNodes) {
    return graph::NodeLimitError("pairwise", n, graph::kMaxBitGraphNodes);
  }
  const auto start = std::chrono::steady_clock::now();
  TestRunner runner(*input.test, input.level);
  const graph::Mask all = graph::AllNodes(n);
  graph::BitGraph g(n);
  std::vector<EdgeDecision> decisions;
  for (int b = 0; b < n; ++b) {
    for (int a = 0; a < n; ++a) {
      const graph::Edge e{a, b, graph::EdgeKind::kDirected};
      const graph::Mask given = all & ~graph::Bit(a);
      // Not estimable is no separation: the edge stays (undecided).
      if (runner.Dependent(a, b, given)) {
        g.Add(e);
        decisions.push_back(MakeDecision(e, true, "test", "dependent"));
      } else {
        decisions.push_back(MakeDecision(e, false, "test", "separated",
                                         {runner.Witness(a, b, given, false)}));
      }
    }
  }
  // Bidirected edges are outside the method: recorded so that every edge of
  // the truth has a record saying why it is missing.
  for (int a = 0; a < n; ++a) {
    for (int b = a + 1; b < n; ++b) {
      decisions.push_back(
          MakeDecision({a, b, graph::EdgeKind::kBidirected}, false, "test", "never considered"));
    }
  }
  LearnResult result;
  result.method = "pairwise";
  result.graph = graph::ToDmg(g, input.test->names());
  runner.Fill(result);
  result.decisions = std::move(decisions);
  FinishDecisions(result);
  result.seconds = SecondsSince(start);
  return result;
}

}  // namespace locind::learners
