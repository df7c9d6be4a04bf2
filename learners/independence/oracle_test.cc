#include "learners/independence/oracle_test.h"

#include <cassert>

#include "graph/latent_projection.h"
#include "graph/mu_separation.h"

namespace locind::learners {
namespace {

graph::Mask ToMask(const std::vector<int>& nodes) {
  graph::Mask m = 0;
  for (int v : nodes) m |= graph::Bit(v);
  return m;
}

}  // namespace

Result<OracleTest> OracleTest::FromTruth(const graph::TruthGraph& truth) {
  Result<graph::Dmg> projected = graph::LatentProjection(truth.graph, truth.hidden);
  if (!projected.ok()) return projected.status();
  return OracleTest(*projected);
}

OracleTest::OracleTest(const graph::Dmg& observed_graph)
    : graph_(*graph::ToBitGraph(observed_graph)), names_(observed_graph.names()) {
  assert(observed_graph.size() <= graph::kMaxBitGraphNodes);
}

TestResult OracleTest::Run(const TestQuery& q) {
  const graph::Mask sources = ToMask(q.sources);
  const graph::Mask given = ToMask(q.given);
  const auto key = std::make_tuple(q.target, sources, given);
  auto it = cache_.find(key);
  if (it == cache_.end()) {
    const bool separated = graph::MuSeparated(graph_, sources, graph::Bit(q.target), given);
    it = cache_.emplace(key, separated).first;
  }
  TestResult r;
  r.statistic = it->second ? 0 : 1;
  r.df = 0;
  r.p_value = it->second ? 1.0 : 0.0;
  return r;
}

}  // namespace locind::learners
