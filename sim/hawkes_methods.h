// Internal to sim/: the two exact Hawkes simulation methods. Each returns the
// event times of every node (hidden ones included) on [-burn_in, horizon),
// sorted per node, or an error when the event cap is reached.
// REQUIRES: Validate(model).ok() and valid options (checked by SimulateHawkes).
#pragma once

#include <vector>

#include "base/random_stream.h"
#include "base/status.h"
#include "sim/hawkes_model.h"
#include "sim/hawkes_simulator.h"

namespace locind::sim {

using NodeTimes = std::vector<std::vector<double>>;

// Ogata thinning with the exponential intensity recursion.
// REQUIRES: every kernel of an exponential family.
Result<NodeTimes> SimulateByThinning(const HawkesModel& model, const HawkesRunOptions& options,
                                     base::RandomStream& random);

// Immigrant-offspring construction. REQUIRES: linear link.
Result<NodeTimes> SimulateByClusters(const HawkesModel& model, const HawkesRunOptions& options,
                                     base::RandomStream& random);

// The message for a reached event cap.
Status EventCapReached(const HawkesRunOptions& options, double time);

}  // namespace locind::sim
