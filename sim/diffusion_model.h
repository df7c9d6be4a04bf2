// DiffusionModel: a multivariate diffusion on the nodes of a truth graph.
//
//   dX_b = f_b(X) dt + sigma_b dW_b,   independent Brownian motions W_b.
//
// Drift families:
//   linear (Ornstein-Uhlenbeck)  f(x) = c + M x
//   tanh (saturating coupling)   f_b(x) = c_b + M_bb x_b + sum_{a != b} M_ba tanh(x_a)
//
// M(b, a) may be non-zero only when truth.graph has the edge a -> b (the loop
// b -> b for the self term M_bb), so a -> b is in the local independence graph
// exactly when M(b, a) != 0. Hidden nodes are simulated and dropped.
#pragma once

#include <Eigen/Dense>

#include "base/status.h"
#include "graph/truth_graph.h"

namespace locind::sim {

enum class DriftFamily { kLinear, kTanh };

struct DiffusionModel {
  graph::TruthGraph truth;
  DriftFamily drift = DriftFamily::kLinear;
  Eigen::VectorXd c;      // offsets, one per node
  Eigen::MatrixXd M;      // nodes x nodes; M(b, a) != 0 only for edges a -> b
  Eigen::VectorXd sigma;  // noise scales, one per node, >= 0

  int nodes() const { return truth.graph.size(); }
  // f(x). REQUIRES: x.size() == nodes().
  void Drift(const Eigen::VectorXd& x, Eigen::VectorXd& out) const;
};

// c = 0, sigma_b = sigma, M_bb = -self_rate on loops b -> b, M_ba = coupling
// on edges a -> b (a != b). A node without a loop gets M_bb = 0: its drift
// does not depend on itself, which usually makes the model unstable (and
// CheckStable says so).
DiffusionModel LinearDiffusion(const graph::TruthGraph& truth, double self_rate, double coupling,
                               double sigma);
// The same parameters with the tanh drift family.
DiffusionModel TanhDiffusion(const graph::TruthGraph& truth, double self_rate, double coupling,
                             double sigma);

// Checks sizes, finiteness, sigma >= 0 and that M is zero off the edges of
// truth.graph (the error names the offending pair).
Status Validate(const DiffusionModel& model);

// Linear drift: ok iff every eigenvalue of M has a negative real part.
// Tanh drift: ok iff M_bb < 0 for every b (the coupling terms are bounded, so
// each coordinate is mean-reverting). Messages name the largest real part or
// the node without mean reversion. REQUIRES: Validate(model).ok().
Status CheckStable(const DiffusionModel& model);

// Stationary mean -M^{-1} c of a stable linear model.
Result<Eigen::VectorXd> StationaryMean(const DiffusionModel& model);

// Stationary covariance S of a stable linear model: the solution of the
// Lyapunov equation M S + S M^T + diag(sigma^2) = 0 (Gardiner, Handbook of
// Stochastic Methods, sec. 4.4.6), solved through the Kronecker form; refused
// beyond kMaxLyapunovNodes nodes.
inline constexpr int kMaxLyapunovNodes = 40;
Result<Eigen::MatrixXd> StationaryCovariance(const Eigen::MatrixXd& M, const Eigen::VectorXd& sigma);

const char* DriftFamilyName(DriftFamily family);

}  // namespace locind::sim
