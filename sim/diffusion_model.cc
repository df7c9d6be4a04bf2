#include "sim/diffusion_model.h"

#include <cmath>
#include <sstream>

#include "sim/stability.h"

namespace locind::sim {
namespace {

DiffusionModel BuildDiffusion(const graph::TruthGraph& truth, DriftFamily family, double self_rate,
                              double coupling, double sigma) {
  const int n = truth.graph.size();
  DiffusionModel model;
  model.truth = truth;
  model.drift = family;
  model.c = Eigen::VectorXd::Zero(n);
  model.sigma = Eigen::VectorXd::Constant(n, sigma);
  model.M = Eigen::MatrixXd::Zero(n, n);
  for (int b = 0; b < n; ++b) {
    for (int a : truth.graph.Parents(b)) model.M(b, a) = (a == b) ? -self_rate : coupling;
  }
  return model;
}

}  // namespace

void DiffusionModel::Drift(const Eigen::VectorXd& x, Eigen::VectorXd& out) const {
  if (drift == DriftFamily::kLinear) {
    out.noalias() = c + M * x;
    return;
  }
  const Eigen::VectorXd saturated = x.array().tanh().matrix();
  out.noalias() = c + M * saturated;
  // The self term stays linear: replace M_bb tanh(x_b) by M_bb x_b.
  out.array() += M.diagonal().array() * (x - saturated).array();
}

DiffusionModel LinearDiffusion(const graph::TruthGraph& truth, double self_rate, double coupling,
                               double sigma) {
  return BuildDiffusion(truth, DriftFamily::kLinear, self_rate, coupling, sigma);
}

DiffusionModel TanhDiffusion(const graph::TruthGraph& truth, double self_rate, double coupling,
                             double sigma) {
  return BuildDiffusion(truth, DriftFamily::kTanh, self_rate, coupling, sigma);
}

Status Validate(const DiffusionModel& model) {
  const graph::Dmg& g = model.truth.graph;
  const int n = g.size();
  if (n == 0) return Status::Error("the truth graph has no nodes");
  if (model.c.size() != n || model.sigma.size() != n || model.M.rows() != n || model.M.cols() != n) {
    return Status::Error("offsets, noise scales and drift matrix must match the " +
                         std::to_string(n) + " nodes of the truth graph");
  }
  if (!model.c.allFinite() || !model.M.allFinite() || !model.sigma.allFinite()) {
    return Status::Error("the model has a non-finite parameter");
  }
  for (int b = 0; b < n; ++b) {
    if (model.sigma(b) < 0) return Status::Error("noise scale of " + g.name(b) + " is negative");
    for (int a = 0; a < n; ++a) {
      if (model.M(b, a) != 0 && !g.HasDirected(a, b)) {
        return Status::Error("drift coefficient of " + g.name(a) + " in " + g.name(b) +
                             " is non-zero but the truth graph has no edge " + g.name(a) +
                             " -> " + g.name(b));
      }
    }
  }
  return Status::Ok();
}

Status CheckStable(const DiffusionModel& model) {
  const graph::Dmg& g = model.truth.graph;
  if (model.drift == DriftFamily::kTanh) {
    for (int b = 0; b < model.nodes(); ++b) {
      if (!(model.M(b, b) < 0)) {
        return Status::Error("unstable: node " + g.name(b) + " has no mean reversion (its self "
                             "coefficient must be < 0, which needs the loop " + g.name(b) +
                             " -> " + g.name(b) + ")");
      }
    }
    return Status::Ok();
  }
  Result<double> largest = LargestRealPart(model.M);
  if (!largest.ok()) return largest.status();
  if (*largest < 0) return Status::Ok();
  std::ostringstream msg;
  msg << "unstable: the drift matrix has an eigenvalue with real part " << *largest
      << " (all must be negative); raise the self rates or lower the couplings";
  for (int b = 0; b < model.nodes(); ++b) {
    if (!g.HasDirected(b, b)) {
      msg << "; node " << g.name(b) << " has no loop " << g.name(b) << " -> " << g.name(b)
          << ", so it does not revert to a mean";
      break;
    }
  }
  return Status::Error(msg.str());
}

Result<Eigen::VectorXd> StationaryMean(const DiffusionModel& model) {
  if (model.drift != DriftFamily::kLinear) {
    return Status::Error("the closed-form stationary mean needs the linear drift");
  }
  if (Status s = CheckStable(model); !s.ok()) return s;
  return Eigen::VectorXd(-model.M.partialPivLu().solve(model.c));
}

Result<Eigen::MatrixXd> StationaryCovariance(const Eigen::MatrixXd& M, const Eigen::VectorXd& sigma) {
  const int n = static_cast<int>(M.rows());
  if (n == 0 || M.cols() != n || sigma.size() != n) {
    return Status::Error("drift matrix and noise scales do not match");
  }
  if (n > kMaxLyapunovNodes) {
    return Status::Error("the Lyapunov solver is limited to " + std::to_string(kMaxLyapunovNodes) +
                         " nodes");
  }
  Result<double> largest = LargestRealPart(M);
  if (!largest.ok()) return largest.status();
  if (*largest >= 0) return Status::Error("no stationary covariance: the drift matrix is unstable");
  // Column-major vec: vec(M S) = (I (x) M) vec S, vec(S M^T) = (M (x) I) vec S.
  const int n2 = n * n;
  Eigen::MatrixXd a = Eigen::MatrixXd::Zero(n2, n2);
  for (int i = 0; i < n; ++i) {
    for (int j = 0; j < n; ++j) {
      for (int k = 0; k < n; ++k) {
        a(j * n + i, j * n + k) += M(i, k);  // (M S)(i, j) = sum_k M(i, k) S(k, j)
        a(j * n + i, k * n + i) += M(j, k);  // (S M^T)(i, j) = sum_k S(i, k) M(j, k)
      }
    }
  }
  Eigen::VectorXd rhs = Eigen::VectorXd::Zero(n2);
  for (int i = 0; i < n; ++i) rhs(i * n + i) = -sigma(i) * sigma(i);
  const Eigen::VectorXd vec = a.partialPivLu().solve(rhs);
  Eigen::MatrixXd s = Eigen::Map<const Eigen::MatrixXd>(vec.data(), n, n);
  return Eigen::MatrixXd(0.5 * (s + s.transpose()));
}

const char* DriftFamilyName(DriftFamily family) {
  return family == DriftFamily::kLinear ? "linear" : "tanh";
}

}  // namespace locind::sim
