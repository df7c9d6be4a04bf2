#include "learners/independence/reference_distributions.h"

#include <algorithm>
#include <cmath>

#include <boost/math/distributions/chi_squared.hpp>
#include <boost/math/constants/constants.hpp>
#include <boost/math/distributions/fisher_f.hpp>
#include <boost/math/distributions/normal.hpp>
#include <boost/random/normal_distribution.hpp>

namespace locind::learners {
namespace {

// Projection of z onto {x >= 0} in the metric q (positive definite), by
// cyclic coordinate descent on (x - z)' q (x - z); exact coordinate
// minimisation makes it converge for any positive definite q.
Eigen::VectorXd ProjectOntoOrthant(const Eigen::VectorXd& z, const Eigen::MatrixXd& q) {
  Eigen::VectorXd x = z.cwiseMax(0.0);
  Eigen::VectorXd qr = q * (x - z);  // gradient / 2
  for (int sweep = 0; sweep < 500; ++sweep) {
    double change = 0;
    for (Eigen::Index i = 0; i < x.size(); ++i) {
      const double updated = std::max(0.0, x[i] - qr[i] / q(i, i));
      const double delta = updated - x[i];
      if (delta != 0) {
        qr += delta * q.col(i);
        x[i] = updated;
        change = std::max(change, std::abs(delta));
      }
    }
    if (change < 1e-13 * (1 + z.cwiseAbs().maxCoeff())) break;
  }
  return x;
}

}  // namespace

std::vector<double> ChiBarSquaredWeights(const Eigen::MatrixXd& covariance, int draws,
                                         base::RandomStream& random) {
  const Eigen::Index q = covariance.rows();
  const Eigen::MatrixXd lower = covariance.llt().matrixL();
  const Eigen::MatrixXd metric = covariance.inverse();
  boost::random::normal_distribution<double> normal;
  std::vector<double> counts(static_cast<size_t>(q) + 1, 0.0);
  Eigen::VectorXd e(q);
  for (int d = 0; d < draws; ++d) {
    for (Eigen::Index i = 0; i < q; ++i) e[i] = normal(random.engine());
    const Eigen::VectorXd x = ProjectOntoOrthant(lower * e, metric);
    counts[static_cast<size_t>((x.array() > 0).count())] += 1;
  }
  for (double& c : counts) c /= draws;
  return counts;
}

double ChiBarSquaredSurvival(const std::vector<double>& weights, double t) {
  if (std::isnan(t)) return t;
  if (t <= 0) return 1;
  double p = 0;
  for (size_t i = 1; i < weights.size(); ++i) p += weights[i] * ChiSquaredSurvival(double(i), t);
  return std::clamp(p, 0.0, 1.0);
}

double ChiSquaredSurvival(double df, double t) {
  if (std::isnan(t)) return t;
  if (std::isinf(t)) return t > 0 ? 0 : 1;
  if (t <= 0) return 1;
  return boost::math::cdf(boost::math::complement(boost::math::chi_squared_distribution<>(df), t));
}

// Two series for the same probability, each used where it converges fast.
// Reflection (images): P(sup |B| >= x) = 4 sum_{k>=0} (-1)^k P(N > (2k+1) x),
// N standard normal; terms fall like exp(-(2k+1)^2 x^2 / 2), quick for
// x >= 1. Eigenfunction (theta) form: P(sup |B| < x) = (4/pi) sum_{k>=0}
// (-1)^k / (2k+1) exp(-pi^2 (2k+1)^2 / (8 x^2)), quick for x < 1. Both are
// alternating with decreasing terms, so stopping once a term is below 1e-17
// leaves an error below that term.
double SupAbsBrownianSurvival(double x) {
  if (std::isnan(x)) return x;
  if (std::isinf(x)) return x > 0 ? 0 : 1;
  if (x <= 0) return 1;
  const double pi = boost::math::constants::pi<double>();
  double sum = 0;
  if (x >= 1) {
    const boost::math::normal_distribution<> normal;
    for (int k = 0; k < 50; ++k) {
      const double term = boost::math::cdf(boost::math::complement(normal, (2 * k + 1) * x));
      sum += (k % 2 ? -term : term);
      if (term < 1e-17) break;
    }
    return std::clamp(4 * sum, 0.0, 1.0);
  }
  for (int k = 0; k < 200; ++k) {
    const double odd = 2 * k + 1;
    const double term = std::exp(-pi * pi * odd * odd / (8 * x * x)) / odd;
    sum += (k % 2 ? -term : term);
    if (term < 1e-17) break;
  }
  return std::clamp(1 - 4 / pi * sum, 0.0, 1.0);
}

double FSurvival(double df1, double df2, double t) {
  if (std::isnan(t)) return t;
  if (std::isinf(t)) return t > 0 ? 0 : 1;
  if (t <= 0) return 1;
  return boost::math::cdf(
      boost::math::complement(boost::math::fisher_f_distribution<>(df1, df2), t));
}

}  // namespace locind::learners
