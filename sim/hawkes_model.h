// HawkesModel: a multivariate Hawkes process on the nodes of a truth graph.
//
// Every node v of truth.graph is a process with baseline rate mu_v. The
// intensity of b is
//
//   lambda_b(t) = link( mu_b + sum_a sum_{t_k^a < t} g_ba(t - t_k^a) )
//
// with one kernel g_ba per directed edge a -> b of truth.graph (no edge, no
// kernel; a loop b -> b carries the self-excitation kernel). Hidden nodes are
// simulated like the others and dropped from the output.
//
// Kernel families (g(t) for t > 0, zero before; "weight" is always the
// integral of the kernel, so K_ba = integral of g_ba):
//   exponential          g(t) = w beta exp(-beta t)
//   sum of exponentials  g(t) = sum_j w_j beta_j exp(-beta_j t)
//   delayed gamma        g(t) = w Gamma(t - delay; shape, rate) density, which
//                        is zero on [0, delay]; integer shapes give the Erlang
//                        delay. No Markov recursion exists for it.
//
// Links: linear (the classical process; kernels and baselines must be >= 0),
// softplus log(1 + e^x) and rectified max(x, 0) (Bremaud & Massoulie 1996,
// Ann. Probab. 24(3)); the two nonlinear links admit signed kernels, i.e.
// inhibition.
#pragma once

#include <string>
#include <vector>

#include <Eigen/Dense>

#include "base/status.h"
#include "graph/truth_graph.h"

namespace locind::sim {

enum class KernelFamily { kExponential, kSumOfExponentials, kDelayedGamma };
enum class Link { kLinear, kSoftplus, kRectified };

// One exponential term w * beta * exp(-beta t).
struct ExpTerm {
  double weight = 0;
  double decay = 1;
};

struct Kernel {
  KernelFamily family = KernelFamily::kExponential;
  std::vector<ExpTerm> terms;  // exponential (one term) and sum of exponentials
  double weight = 0;           // delayed gamma: integral
  double delay = 0;            // delayed gamma: no effect before `delay`
  double shape = 1;            // delayed gamma: shape k > 0 (integer k: Erlang)
  double rate = 1;             // delayed gamma: rate > 0

  static Kernel Exponential(double weight, double decay);
  static Kernel SumOfExponentials(std::vector<ExpTerm> terms);
  static Kernel DelayedGamma(double weight, double delay, double shape, double rate);

  // True for the families simulated by thinning with the intensity recursion.
  bool IsExponentialFamily() const { return family != KernelFamily::kDelayedGamma; }
  // Integral of g over (0, inf); signed for inhibitory kernels.
  double Integral() const;
  // Integral of |g| over (0, inf) (>= |Integral()|).
  double AbsoluteIntegral() const;
  // g(t); 0 for t <= 0.
  double Value(double t) const;
  // Integral of g over (0, t]; 0 for t <= 0.
  double Cumulative(double t) const;
};

// The kernel g_{to,from} of the directed edge from -> to.
struct EdgeKernel {
  int from = 0;
  int to = 0;
  Kernel kernel;
};

struct HawkesModel {
  graph::TruthGraph truth;
  std::vector<double> baseline;     // mu_v, one per node of truth.graph
  std::vector<EdgeKernel> kernels;  // exactly one per directed edge of truth.graph
  Link link = Link::kLinear;

  int nodes() const { return truth.graph.size(); }
  // The integrated kernel matrix K (K(b, a) = integral of g_ba); with
  // `absolute`, integrals of |g| (the matrix in the nonlinear stability
  // condition).
  Eigen::MatrixXd KernelIntegrals(bool absolute = false) const;
};

// Every edge a -> b gets Kernel::Exponential(weight, decay); every node the
// baseline. `loop_weight` (when >= 0) replaces `weight` on loops a -> a.
HawkesModel ExponentialHawkes(const graph::TruthGraph& truth, double baseline, double weight,
                              double decay, double loop_weight = -1);

// Checks shapes and values: one baseline per node (finite; >= 0 for the
// linear link), one kernel per directed edge and none elsewhere, finite
// parameters, decays/rates/shapes > 0, delay >= 0, non-negative kernels for
// the linear link, exponential families only for the nonlinear links.
Status Validate(const HawkesModel& model);

// Spectral radius of K (linear link) or of the matrix of integrals of |g|
// (nonlinear links, whose condition is sufficient: Bremaud & Massoulie 1996).
// REQUIRES: Validate(model).ok().
Result<double> HawkesSpectralRadius(const HawkesModel& model);

// Ok when HawkesSpectralRadius(model) < 1, else an error naming the radius
// and what to change.
Status CheckStationary(const HawkesModel& model);

// Stationary mean intensities (I - K)^{-1} mu of a linear model (Hawkes 1971,
// Biometrika 58(1)). Fails unless the link is linear and the model stationary.
Result<Eigen::VectorXd> StationaryIntensity(const HawkesModel& model);

const char* LinkName(Link link);
const char* KernelFamilyName(KernelFamily family);

}  // namespace locind::sim
