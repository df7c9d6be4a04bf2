#include "learners/independence/projected_newton.h"

#include <algorithm>
#include <cmath>
#include <limits>
#include <vector>

namespace locind::learners {
namespace {

Eigen::VectorXd Project(const Eigen::VectorXd& x, const Eigen::VectorXd& lower) {
  return x.cwiseMax(lower);
}

// Solves (-H_FF) d = g_F for the free coordinates, adding a ridge until the
// matrix factors as positive definite.
Eigen::VectorXd NewtonStepOnFree(const Eigen::MatrixXd& hessian, const Eigen::VectorXd& gradient,
                                 const std::vector<int>& free) {
  const Eigen::Index m = static_cast<Eigen::Index>(free.size());
  Eigen::MatrixXd a(m, m);
  Eigen::VectorXd g(m);
  for (Eigen::Index i = 0; i < m; ++i) {
    g[i] = gradient[free[i]];
    for (Eigen::Index j = 0; j < m; ++j) a(i, j) = -hessian(free[i], free[j]);
  }
  const double scale = std::max(a.diagonal().cwiseAbs().maxCoeff(), 1e-300);
  // Overflowed curvature would make the ridge loop below endless; the caller
  // stops on non-finite derivatives, this only guards the loop.
  if (!std::isfinite(scale)) return Eigen::VectorXd::Zero(m);
  for (double ridge = 0;; ridge = ridge == 0 ? 1e-12 * scale : ridge * 100) {
    Eigen::MatrixXd shifted = a;
    shifted.diagonal().array() += ridge;
    Eigen::LDLT<Eigen::MatrixXd> ldlt(shifted);
    if (ldlt.info() == Eigen::Success && ldlt.isPositive() &&
        (ldlt.vectorD().array() > 1e-14 * scale).all()) {
      Eigen::VectorXd d = ldlt.solve(g);
      if (d.allFinite()) return d;
    }
    if (ridge > 1e6 * scale) return g / scale;  // plain scaled gradient as a last resort
  }
}

}  // namespace

NewtonResult MaximizeConcave(const ConcaveObjective& f, const Eigen::VectorXd& start,
                             const Eigen::VectorXd& lower, const NewtonOptions& options) {
  const Eigen::Index n = start.size();
  NewtonResult result;
  result.x = Project(start, lower);
  result.value = f.value(result.x);
  Eigen::VectorXd g(n);
  Eigen::MatrixXd h(n, n);
  for (result.iterations = 0; result.iterations < options.max_iterations; ++result.iterations) {
    f.derivatives(result.x, g, h);
    // Overflowed derivatives (e.g. an intensity near zero): report a failed
    // fit, which the tests turn into "not estimable", rather than iterate on.
    if (!g.allFinite() || !h.allFinite()) {
      result.converged = false;
      return result;
    }
    const Eigen::VectorXd projected_gradient = Project(result.x + g, lower) - result.x;
    // Active set with the eps of Bertsekas (1982), eq. (3.6).
    const double eps = std::min(1e-6, projected_gradient.norm());
    std::vector<int> free;
    Eigen::VectorXd d = Eigen::VectorXd::Zero(n);
    for (Eigen::Index i = 0; i < n; ++i) {
      const bool at_bound = std::isfinite(lower[i]) && result.x[i] <= lower[i] + eps;
      if (at_bound && g[i] <= 0) {
        d[i] = g[i] / std::max(-h(i, i), 1e-300);
      } else {
        free.push_back(static_cast<int>(i));
      }
    }
    double decrement = 0;
    double active_gap = 0;  // how far active coordinates still are from their bound
    for (Eigen::Index i = 0; i < n; ++i) {
      if (d[i] != 0) active_gap = std::max(active_gap, result.x[i] - lower[i]);
    }
    if (!free.empty()) {
      const Eigen::VectorXd step = NewtonStepOnFree(h, g, free);
      for (size_t i = 0; i < free.size(); ++i) {
        d[free[i]] = step[static_cast<Eigen::Index>(i)];
        decrement += g[free[i]] * step[static_cast<Eigen::Index>(i)];
      }
    }
    // Converged once the predicted gain is below tolerance; the last step is
    // still taken (Newton converges quadratically, so it costs nothing and
    // sharpens the estimate).
    const bool small = decrement <= options.tolerance && active_gap == 0;
    // Armijo backtracking along the projected arc.
    bool moved = false;
    for (double alpha = 1; alpha > 1e-20; alpha *= 0.5) {
      const Eigen::VectorXd next = Project(result.x + alpha * d, lower);
      const double value = f.value(next);
      if (std::isfinite(value) && value >= result.value + 1e-4 * g.dot(next - result.x)) {
        moved = true;
        result.x = next;
        result.value = value;
        break;
      }
    }
    if (small || !moved) {
      // Without an acceptable step the point is stationary up to rounding.
      result.converged = small || decrement <= 1e3 * options.tolerance;
      return result;
    }
  }
  return result;
}

}  // namespace locind::learners
