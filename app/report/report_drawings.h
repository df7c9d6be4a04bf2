// The DOT text of a learned graph scored against the class (the drawings of
// the truths themselves are in app/study/truth_drawings.h):
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

#include "app/results/results_reader.h"
#include "app/study/study_truths.h"
#include "app/study/truth_drawings.h"
#include "metrics/truth_class.h"

namespace locind::app {

// The graph one learner reported in one replicate, from its rows of
// edges.csv (all rows of one cell, replicate and learner). Rows naming an
// edge over nodes the class does not have are skipped.
std::string LearnedDot(const metrics::TruthClass& truth_class, const std::vector<EdgeLine>& rows,
                       const std::string& title);

}  // namespace locind::app
