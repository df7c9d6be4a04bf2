// TruthGraph: a ground-truth graph with some nodes marked hidden, and the
// generator of random truths.
#pragma once

#include <cstdint>
#include <vector>

#include "graph/dmg.h"
#include "base/random_stream.h"
#include "base/status.h"

namespace locind::graph {

struct TruthGraph {
  Dmg graph;
  std::vector<int> hidden;  // sorted node indices

  bool IsHidden(int v) const;
  std::vector<int> Observed() const;  // sorted node indices
};

enum class LoopPolicy { kAll, kNone, kRandom };

struct RandomGraphOptions {
  int nodes = 5;
  // Probability of each directed edge a -> b (a != b). When
  // expected_in_degree >= 0 it overrides: p = expected_in_degree / (nodes - 1).
  double edge_probability = 0.3;
  double expected_in_degree = -1;
  LoopPolicy loops = LoopPolicy::kRandom;
  double loop_probability = 0.5;        // used with LoopPolicy::kRandom
  double bidirected_probability = 0.0;  // per unordered pair; 0 for process truths
  int hidden_count = 0;                 // drawn at random among the nodes...
  std::vector<int> hidden_list;         // ...unless listed here explicitly
};

// Checks the options: nodes >= 1, probabilities in [0, 1], hidden count and
// indices in range, and at least one observed node.
Status Validate(const RandomGraphOptions& options);

// Draws a graph. Observed nodes are named x1, x2, ... and hidden ones h1,
// h2, ... in index order. REQUIRES: Validate(options).ok().
TruthGraph RandomTruthGraph(const RandomGraphOptions& options, base::RandomStream& random);

}  // namespace locind::graph
