// Shared helpers for the simulator tests: truth graphs from edge lists, a
// three-node linear diffusion, and a checked draw.
#pragma once

#include <doctest/doctest.h>

#include <string>
#include <utility>
#include <vector>

#include "base/random_stream.h"
#include "graph/truth_graph.h"
#include "sim/diffusion_simulator.h"

namespace locind::testing {

inline graph::TruthGraph Graph(const std::vector<std::string>& names,
                               const std::vector<std::pair<int, int>>& edges, std::vector<int> hidden = {}) {
  graph::Dmg g(names);
  for (auto [a, b] : edges) g.AddDirected(a, b);
  return graph::TruthGraph{g, hidden};
}

// x1 -> x2 -> x3 -> x1 with loops everywhere.
inline sim::DiffusionModel Cycle(double coupling = 0.6) {
  sim::DiffusionModel m = sim::LinearDiffusion(
      Graph({"x1", "x2", "x3"}, {{0, 0}, {1, 1}, {2, 2}, {0, 1}, {1, 2}, {2, 0}}), 1.0, coupling, 0.7);
  m.c << 0.5, -0.2, 0.1;
  m.sigma << 0.7, 1.0, 0.4;
  m.M(1, 1) = -1.6;
  return m;
}

inline sim::PathData Draw(const sim::DiffusionModel& m, const sim::PathRunOptions& o, uint64_t seed) {
  base::RandomStream random(seed);
  Result<sim::PathData> data = sim::SimulateDiffusion(m, o, random);
  REQUIRE_MESSAGE(data.ok(), (data.ok() ? "" : data.status().message()));
  return std::move(data.value());
}

}  // namespace locind::testing
