// The DOT text of every graph drawing of a study: each truth (hidden
// processes as grey dashed boxes), its latent projection, its equivalence
// graph (dashed edges dashed), and a learned graph scored against the class:
//
//   edge in the class          drawn as usual (dashed when the method marked it so)
//   false edge (not in N)      vermillion #D55E00 and thick
//   solid edge of N missed     dotted orange #E69F00, thick
//
// Colours from the Okabe & Ito (2008) colour-blind-safe set; false and
// missed edges also differ by thickness and line style, so the drawing reads
// without colour.
#pragma once

#include <string>
#include <vector>

#include "app/report_data.h"
#include "app/runner_truths.h"
#include "metrics/truth_class.h"

namespace locind::app {

std::string TruthDot(const PreparedTruth& truth);
// REQUIRES: truth.truth_class.ok() for the two below.
std::string ProjectionDot(const PreparedTruth& truth);
std::string ClassDot(const PreparedTruth& truth);

// The graph one learner reported in one replicate, from its rows of
// edges.csv (all rows of one cell, replicate and learner). Rows naming an
// edge over nodes the class does not have are skipped.
std::string LearnedDot(const metrics::TruthClass& truth_class, const std::vector<EdgeLine>& rows,
                       const std::string& title);

}  // namespace locind::app
