// DriftTransitionTest ("drift-exact-lr"): likelihood-ratio test of local
// independence for sampled paths built on the exact Gaussian transition of a
// linear drift.
//
// Model. For a query (b, A, C) let V = A u C u {b} (sorted; the observed
// coordinates the test looks at). X_V is modelled as a linear SDE
//   dX = (c + M X) dt + diag(sigma) dW,  independent Brownian motions,
// sampled at t_0 < ... < t_n. Over a step D the transition is exactly
//   X(t + D) | X(t) ~ N(e^{MD} X(t) + h_D, Q(D)),
//   h_D = (int_0^D e^{Ms} ds) c,  Q(D) = int_0^D e^{Ms} diag(sigma^2) e^{M's} ds,
// with e^{MD} and Q(D) from one block matrix exponential (Van Loan 1978,
// IEEE Trans. Autom. Control 23(3), Theorem 1). Coordinates outside V are
// left out (not modelled); every row of M other than b's is free over V, so
// the effect of left-out or hidden processes on the other coordinates is
// absorbed as well as a linear Markov model of X_V can.
//
// Hypotheses. Full model: row b of M free over V. Null: M(b, a) = 0 for
// a in A. Both are fitted by maximum likelihood of the exact transitions
// (start: the Euler regression estimate; then BFGS with central-difference
// gradients; the null optimum also starts the full fit, so LR >= 0). The
// offset h_D is profiled out in closed form (the mean of X(t+D) - e^{MD}X(t))
// and is a free nuisance parameter per distinct spacing. Statistic
// LR = 2 (l_full - l_null); reference chi^2 with |A| degrees of freedom (the
// tested entries are interior parameters; Wilks 1938, Ann. Math. Statist.
// 9(1)).
//
// Sampling: spacings equal within a relative 1e-6 share one transition; up to
// kMaxDistinctSpacings distinct spacings are handled (one transition each);
// more give "not estimable: irregular sampling".
//
// Several trials (sim::PathData::trial_starts): the transitions of every trial
// enter one likelihood (log-likelihoods add); no step spans two trials.
//
// Not estimable: fewer than d (d + 2) + 10 increments for d = |V|
// ("too few samples"), a coordinate that never moves ("perfect fit"), a
// singular Euler start ("singular design"), a fit that does not converge
// within max_iterations ("failed fit"). Data moments are computed once per
// data set; results are cached by (b, A, C). Not thread-safe.
#pragma once

#include <map>
#include <optional>
#include <tuple>
#include <vector>

#include <Eigen/Dense>

#include "base/status.h"
#include "learners/independence/independence_test.h"
#include "sim/path_data.h"

namespace locind::learners {

inline constexpr int kMaxDistinctSpacings = 20;

struct DriftTransitionOptions {
  int max_iterations = 500;  // BFGS iterations per fit
};

// One maximum-likelihood fit of the linear SDE on a set of coordinates.
struct TransitionFit {
  double log_likelihood = 0;  // at the optimum, offsets profiled out
  Eigen::MatrixXd M;          // d x d, zero where not allowed
  Eigen::VectorXd sigma;      // d
  int iterations = 0;
  bool converged = false;
};

class DriftTransitionTest : public IndependenceTest {
 public:
  // Fails when the data is invalid (ValidatePathData).
  static Result<DriftTransitionTest> Create(sim::PathData data, DriftTransitionOptions options = {});

  int processes() const override { return data_.processes(); }
  const std::vector<std::string>& names() const override { return data_.names; }
  std::string kind() const override { return "drift-exact-lr"; }
  TestResult Run(const TestQuery& query) override;

  // Maximum-likelihood fit of the coordinates `coords` (sorted process
  // indices) with M(i, j) allowed to be non-zero only where allowed(i, j)
  // (d x d, d = coords.size()); `start`, when given, is a d x d drift and d
  // noise scales to start from instead of the Euler estimate. Fails on
  // irregular sampling, a singular Euler start or a non-moving coordinate.
  Result<TransitionFit> Fit(const std::vector<int>& coords, const Eigen::MatrixX<bool>& allowed,
                            const TransitionFit* start = nullptr);

  size_t distinct_queries() const { return cache_.size(); }

 private:
  DriftTransitionTest(sim::PathData data, DriftTransitionOptions options)
      : data_(std::move(data)), options_(options) {}
  // Centred moments of (X(t_i), X(t_{i+1})) over the steps of one spacing,
  // for all processes.
  struct SpacingMoments {
    double step = 0;
    double count = 0;
    Eigen::MatrixXd zz, yz, yy;  // sums of (z - zbar)(z - zbar)', (y - ybar)(z - zbar)', ...
  };
  const std::vector<SpacingMoments>& Moments();
  TestResult Compute(const TestQuery& query);

  sim::PathData data_;
  DriftTransitionOptions options_;
  std::optional<std::vector<SpacingMoments>> moments_;  // empty vector: irregular sampling
  std::map<std::tuple<int, std::vector<int>, std::vector<int>>, TestResult> cache_;
};

}  // namespace locind::learners
