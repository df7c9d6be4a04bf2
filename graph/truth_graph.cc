#include "graph/truth_graph.h"

#include <algorithm>
#include <string>

namespace locind::graph {

bool TruthGraph::IsHidden(int v) const {
  return std::binary_search(hidden.begin(), hidden.end(), v);
}

std::vector<int> TruthGraph::Observed() const {
  std::vector<int> out;
  for (int v = 0; v < graph.size(); ++v) {
    if (!IsHidden(v)) out.push_back(v);
  }
  return out;
}

Status Validate(const RandomGraphOptions& o) {
  auto is_probability = [](double p) { return p >= 0 && p <= 1; };
  if (o.nodes < 1) return Status::Error("nodes must be at least 1");
  if (!is_probability(o.edge_probability)) return Status::Error("edge probability must lie in [0, 1]");
  if (o.expected_in_degree >= 0 && o.nodes > 1 && o.expected_in_degree > o.nodes - 1) {
    return Status::Error("expected in-degree must be at most nodes - 1");
  }
  if (!is_probability(o.loop_probability)) return Status::Error("loop probability must lie in [0, 1]");
  if (!is_probability(o.bidirected_probability)) {
    return Status::Error("bidirected probability must lie in [0, 1]");
  }
  if (o.hidden_count < 0 || o.hidden_count >= o.nodes) {
    return Status::Error("hidden count must be between 0 and nodes - 1");
  }
  for (int h : o.hidden_list) {
    if (h < 0 || h >= o.nodes) return Status::Error("hidden node index out of range");
  }
  if (static_cast<int>(o.hidden_list.size()) >= o.nodes) {
    return Status::Error("at least one node must be observed");
  }
  return Status::Ok();
}

namespace {

std::vector<int> DrawHidden(const RandomGraphOptions& o, base::RandomStream& random) {
  std::vector<int> hidden = o.hidden_list;
  if (hidden.empty() && o.hidden_count > 0) {
    // Partial Fisher-Yates shuffle: the first hidden_count entries.
    std::vector<int> order(o.nodes);
    for (int v = 0; v < o.nodes; ++v) order[v] = v;
    for (int i = 0; i < o.hidden_count; ++i) {
      const int j = i + static_cast<int>(random.Uniform() * (o.nodes - i));
      std::swap(order[i], order[j]);
    }
    hidden.assign(order.begin(), order.begin() + o.hidden_count);
  }
  std::sort(hidden.begin(), hidden.end());
  hidden.erase(std::unique(hidden.begin(), hidden.end()), hidden.end());
  return hidden;
}

std::vector<std::string> RoleNames(int nodes, const std::vector<int>& hidden) {
  std::vector<std::string> names(nodes);
  int observed_count = 0;
  int hidden_count = 0;
  for (int v = 0; v < nodes; ++v) {
    const bool is_hidden = std::binary_search(hidden.begin(), hidden.end(), v);
    // Built from a char rather than "h" + to_string(): g++ 12 -O2 warns
    // (-Wrestrict, a false positive) on the inlined literal + temporary.
    std::string name(1, is_hidden ? 'h' : 'x');
    name += std::to_string(is_hidden ? ++hidden_count : ++observed_count);
    names[v] = std::move(name);
  }
  return names;
}

}  // namespace

TruthGraph RandomTruthGraph(const RandomGraphOptions& o, base::RandomStream& random) {
  const double p = (o.expected_in_degree >= 0 && o.nodes > 1)
                       ? o.expected_in_degree / (o.nodes - 1)
                       : o.edge_probability;
  std::vector<int> hidden = DrawHidden(o, random);
  Dmg g(RoleNames(o.nodes, hidden));
  for (int a = 0; a < o.nodes; ++a) {
    for (int b = 0; b < o.nodes; ++b) {
      if (a != b && random.Uniform() < p) g.AddDirected(a, b);
    }
  }
  for (int a = 0; a < o.nodes; ++a) {
    const bool loop = o.loops == LoopPolicy::kAll ||
                      (o.loops == LoopPolicy::kRandom && random.Uniform() < o.loop_probability);
    if (loop) g.AddDirected(a, a);
  }
  for (int a = 0; a < o.nodes; ++a) {
    for (int b = a + 1; b < o.nodes; ++b) {
      if (o.bidirected_probability > 0 && random.Uniform() < o.bidirected_probability) {
        g.AddBidirected(a, b);
      }
    }
  }
  return TruthGraph{std::move(g), std::move(hidden)};
}

}  // namespace locind::graph
