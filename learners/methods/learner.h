// Learner: the interface of every learning method.
//
// A method takes an independence test (statistical or the oracle) and a
// significance level, asks the test "is b locally independent of A given C?"
// as often as it needs, and returns a graph over the observed processes, the
// solid/dashed marks when it has them, the log of every test it made, and its
// cost. Methods that fit the data directly (no tests) read it from the input.
//
// Decision rule, shared by every method (learners/methods/test_runner.h): independence
// is rejected ("dependent") when p <= level, and accepted (a separation) when
// p > level. A result that could not be computed is neither: it is never a
// separation (so the edge in question is kept, marked undecided) and never
// used as evidence of a connection by a rule that removes another edge. Such
// results are counted in LearnResult::not_estimable, keep their reason, and
// carry a NaN p-value (written as an empty field, never as 1).
//
// Decision records: every method says, for each candidate edge it considered,
// whether it kept or removed it, in which phase, by which rule, and the
// answers that caused the decision (LearnResult::decisions).
//
// Determinism: the same input gives the same graph, marks and log (only
// `seconds` varies); no method draws random numbers.
#pragma once

#include <string>
#include <vector>

#include "graph/dmg.h"
#include "graph/edge.h"
#include "base/status.h"
#include "learners/independence/independence_test.h"

namespace locind::sim {
struct EventData;
struct PathData;
}  // namespace locind::sim

namespace locind::learners {

// What a method gets. `test` is required by every test-based method; the
// data pointers are read only by methods that fit the data directly (one of
// them set). Names and order of the observed processes come from the test,
// or from the data when there is no test.
struct LearnInput {
  IndependenceTest* test = nullptr;
  double level = 0.05;
  const sim::EventData* events = nullptr;
  const sim::PathData* paths = nullptr;
};

// One test made by a method, in the order made; also one witness of an
// EdgeDecision. The query is "target locally independent of sources given
// `given`" (b, A, C).
struct TestRecord {
  int target = 0;
  std::vector<int> sources;
  std::vector<int> given;
  double statistic = 0;
  double df = 0;
  double p_value = 1;  // NaN when not estimable or implied
  TestStatus status = TestStatus::kOk;
  bool dependent = false;  // independence rejected (false when not estimable)
  // Witnesses only: the answer was implied by a graph the method holds, no
  // test was made (statistic, df and p_value are NaN; status kOk).
  bool implied = false;
  std::string reason;  // why not estimable (empty otherwise)
};

// Why a method kept or removed one candidate edge.
//
// phase: where the decision was made. maximal-search and margin-search:
//   "separation", "pruning", "final" (and "marks" for the solid/dashed mark of a kept
//   edge, which is recorded in `mark`, not as a separate record); pairwise:
//   "test"; screen: "screen"; exhaustive: "criterion"; penalized-fit: "fit".
// rule: "separated" (a separation of the pair: D1 fails), "implied
//   separation" (separated in the method's current graph), "D2", "D3",
//   "F6(i)", "F6(ii)", "B2" (the condition of learners/methods/maximal_criterion.h or
//   docs/theory.md F6 that failed), "one direction removed" (screen's
//   bidirected edges), "zero coefficient" (penalized-fit), "never considered"
//   (an edge kind outside the method: pairwise, penalized-fit and <->); for kept edges
//   "inseparable", "conditions hold", "own evidence" (margin-search: a
//   separation that did not refute the edge), "not estimable" (undecided),
//   "both directions kept", "nonzero coefficient".
// witnesses: the answers that caused the decision, the deciding separation
//   first when the edge was removed (then the connections the rule needed,
//   each with dependent = true); for a kept edge the tests of its own pair
//   that said dependent (or, when undecided, the tests that could not be
//   computed).
struct EdgeDecision {
  graph::Edge edge;         // over the observed processes, indices in the test's order
  bool kept = false;        // in the returned graph
  bool undecided = false;   // kept only because a test it needed was not estimable
  std::string mark;         // "solid" or "dashed" when kept and the method has marks; else ""
  std::string phase;
  std::string rule;
  std::vector<TestRecord> witnesses;
};

struct LearnResult {
  std::string method;     // registry name of the method
  std::string test_kind;  // IndependenceTest::kind(), or "none"
  graph::Dmg graph;       // over the observed names, in the test's order
  // Marks: when has_marks, edges lists every edge of `graph` in ListEdges
  // order and dashed[i] says whether edges[i] is dashed (missing from some
  // member of the class). Empty otherwise.
  bool has_marks = false;
  std::vector<graph::Edge> edges;
  std::vector<bool> dashed;
  std::vector<TestRecord> log;
  // One record per candidate edge the method considered (ListEdges order of
  // the complete candidate set of the method); see EdgeDecision.
  std::vector<EdgeDecision> decisions;
  int tests = 0;          // tests made (== log.size())
  int not_estimable = 0;  // tests whose result was not estimable
  int largest_given = 0;  // largest conditioning set used (0 when no test)
  double seconds = 0;     // wall-clock time of the method
  std::string note;       // anything the caller should know (empty when nothing)
};

class Learner {
 public:
  virtual ~Learner() = default;
  // Fails when the input lacks what the method needs (no test, no data) or
  // the problem is beyond the method's size limit (the message says which).
  virtual Result<LearnResult> Learn(const LearnInput& input) = 0;
};

// The dashed edges of a result with marks (empty otherwise).
std::vector<graph::Edge> DashedEdges(const LearnResult& result);

}  // namespace locind::learners
