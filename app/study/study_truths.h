// The truths of a study and the process models built on them.
//
// StudyTruths draws every truth a study needs (one per hidden-count factor
// and truth index) and computes its class once (metrics::ComputeTruthClass);
// a truth beyond the exact limit keeps the error, and every replicate on it
// becomes a failed row. Process parameters are drawn per truth from the
// study's ranges (stream purpose kPurposeParameters) and rescaled to the
// cell's stationarity target.
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

// The Hawkes model of a truth for a cell, and the spectral radius of its K.
struct BuiltHawkes {
  sim::HawkesModel model;
  double spectral_radius = 0;
};
Result<BuiltHawkes> BuildHawkes(const StudySpec& study, const PreparedTruth& truth, const Cell& cell);

// The diffusion model of a truth for a cell, and the largest real part of
// the eigenvalues of M.
struct BuiltDiffusion {
  sim::DiffusionModel model;
  double largest_real_part = 0;
};
Result<BuiltDiffusion> BuildDiffusion(const StudySpec& study, const PreparedTruth& truth,
                                      const Cell& cell);

}  // namespace locind::app
