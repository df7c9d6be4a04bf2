#include "sim/ou_transition.h"

#include <cmath>

#include <Eigen/Eigenvalues>
#include <unsupported/Eigen/MatrixFunctions>

namespace locind::sim {

Result<OuTransition> ExactTransition(const Eigen::MatrixXd& M, const Eigen::VectorXd& c,
                                     const Eigen::VectorXd& sigma, double step) {
  const int n = static_cast<int>(M.rows());
  if (n == 0 || M.cols() != n || c.size() != n || sigma.size() != n) {
    return Status::Error("drift matrix, offsets and noise scales do not match");
  }
  if (!M.allFinite() || !c.allFinite() || !sigma.allFinite() || !std::isfinite(step) || step <= 0) {
    return Status::Error("the transition needs finite parameters and a step > 0");
  }
  OuTransition out;
  // exp([[M, c], [0, 0]] D) = [[e^{MD}, (int_0^D e^{Ms} ds) c], [0, 1]].
  Eigen::MatrixXd drift = Eigen::MatrixXd::Zero(n + 1, n + 1);
  drift.topLeftCorner(n, n) = M * step;
  drift.topRightCorner(n, 1) = c * step;
  const Eigen::MatrixXd e1 = drift.exp();
  out.F = e1.topLeftCorner(n, n);
  out.offset = e1.topRightCorner(n, 1);
  // exp([[-M, S], [0, M^T]] D) = [[., G], [0, e^{M^T D}]] and the covariance
  // is e^{M^T D}^T G (Van Loan 1978, Theorem 1).
  Eigen::MatrixXd block = Eigen::MatrixXd::Zero(2 * n, 2 * n);
  block.topLeftCorner(n, n) = -M * step;
  block.topRightCorner(n, n) = sigma.array().square().matrix().asDiagonal();
  block.topRightCorner(n, n) *= step;
  block.bottomRightCorner(n, n) = M.transpose() * step;
  const Eigen::MatrixXd e2 = block.exp();
  const Eigen::MatrixXd q = e2.bottomRightCorner(n, n).transpose() * e2.topRightCorner(n, n);
  out.covariance = 0.5 * (q + q.transpose());
  Eigen::SelfAdjointEigenSolver<Eigen::MatrixXd> eigen(out.covariance);
  if (eigen.info() != Eigen::Success) return Status::Error("covariance factorisation failed");
  const Eigen::VectorXd root = eigen.eigenvalues().cwiseMax(0.0).cwiseSqrt();
  out.noise_factor = eigen.eigenvectors() * root.asDiagonal() * eigen.eigenvectors().transpose();
  if (!out.F.allFinite() || !out.noise_factor.allFinite()) {
    return Status::Error("the transition overflowed (step too long for this drift)");
  }
  return out;
}

}  // namespace locind::sim
