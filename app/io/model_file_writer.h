// Writing a model file: the text that app/io/model_file.h reads back to the
// same model (graph, hidden nodes and every parameter).
//
// Numbers are written in the shortest form that reads back to the same
// double (base::FormatNumber), so write-then-read is exact. Only what the
// reader can express is written: exponential kernels (one term) as
// {weight, decay}, other kernels in their own family; diffusion offsets,
// self rates and noise per node, couplings per edge.
#pragma once

#include <string>

#include "sim/diffusion_simulator.h"
#include "sim/hawkes_simulator.h"

namespace locind::app {

// An events model file. `heading` (may be empty) becomes '#' comment lines
// on top. The run options written: burn_in, method, event_cap and
// allow_nonstationary (horizon is given to `locind simulate`).
std::string FormatEventModelFile(const sim::HawkesModel& model, const sim::HawkesRunOptions& run,
                                 const std::string& heading);

// A paths model file (drift family, offsets, self rates, couplings, noise,
// step, interval, burn_in, method).
std::string FormatPathModelFile(const sim::DiffusionModel& model, const sim::PathRunOptions& run,
                                const std::string& heading);

}  // namespace locind::app
