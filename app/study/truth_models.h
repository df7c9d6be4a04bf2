// The process model of every truth a study simulates, written out so any
// replicate's truth can be rerun alone.
//
// One TruthModel per truth and stationarity target of the cells (the
// parameters do not depend on length or level): the model as simulated, its
// stationarity value (spectral radius of K for events, largest real part of
// M for paths) as drawn and as simulated, the rescaling factor, a note when
// rescaling moved parameters outside their configured ranges, the model
// file text (app/io/model_file.h reads it; `locind simulate` runs it) and
// the parameters as JSON (for study.json).
#pragma once

#include <optional>
#include <string>
#include <vector>

#include "app/study/study_grid.h"
#include "app/study/study_spec.h"
#include "app/study/study_truths.h"

namespace locind::app {

struct TruthModel {
  std::string truth;  // the truth's label (truth column of replicates.csv)
  std::optional<double> target;
  // The file label: the truth's label, plus "-target<value>" when the grid
  // has a stationarity factor. Files go to truths/<label>.model.yaml.
  std::string label;
  std::string problem;  // the model could not be built (then nothing below is set)
  double drawn_value = 0;
  double simulated_value = 0;
  double scale = 1;
  std::string outside_range;  // empty when every rescaled parameter stays in its range
  std::string file_text;
  std::string parameters_json;
};

// Every (truth, target) pair of the cells, in truth order then target order.
std::vector<TruthModel> TruthModels(const StudySpec& study, const std::vector<Cell>& cells,
                                    const StudyTruths& truths);

// One line per model whose rescaled parameters left the configured ranges.
std::vector<std::string> RescaleWarnings(const std::vector<TruthModel>& models);

}  // namespace locind::app
