// penalized-fit: a baseline that makes no tests. It fits every process's
// model on the histories of all observed processes with an L1 penalty and
// draws j -> b when some coefficient of j in b's model is non-zero. Directed
// edges (loops included), no marks; LearnResult::tests is 0.
//
// Event streams (linear Hawkes intensity on the exponential basis of
// learners/independence/hawkes_features.h): lambda_b(t) = mu_b + sum_j sum_k
// theta_bjk x_jk(t), theta >= 0, maximizing
//   sum_i log lambda_b(t_i) - int lambda_b - sum_jk w_jk theta_jk
// by projected Newton (learners/independence/projected_newton.h); with theta >= 0 the L1
// penalty is linear and the non-selected coefficients sit exactly at 0. The
// weight w_jk = c * sqrt(2 log p) * s_jk, with s_jk = sqrt(sum_i x_jk(t_i)^2)
// / lambda0 the null standard deviation of the score of theta_jk (lambda0 =
// events of b / duration, p = n K coefficients): the universal threshold of
// Donoho & Johnstone (1994, Biometrika 81(3)) on the score scale.
//
// Diffusion paths (the drift regression of learners/independence/drift_test.h): y = X beta
// + noise with the design [1, X_j, filtered X_j] for every j, lasso
// (Tibshirani 1996, J. R. Stat. Soc. B 58(1)) by cyclic coordinate descent
// (Friedman, Hastie & Tibshirani 2010, J. Stat. Softw. 33(1), Sec. 2) on
// columns scaled to unit root mean square, the intercept unpenalized,
// lambda = c * sigma * sqrt(2 n log p), sigma from the unpenalized least
// squares fit (universal threshold again).
//
// Not estimable (the policy of learner.h): an event stream with fewer than
// 2 events has no intensity fit; every edge into it is kept and marked
// undecided (rule "not estimable", the fit as witness with its reason), and
// the note says so. Paths too short for the noise scale are refused instead
// (all processes have the same number of increments, so no fit could be made).
//
// c is MethodSettings::penalty (default 1). Needs data (LearnInput::events
// or ::paths); fails with the oracle.
#pragma once

#include "learners/methods/learner.h"

namespace locind::learners {

class PenalizedFitLearner : public Learner {
 public:
  // `scale` is c above; <= 0 means the default 1.
  explicit PenalizedFitLearner(double scale = 1) : scale_(scale > 0 ? scale : 1) {}
  Result<LearnResult> Learn(const LearnInput& input) override;

 private:
  double scale_;
};

}  // namespace locind::learners
