#include "graph/equivalence_graph.h"

#include "graph/mu_separation.h"
#include "graph/separation_model.h"

namespace locind::graph {
namespace {

// Edges absent from g on pairs that no conditioning set separates (F5): a
// directed edge a -> b needs b inseparable from a, a bidirected edge needs
// both directions inseparable.
std::vector<Edge> CandidateEdges(const BitGraph& g) {
  std::vector<bool> inseparable(g.n * g.n);
  for (int a = 0; a < g.n; ++a) {
    for (int b = 0; b < g.n; ++b) inseparable[a * g.n + b] = !Separable(g, a, b);
  }
  std::vector<Edge> out;
  for (int a = 0; a < g.n; ++a) {
    for (int b = 0; b < g.n; ++b) {
      const Edge directed{a, b, EdgeKind::kDirected};
      if (inseparable[a * g.n + b] && !g.Has(directed)) out.push_back(directed);
      const Edge bidirected{a, b, EdgeKind::kBidirected};
      if (a < b && inseparable[a * g.n + b] && inseparable[b * g.n + a] && !g.Has(bidirected)) {
        out.push_back(bidirected);
      }
    }
  }
  return out;
}

// Members are found by removing sets of dashed edges from the maximal graph.
// Removing edges only adds separations, so once a removal set breaks
// equivalence every superset does too, and the search prunes there.
Status CollectMembers(const SeparationModel& model, const std::vector<Edge>& dashed, size_t next,
                      BitGraph& current, size_t max_members, std::vector<BitGraph>& out) {
  for (size_t i = next; i < dashed.size(); ++i) {
    current.Remove(dashed[i]);
    Result<SeparationModel> changed = SeparationModel::Compute(current);
    if (changed->SameSeparations(model)) {
      if (out.size() >= max_members) {
        current.Add(dashed[i]);
        return Status::Error("the class has more than " + std::to_string(max_members) +
                             " members");
      }
      out.push_back(current);
      Status status = CollectMembers(model, dashed, i + 1, current, max_members, out);
      if (!status.ok()) return status;
    }
    current.Add(dashed[i]);
  }
  return Status::Ok();
}

}  // namespace

Result<BitGraph> MaximalGraph(const BitGraph& g) {
  Result<SeparationModel> model = SeparationModel::Compute(g);
  if (!model.ok()) return model.status();
  BitGraph maximal = g;
  BitGraph trial = g;
  for (const Edge& e : CandidateEdges(g)) {
    trial.Add(e);
    if (model->SameAfterChange(trial, e)) maximal.Add(e);
    trial.Remove(e);
  }
  return maximal;
}

Result<EquivalenceGraph> ComputeEquivalenceGraph(const BitGraph& g) {
  Result<BitGraph> maximal = MaximalGraph(g);
  if (!maximal.ok()) return maximal.status();
  Result<SeparationModel> model = SeparationModel::Compute(*maximal);
  EquivalenceGraph out{*maximal, ListEdges(*maximal), {}};
  BitGraph trial = *maximal;
  for (const Edge& e : out.edges) {
    trial.Remove(e);
    out.dashed.push_back(model->SameAfterChange(trial, e));
    trial.Add(e);
  }
  return out;
}

Result<std::vector<BitGraph>> ClassMembers(const BitGraph& g, size_t max_members) {
  if (max_members < 1) return Status::Error("max_members must be at least 1");
  Result<EquivalenceGraph> eg = ComputeEquivalenceGraph(g);
  if (!eg.ok()) return eg.status();
  std::vector<Edge> dashed;
  for (size_t i = 0; i < eg->edges.size(); ++i) {
    if (eg->dashed[i]) dashed.push_back(eg->edges[i]);
  }
  Result<SeparationModel> model = SeparationModel::Compute(eg->maximal);
  std::vector<BitGraph> members{eg->maximal};
  BitGraph current = eg->maximal;
  Status status = CollectMembers(*model, dashed, 0, current, max_members, members);
  if (!status.ok()) return status;
  return members;
}

Result<NamedEquivalenceGraph> ComputeEquivalenceGraph(const Dmg& g) {
  Result<BitGraph> bits = ToBitGraph(g);
  if (!bits.ok()) return bits.status();
  Result<EquivalenceGraph> eg = ComputeEquivalenceGraph(*bits);
  if (!eg.ok()) return eg.status();
  return NamedEquivalenceGraph{ToDmg(eg->maximal, g.names()), eg->edges, eg->dashed};
}

}  // namespace locind::graph
