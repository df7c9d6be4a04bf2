// Compensators of a linear Hawkes process, for checks such as the
// time-rescaling theorem (Brown, Barbieri, Ventura, Kass & Frank 2002,
// Neural Computation 14(2)): the compensator-transformed event times of each
// process form a unit-rate Poisson process.
#pragma once

#include <vector>

#include "base/status.h"
#include "sim/event_data.h"
#include "sim/hawkes_model.h"

namespace locind::sim {

// For every node b and every event t_i of b in `data`, Lambda_b(t_i) =
// integral over [data.start, t_i] of lambda_b, assuming the process was
// empty before data.start. `data` must hold every node of the model in
// model order (e.g. a draw with no hidden nodes and burn_in = 0).
// Cost O(events^2) in the worst case; meant for tests. Fails unless the link
// is linear and the data match the model.
Result<std::vector<std::vector<double>>> CompensatorAtEvents(const HawkesModel& model,
                                                             const EventData& data);

}  // namespace locind::sim
