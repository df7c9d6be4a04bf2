// ErrorAttribution: why a learned graph differs from the true class.
//
// Every test a method made is judged against the truth: "b locally
// independent of A given C" holds when b is mu-separated from every a in A
// given C in the latent projection of the truth (the oracle of
// learners/independence/oracle_test.h; Mogensen & Hansen 2020, under
// faithfulness). A test is then correct, a false separation (independence
// accepted where the truth connects), a false dependence (rejected where the
// truth separates), or not estimable.
//
// Each missed solid edge and each false edge of the learned graph gets
// exactly one cause, read from the method's decision record of the edge
// (learners/methods/learner.h, EdgeDecision) and its log:
//
//   missed solid edge (in the maximal graph N, solid, not reported):
//     own_test     a witness of its removal is a test of its own pair
//                  (target = head, source = tail; both ways for <->) that is a
//                  false separation;
//     propagation  otherwise a witness is wrong (a false separation or false
//                  dependence about another pair; or an answer implied by the
//                  method's graph, which was wrong because an earlier test
//                  was): the blamed test is that witness, or for an implied
//                  one the first false separation of the log (first wrong test
//                  when there is none);
//     reach        otherwise: no record for the edge (the method never
//                  considers such edges, e.g. pairwise and bidirected edges),
//                  or every witness is right (the method's own rule).
//   false edge (reported, not in N):
//     own_test     a test of its own pair is a false dependence;
//     not_estimable otherwise a test of its own pair could not be computed, or
//                  the edge is undecided;
//     reach        when the record explains the edge in full and every
//                  answer it names is right: margin-search's rule "own
//                  evidence" (a separation set aside against the edge's own
//                  strong dependence, e.g. a dependence that a hidden common
//                  driver causes);
//     propagation  otherwise, for a method whose decisions use other pairs'
//                  answers (every phase but "test", "screen" and "fit"), the
//                  first wrong test of the log;
//     reach        otherwise (the method's rule with its own tests right).
//
// Per replicate the causes add up: missed_* sum to the missed solid edges and
// false_* to the false edges.
#pragma once

#include <optional>
#include <string>
#include <vector>

#include "graph/dmg.h"
#include "graph/edge.h"
#include "learners/independence/oracle_test.h"
#include "learners/methods/learner.h"
#include "metrics/truth_class.h"

namespace locind::metrics {

enum class TestVerdict { kCorrect, kFalseSeparation, kFalseDependence, kNotEstimable };
enum class ErrorCause { kOwnTest, kPropagation, kNotEstimable, kReach };

const char* TestVerdictName(TestVerdict v);  // "correct", "false separation", ...
const char* ErrorCauseName(ErrorCause c);    // "own_test", "propagation", "not_estimable", "reach"

struct TestVerdictCounts {
  int correct = 0;
  int false_separation = 0;
  int false_dependence = 0;
  int not_estimable = 0;
};

// One missed solid edge or false edge and its cause.
struct AttributedEdge {
  graph::Edge edge;
  bool missed = false;  // a missed solid edge; else a false edge
  ErrorCause cause = ErrorCause::kReach;
  std::string rule;                             // the decision's rule ("" without a record)
  std::optional<learners::TestRecord> blamed;  // the test error named, when any
};

struct ErrorAttribution {
  TestVerdictCounts tests;  // over the log, every test made
  int missed_own_test = 0;
  int missed_propagation = 0;
  int missed_reach = 0;
  int false_own_test = 0;
  int false_propagation = 0;
  int false_not_estimable = 0;
  int false_reach = 0;
  std::vector<AttributedEdge> edges;  // in ListEdges order of the union

  int missed() const { return missed_own_test + missed_propagation + missed_reach; }
  int false_edges() const {
    return false_own_test + false_propagation + false_not_estimable + false_reach;
  }
  ErrorAttribution& operator+=(const ErrorAttribution& o);  // counts only, not edges
};

// Judges one test (or implied answer) against the projected truth.
// REQUIRES: `projected` is truth_class.projected (at most 64 nodes).
class TestJudge {
 public:
  explicit TestJudge(const graph::Dmg& projected) : oracle_(projected) {}
  TestVerdict Judge(const learners::TestRecord& t);

 private:
  learners::OracleTest oracle_;
};

// The attribution of `result` (a learner's output on data whose truth class
// is `truth_class`). REQUIRES: result.graph has the observed names in order.
ErrorAttribution AttributeErrors(const TruthClass& truth_class,
                                 const learners::LearnResult& result);

// The decision record of `e` in `result`, or nullptr.
const learners::EdgeDecision* FindDecision(const learners::LearnResult& result,
                                           const graph::Edge& e);

// Decision records whose deciding witness contradicts the decision: a removed
// edge whose first witness is not a separation. (Zero by construction; the
// check guards the records.)
int ContradictingDecisions(const learners::LearnResult& result);

}  // namespace locind::metrics
