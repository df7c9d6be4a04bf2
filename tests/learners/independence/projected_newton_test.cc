#include "learners/independence/projected_newton.h"

#include <cmath>
#include <limits>

#include <doctest/doctest.h>

namespace locind::learners {
namespace {

// f(x) = -(x - c)' Q (x - c): the maximiser over x >= 0 is checked against
// the best of all 2^n faces, each solved in closed form (common practice, no
// source: a strictly concave quadratic has one KKT point per face).
ConcaveObjective Quadratic(const Eigen::MatrixXd& q, const Eigen::VectorXd& c) {
  ConcaveObjective f;
  f.value = [q, c](const Eigen::VectorXd& x) { return -(x - c).dot(q * (x - c)); };
  f.derivatives = [q, c](const Eigen::VectorXd& x, Eigen::VectorXd& g, Eigen::MatrixXd& h) {
    g = -2 * q * (x - c);
    h = -2 * q;
  };
  return f;
}

double BestOverFaces(const Eigen::MatrixXd& q, const Eigen::VectorXd& c) {
  const int n = int(c.size());
  double best = -std::numeric_limits<double>::infinity();
  for (int mask = 0; mask < (1 << n); ++mask) {
    std::vector<int> free;
    for (int i = 0; i < n; ++i) {
      if (mask >> i & 1) free.push_back(i);
    }
    Eigen::VectorXd x = Eigen::VectorXd::Zero(n);
    if (!free.empty()) {
      // Stationarity on the face: Q_FF x_F = (Q c)_F.
      Eigen::MatrixXd qff(free.size(), free.size());
      Eigen::VectorXd rhs(free.size());
      const Eigen::VectorXd qc = q * c;
      for (size_t i = 0; i < free.size(); ++i) {
        rhs[i] = qc[free[i]];
        for (size_t j = 0; j < free.size(); ++j) qff(i, j) = q(free[i], free[j]);
      }
      const Eigen::VectorXd xf = qff.llt().solve(rhs);
      for (size_t i = 0; i < free.size(); ++i) x[free[i]] = xf[i];
    }
    if ((x.array() < 0).any()) continue;
    best = std::max(best, -(x - c).dot(q * (x - c)));
  }
  return best;
}

TEST_CASE("projected Newton finds the bound-constrained maximum of quadratics") {
  Eigen::MatrixXd q(4, 4);
  q << 4, 1, 0.5, 0, 1, 3, 0.2, 0.1, 0.5, 0.2, 2, 0.3, 0, 0.1, 0.3, 1;
  const Eigen::VectorXd lower = Eigen::VectorXd::Zero(4);
  for (const Eigen::Vector4d& c : {Eigen::Vector4d(1, -2, 0.5, -0.1), Eigen::Vector4d(-1, -1, -1, -1),
                                  Eigen::Vector4d(0.3, 0.2, 0.1, 2)}) {
    NewtonResult r = MaximizeConcave(Quadratic(q, c), Eigen::VectorXd::Ones(4), lower);
    CHECK(r.converged);
    CHECK(r.value == doctest::Approx(BestOverFaces(q, c)).epsilon(1e-9));
    CHECK((r.x.array() >= 0).all());
  }
}

TEST_CASE("unbounded coordinates give damped Newton") {
  // Poisson log-likelihood in the log rate: n u - T e^u, maximised at
  // u = log(n / T) (closed form).
  ConcaveObjective f;
  f.value = [](const Eigen::VectorXd& x) { return 30 * x[0] - 10 * std::exp(x[0]); };
  f.derivatives = [](const Eigen::VectorXd& x, Eigen::VectorXd& g, Eigen::MatrixXd& h) {
    g.resize(1);
    h.resize(1, 1);
    g[0] = 30 - 10 * std::exp(x[0]);
    h(0, 0) = -10 * std::exp(x[0]);
  };
  Eigen::VectorXd lower(1);
  lower[0] = -std::numeric_limits<double>::infinity();
  NewtonResult r = MaximizeConcave(f, Eigen::VectorXd::Constant(1, 8.0), lower);
  CHECK(r.converged);
  CHECK(r.x[0] == doctest::Approx(std::log(3.0)).epsilon(1e-9));
}

TEST_CASE("points outside the domain are rejected by the line search") {
  // log(x) - x on x > 0 (value -inf elsewhere), maximised at 1; a Newton step
  // from 5 overshoots into x < 0 and must be shortened.
  ConcaveObjective f;
  f.value = [](const Eigen::VectorXd& x) {
    return x[0] > 0 ? std::log(x[0]) - x[0] : -std::numeric_limits<double>::infinity();
  };
  f.derivatives = [](const Eigen::VectorXd& x, Eigen::VectorXd& g, Eigen::MatrixXd& h) {
    g = Eigen::VectorXd::Constant(1, 1 / x[0] - 1);
    h = Eigen::MatrixXd::Constant(1, 1, -1 / (x[0] * x[0]));
  };
  NewtonResult r = MaximizeConcave(f, Eigen::VectorXd::Constant(1, 5.0),
                                   Eigen::VectorXd::Constant(1, -1e300));
  CHECK(r.converged);
  CHECK(r.x[0] == doctest::Approx(1.0).epsilon(1e-9));
}

}  // namespace
}  // namespace locind::learners
