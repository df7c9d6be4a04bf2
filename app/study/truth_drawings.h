// The DOT text of the drawings of one truth: the truth itself (hidden
// processes as grey dashed boxes), its latent projection and its equivalence
// graph (dashed edges dashed). The result files and the report both draw them.
#pragma once

#include <string>

#include "app/study/study_truths.h"

namespace locind::app {

std::string TruthDot(const PreparedTruth& truth);
// REQUIRES: truth.truth_class.ok() for the two below.
std::string ProjectionDot(const PreparedTruth& truth);
std::string ClassDot(const PreparedTruth& truth);

}  // namespace locind::app
