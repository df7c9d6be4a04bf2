// SimulateDiffusion: one draw of a diffusion observed on a regular grid.
//
// The state starts at `initial` (zero when empty) at time -burn_in, evolves
// through the burn-in, and is then recorded at times 0, interval, 2 interval,
// ..., up to horizon (inclusive when it falls on the grid). The result holds
// the observed coordinates only (names in truth.Observed() order).
//
// Methods:
//  - euler: Euler-Maruyama with internal step h; interval must be a multiple
//    of h (Kloeden & Platen 1992, Numerical Solution of SDEs, sec. 9.1).
//  - exact: the Gaussian transition of the linear drift over one interval,
//    X(t + D) = e^{M D} X(t) + (integral_0^D e^{M s} ds) c + N(0, Q(D)),
//    Q(D) = integral_0^D e^{M s} diag(sigma^2) e^{M^T s} ds, computed with
//    block matrix exponentials (Van Loan 1978, IEEE Trans. Autom. Control
//    23(3)). Linear drift only; the step h is not used.
#pragma once

#include <Eigen/Dense>

#include "base/random_stream.h"
#include "base/status.h"
#include "sim/diffusion_model.h"
#include "sim/path_data.h"

namespace locind::sim {

enum class PathMethod { kEuler, kExact };

struct PathRunOptions {
  double horizon = 100;   // recorded window [0, horizon], > 0
  double step = 0.01;     // h, internal Euler-Maruyama step, > 0
  double interval = 0.1;  // observation interval, a multiple of step (relative tolerance 1e-9)
  double burn_in = 0;     // >= 0; rounded up to a multiple of interval
  PathMethod method = PathMethod::kEuler;
  Eigen::VectorXd initial;  // state at -burn_in over all nodes; empty means zero
  // Refuse unstable models (CheckStable). When false, they are simulated
  // anyway and a non-finite state is reported as an error.
  bool require_stable = true;
};

// Draws the paths. Fails (without partial data) on an invalid model or
// options, an unstable model, the exact method with a non-linear drift, or a
// state that leaves the finite numbers.
Result<PathData> SimulateDiffusion(const DiffusionModel& model, const PathRunOptions& options,
                                   base::RandomStream& random);

// Draws `trials` independent trials one after the other from `random`, as one
// data set with PathData::trial_starts (one trial: exactly SimulateDiffusion).
// REQUIRES: trials >= 1.
Result<PathData> SimulateDiffusionTrials(const DiffusionModel& model, const PathRunOptions& options,
                                         int trials, base::RandomStream& random);

const char* PathMethodName(PathMethod method);

}  // namespace locind::sim
