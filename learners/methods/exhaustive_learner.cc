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
      if (*runner_.Known(c, d, given) != Answer::kSeparated) out |= Bit(d);
    }
    return out;
  }
  Mask Unknown(int c, Mask given) override {
    if (runner_.not_estimable() == 0) return 0;
    Mask out = 0;
    for (int d = 0; d < size(); ++d) {
      if (runner_.Known(c, d, given) == Answer::kUnknown) {
        out |= Bit(d);
        if (unknown_used.size() < 5) unknown_used.push_back(*runner_.Record(c, d, given));
      }
    }
    return out;
  }
  // The first separation of (a, b) in the table (sets in increasing mask
  // order), for the witness of a D1 removal. REQUIRES: one exists.
  TestRecord FirstSeparation(int a, int b) const {
    for (Mask given = 0;; ++given) {
      if (graph::Contains(given, a)) continue;
      if (runner_.Known(a, b, given) == Answer::kSeparated) return *runner_.Record(a, b, given);
    }
  }
  TestRecord Witness(int source, int target, Mask given, bool connected) const {
    return runner_.Witness(source, target, given, connected);
  }
  std::vector<TestRecord> unknown_used;  // reset per edge by the caller
  Mask Possible(int, Mask) override { return graph::AllNodes(runner_.processes()); }
  Mask KnownAncestors(Mask given) override { return given; }
  Mask PossibleAncestors(Mask) override { return graph::AllNodes(size()); }
  Mask Certain(int c, Mask given) override {
    Mask out = 0;
    for (int d = 0; d < size(); ++d) {
      if (runner_.Known(c, d, given) == Answer::kConnected) out |= Bit(d);
    }
    return out;
  }

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

// Decides one edge whose pair is inseparable, by the criterion; adds it to
// `g` when kept and records the decision.
void DecideByCriterion(TableAnswers& answers, const graph::Edge& e, graph::BitGraph& g,
                       std::vector<EdgeDecision>& decisions) {
  Violation why;
  answers.unknown_used.clear();
  const bool keep = e.is_loop() ||
                    (e.kind == EdgeKind::kDirected
                         ? DirectedConditionsHold(answers, e.from, e.to, &why)
                         : BidirectedConditionsHold(answers, e.from, e.to, &why));
  if (keep) {
    g.Add(e);
    EdgeDecision d = MakeDecision(e, true, "criterion",
                                  e.is_loop() ? "inseparable" : "conditions hold");
    if (!answers.unknown_used.empty()) {
      d.undecided = true;
      d.rule = "not estimable";
      d.witnesses = answers.unknown_used;
    }
    decisions.push_back(std::move(d));
    return;
  }
  decisions.push_back(MakeDecision(
      e, false, "criterion", why.rule,
      {answers.Witness(why.conclusion_source, why.conclusion_target, why.conclusion_given, false),
       answers.Witness(why.premise_source, why.premise_target, why.premise_given, true)}));
}

graph::BitGraph DecideEveryEdge(TableAnswers& answers, int n,
                                std::vector<EdgeDecision>& decisions) {
  graph::BitGraph g(n);
  for (int a = 0; a < n; ++a) {
    for (int b = 0; b < n; ++b) {
      const graph::Edge e{a, b, EdgeKind::kDirected};
      if (!Inseparable(answers, a, b)) {
        decisions.push_back(
            MakeDecision(e, false, "criterion", "separated", {answers.FirstSeparation(a, b)}));
        continue;
      }
      DecideByCriterion(answers, e, g, decisions);
    }
  }
  for (int a = 0; a < n; ++a) {
    for (int b = a + 1; b < n; ++b) {
      const graph::Edge e{a, b, EdgeKind::kBidirected};
      if (!Inseparable(answers, a, b)) {
        decisions.push_back(
            MakeDecision(e, false, "criterion", "separated", {answers.FirstSeparation(a, b)}));
      } else if (!Inseparable(answers, b, a)) {
        decisions.push_back(
            MakeDecision(e, false, "criterion", "separated", {answers.FirstSeparation(b, a)}));
      } else {
        DecideByCriterion(answers, e, g, decisions);
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
  std::vector<EdgeDecision> decisions;
  SetGraphWithMarks(DecideEveryEdge(answers, n, decisions), input.test->names(), result);
  runner.Fill(result);
  result.decisions = std::move(decisions);
  FinishDecisions(result);
  result.seconds = SecondsSince(start);
  return result;
}

}  // namespace locind::learners
