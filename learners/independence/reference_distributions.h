// Reference distributions for the tests' p-values: chi-squared and F
// (Boost.Math) and the chi-bar-squared mixture for tests on a boundary.
//
// When the tested parameters theta_A satisfy theta_A >= 0 and the null puts
// them at 0, the likelihood-ratio statistic is asymptotically not chi-squared
// but a mixture sum_i w_i chi^2_i, i = 0..q (Self & Liang 1987, J. Amer.
// Statist. Assoc. 82(398), Case 5-6; Shapiro 1985, Biometrika 72(1)). The
// weight w_i is the probability that the projection of Z ~ N(0, V) onto the
// non-negative orthant, in the metric V^{-1}, has exactly i positive
// components (Silvapulle & Sen 2005, Constrained Statistical Inference, Wiley,
// Sec. 3.5). Closed forms exist for q <= 2 only, so the weights are estimated
// by Monte Carlo with a given random stream.
#pragma once

#include <vector>

#include <Eigen/Dense>

#include "base/random_stream.h"

namespace locind::learners {

// Weights w_0..w_q for covariance V (q x q, positive definite) from `draws`
// Monte Carlo draws. REQUIRES: V positive definite, draws > 0.
std::vector<double> ChiBarSquaredWeights(const Eigen::MatrixXd& covariance, int draws,
                                         base::RandomStream& random);

// P(chi-bar-squared >= t) for the mixture with `weights` (chi^2_0 is the
// point mass at 0, so t <= 0 gives 1).
double ChiBarSquaredSurvival(const std::vector<double>& weights, double t);

// P(chi^2_df >= t), df > 0 (Boost.Math); 1 for t <= 0, 0 for t = +inf, NaN
// for a NaN statistic (never an exception).
double ChiSquaredSurvival(double df, double t);

// P(sup_{0 <= s <= 1} |B_s| >= x) for a standard Brownian motion B, the
// reference of the local covariance test's supremum statistic. 1 for x <= 0,
// 0 for x = +inf, NaN for NaN. Series: Feller (1971), An Introduction to
// Probability Theory II, Ch. X.5 (reflection principle).
double SupAbsBrownianSurvival(double x);

// P(F_{df1, df2} >= t) (Boost.Math); 1 for t <= 0, 0 for t = +inf, NaN for
// a NaN statistic.
double FSurvival(double df1, double df2, double t);

}  // namespace locind::learners
