// The linear-diffusion designs shared by the path-test calibration suites
// (drift_transition_calibration_test.cc and
// drift_transition_history_calibration_test.cc): truths whose observed
// processes are named so that every null query is x1 (the last observed
// column) against x2 (column 0) given {x3, x1}. Test helper, no checks of
// its own. The enum's values key the suites' random streams: append, never
// reorder.
#pragma once

#include "graph/dmg.h"
#include "learners/independence/independence_test.h"
#include "sim/diffusion_simulator.h"

namespace locind::learners {

enum class PathDesign { kUncoupled, kChain, kOmittedParent, kHiddenMediator, kHiddenDriver, kAlternative };

// uncoupled: x2, x1 with loops only; alternative: the same plus x2 -> x1;
// chain: x2 -> x3 -> x1; omitted parent: x2 -> x3 -> x1 and p -> x1 (p
// observed but left out of the query's C); hidden mediator: x2 -> x3 -> h
// -> x1, h hidden; hidden driver: h -> x2, h -> x3 -> x1, h hidden. Every
// process has its loop.
inline graph::TruthGraph PathDesignTruth(PathDesign s) {
  auto loops = [](graph::Dmg& g) {
    for (int v = 0; v < g.size(); ++v) g.AddDirected(v, v);
  };
  switch (s) {
    case PathDesign::kUncoupled:
    case PathDesign::kAlternative: {
      graph::Dmg g({"x2", "x1"});
      if (s == PathDesign::kAlternative) g.AddDirected(0, 1);
      loops(g);
      return {g, {}};
    }
    case PathDesign::kChain: {
      graph::Dmg g({"x2", "x3", "x1"});
      g.AddDirected(0, 1);
      g.AddDirected(1, 2);
      loops(g);
      return {g, {}};
    }
    case PathDesign::kOmittedParent: {
      graph::Dmg g({"x2", "x3", "p", "x1"});
      g.AddDirected(0, 1);
      g.AddDirected(1, 3);
      g.AddDirected(2, 3);
      loops(g);
      return {g, {}};
    }
    case PathDesign::kHiddenMediator: {
      graph::Dmg g({"x2", "x3", "h", "x1"});
      g.AddDirected(0, 1);
      g.AddDirected(1, 2);
      g.AddDirected(2, 3);
      loops(g);
      return {g, {2}};
    }
    case PathDesign::kHiddenDriver: {
      graph::Dmg g({"h", "x2", "x3", "x1"});
      g.AddDirected(0, 1);
      g.AddDirected(0, 2);
      g.AddDirected(2, 3);
      loops(g);
      return {g, {0}};
    }
  }
  return {};
}

// The design's query on data simulated from its truth: x1 against x2 given
// {x1} (uncoupled, alternative) or {x3, x1} (with an omitted parent, p is
// left out).
inline TestQuery PathDesignQuery(PathDesign s, const sim::PathData& d) {
  const int b = d.processes() - 1;
  if (s == PathDesign::kUncoupled || s == PathDesign::kAlternative) return {b, {0}, {b}};
  return {b, {0}, {1, b}};
}

}  // namespace locind::learners
