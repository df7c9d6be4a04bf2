#include "sim/hawkes_model.h"

#include <cmath>
#include <sstream>

#include <boost/math/special_functions/gamma.hpp>

#include "sim/stability.h"

namespace locind::sim {
namespace {

bool Finite(double x) { return std::isfinite(x); }

std::string EdgeName(const graph::Dmg& g, int from, int to) {
  return g.name(from) + " -> " + g.name(to);
}

Status ValidateKernel(const Kernel& k, Link link, const std::string& where) {
  if (k.family == KernelFamily::kDelayedGamma) {
    if (link != Link::kLinear) {
      return Status::Error(where + ": the delayed gamma kernel needs the linear link (the "
                                   "nonlinear links are simulated by thinning, exponential "
                                   "families only)");
    }
    if (!Finite(k.weight) || k.weight < 0) {
      return Status::Error(where + ": weight must be finite and >= 0");
    }
    if (!Finite(k.delay) || k.delay < 0) return Status::Error(where + ": delay must be >= 0");
    if (!Finite(k.shape) || k.shape <= 0) return Status::Error(where + ": shape must be > 0");
    if (!Finite(k.rate) || k.rate <= 0) return Status::Error(where + ": rate must be > 0");
    return Status::Ok();
  }
  if (k.terms.empty()) return Status::Error(where + ": kernel without terms");
  if (k.family == KernelFamily::kExponential && k.terms.size() != 1) {
    return Status::Error(where + ": an exponential kernel has exactly one term");
  }
  for (const ExpTerm& t : k.terms) {
    if (!Finite(t.weight)) return Status::Error(where + ": weight must be finite");
    if (link == Link::kLinear && t.weight < 0) {
      return Status::Error(where + ": negative weight " + std::to_string(t.weight) +
                           " needs a softplus or rectified link (inhibition)");
    }
    if (!Finite(t.decay) || t.decay <= 0) return Status::Error(where + ": decay must be > 0");
  }
  return Status::Ok();
}

}  // namespace

Kernel Kernel::Exponential(double weight, double decay) {
  Kernel k;
  k.family = KernelFamily::kExponential;
  k.terms = {ExpTerm{weight, decay}};
  return k;
}

Kernel Kernel::SumOfExponentials(std::vector<ExpTerm> terms) {
  Kernel k;
  k.family = KernelFamily::kSumOfExponentials;
  k.terms = std::move(terms);
  return k;
}

Kernel Kernel::DelayedGamma(double weight, double delay, double shape, double rate) {
  Kernel k;
  k.family = KernelFamily::kDelayedGamma;
  k.weight = weight;
  k.delay = delay;
  k.shape = shape;
  k.rate = rate;
  return k;
}

double Kernel::Integral() const {
  if (family == KernelFamily::kDelayedGamma) return weight;
  double sum = 0;
  for (const ExpTerm& t : terms) sum += t.weight;
  return sum;
}

double Kernel::AbsoluteIntegral() const {
  if (family == KernelFamily::kDelayedGamma) return std::abs(weight);
  // Sum of |w_j| bounds the integral of |g| (triangle inequality); it is
  // exact when all terms share a sign.
  double sum = 0;
  for (const ExpTerm& t : terms) sum += std::abs(t.weight);
  return sum;
}

double Kernel::Value(double t) const {
  if (t <= 0) return 0;
  if (family == KernelFamily::kDelayedGamma) {
    const double u = t - delay;
    if (u <= 0) return 0;
    // Gamma(shape, rate) density at u = rate * gamma_p_derivative(shape, rate u).
    return weight * rate * boost::math::gamma_p_derivative(shape, rate * u);
  }
  double sum = 0;
  for (const ExpTerm& e : terms) sum += e.weight * e.decay * std::exp(-e.decay * t);
  return sum;
}

double Kernel::Cumulative(double t) const {
  if (t <= 0) return 0;
  if (family == KernelFamily::kDelayedGamma) {
    const double u = t - delay;
    return u <= 0 ? 0 : weight * boost::math::gamma_p(shape, rate * u);
  }
  double sum = 0;
  for (const ExpTerm& e : terms) sum += e.weight * -std::expm1(-e.decay * t);
  return sum;
}

Eigen::MatrixXd HawkesModel::KernelIntegrals(bool absolute) const {
  Eigen::MatrixXd k = Eigen::MatrixXd::Zero(nodes(), nodes());
  for (const EdgeKernel& e : kernels) {
    k(e.to, e.from) += absolute ? e.kernel.AbsoluteIntegral() : e.kernel.Integral();
  }
  return k;
}

HawkesModel ExponentialHawkes(const graph::TruthGraph& truth, double baseline, double weight,
                              double decay, double loop_weight) {
  HawkesModel model;
  model.truth = truth;
  const int n = truth.graph.size();
  model.baseline.assign(n, baseline);
  for (int to = 0; to < n; ++to) {
    for (int from : truth.graph.Parents(to)) {
      const double w = (from == to && loop_weight >= 0) ? loop_weight : weight;
      model.kernels.push_back(EdgeKernel{from, to, Kernel::Exponential(w, decay)});
    }
  }
  return model;
}

Status Validate(const HawkesModel& model) {
  const graph::Dmg& g = model.truth.graph;
  const int n = g.size();
  if (n == 0) return Status::Error("the truth graph has no nodes");
  if (static_cast<int>(model.baseline.size()) != n) {
    return Status::Error("expected " + std::to_string(n) + " baseline rates, got " +
                         std::to_string(model.baseline.size()));
  }
  for (int v = 0; v < n; ++v) {
    const double mu = model.baseline[v];
    if (!Finite(mu) || (model.link == Link::kLinear && mu < 0)) {
      return Status::Error("baseline of " + g.name(v) + " must be finite" +
                           (model.link == Link::kLinear ? " and >= 0" : ""));
    }
  }
  std::vector<char> seen(static_cast<size_t>(n) * n, 0);
  for (const EdgeKernel& e : model.kernels) {
    if (e.from < 0 || e.from >= n || e.to < 0 || e.to >= n) {
      return Status::Error("kernel with a node index out of range");
    }
    const std::string where = "kernel of " + EdgeName(g, e.from, e.to);
    if (!g.HasDirected(e.from, e.to)) {
      return Status::Error(where + ": the truth graph has no such edge");
    }
    if (seen[static_cast<size_t>(e.to) * n + e.from]++) return Status::Error(where + ": given twice");
    if (Status s = ValidateKernel(e.kernel, model.link, where); !s.ok()) return s;
  }
  for (int to = 0; to < n; ++to) {
    for (int from : g.Parents(to)) {
      if (!seen[static_cast<size_t>(to) * n + from]) {
        return Status::Error("the edge " + EdgeName(g, from, to) + " has no kernel");
      }
    }
  }
  return Status::Ok();
}

Result<double> HawkesSpectralRadius(const HawkesModel& model) {
  return SpectralRadius(model.KernelIntegrals(model.link != Link::kLinear));
}

Status CheckStationary(const HawkesModel& model) {
  Result<double> radius = HawkesSpectralRadius(model);
  if (!radius.ok()) return radius.status();
  if (*radius < 1) return Status::Ok();
  std::ostringstream msg;
  msg << "not stationary: the spectral radius of the "
      << (model.link == Link::kLinear ? "integrated kernel matrix" : "matrix of integrated |kernels|")
      << " is " << *radius << " (it must be below 1); lower the kernel weights, or allow a "
      << "non-stationary run with an event cap";
  return Status::Error(msg.str());
}

Result<Eigen::VectorXd> StationaryIntensity(const HawkesModel& model) {
  if (model.link != Link::kLinear) {
    return Status::Error("the closed-form stationary intensity needs the linear link");
  }
  if (Status s = CheckStationary(model); !s.ok()) return s;
  const int n = model.nodes();
  const Eigen::VectorXd mu = Eigen::Map<const Eigen::VectorXd>(model.baseline.data(), n);
  const Eigen::MatrixXd a = Eigen::MatrixXd::Identity(n, n) - model.KernelIntegrals();
  return Eigen::VectorXd(a.partialPivLu().solve(mu));
}

const char* LinkName(Link link) {
  switch (link) {
    case Link::kLinear: return "linear";
    case Link::kSoftplus: return "softplus";
    case Link::kRectified: return "rectified";
  }
  return "?";
}

const char* KernelFamilyName(KernelFamily family) {
  switch (family) {
    case KernelFamily::kExponential: return "exponential";
    case KernelFamily::kSumOfExponentials: return "exponential-sum";
    case KernelFamily::kDelayedGamma: return "delayed-gamma";
  }
  return "?";
}

}  // namespace locind::sim
