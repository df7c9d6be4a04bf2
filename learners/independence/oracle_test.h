// OracleTest: answers from mu-separation in the latent projection of the
// truth, so a learner can run without sampling error: p = 1 when b is
// separated from every a in A given C, p = 0 otherwise.
#pragma once

#include <map>
#include <tuple>

#include "graph/bit_graph.h"
#include "graph/truth_graph.h"
#include "base/status.h"
#include "learners/independence/independence_test.h"

namespace locind::learners {

class OracleTest : public IndependenceTest {
 public:
  // Projects the truth onto its observed nodes; fails beyond 64 nodes.
  static Result<OracleTest> FromTruth(const graph::TruthGraph& truth);
  // An oracle for a graph whose every node is observed.
  // REQUIRES: at most graph::kMaxBitGraphNodes nodes (use FromTruth for
  // graphs read from users, which checks).
  explicit OracleTest(const graph::Dmg& observed_graph);

  int processes() const override { return graph_.n; }
  const std::vector<std::string>& names() const override { return names_; }
  std::string kind() const override { return "oracle"; }
  TestResult Run(const TestQuery& query) override;

  // The number of distinct queries answered so far.
  size_t distinct_queries() const { return cache_.size(); }

 private:
  OracleTest(graph::BitGraph g, std::vector<std::string> names)
      : graph_(std::move(g)), names_(std::move(names)) {}

  graph::BitGraph graph_;
  std::vector<std::string> names_;
  std::map<std::tuple<int, graph::Mask, graph::Mask>, bool> cache_;
};

}  // namespace locind::learners
