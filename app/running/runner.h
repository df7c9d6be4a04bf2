// The parallel runner: units of work spread over threads.
//
// Each worker takes the next unit from a shared counter, runs it (RunUnit)
// and hands the result to a sink under a lock, as soon as it is done. Units
// are independent and draw from their own random streams, so the results do
// not depend on the number of threads or the order in which units finish;
// only the order of the sink calls does, and every output is sorted
// afterwards.
#pragma once

#include <functional>
#include <vector>

#include "app/running/progress.h"
#include "app/results/results_rows.h"
#include "app/study/study_truths.h"
#include "app/study/study_grid.h"
#include "app/study/study_spec.h"

namespace locind::app {

using UnitSink = std::function<void(UnitResult)>;

// Runs `units` (cells indexed by Unit::cell) on `threads` threads (>= 1),
// calling `sink` once per unit (serialised) and `progress` (may be null)
// after each. `learners`: indices to run, all when empty.
void RunUnits(const StudySpec& study, const std::vector<Cell>& cells, const StudyTruths& truths,
              const std::vector<Unit>& units, int threads, const UnitSink& sink,
              Progress* progress, const std::vector<int>& learners = {});

}  // namespace locind::app
