// Prints locind's OU quantities for the reference check ou_lyapunov_scipy.py.
//
// stdin: cases "n step", then M (n x n, row-major), then sigma (n values).
// stdout per case: the stationary covariance S (row-major), then e^{M step}
// and the exact transition covariance Q(step), each on one line.
#include <cstdio>
#include <iostream>

#include "sim/diffusion_model.h"
#include "sim/ou_transition.h"

namespace {

void PrintMatrix(const Eigen::MatrixXd& m) {
  for (Eigen::Index i = 0; i < m.rows(); ++i) {
    for (Eigen::Index j = 0; j < m.cols(); ++j) std::printf("%.17g ", m(i, j));
  }
  std::printf("\n");
}

}  // namespace

int main() {
  int n = 0;
  double step = 0;
  while (std::cin >> n >> step) {
    Eigen::MatrixXd M(n, n);
    Eigen::VectorXd sigma(n);
    for (int i = 0; i < n; ++i) {
      for (int j = 0; j < n; ++j) std::cin >> M(i, j);
    }
    for (int i = 0; i < n; ++i) std::cin >> sigma(i);
    auto s = locind::sim::StationaryCovariance(M, sigma);
    auto t = locind::sim::ExactTransition(M, Eigen::VectorXd::Zero(n), sigma, step);
    if (!s.ok() || !t.ok()) {
      std::fprintf(stderr, "probe: %s\n", (!s.ok() ? s.status() : t.status()).message().c_str());
      return 1;
    }
    PrintMatrix(*s);
    PrintMatrix(t->F);
    PrintMatrix(t->covariance);
  }
  return 0;
}
