// RunUnit: one replicate of one cell — simulate once, run every learner on
// the same data, score each learned graph against the truth's class.
//
// Nothing here throws or aborts on a bad replicate: a simulation that fails
// (event cap, unstable draw), a learner that refuses, or a truth beyond the
// exact limit gives rows with status "failed" and the message. The data
// stream is keyed by (study seed, cell key, replicate, kPurposeData), so a
// unit's rows do not depend on which thread or process ran it (timing
// columns aside).
#pragma once

#include <vector>

#include "app/results/results_rows.h"
#include "app/study/study_truths.h"
#include "app/study/study_grid.h"
#include "app/study/study_spec.h"

namespace locind::app {

// Runs the learners whose indices are listed (all when `learners` is empty).
UnitResult RunUnit(const StudySpec& study, const Cell& cell, const StudyTruths& truths,
                   int replicate, const std::vector<int>& learners = {});

}  // namespace locind::app
