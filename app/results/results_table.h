// A plain-text table of a study's summary for the terminal: one line per
// cell and learner with power, false-edge rate and class recovery (each with
// its 95% interval), tests made and failed replicates.
#pragma once

#include <map>
#include <string>
#include <vector>

#include "app/results/results_rows.h"
#include "app/study/study_grid.h"
#include "app/study/study_spec.h"

namespace locind::app {

std::string SummaryTable(const StudySpec& study, const std::vector<Cell>& cells,
                         const std::map<Unit, UnitResult>& units);

// "0.83 [0.71, 0.91]", or "-" when undefined.
std::string IntervalText(const metrics::Interval& i);

}  // namespace locind::app
