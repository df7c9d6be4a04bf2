// The planner: for each learner, the smallest observation length at which
// the pooled power reaches a target and the false-edge rate stays below one.
//
// Adaptive search per learner, on the first value of every other grid factor
// (level, hidden count, stationarity target): start at plan.start (default
// the smallest grid length) and double until both targets are met or the cap
// (plan.cap, default 64 x the largest grid length) is passed; then bisect
// between the last length that failed and the first that met the targets,
// plan.bisection_steps times. Every evaluated length runs grid.replicates
// replicates with the study's own random streams (cells keyed by their
// length), and is summarised with metrics::Summarize.
//
// Uncertainty: besides the length where the point estimates meet the
// targets, two bounds from the summary's 95% intervals over the evaluated
// lengths (two-stage cluster bootstrap over truths and replicates,
// metrics/cell_summary.h; when every replicate agrees the interval has zero
// width, e.g. an oracle finding every edge is "guaranteed" at once): the smallest length whose intervals still allow the targets
// (optimistic: power upper bound >= target and false-edge lower bound <=
// target) and the smallest from which the intervals guarantee them
// (conservative: power lower bound >= target and false-edge upper bound <=
// target); NaN when no evaluated length qualifies. Power need not grow with
// length for every method, so the search reports what it evaluated.
#pragma once

#include <cmath>
#include <functional>
#include <string>
#include <vector>

#include "app/study/study_spec.h"
#include "metrics/cell_summary.h"

namespace locind::app {

struct PlanTargets {
  double power = 0.8;
  double false_edges = 0.05;
};

struct PlanStep {
  double length = 0;
  metrics::CellSummary summary;
  bool meets = false;
};

struct LearnerPlan {
  std::string learner;
  bool reached = false;
  double length = 0;          // when reached
  double optimistic = NAN;
  double conservative = NAN;
  double cap = 0;
  std::vector<PlanStep> steps;  // sorted by length
};

// Point estimates meet both targets (no reported edge counts as no false edge).
bool MeetsTargets(const metrics::CellSummary& s, const PlanTargets& targets);

// `log` (may be empty) receives one line per evaluated length.
std::vector<LearnerPlan> PlanLengths(const StudySpec& study, const PlanTargets& targets, int threads,
                                     const std::function<void(const std::string&)>& log);

// Plain text: a table of the learners that reached the targets, and one
// plain sentence for each that did not.
std::string PlanReport(const std::vector<LearnerPlan>& plans, const PlanTargets& targets);

// plan.csv (header and one line per learner; columns in results/README.md),
// which `locind report` reads to draw the targets and planned lengths.
const std::string& PlanHeader();
std::string PlanCsv(const std::vector<LearnerPlan>& plans, const PlanTargets& targets);

}  // namespace locind::app
