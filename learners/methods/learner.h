// Learner: the interface of every learning method.
//
// A method takes an independence test (statistical or the oracle) and a
// significance level, asks the test "is b locally independent of A given C?"
// as often as it needs, and returns a graph over the observed processes, the
// solid/dashed marks when it has them, the log of every test it made, and its
// cost. Methods that fit the data directly (no tests) read it from the input.
//
// Decision rule, shared by every method (learners/methods/test_runner.h): independence
// is rejected ("dependent") when p <= level. A result marked not estimable is
// treated as dependent, so the edge in question is kept: a method never
// removes an edge on evidence it could not compute. Such results are counted
// in LearnResult::not_estimable and flagged in the log.
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

// One test made by a method, in the order made.
struct TestRecord {
  int target = 0;
  std::vector<int> sources;
  std::vector<int> given;
  double statistic = 0;
  double df = 0;
  double p_value = 1;
  TestStatus status = TestStatus::kOk;
  bool dependent = false;  // the decision: independence rejected
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
