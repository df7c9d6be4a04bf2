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
// History inputs ("drift-exact-lr-history", options.history). A hidden
// process between C and b (x3 -> h -> b) makes b's drift depend on the past
// of C, not only its present, which no linear Markov model of X_V
// represents. The variant adds to b's drift, in both models, the nuisance
// term gamma' H(t), H = the filtered histories of every process of C at every
// filter rate r of options.rates (default: drift-f's supported default rates,
// SupportedDriftRates(DefaultDriftRates): at spacing 0.1, rate 1 from a window
// of 50 and rate 0.1 from 500), with drift-f's recursion
//   F_i = a F_{i-1} + (1 - a) X(t_{i-1}),  a = exp(-r (t_i - t_{i-1})),
// (so H(t_i) uses only values before t_i), held constant over each step:
//   dX = (c + M X + e_b gamma' H(t_i)) dt + diag(sigma) dW  on [t_i, t_{i+1}).
// The transition stays exact given H(t_i): its mean gains
// (int_0^D e^{Ms} ds) e_b gamma' H(t_i). gamma (|C| K entries) is profiled
// out in closed form (generalised least squares given M and sigma); the
// tested entries M(b, a) keep the exact-transition treatment. Statistic and
// reference as above: LR, chi^2 with |A| degrees of freedom. Without
// history columns (C empty, or no supported rate) it is drift-exact-lr.
// Collinear filtered columns give "singular design"; the sample-size floor
// grows by |C| K.
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
  // drift-exact-lr-history: filtered histories of the conditioning processes
  // enter the target's drift as nuisance inputs (see the header comment).
  bool history = false;
  std::vector<double> rates = {};  // history filter rates; empty: the supported DefaultDriftRates
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
  std::string kind() const override { return options_.history ? "drift-exact-lr-history" : "drift-exact-lr"; }
  TestResult Run(const TestQuery& query) override;

  // Maximum-likelihood fit of the coordinates `coords` (sorted process
  // indices) with M(i, j) allowed to be non-zero only where allowed(i, j)
  // (d x d, d = coords.size()); `start`, when given, is a d x d drift and d
  // noise scales to start from instead of the Euler estimate. Fails on
  // irregular sampling, a singular Euler start or a non-moving coordinate.
  Result<TransitionFit> Fit(const std::vector<int>& coords, const Eigen::MatrixX<bool>& allowed,
                            const TransitionFit* start = nullptr);
  // The same with history inputs in the drift of coordinate `target`
  // (position in coords): the filtered histories, at every rate of
  // history_rates(), of the processes `history` (drift-exact-lr-history;
  // with `history` empty this is Fit). The input coefficients are profiled out.
  // Also fails when `history` is not empty and `target` is not a position in
  // coords, or a history process is out of range.
  Result<TransitionFit> FitWithHistory(const std::vector<int>& coords, const Eigen::MatrixX<bool>& allowed,
                                       Eigen::Index target, const std::vector<int>& history,
                                       const TransitionFit* start = nullptr);

  // The filter rates of the history inputs (empty unless options.history).
  const std::vector<double>& history_rates() const { return options_.rates; }

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
    // With history inputs: the centred sums hh, hy = sum (h - hbar)(y - ybar)',
    // hz over the filtered columns h (column j * K + k: process j, rate k).
    Eigen::MatrixXd hh, hy, hz;
  };
  const std::vector<SpacingMoments>& Moments();
  TestResult Compute(const TestQuery& query);

  sim::PathData data_;
  DriftTransitionOptions options_;
  std::optional<std::vector<SpacingMoments>> moments_;  // empty vector: irregular sampling
  std::map<std::tuple<int, std::vector<int>, std::vector<int>>, TestResult> cache_;
};

}  // namespace locind::learners
