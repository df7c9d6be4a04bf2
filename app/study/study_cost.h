// The expected work and memory of a study, worked out before any simulation
// (for `locind run --check`, and for the memory limit `locind run` enforces).
//
// Counts are exact: truths, cells, replicates, simulations (one per unit)
// and learner runs. Data sizes are expectations: an event replicate holds
// about (burn-in + length) x sum of the stationary mean intensities
// (I - K)^{-1} mu events (Hawkes 1971, Biometrika 58(1)); a path replicate
// holds length / interval + 1 samples of every observed process. Bytes per
// replicate are a rough model of what the replicate keeps (documented at
// BytesPerEvent and BytesPerSample), not a measurement.
#pragma once

#include <cstdint>
#include <string>
#include <vector>

#include "app/study/study_truths.h"
#include "app/study/study_grid.h"
#include "app/study/study_spec.h"

namespace locind::app {

struct CellCost {
  const Cell* cell = nullptr;
  double points = 0;  // expected events, or path samples x observed processes (largest over truths)
  double bytes = 0;   // estimated peak memory of one replicate
  std::string note;   // set when a truth of the cell cannot be simulated (not stationary, unstable)
};

struct StudyCost {
  int truths = 0;  // distinct truths drawn (classes computed)
  int cells = 0;
  int replicates = 0;  // per cell
  int64_t simulations = 0;
  int64_t learner_runs = 0;
  std::vector<CellCost> per_cell;
  double peak_bytes = 0;  // largest over cells
};

// Memory kept per simulated event (with `observed` observed processes):
// the time in the simulator and in the data (2 x 8 bytes) and the history
// features of every (target, source) pair at K = 3 rates (8 x 3 x observed),
// four times that when a signed test adds its quadrature grid.
double BytesPerEvent(const StudySpec& study, int observed);
// Memory kept per observed value of a path: the data, the increments and the
// filtered design columns of a drift test (4 x 8 bytes).
double BytesPerSample();

// Observed values of one path replicate of `cell`: (length / interval + 1)
// grid times x `observed` processes.
double PathPoints(const StudySpec& study, const Cell& cell, int observed);

// The events one replicate may simulate: process.events.event_cap, or fewer
// when memory_mb allows fewer (memory_mb MiB / BytesPerEvent).
int64_t EventCap(const StudySpec& study, int observed);

// REQUIRES: `truths` were built for `cells` of `study`.
StudyCost EstimateCost(const StudySpec& study, const std::vector<Cell>& cells,
                       const StudyTruths& truths);

// The cost as text for the terminal; `threads` scales the memory of the run.
std::string CostText(const StudySpec& study, const StudyCost& cost, int threads);

// The first cell whose replicate would need more than study.memory_mb, as a
// one-line message naming the key to change; empty when every cell fits.
std::string MemoryProblem(const StudySpec& study, const StudyCost& cost);

}  // namespace locind::app
