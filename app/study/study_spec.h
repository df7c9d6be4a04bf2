// StudySpec: a study file after reading and validation, every default filled
// in (the vocabulary is documented in configs/README.md).
//
// A study fixes the truths (one explicit graph, or a random family from which
// `truths` distinct graphs are drawn), the process model run on them (Hawkes
// event streams or diffusion paths, parameters fixed or drawn per truth from
// ranges and optionally rescaled to a stationarity target), the grid of
// conditions (observation lengths and other factors), the replicates per cell
// and the learners (method + independence test, or the oracle).
#pragma once

#include <cstdint>
#include <optional>
#include <string>
#include <vector>

#include "graph/truth_graph.h"

namespace locind::app {

// A number fixed for every truth, or drawn uniformly from [low, high] per
// truth (and per edge or node where it is a per-edge or per-node value).
struct ValueRange {
  double low = 0;
  double high = 0;
  bool IsFixed() const { return low == high; }
};

struct TruthSpec {
  bool random = false;
  graph::TruthGraph explicit_graph;       // when !random
  graph::RandomGraphOptions random_graph;  // when random
  int truths = 1;                          // distinct truths drawn (parameters, and graphs when random)
};

// Hawkes process with exponential kernels w * decay * exp(-decay t).
struct EventProcessSpec {
  ValueRange baseline{0.2, 0.2};
  ValueRange weight{0.3, 0.3};       // edges a -> b, a != b
  ValueRange loop_weight{0.3, 0.3};  // loops a -> a
  ValueRange decay{1, 1};
  // When set, K is multiplied by a constant so its spectral radius equals
  // this value (0 < value < 1).
  std::optional<double> spectral_radius;
  // rescale: both: every draw is rescaled to the target (up or down); down
  // (the default): only a draw whose radius exceeds the target is scaled
  // down to it, so a stable draw keeps its configured weights.
  bool rescale_both = false;
  double burn_in = 50;
  int64_t event_cap = 5'000'000;
};

// Linear or tanh diffusion; observed on a regular grid.
struct PathProcessSpec {
  bool tanh = false;
  ValueRange self_rate{1, 1};  // M_bb = -self_rate on loops b -> b
  ValueRange coupling{0.5, 0.5};
  double noise = 1;
  double step = 0.01;
  double interval = 0.1;
  double burn_in = 10;
  bool exact = false;  // exact Gaussian transition (linear drift only)
  // When set (< 0), M is multiplied by a positive constant so the largest real
  // part of its eigenvalues equals this value (linear drift only).
  std::optional<double> drift_bound;
  // rescale: both: every draw is rescaled to drift_bound; down (the
  // default): only a draw whose largest real part exceeds the bound (is less
  // stable than asked) is rescaled, moving that value down to the bound.
  bool rescale_both = false;
};

struct LearnerSpec {
  std::string label;   // unique; "method/test" unless named in the file
  std::string method;  // registry name
  std::string test;    // oracle, an EventTestNames() entry (app/study/test_choice.h), a PathTestNameList() entry, none
  int screening_size = 1;
  double penalty = -1;
  // --- An external learner (docs/external_learners.md): a program run per
  // replicate instead of a built-in method. method is then "external" and
  // test "none" (needs: data) or "oracle" (needs: oracle). ---
  std::vector<std::string> program;  // argv; empty for built-in methods
  double time_limit = 60;            // seconds per replicate
  bool IsExternal() const { return !program.empty(); }
};

struct GridSpec {
  std::vector<double> lengths;
  std::vector<double> levels{0.05};
  std::vector<int> hidden_counts;        // random truths only; empty: the truth's own
  // hidden_mode under a hidden-count factor. fresh-truth (false, the
  // default): each count draws its own truths on truth.random.nodes nodes,
  // hidden ones included. fixed-observed (true): one truth on
  // truth.random.nodes observed + max(hidden_counts) hidden nodes; count h
  // keeps the observed nodes and the first h hidden ones (the rest are left
  // out of the system), so every count has the same observed processes.
  bool hidden_fixed_observed = false;
  std::vector<double> stationarity;      // spectral radius or drift bound targets; empty: the process's own
  int replicates = 10;
  // Number of trials factor (grid.trials): each replicate records that many
  // independent trials of `length` each. Empty: one trial, and no factor
  // (cell labels, keys and data as without the key).
  std::vector<int> trials;
};

// Settings for `locind plan`.
struct PlanSpec {
  double start = 0;  // first length tried; 0: the smallest grid length
  double cap = 0;    // largest length tried; 0: 64 times the largest grid length
  int bisection_steps = 4;
  // What plan searches along (plan.along): the trial length ("length", the
  // default) or the number of trials ("trials", at each grid length; start
  // and cap then count trials).
  bool along_trials = false;
};

struct StudySpec {
  std::string file;  // path it was read from
  std::string name;
  uint64_t seed = 1;
  TruthSpec truth;
  bool events = true;  // events (Hawkes) or paths (diffusion)
  EventProcessSpec event_process;
  PathProcessSpec path_process;
  GridSpec grid;
  std::vector<LearnerSpec> learners;
  PlanSpec plan;
  // Memory one replicate may use, in MiB: a study whose expected replicate
  // needs more is refused before any work, and an event simulation stops
  // (the replicate fails with a message) once its events would need more.
  int64_t memory_mb = 2048;
};

}  // namespace locind::app
