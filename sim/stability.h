// Stability helpers shared by the Hawkes and diffusion models.
//
// A multivariate linear Hawkes process has a stationary version iff the
// spectral radius of its integrated kernel matrix K is below 1 (Hawkes 1971,
// Biometrika 58(1)); a linear diffusion dX = (c + M X) dt + ... is stable iff
// every eigenvalue of M has a negative real part. Both answers come with
// messages a user can act on.
#pragma once

#include <Eigen/Dense>

#include "base/status.h"

namespace locind::sim {

// max |eigenvalue| of a square matrix. Fails on an empty, non-square or
// non-finite matrix.
Result<double> SpectralRadius(const Eigen::MatrixXd& matrix);

// max Re(eigenvalue) of a square matrix. Same failures as SpectralRadius.
Result<double> LargestRealPart(const Eigen::MatrixXd& matrix);

}  // namespace locind::sim
