// SimulateHawkes: one exact draw of a multivariate Hawkes process.
//
// The process starts empty at time -burn_in; events in [-burn_in, 0) shape
// the intensities but are not recorded. The result holds the observed
// processes only (names in truth.Observed() order) with times on the
// recorded window [0, horizon).
//
// Methods (both exact, both checked against each other in the tests):
//  - thinning: Ogata (1981), IEEE Trans. Inf. Theory 27(1), with the
//    exponential intensity recursion; exponential families only. For the
//    linear link each event costs O(out-degree * terms + log n); the
//    nonlinear links cost O(nodes * terms) per proposal.
//  - cluster: the immigrant-offspring construction (Hawkes & Oakes 1974,
//    J. Appl. Probab. 11(3)); any kernel family, linear link only.
//  - auto: thinning when every kernel is of an exponential family, else
//    cluster.
#pragma once

#include <cstdint>

#include "base/random_stream.h"
#include "base/status.h"
#include "sim/event_data.h"
#include "sim/hawkes_model.h"

namespace locind::sim {

enum class HawkesMethod { kAuto, kThinning, kCluster };

// Work counts of one draw (for benchmarks and diagnostics).
struct HawkesRunStats {
  int64_t events = 0;     // simulated, burn-in and hidden nodes included
  int64_t proposals = 0;  // thinning: candidate points drawn (accepted or not)
};

struct HawkesRunOptions {
  double horizon = 100;   // length of the recorded window, > 0
  double burn_in = 0;     // simulated before the window, >= 0
  // Hard cap on the number of events simulated (burn-in included). Reaching
  // it is an error that says so.
  int64_t event_cap = 50'000'000;
  // When false, models with spectral radius >= 1 are refused before any
  // work. When true they are simulated until the horizon or the event cap.
  bool allow_nonstationary = false;
  HawkesMethod method = HawkesMethod::kAuto;
  HawkesRunStats* stats = nullptr;  // when set, receives the work counts
};

// Draws the process. Fails (without partial data) on an invalid model or
// options, a refused non-stationary model, a method that cannot handle the
// model, or when the event cap is reached.
Result<EventData> SimulateHawkes(const HawkesModel& model, const HawkesRunOptions& options,
                                 base::RandomStream& random);

// Draws `trials` independent trials (each a fresh draw with its own burn-in,
// on [0, horizon)) one after the other from `random`, as one data set with
// EventData::trials (one trial: exactly SimulateHawkes). The event cap
// applies per trial. REQUIRES: trials >= 1.
Result<EventData> SimulateHawkesTrials(const HawkesModel& model, const HawkesRunOptions& options,
                                       int trials, base::RandomStream& random);

const char* HawkesMethodName(HawkesMethod method);

}  // namespace locind::sim
