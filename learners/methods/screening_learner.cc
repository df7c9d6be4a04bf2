#include "learners/methods/screening_learner.h"

#include <algorithm>
#include <bit>

#include "graph/bit_graph.h"
#include "learners/methods/test_runner.h"

namespace locind::learners {
namespace {

using graph::Bit;
using graph::Mask;

// True when some C = base + D, D a subset of `pool` of at most `k` members,
// separates b from a; sizes increase, and within a size subsets come in
// lexicographic order of their members.
bool SeparatedBySmallSet(TestRunner& runner, int a, int b, Mask base, Mask pool, int k,
                         Mask& found) {
  const std::vector<int> members = MaskToList(pool);
  const int m = static_cast<int>(members.size());
  for (int size = 0; size <= std::min(k, m); ++size) {
    std::vector<int> pick(size);
    for (int i = 0; i < size; ++i) pick[i] = i;
    while (true) {
      Mask c = base;
      for (int i : pick) c |= Bit(members[i]);
      if (!runner.Dependent(a, b, c)) {
        found = c;
        return true;
      }
      int i = size - 1;
      while (i >= 0 && pick[i] == m - size + i) --i;
      if (i < 0) break;
      ++pick[i];
      for (int j = i + 1; j < size; ++j) pick[j] = pick[j - 1] + 1;
    }
  }
  return false;
}

}  // namespace

Result<LearnResult> ScreeningLearner::Learn(const LearnInput& input) {
  if (input.test == nullptr) return Status::Error("screen needs an independence test");
  const int n = input.test->processes();
  if (n > graph::kMaxBitGraphNodes) {
    return graph::NodeLimitError("screen", n, graph::kMaxBitGraphNodes);
  }
  const auto start = std::chrono::steady_clock::now();
  TestRunner runner(*input.test, input.level);
  const Mask all = graph::AllNodes(n);
  graph::BitGraph g(n);
  std::vector<EdgeDecision> decisions;
  std::vector<TestRecord> separation(static_cast<size_t>(n) * n);  // [a * n + b]
  for (int a = 0; a < n; ++a) {
    for (int b = 0; b < n; ++b) {
      const Mask base = a == b ? 0 : Bit(b);
      const Mask pool = all & ~Bit(a) & ~Bit(b);
      const graph::Edge e{a, b, graph::EdgeKind::kDirected};
      Mask found = 0;
      if (!SeparatedBySmallSet(runner, a, b, base, pool, max_extra_, found)) {
        g.Add(e);
        decisions.push_back(MakeDecision(e, true, "screen", "inseparable"));
      } else {
        separation[a * n + b] = runner.Witness(a, b, found, false);
        decisions.push_back(MakeDecision(e, false, "screen", "separated", {separation[a * n + b]}));
      }
    }
  }
  for (int a = 0; a < n; ++a) {
    for (int b = a + 1; b < n; ++b) {
      const graph::Edge e{a, b, graph::EdgeKind::kBidirected};
      if (g.HasDirected(a, b) && g.HasDirected(b, a)) {
        g.Add(e);
        decisions.push_back(MakeDecision(e, true, "screen", "both directions kept"));
      } else {
        // The separation that removed a direction is the witness.
        const TestRecord& w = g.HasDirected(a, b) ? separation[b * n + a] : separation[a * n + b];
        decisions.push_back(MakeDecision(e, false, "screen", "one direction removed", {w}));
      }
    }
  }
  LearnResult result;
  result.method = "screen";
  result.graph = graph::ToDmg(g, input.test->names());
  runner.Fill(result);
  result.decisions = std::move(decisions);
  FinishDecisions(result);
  result.seconds = SecondsSince(start);
  return result;
}

}  // namespace locind::learners
