// One Euler-Maruyama step for an SDE with diagonal noise,
//
//   x <- x + f(x) h + g(x) .* dW,   dW ~ N(0, h I),
//
// (Kloeden & Platen 1992, Numerical Solution of SDEs, sec. 9.1; Higham 2001,
// SIAM Review 43(3)). Templated on the drift and noise callables so the
// diffusion simulator and the convergence checks in the tests share it.
#pragma once

#include <Eigen/Dense>

namespace locind::sim {

// `drift(x, out)` writes f(x) into out; `noise(x, out)` writes the diagonal
// of g(x). `scratch_f` and `scratch_g` avoid allocations. REQUIRES: sizes
// agree.
template <typename Drift, typename Noise>
void EulerMaruyamaStep(const Drift& drift, const Noise& noise, double h, const Eigen::VectorXd& dw,
                       Eigen::VectorXd& x, Eigen::VectorXd& scratch_f, Eigen::VectorXd& scratch_g) {
  drift(x, scratch_f);
  noise(x, scratch_g);
  x += h * scratch_f + scratch_g.cwiseProduct(dw);
}

}  // namespace locind::sim
