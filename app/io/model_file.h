// The model file: a truth graph plus the parameters of one process model, in
// YAML (documented with examples in configs/models/README.md).
//
//   nodes: [x1, x2, h]
//   edges: [x1 -> x2, h -> x1, h -> x2, x1 -> x1]
//   hidden: [h]
//   events:            # a Hawkes model ...
//     link: linear
//     baseline: 0.2
//     kernel: {family: exponential, weight: 0.3, decay: 2}
//   paths:             # ... or a diffusion model (exactly one of the two)
//     drift: linear
//     self_rate: 1
//     coupling: 0.5
//     noise: 1
//
// Every problem is reported as FILE:LINE:COLUMN: FIELD: message.
#pragma once

#include <string>
#include <variant>

#include "app/io/error.h"
#include "sim/diffusion_simulator.h"
#include "sim/hawkes_simulator.h"

namespace locind::app {

struct EventModelSpec {
  sim::HawkesModel model;
  sim::HawkesRunOptions run;  // horizon left at its default; the caller sets it
};

struct PathModelSpec {
  sim::DiffusionModel model;
  sim::PathRunOptions run;  // horizon left at its default; the caller sets it
};

using ModelSpec = std::variant<EventModelSpec, PathModelSpec>;
using ModelOrError = std::variant<ModelSpec, Error>;

// Reads and validates a model file (graph, parameters, sim::Validate).
ModelOrError ReadModelFile(const std::string& path);

// Parses model text; `file` names the source in errors.
ModelOrError ParseModelText(const std::string& text, const std::string& file);

}  // namespace locind::app
