// The truths of a study and the process models built on them.
//
// StudyTruths draws every truth a study needs (one per hidden-count factor
// and truth index) and computes its class once (metrics::ComputeTruthClass);
// a truth beyond the exact limit keeps the error, and every replicate on it
// becomes a failed row. Process parameters are drawn per truth from the
// study's ranges (stream purpose kPurposeParameters) on the drawn graph,
// restricted to the truth's nodes (the same nodes unless hidden_mode is
// fixed-observed), and rescaled to the cell's stationarity target: only
// downwards unless `rescale: both` (see EventProcessSpec).
#pragma once

#include <map>
#include <string>
#include <utility>

#include "app/study/study_grid.h"
#include "app/study/study_spec.h"
#include "base/status.h"
#include "graph/truth_graph.h"
#include "metrics/truth_class.h"
#include "sim/diffusion_model.h"
#include "sim/hawkes_model.h"

namespace locind::app {

struct PreparedTruth {
  int hidden_factor = -1;
  int index = 0;
  std::string label;
  graph::TruthGraph truth;
  Result<metrics::TruthClass> truth_class = Status::Error("not computed");
  // The graph the parameters are drawn on, its parameter-stream key, and
  // which of its nodes `truth` keeps (in order). Under hidden_mode
  // fresh-truth (or without a hidden-count factor) drawn == truth.
  graph::TruthGraph drawn;
  uint64_t drawn_key = 0;
  std::vector<int> kept;
};

class StudyTruths {
 public:
  // Draws and classifies every truth the cells need (sequentially).
  StudyTruths(const StudySpec& study, const std::vector<Cell>& cells);

  // REQUIRES: (hidden_factor, index) is a truth of the cells given.
  const PreparedTruth& Get(int hidden_factor, int index) const;
  const std::map<std::pair<int, int>, PreparedTruth>& all() const { return truths_; }

 private:
  std::map<std::pair<int, int>, PreparedTruth> truths_;
};

// Draws truth `index` under the hidden-count factor (explicit graphs are
// returned as they are).
graph::TruthGraph DrawTruth(const StudySpec& study, int hidden_factor, int index);

// The truth with its drawn graph, key and kept nodes (class not computed).
PreparedTruth PrepareTruth(const StudySpec& study, int hidden_factor, int index);

// The Hawkes model of a truth for a cell, and the spectral radius of its K
// as drawn and as simulated (after rescaling; equal when not rescaled).
struct BuiltHawkes {
  sim::HawkesModel model;
  double drawn_radius = 0;
  double spectral_radius = 0;
  double scale = 1;            // factor applied to every kernel weight
  std::string outside_range;  // when rescaling left the configured ranges: what and how far
};
Result<BuiltHawkes> BuildHawkes(const StudySpec& study, const PreparedTruth& truth, const Cell& cell);

// The diffusion model of a truth for a cell, and the largest real part of
// the eigenvalues of M.
struct BuiltDiffusion {
  sim::DiffusionModel model;
  double drawn_largest_real_part = 0;
  double largest_real_part = 0;
  double scale = 1;            // factor applied to M
  std::string outside_range;  // as for BuiltHawkes (self_rate and coupling ranges)
};
Result<BuiltDiffusion> BuildDiffusion(const StudySpec& study, const PreparedTruth& truth,
                                      const Cell& cell);

}  // namespace locind::app
