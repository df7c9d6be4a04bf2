// The exact Gaussian transition of a linear (Ornstein-Uhlenbeck) diffusion
// dX = (c + M X) dt + diag(sigma) dW over a time step D:
//
//   X(t + D) | X(t) = x  ~  N(F x + offset, covariance)
//   F = e^{M D},  offset = (integral_0^D e^{M s} ds) c,
//   covariance = integral_0^D e^{M s} diag(sigma^2) e^{M^T s} ds,
//
// all from block matrix exponentials (Van Loan 1978, IEEE Trans. Autom.
// Control 23(3)). No stability is needed.
#pragma once

#include <Eigen/Dense>

#include "base/status.h"

namespace locind::sim {

struct OuTransition {
  Eigen::MatrixXd F;
  Eigen::VectorXd offset;
  Eigen::MatrixXd covariance;
  Eigen::MatrixXd noise_factor;  // L with L L^T = covariance (symmetric square root)
};

// Fails on mismatched sizes, non-finite entries or step <= 0.
Result<OuTransition> ExactTransition(const Eigen::MatrixXd& M, const Eigen::VectorXd& c,
                                     const Eigen::VectorXd& sigma, double step);

}  // namespace locind::sim
