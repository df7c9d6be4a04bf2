#include "sim/stability.h"

#include <string>

#include <Eigen/Eigenvalues>

namespace locind::sim {
namespace {

Status CheckSquareFinite(const Eigen::MatrixXd& matrix) {
  if (matrix.rows() == 0 || matrix.rows() != matrix.cols()) {
    return Status::Error("expected a non-empty square matrix, got " +
                         std::to_string(matrix.rows()) + " x " + std::to_string(matrix.cols()));
  }
  if (!matrix.allFinite()) return Status::Error("the matrix has a non-finite entry");
  return Status::Ok();
}

}  // namespace

Result<double> SpectralRadius(const Eigen::MatrixXd& matrix) {
  if (Status s = CheckSquareFinite(matrix); !s.ok()) return s;
  Eigen::EigenSolver<Eigen::MatrixXd> solver(matrix, /*computeEigenvectors=*/false);
  if (solver.info() != Eigen::Success) return Status::Error("eigenvalue computation failed");
  return solver.eigenvalues().cwiseAbs().maxCoeff();
}

Result<double> LargestRealPart(const Eigen::MatrixXd& matrix) {
  if (Status s = CheckSquareFinite(matrix); !s.ok()) return s;
  Eigen::EigenSolver<Eigen::MatrixXd> solver(matrix, /*computeEigenvectors=*/false);
  if (solver.info() != Eigen::Success) return Status::Error("eigenvalue computation failed");
  return solver.eigenvalues().real().maxCoeff();
}

}  // namespace locind::sim
