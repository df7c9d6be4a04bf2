#include "metrics/truth_class.h"

#include <algorithm>

#include "graph/latent_projection.h"
#include "graph/separation_model.h"

namespace locind::metrics {

TruthStatus TruthClass::StatusOf(const graph::Edge& e) const {
  auto it = std::lower_bound(edges.begin(), edges.end(), e);
  if (it == edges.end() || !(*it == e)) return TruthStatus::kAbsent;
  return dashed[it - edges.begin()] ? TruthStatus::kDashed : TruthStatus::kSolid;
}

Result<TruthClass> ComputeTruthClass(const graph::TruthGraph& truth) {
  Result<graph::Dmg> projected = graph::LatentProjection(truth.graph, truth.hidden);
  if (!projected.ok()) return projected.status();
  Result<graph::NamedEquivalenceGraph> eg = graph::ComputeEquivalenceGraph(*projected);
  if (!eg.ok()) return eg.status();
  TruthClass out{truth, *projected, eg->maximal, eg->edges, eg->dashed};
  // StatusOf searches the edges by value: keep them sorted with their marks.
  std::vector<size_t> order(out.edges.size());
  for (size_t i = 0; i < order.size(); ++i) order[i] = i;
  std::sort(order.begin(), order.end(),
            [&](size_t x, size_t y) { return out.edges[x] < out.edges[y]; });
  std::vector<graph::Edge> edges;
  std::vector<bool> dashed;
  for (size_t i : order) {
    edges.push_back(out.edges[i]);
    dashed.push_back(out.dashed[i]);
  }
  out.edges = std::move(edges);
  out.dashed = std::move(dashed);
  return out;
}

const char* TruthStatusName(TruthStatus status) {
  switch (status) {
    case TruthStatus::kSolid: return "solid";
    case TruthStatus::kDashed: return "dashed";
    case TruthStatus::kAbsent: return "absent";
  }
  return "absent";
}

}  // namespace locind::metrics
