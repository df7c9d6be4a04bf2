// MaximizeConcave: projected Newton ascent for a smooth concave function with
// simple lower bounds, the fitting engine of the likelihood tests.
//
// Method: the two-metric projected Newton method of Bertsekas (1982), SIAM J.
// Control Optim. 20(2), 221-246, Sec. 2-3. At each step the coordinates that
// sit at (within eps of) their bound with a gradient pushing outward form the
// active set; they take a diagonally scaled gradient step (and are clamped to
// the bound by the projection). The free coordinates take a Newton step from
// the negative Hessian restricted to them (LDLT; a growing ridge when it is
// not positive definite). The step length is found by Armijo backtracking on
// the projected arc, rejecting points where the function is -inf (for example
// a non-positive intensity). Coordinates with lower bound -infinity are free,
// so the same routine does unconstrained damped Newton.
//
// Stops (converged) after the step at which the Newton decrement g_F' d_F on
// the free set is below `tolerance` (in objective units) and every active
// coordinate sits at its bound, or when no step along the arc increases f and
// the decrement is below 1000 * tolerance; otherwise fails (converged =
// false) after `max_iterations`.
#pragma once

#include <functional>

#include <Eigen/Dense>

namespace locind::learners {

struct ConcaveObjective {
  // f(x), or -infinity outside the domain.
  std::function<double(const Eigen::VectorXd& x)> value;
  // Gradient and Hessian at x (x inside the domain).
  std::function<void(const Eigen::VectorXd& x, Eigen::VectorXd& gradient,
                     Eigen::MatrixXd& hessian)>
      derivatives;
};

struct NewtonOptions {
  int max_iterations = 200;
  double tolerance = 1e-9;
};

struct NewtonResult {
  Eigen::VectorXd x;
  double value = 0;
  int iterations = 0;
  bool converged = false;
};

// REQUIRES: lower.size() == start.size(); f(projection of start) finite.
NewtonResult MaximizeConcave(const ConcaveObjective& f, const Eigen::VectorXd& start,
                             const Eigen::VectorXd& lower, const NewtonOptions& options = {});

}  // namespace locind::learners
