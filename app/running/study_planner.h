// The planner: for each learner, the smallest observation length at which
// the pooled power reaches a target and the false-edge rate stays below one.
//
// Adaptive search per learner and per combination of the other grid factors
// (hidden count, stationarity target, level; every combination, or those a
// caller picks): start at plan.start (default
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
#include <optional>
#include <string>
#include <vector>

#include "app/study/study_spec.h"
#include "base/status.h"
#include "metrics/cell_summary.h"

namespace locind::app {

// One combination of the grid factors other than the searched one (length,
// or the number of trials under plan.along: trials).
//
// plan.along: trials searches the number of trials, each of the first grid
// length, the same way (doubling from plan.start or the smallest grid.trials
// value, default 1, up to plan.cap or 64 x the largest; bisection on whole
// numbers); PlanStep::length and LearnerPlan::length/optimistic/conservative/
// cap then count trials.
struct PlanCombination {
  int hidden_factor = -1;  // grid hidden-count value; -1: no such factor
  int hidden_count = 0;    // hidden processes of the truths
  std::optional<double> stationarity;
  double level = 0.05;
  // Number of trials (grid.trials) when searching along length; 0: no such
  // factor, or plan.along: trials (the searched quantity).
  int trials = 0;
  // "level 0.05, 2 hidden, stationarity target 0.6" (factors absent from the grid left out, except level)
  std::string Text() const;
};

// Every combination, in grid order (hidden count, target, level).
std::vector<PlanCombination> PlanCombinations(const StudySpec& study);

// The combinations matching `choice` ("hidden=2 target=0.6 level=0.05", any
// subset, separated by spaces or commas; empty: all). An error names the
// problem and lists the combinations.
Result<std::vector<PlanCombination>> PickCombinations(const StudySpec& study, const std::string& choice);

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
  PlanCombination at;
  bool reached = false;
  double length = 0;          // when reached
  double optimistic = NAN;
  double conservative = NAN;
  double cap = 0;
  std::vector<PlanStep> steps;  // sorted by length
  std::string searched = "length";  // or "trials" (plan.along): what length/optimistic/conservative/cap count
  double trial_length = NAN;        // searched trials: the length of each trial
};

// Point estimates meet both targets (no reported edge counts as no false edge).
bool MeetsTargets(const metrics::CellSummary& s, const PlanTargets& targets);

// `log` (may be empty) receives one line per evaluated length. One plan per
// combination and learner (combination-major); `combinations` empty: all.
std::vector<LearnerPlan> PlanLengths(const StudySpec& study, const PlanTargets& targets, int threads,
                                     const std::function<void(const std::string&)>& log,
                                     const std::vector<PlanCombination>& combinations = {});

// Plain text: per combination (a heading line naming it), a line for each
// learner that reached the targets, and one plain sentence for each that did not.
std::string PlanReport(const std::vector<LearnerPlan>& plans, const PlanTargets& targets);

// plan.csv (header and one line per learner; columns in results/README.md),
// which `locind report` reads to draw the targets and planned lengths.
const std::string& PlanHeader();
std::string PlanCsv(const std::vector<LearnerPlan>& plans, const PlanTargets& targets);

}  // namespace locind::app
