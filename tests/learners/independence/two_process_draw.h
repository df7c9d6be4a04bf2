// A simulated pair of self-exciting event streams, a -> b, shared by the
// event-test suites (test helper, no checks of its own).
#pragma once

#include <cstdint>

#include "base/random_stream.h"
#include "graph/dmg.h"
#include "sim/hawkes_model.h"
#include "sim/hawkes_simulator.h"

namespace locind::learners {

// A draw of a -> b (a, b self-exciting; baseline 0.5, loop weight 0.2,
// decay 2; no edge a -> b when weight is 0) on [0, horizon), burn-in 50.
inline sim::EventData DrawTwoProcesses(double weight, double horizon, uint64_t seed) {
  graph::Dmg g({"a", "b"});
  g.AddDirected(0, 0);
  g.AddDirected(1, 1);
  if (weight > 0) g.AddDirected(0, 1);
  sim::HawkesModel m = sim::ExponentialHawkes(graph::TruthGraph{g, {}}, 0.5, weight, 2.0, 0.2);
  sim::HawkesRunOptions o;
  o.horizon = horizon;
  o.burn_in = 50;
  base::RandomStream random(seed);
  return sim::SimulateHawkes(m, o, random).value();
}

}  // namespace locind::learners
